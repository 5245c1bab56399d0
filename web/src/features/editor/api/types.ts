// The editor's view of the sheets API: the sheet is the contract's (core/contract/sheets.ts), its
// draft typed with the display units the editor offers. Times are ISO-8601 UTC strings.
import type {
  ConflictingDraft as ContractConflictingDraft,
  SheetDetail as ContractSheetDetail,
} from '../../../../../core/contract/sheets';
import type { UnitSystem } from '../../../../../core/display-units';

import { BLOCK_KINDS, type BlockKind, type SheetStatus } from '../../../../../core/vocabulary';

export { BLOCK_KINDS, type BlockKind, type SheetStatus };

export type Block = { id: string; kind: BlockKind; source: string };
export type DraftSettings = { significantFigures: number; units?: UnitSystem };
export type Draft = { blocks: Block[]; settings: DraftSettings };

/** A sheet as GET /api/sheets/:id sends it (the contract's shape), its draft read as the editor's. */
export type SheetDetail = Omit<ContractSheetDetail, 'draft'> & { draft: Draft };

/** What the server holds when a save is refused as stale (the contract's), its draft the editor's. */
export type ConflictingDraft = Omit<ContractConflictingDraft, 'blocks' | 'settings'> & Draft;
