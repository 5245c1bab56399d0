export type SheetStatus = 'draft' | 'in_check' | 'returned' | 'checked' | 'sealed';

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
