// Revisions, their review and their seal (/api/sheets/:id/revisions, /api/revisions/:id…).
import { z } from 'zod';
import { REVISION_STATUSES } from '../vocabulary';
import { id, isoTime, personRef, projectRole } from './common';
import { sheetBlock } from './sheets';

export const revisionSummary = z.strictObject({
  id,
  sheetId: id,
  number: z.number().int().positive(),
  status: z.enum(REVISION_STATUSES),
  purpose: z.string(),
  issuedBy: personRef,
  issuedAt: isoTime,
  returnedBy: personRef.nullable(),
  returnedAt: isoTime.nullable(),
  checkedBy: personRef.nullable(),
  checkedAt: isoTime.nullable(),
  sealedBy: personRef.nullable(),
  sealedAt: isoTime.nullable(),
  supersededAt: isoTime.nullable(),
  sealCode: z.string().nullable(),
  /** The checker's covering note on the return or the sign-off, if one was written. */
  checkNote: z.string().nullable(),
  /** What the checker signed the revision off for ("For construction"); null: as issued. */
  checkedPurpose: z.string().nullable(),
  /** What the principal sealed it for, when stated at the seal; null: as signed off. */
  sealedPurpose: z.string().nullable(),
});
export type RevisionSummary = z.infer<typeof revisionSummary>;

/** A revision's frozen block: as the draft held it when issued. */
export const revisionBlock = sheetBlock;
export type RevisionBlock = z.infer<typeof revisionBlock>;

/** The seal as a revision shows it. */
export const sealView = z.strictObject({
  code: z.string(),
  digest: z.string(),
  signature: z.string(),
  publicKey: z.string(),
  principal: z.strictObject({
    id,
    name: z.string(),
    licenceNumber: z.string(),
    jurisdiction: z.string(),
  }),
  sealedAt: isoTime,
  engineVersion: z.string(),
});
export type SealView = z.infer<typeof sealView>;

/** A revision with everything frozen when it was issued, as GET /api/revisions/:id sends it. */
export const revisionDetail = revisionSummary.extend({
  blocks: z.array(revisionBlock),
  /** The sheet's settings when issued: significant figures and the units results are shown in. */
  settings: z.record(z.string(), z.unknown()),
  canonicalText: z.string(),
  /** The stored results (their shape is the engine's; the client reads them as SheetResults). */
  results: z.unknown(),
  digests: z.strictObject({ canonicalText: z.string(), results: z.string() }),
  engineVersion: z.string(),
  sheet: z.strictObject({ id, number: z.string(), title: z.string(), projectId: id }),
  myRoles: z.array(projectRole),
});
export type RevisionDetail = z.infer<typeof revisionDetail>;

/** GET /api/sheets/:sheetId/revisions. */
export const revisionsResponse = z.strictObject({ revisions: z.array(revisionSummary) });
export type RevisionsResponse = z.infer<typeof revisionsResponse>;

/** Issue, return and sign-off: the revision's summary. */
export const revisionResponse = z.strictObject({ revision: revisionSummary });
export type RevisionResponse = z.infer<typeof revisionResponse>;

/** GET /api/revisions/:revisionId: the revision and its seal, if sealed. */
export const revisionDetailResponse = z.strictObject({
  revision: revisionDetail.extend({ seal: sealView.nullable() }),
});
export type RevisionDetailResponse = z.infer<typeof revisionDetailResponse>;

/** POST /api/revisions/:revisionId/seal. */
export const sealResponse = z.strictObject({ revision: revisionSummary, seal: sealView });
export type SealResponse = z.infer<typeof sealResponse>;
