// The mail the server wrote (/api/outbox): all of it for an administrator, one's own otherwise.
import { z } from 'zod';
import { id, isoTime } from './common';

export const outboxMessage = z.strictObject({
  id,
  to: z.array(z.string()),
  from: z.string(),
  subject: z.string(),
  text: z.string(),
  kind: z.string().nullable(),
  createdAt: isoTime,
  relatedSheetId: z.number().int().nullable(),
  /** The project of the related sheet, so a reader can open it. */
  relatedProjectId: z.number().int().nullable(),
});
export type OutboxMessage = z.infer<typeof outboxMessage>;

/** GET /api/outbox: `all` for an administrator; `mine` (the mail addressed to them) otherwise. */
export const outboxResponse = z.strictObject({
  scope: z.enum(['all', 'mine']),
  messages: z.array(outboxMessage),
});
export type OutboxResponse = z.infer<typeof outboxResponse>;
