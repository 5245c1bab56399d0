// The comparison of two revisions of a sheet, or of a revision and the draft
// (/api/sheets/:id/compare?from=&to=).
import { z } from 'zod';
import { BLOCK_KINDS, REVISION_STATUSES } from '../vocabulary';
import { id, isoTime } from './common';
import { remark } from './remarks';

/** One side compared: an issued revision, or the draft at its version. */
export const compareSide = z.discriminatedUnion('kind', [
  z.strictObject({
    kind: z.literal('revision'),
    id,
    number: z.number().int().positive(),
    status: z.enum(REVISION_STATUSES),
    issuedAt: isoTime,
  }),
  z.strictObject({ kind: z.literal('draft'), draftVersion: z.number().int() }),
]);
export type CompareSide = z.infer<typeof compareSide>;

/** One run of changed lines within a block (1-based line numbers; count 0 for pure inserts). */
export const lineHunk = z.strictObject({
  oldStart: z.number().int(),
  oldCount: z.number().int().nonnegative(),
  newStart: z.number().int(),
  newCount: z.number().int().nonnegative(),
  removed: z.array(z.string()),
  added: z.array(z.string()),
});

/**
 * A block's change, matched by id; `moved` when its place among the common blocks changed (the
 * longest common subsequence of ids stays), lines diffed by Myers' algorithm (core/sheet/diff.ts).
 */
export const blockChange = z.strictObject({
  blockId: z.string(),
  kind: z.enum(BLOCK_KINDS),
  status: z.enum(['added', 'removed', 'changed', 'moved', 'unchanged']),
  moved: z.boolean(),
  kindChanged: z.boolean(),
  oldIndex: z.number().int().nullable(),
  newIndex: z.number().int().nullable(),
  hunks: z.array(lineHunk),
});
export type BlockChange = z.infer<typeof blockChange>;

/**
 * A result whose shown value changed: (new − old) / |old| in SI when both are numbers of one
 * dimension. The two values, when present, are the engine's (core/sheet/types.ts SheetValue).
 */
export const resultChange = z.strictObject({
  blockId: z.string(),
  key: z.string(),
  line: z.number().int().nullable(),
  old: z.string().nullable(),
  new: z.string().nullable(),
  relativeChange: z.number().nullable(),
  oldValue: z.unknown().optional(),
  newValue: z.unknown().optional(),
});

/** A criterion that passed on one side and failed on the other. */
export const criterionFlip = z.strictObject({
  blockId: z.string(),
  label: z.string(),
  line: z.number().int(),
  was: z.boolean(),
  now: z.boolean(),
});
export type CriterionFlip = z.infer<typeof criterionFlip>;

/** A remark of either side, with where its line is on the other side. */
export const remarkInContext = remark.extend({
  revisionNumber: z.number().int().positive(),
  mapped: z.strictObject({
    status: z.enum(['same', 'changed', 'gone']),
    blockId: z.string().nullable(),
    line: z.number().int().nullable(),
  }),
});
export type RemarkInContext = z.infer<typeof remarkInContext>;

/** GET /api/sheets/:sheetId/compare: the changes of source and results, and both sides' remarks. */
export const compareResponse = z.strictObject({
  from: compareSide,
  to: compareSide,
  /** The display unit system of each side (the sheet setting "Units shown"). */
  units: z.strictObject({ from: z.enum(['si', 'us']), to: z.enum(['si', 'us']) }),
  blocks: z.array(blockChange),
  results: z.array(resultChange),
  flipped: z.array(criterionFlip),
  summary: z.strictObject({
    added: z.number().int().nonnegative(),
    removed: z.number().int().nonnegative(),
    changed: z.number().int().nonnegative(),
    moved: z.number().int().nonnegative(),
    resultsChanged: z.number().int().nonnegative(),
    flipped: z.number().int().nonnegative(),
  }),
  remarks: z.array(remarkInContext),
});
export type CompareResponse = z.infer<typeof compareResponse>;
