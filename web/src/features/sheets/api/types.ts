import type { SheetStatus } from '../../../../../core/vocabulary';

export type { SheetStatus };

export type SheetSummary = {
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
};

export type SheetTemplate = { key: string; title: string; description: string };

export const STATUS_LABELS: Record<SheetStatus, string> = {
  draft: 'Draft',
  in_check: 'In check',
  returned: 'Returned',
  checked: 'Checked',
  sealed: 'Sealed',
};

/** A template of the firm's library (GET /api/firm-templates), with where it came from. */
export type FirmTemplate = {
  id: number;
  name: string;
  description: string;
  origin: {
    projectId: number | null;
    jobNumber: string;
    sheetId: number | null;
    sheetNumber: string;
    revisionId: number | null;
    /** Null when saved from the draft. */
    revisionNumber: number | null;
  };
  createdBy: { id: number; name: string };
  createdAt: string;
  updatedAt: string;
};

/** "BW-2611 · DYN-02 Rev 1", or "… draft" when saved from the draft. */
export function originText(origin: FirmTemplate['origin']): string {
  const what = origin.revisionNumber === null ? 'draft' : `Rev ${origin.revisionNumber}`;
  return `${origin.jobNumber} · ${origin.sheetNumber} ${what}`;
}
