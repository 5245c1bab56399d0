// Remarks on a revision's lines and their replies (/api/revisions/:id/remarks, /api/remarks…).
import { z } from 'zod';
import { REMARK_STATES, REMARK_TYPES } from '../vocabulary';
import { id, isoTime, personRef } from './common';

export const remarkReply = z.strictObject({
  id,
  text: z.string(),
  author: personRef,
  createdAt: isoTime,
  /** When its writer last edited it; null when never. */
  editedAt: isoTime.nullable(),
});
export type RemarkReply = z.infer<typeof remarkReply>;

/** A remark as it stood on an earlier revision, before it was carried to this one. */
export const earlierRemark = z.strictObject({
  remarkId: id,
  revisionNumber: z.number().int(),
  line: z.number().int(),
  author: personRef,
  createdAt: isoTime,
  replies: z.array(remarkReply),
});
export type EarlierRemark = z.infer<typeof earlierRemark>;

export const remark = z.strictObject({
  id,
  revisionId: id,
  blockId: z.string(),
  line: z.number().int().nonnegative(),
  type: z.enum(REMARK_TYPES),
  text: z.string(),
  state: z.enum(REMARK_STATES),
  carriedFrom: z
    .strictObject({ remarkId: id, revisionNumber: z.number().int(), line: z.number().int() })
    .nullable(),
  lineChanged: z.boolean(),
  author: personRef,
  createdAt: isoTime,
  updatedAt: isoTime,
  closedBy: personRef.nullable(),
  closedAt: isoTime.nullable(),
  replies: z.array(remarkReply),
  /** For a carried remark, the thread on the earlier revisions, oldest first. */
  earlier: z.array(earlierRemark),
});
export type Remark = z.infer<typeof remark>;

/** GET /api/revisions/:revisionId/remarks. */
export const remarksResponse = z.strictObject({ remarks: z.array(remark) });
export type RemarksResponse = z.infer<typeof remarksResponse>;

/** A remark made, replied to or changed. */
export const remarkResponse = z.strictObject({ remark });
export type RemarkResponse = z.infer<typeof remarkResponse>;
