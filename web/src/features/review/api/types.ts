// The shapes the review routes send (api/modules/revisions, remarks, seals): the contract's.
import type { SheetResults } from '../../../components/results';
import type { PersonRef } from '../../../../../core/contract/common';
import type { Remark, RemarkReply } from '../../../../../core/contract/remarks';
import type {
  RevisionBlock,
  RevisionDetailResponse,
  RevisionSummary,
  SealView,
} from '../../../../../core/contract/revisions';
import type { RemarkState, RemarkType, RevisionStatus } from '../../../../../core/vocabulary';

export type {
  PersonRef,
  Remark,
  RemarkReply,
  RemarkState,
  RemarkType,
  RevisionBlock,
  RevisionStatus,
  RevisionSummary,
  SealView,
};

/**
 * A revision as GET /api/revisions/:id sends it, with its seal; its stored results read as the
 * engine's SheetResults, its settings as the sheet's (significant figures, the units shown).
 */
export type RevisionDetail = Omit<RevisionDetailResponse['revision'], 'results' | 'settings'> & {
  results: SheetResults;
  settings?: { significantFigures?: number; units?: string };
};

export const REVISION_STATUS_LABELS: Record<RevisionStatus, string> = {
  in_check: 'In check',
  returned: 'Returned',
  checked: 'Checked',
  sealed: 'Sealed',
  superseded: 'Superseded',
};

export const REMARK_TYPE_LABELS: Record<RemarkType, string> = {
  error: 'Error',
  query: 'Query',
  editorial: 'Editorial',
};

export const REMARK_STATE_LABELS: Record<RemarkState, string> = {
  open: 'Open',
  answered: 'Answered',
  closed: 'Closed',
};
