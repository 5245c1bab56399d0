// Sheets, their drafts and the templates a sheet starts from (/api/projects/:id/sheets,
// /api/sheets/:id, /api/sheet-templates, /api/firm-templates).
import { z } from 'zod';
import { BLOCK_KINDS, SHEET_STATUSES } from '../vocabulary';
import { id, isoTime, personRef } from './common';

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
  myRoles: z.array(z.string()),
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

/**
 * POST /api/sheets/:sheetId/evaluate: the results and their digests, the engine's version, and
 * whether they were answered from the results store (an unchanged text) rather than computed now.
 */
export const evaluationResponse = z.strictObject({
  results: sheetResults,
  digests: z.strictObject({ canonicalText: z.string(), results: z.string() }),
  engineVersion: z.string(),
  fromStore: z.boolean(),
});
export type EvaluationResponse = z.infer<typeof evaluationResponse>;

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
