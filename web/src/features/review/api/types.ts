// The shapes the review routes send (api/modules/revisions, remarks, seals).
import type { SheetResults } from '../../../components/results';

export type PersonRef = { id: number; name: string };
import type { RevisionStatus } from '../../../../../core/vocabulary';

export type { RevisionStatus };

export type RevisionSummary = {
  id: number;
  sheetId: number;
  number: number;
  status: RevisionStatus;
  purpose: string;
  issuedBy: PersonRef;
  issuedAt: string;
  returnedBy: PersonRef | null;
  returnedAt: string | null;
  checkedBy: PersonRef | null;
  checkedAt: string | null;
  sealedBy: PersonRef | null;
  sealedAt: string | null;
  supersededAt: string | null;
  sealCode: string | null;
  /** The checker's covering note on the return or the sign-off. */
  checkNote: string | null;
  /** What the checker signed the revision off for; null: as issued. */
  checkedPurpose: string | null;
  /** What the principal sealed it for, when stated at the seal; null: as signed off. */
  sealedPurpose: string | null;
};

export type SealView = {
  code: string;
  digest: string;
  signature: string;
  publicKey: string;
  principal: { id: number; name: string; licenceNumber: string; jurisdiction: string };
  sealedAt: string;
  engineVersion: string;
};

export type RevisionBlock = {
  id: string;
  kind: 'text' | 'calc' | 'matrix' | 'modes' | 'response' | 'criteria';
  source: string;
};

export type RevisionDetail = RevisionSummary & {
  blocks: RevisionBlock[];
  /** The sheet's settings when issued: significant figures and the units results are shown in. */
  settings?: { significantFigures?: number; units?: string };
  canonicalText: string;
  results: SheetResults;
  digests: { canonicalText: string; results: string };
  engineVersion: string;
  seal: SealView | null;
  sheet: { id: number; number: string; title: string; projectId: number };
  myRoles: string[];
};

export type RemarkType = 'error' | 'query' | 'editorial';
export type RemarkState = 'open' | 'answered' | 'closed';

export type Remark = {
  id: number;
  revisionId: number;
  blockId: string;
  line: number;
  type: RemarkType;
  text: string;
  state: RemarkState;
  carriedFrom: { remarkId: number; revisionNumber: number; line: number } | null;
  lineChanged: boolean;
  author: PersonRef;
  createdAt: string;
  closedBy: PersonRef | null;
  closedAt: string | null;
  replies: RemarkReply[];
  /** For a carried remark, the thread on the earlier revisions, oldest first. */
  earlier: {
    remarkId: number;
    revisionNumber: number;
    line: number;
    author: PersonRef;
    createdAt: string;
    replies: RemarkReply[];
  }[];
};

export type RemarkReply = {
  id: number;
  text: string;
  author: PersonRef;
  createdAt: string;
  /** When its writer last edited it; null when never. */
  editedAt: string | null;
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
