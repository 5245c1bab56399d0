import { Router } from 'express';
import { z } from 'zod';
import { currentUser, requireSignedIn } from '../../http/auth';
import type { AppContext } from '../../http/context';
import { parse } from '../../http/validate';
import { outboxService } from './outbox.service';
import type { OutboxResponse } from '../../../core/contract/outbox';

const outboxQuery = z.object({
  sheetId: z.coerce.number().int().positive({ error: 'sheetId must be a sheet id.' }).optional(),
  limit: z.coerce
    .number()
    .int()
    .min(1, { error: 'limit must be at least 1.' })
    .max(1000, { error: 'limit can be at most 1000.' })
    .optional(),
});

/**
 * Mounted at /api/outbox: the mail the local fake transport kept, newest first. An administrator
 * reads all of it (`scope: "all"`); everyone else the messages addressed to them (`"mine"`).
 */
export function createOutboxRouter({ db }: AppContext): Router {
  const router = Router();
  router.get('/', requireSignedIn, async (req, res) => {
    const q = parse(outboxQuery, req.query, 'query');
    res.json((await outboxService.listFor(db, currentUser(req), q)) satisfies OutboxResponse);
  });
  return router;
}
