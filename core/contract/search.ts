// Search across the projects a person may read (/api/search).
import { z } from 'zod';
import { BLOCK_KINDS } from '../vocabulary';
import { id } from './common';

export const projectRef = z.strictObject({ id, jobNumber: z.string(), name: z.string() });
export type ProjectRef = z.infer<typeof projectRef>;

/**
 * Where in a sheet the words are: a block and its line (both 1-based), in the draft (`revision`
 * null) or, for a person who may not read the draft (a viewer), in the newest revision.
 */
export const blockPlace = z.strictObject({
  revision: z.strictObject({ id, number: z.number().int() }).nullable(),
  blockId: z.string(),
  blockIndex: z.number().int(),
  blockKind: z.enum(BLOCK_KINDS),
  line: z.number().int(),
  text: z.string(),
});
export type BlockPlace = z.infer<typeof blockPlace>;

export const sheetSearchResult = z.strictObject({
  kind: z.literal('sheet'),
  project: projectRef,
  sheet: z.strictObject({ id, number: z.string(), title: z.string(), subject: z.string() }),
  /** Which of number, title and subject hold a searched word. */
  fields: z.array(z.enum(['number', 'title', 'subject'])),
  /**
   * The first line holding a searched word (text and calc blocks first), if any: of the draft,
   * or of the newest revision for a person who may not read the draft.
   */
  place: blockPlace.nullable(),
});
export type SheetSearchResult = z.infer<typeof sheetSearchResult>;

export const remarkSearchResult = z.strictObject({
  kind: z.enum(['remark', 'reply']),
  project: projectRef,
  sheet: z.strictObject({ id, number: z.string(), title: z.string() }),
  revision: z.strictObject({ id, number: z.number().int() }),
  remarkId: id,
  blockId: z.string(),
  line: z.number().int(),
  text: z.string(),
});
export type RemarkSearchResult = z.infer<typeof remarkSearchResult>;

/** GET /api/search?q=…: the words searched, those skipped and why, and the places found. */
export const searchAnswer = z.strictObject({
  query: z.string(),
  words: z.array(z.string()),
  skipped: z.array(z.strictObject({ word: z.string(), reason: z.enum(['short', 'common']) })),
  results: z.array(z.union([sheetSearchResult, remarkSearchResult])),
  /** True when more matched than are listed. */
  truncated: z.boolean(),
});
export type SearchAnswer = z.infer<typeof searchAnswer>;
