// The shapes the sheets API sends (the sheets contract). Times are ISO-8601 UTC strings.
import type { UnitSystem } from '../../../../../core/display-units';

import { BLOCK_KINDS, type BlockKind, type SheetStatus } from '../../../../../core/vocabulary';

export { BLOCK_KINDS, type BlockKind, type SheetStatus };

export type Block = { id: string; kind: BlockKind; source: string };
export type DraftSettings = { significantFigures: number; units?: UnitSystem };
export type Draft = { blocks: Block[]; settings: DraftSettings };

export type SheetDetail = {
  id: number;
  projectId: number;
  number: string;
  title: string;
  subject: string | null;
  status: SheetStatus;
  latestRevision: { id: number; number: number; status: string } | null;
  draftVersion: number;
  updatedAt: string;
  updatedBy: { id: number; name: string } | null;
  draft: Draft;
  projectJobNumber: string;
  projectName: string;
  myRoles: string[];
  /** True for a viewer: the unissued draft is withheld; the issued revisions are below it. */
  draftHidden?: boolean;
};

export type Upload = {
  id: number;
  name: string;
  format: 'matrix-market' | 'csv';
  size: number;
  sha256: string;
  rows: number;
  cols: number;
  nonzeros: number;
  symmetric: boolean;
  worstAsymmetry?: unknown;
  createdAt: string;
};

/** What the server holds when a save is refused as stale (409 DRAFT_CONFLICT). */
export type ConflictingDraft = Draft & {
  draftVersion: number;
  updatedAt: string;
  updatedBy: { id: number; name: string } | null;
};
