// A revision as its print shows it (/api/revisions/:id/print), and a project's calculation
// package binding the chosen revisions with their record of check (/api/projects/:id/package).
import { z } from 'zod';
import { REVISION_STATUSES } from '../vocabulary';
import { id, isoTime, personRef } from './common';
import { remark } from './remarks';
import { sealView } from './revisions';
import { sheetBlock, sheetDigests } from './sheets';

/** The project as the title block names it. */
export const printProject = z.strictObject({
  id,
  jobNumber: z.string(),
  name: z.string(),
  client: z.string(),
  site: z.string(),
});

/**
 * GET /api/revisions/:revisionId/print: everything the print view needs in one answer, with the
 * cautions every print carries (DESIGN §12). The results are the engine's (the client reads them
 * as SheetResults).
 */
export const printResponse = z.strictObject({
  firm: z.strictObject({ name: z.string() }),
  project: printProject,
  sheet: z.strictObject({ id, number: z.string(), title: z.string(), subject: z.string() }),
  revision: z.strictObject({
    id,
    number: z.number().int().positive(),
    status: z.enum(REVISION_STATUSES),
    /** What the principal sealed it or the checker signed it off for, else what it was issued for. */
    purpose: z.string(),
    preparedBy: personRef,
    preparedAt: isoTime,
    checkedBy: personRef.nullable(),
    checkedAt: isoTime.nullable(),
    sealedBy: personRef.nullable(),
    sealedAt: isoTime.nullable(),
    digests: sheetDigests,
    engineVersion: z.string(),
    preliminary: z.boolean(),
    /** "Preliminary — not for construction. …" on a revision not sealed; null once sealed. */
    banner: z.string().nullable(),
  }),
  history: z.array(
    z.strictObject({
      number: z.number().int().positive(),
      status: z.enum(REVISION_STATUSES),
      purpose: z.string(),
      issuedBy: personRef,
      issuedAt: isoTime,
      checkedBy: personRef.nullable(),
      checkedAt: isoTime.nullable(),
      sealedBy: personRef.nullable(),
      sealedAt: isoTime.nullable(),
      sealCode: z.string().nullable(),
    }),
  ),
  blocks: z.array(sheetBlock),
  /** The revision's settings: significant figures and the units its results are shown in. */
  settings: z.record(z.string(), z.unknown()),
  results: z.unknown(),
  seal: sealView.extend({ verifyPath: z.string() }).nullable(),
  caution: z.string(),
});
export type PrintResponse = z.infer<typeof printResponse>;

/** One sheet of the project as the package's cover lists it, with the revisions to choose from. */
export const packageSheet = z.strictObject({
  id,
  number: z.string(),
  title: z.string(),
  revisions: z.array(
    z.strictObject({
      id,
      number: z.number().int().positive(),
      status: z.enum(REVISION_STATUSES),
      sealCode: z.string().nullable(),
    }),
  ),
  /** The revision bound into the package, or null when the sheet is left out. */
  chosenRevisionId: id.nullable(),
});
export type PackageSheet = z.infer<typeof packageSheet>;

/** The record of check of one revision: its remarks with their threads, in sheet order. */
export const checkRecord = z.strictObject({ revisionId: id, remarks: z.array(remark) });
export type CheckRecord = z.infer<typeof checkRecord>;

/**
 * GET /api/projects/:projectId/package: the chosen revisions (by default the latest sealed of each
 * sheet) in sheet order, each as its print has it with its record of check.
 */
export const packageResponse = z.strictObject({
  firm: z.strictObject({ name: z.string() }),
  project: printProject,
  sheets: z.array(packageSheet),
  parts: z.array(printResponse.extend({ record: checkRecord })),
  /** True when every revision is the default choice (the latest sealed of each sheet). */
  defaultChoice: z.boolean(),
});
export type PackageResponse = z.infer<typeof packageResponse>;
