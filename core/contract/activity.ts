// The activity record as lists send it (/api/projects/:id/activity, /api/sheets/:id/activity).
import { z } from 'zod';
import { id, isoTime, personRef } from './common';

export const activityEntry = z.strictObject({
  id,
  at: isoTime,
  actor: personRef.nullable(),
  /** One of ACTIVITY_ACTIONS (core/vocabulary.ts); older rows may hold retired words. */
  action: z.string(),
  objectType: z.string(),
  objectId: z.number().int().nullable(),
  details: z.record(z.string(), z.unknown()),
  /** The sheet the entry is about (its details name `sheetId`, or the object is a sheet), when it still exists. */
  sheet: z.strictObject({ id, number: z.string(), title: z.string() }).optional(),
});
export type ActivityEntry = z.infer<typeof activityEntry>;

/** GET of a project's or a sheet's activity. */
export const activityResponse = z.strictObject({ activity: z.array(activityEntry) });
export type ActivityResponse = z.infer<typeof activityResponse>;
