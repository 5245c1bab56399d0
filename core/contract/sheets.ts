// Sheets, their drafts and the templates a sheet starts from (/api/projects/:id/sheets,
// /api/sheets/:id, /api/sheet-templates, /api/firm-templates).
import { z } from 'zod';
import { BLOCK_KINDS, SHEET_STATUSES } from '../vocabulary';
import { id, isoTime, personRef, projectRole } from './common';

export const sheetBlock = z.strictObject({
  id: z.string().min(1),
  kind: z.enum(BLOCK_KINDS),
  source: z.string(),
});
export type SheetBlockShape = z.infer<typeof sheetBlock>;

/**
 * The sheet's settings: significant figures and the units results are shown in (display only;
 * SI when absent). The unit systems themselves are in core/display-units.ts.
 */
export const sheetSettings = z.strictObject({
  significantFigures: z.number().int(),
  units: z.string().optional(),
});

export const sheetDraft = z.strictObject({
  blocks: z.array(sheetBlock),
  settings: sheetSettings,
});

export const sheetSummary = z.strictObject({
  id,
  projectId: id,
  number: z.string(),
  title: z.string(),
  subject: z.string(),
  status: z.enum(SHEET_STATUSES),
  latestRevision: z.strictObject({ id, number: z.number().int(), status: z.string() }).nullable(),
  draftVersion: z.number().int(),
  createdAt: isoTime,
  createdBy: personRef,
  updatedAt: isoTime,
  updatedBy: personRef,
});
export type SheetSummary = z.infer<typeof sheetSummary>;

/** A sheet as GET /api/sheets/:id sends it: the draft, its project's names, the caller's roles. */
export const sheetDetail = sheetSummary.extend({
  draft: sheetDraft,
  projectJobNumber: z.string(),
  projectName: z.string(),
  myRoles: z.array(projectRole),
  /** True for a viewer: the draft is withheld (its blocks empty); the revisions are theirs to read. */
  draftHidden: z.boolean().optional(),
});
export type SheetDetail = z.infer<typeof sheetDetail>;

/** GET /api/projects/:projectId/sheets. */
export const sheetsResponse = z.strictObject({ sheets: z.array(sheetSummary) });
export type SheetsResponse = z.infer<typeof sheetsResponse>;

/** GET, POST and PATCH of one sheet. */
export const sheetResponse = z.strictObject({ sheet: sheetDetail });
export type SheetResponse = z.infer<typeof sheetResponse>;

/** PUT /api/sheets/:sheetId/draft: the new version. */
export const draftSaved = z.strictObject({ draftVersion: z.number().int(), updatedAt: isoTime });
export type DraftSaved = z.infer<typeof draftSaved>;

/**
 * What the server holds when a draft save is refused as stale: the answer is 409 with
 * `error.code` DRAFT_CONFLICT and these `error.details`, so the editor can show both versions.
 */
export const conflictingDraft = sheetDraft.extend({
  draftVersion: z.number().int(),
  updatedAt: isoTime,
  updatedBy: personRef,
});
export type ConflictingDraft = z.infer<typeof conflictingDraft>;

/** The `details` of the 409 DRAFT_CONFLICT error of PUT /api/sheets/:sheetId/draft. */
export const draftConflictDetails = z.strictObject({ current: conflictingDraft });
export type DraftConflictDetails = z.infer<typeof draftConflictDetails>;

/**
 * A sheet's results: each block's results (their shape is the engine's, core/sheet/types.ts
 * BlockResult), the refusals with their place, and the criteria's tally.
 */
export const sheetResults = z.strictObject({
  engineVersion: z.string(),
  significantFigures: z.number().int(),
  blocks: z.array(z.unknown()),
  errors: z.array(z.unknown()),
  summary: z.strictObject({
    passed: z.number().int(),
    failed: z.number().int(),
    errors: z.number().int(),
  }),
});

/** SHA-256 (hex) of a sheet's canonical text and of its results' canonical JSON. */
export const sheetDigests = z.strictObject({ canonicalText: z.string(), results: z.string() });

/**
 * POST /api/sheets/:sheetId/evaluate: the results and their digests, the engine's version, and
 * whether they were answered from the results store (an unchanged text) rather than computed now.
 */
export const evaluationResponse = z.strictObject({
  results: sheetResults,
  digests: sheetDigests,
  engineVersion: z.string(),
  fromStore: z.boolean(),
});
export type EvaluationResponse = z.infer<typeof evaluationResponse>;

/**
 * Where an evaluation has got to: the block being evaluated (0-based of `blockCount`) and, while
 * a modes block solves, the method's stage, its iteration and the modes converged of those wanted.
 */
export const sheetProgress = z.strictObject({
  blockIndex: z.number().int().nonnegative(),
  blockId: z.string(),
  blockCount: z.number().int().nonnegative(),
  kind: z.enum(BLOCK_KINDS),
  message: z.string(),
  stage: z.string().optional(),
  iteration: z.number().int().optional(),
  modesConverged: z.number().int().optional(),
  modesWanted: z.number().int().optional(),
});
export type SheetProgress = z.infer<typeof sheetProgress>;

/**
 * The data of a `progress` server-sent event (POST /api/sheets/:id/evaluate/stream and GET
 * /api/sheets/:id/evaluations/:jobId/events): the progress and the share of the sheet done, 0–1
 * (null for a sheet without blocks).
 */
export const progressEvent = sheetProgress.extend({
  fraction: z.number().min(0).max(1).nullable(),
});
export type ProgressEvent = z.infer<typeof progressEvent>;

/**
 * The data of an `error` server-sent event: the API's one error shape, sent once the stream has
 * started (before it, a refusal is an ordinary JSON answer with its status).
 */
export const errorEvent = z.strictObject({
  error: z.strictObject({
    code: z.string(),
    message: z.string(),
    field: z.string().optional(),
    details: z.record(z.string(), z.unknown()).optional(),
  }),
});
export type ErrorEvent = z.infer<typeof errorEvent>;

/** The text an evaluation job evaluated: the draft as sent (its settings may be left out). */
export const evaluatedText = z.strictObject({
  blocks: z.array(sheetBlock),
  settings: z
    .strictObject({
      significantFigures: z.number().int().optional(),
      units: z.string().optional(),
    })
    .optional(),
});

/**
 * An evaluation not bound to a request, as the server keeps it (a day at most): its state, the
 * text evaluated, its last progress, and once `done` the results with their digests; once
 * `failed` the refusal. An unchanged text answered from the results store is `done` at once with
 * `fromStore` true and no job behind it (`id` null).
 */
export const evaluationJob = z.strictObject({
  id: z.string().nullable(),
  state: z.enum(['waiting', 'running', 'done', 'failed']),
  draft: evaluatedText,
  progress: sheetProgress.nullable(),
  results: sheetResults.optional(),
  digests: sheetDigests.optional(),
  engineVersion: z.string().optional(),
  fromStore: z.boolean().optional(),
  error: z
    .strictObject({
      code: z.string(),
      message: z.string(),
      details: z.record(z.string(), z.unknown()).optional(),
    })
    .optional(),
});
export type EvaluationJob = z.infer<typeof evaluationJob>;

/**
 * POST /api/sheets/:sheetId/evaluations: 202 with the job just queued (`waiting`), or 200 with
 * the stored results of an unchanged text (a `done` job, `fromStore`).
 */
export const evaluationStarted = z.strictObject({
  job: z.union([z.strictObject({ id: z.string(), state: z.literal('waiting') }), evaluationJob]),
});
export type EvaluationStarted = z.infer<typeof evaluationStarted>;

/** GET /api/sheets/:sheetId/evaluations/latest: the person's latest evaluation, or null. */
export const latestEvaluationResponse = z.strictObject({ job: evaluationJob.nullable() });
export type LatestEvaluationResponse = z.infer<typeof latestEvaluationResponse>;

export const sheetTemplate = z.strictObject({
  key: z.string(),
  title: z.string(),
  description: z.string(),
});
export type SheetTemplate = z.infer<typeof sheetTemplate>;

/** GET /api/sheet-templates. */
export const sheetTemplatesResponse = z.strictObject({ templates: z.array(sheetTemplate) });
export type SheetTemplatesResponse = z.infer<typeof sheetTemplatesResponse>;

/** Where a firm template came from, as it was when saved. */
export const templateOrigin = z.strictObject({
  projectId: z.number().int().nullable(),
  jobNumber: z.string(),
  sheetId: z.number().int().nullable(),
  sheetNumber: z.string(),
  revisionId: z.number().int().nullable(),
  /** Null when saved from the draft. */
  revisionNumber: z.number().int().nullable(),
});
export type TemplateOrigin = z.infer<typeof templateOrigin>;

/** A template of the firm's library as lists show it. */
export const firmTemplateSummary = z.strictObject({
  id,
  name: z.string(),
  description: z.string(),
  origin: templateOrigin,
  createdBy: personRef,
  createdAt: isoTime,
  updatedAt: isoTime,
});
export type FirmTemplateSummary = z.infer<typeof firmTemplateSummary>;

/** GET /api/firm-templates. */
export const firmTemplatesResponse = z.strictObject({ templates: z.array(firmTemplateSummary) });
export type FirmTemplatesResponse = z.infer<typeof firmTemplatesResponse>;
