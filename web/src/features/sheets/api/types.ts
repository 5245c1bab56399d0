import type {
  FirmTemplateSummary as FirmTemplate,
  SheetSummary,
  SheetTemplate,
} from '../../../../../core/contract/sheets';
import type { SheetStatus } from '../../../../../core/vocabulary';

// The shapes the sheets routes send are the contract's; the labels and helpers below are the
// client's.
export type { FirmTemplate, SheetStatus, SheetSummary, SheetTemplate };

export const STATUS_LABELS: Record<SheetStatus, string> = {
  draft: 'Draft',
  in_check: 'In check',
  returned: 'Returned',
  checked: 'Checked',
  sealed: 'Sealed',
};

/** "BW-2611 · DYN-02 Rev 1", or "… draft" when saved from the draft. */
export function originText(origin: FirmTemplate['origin']): string {
  const what = origin.revisionNumber === null ? 'draft' : `Rev ${origin.revisionNumber}`;
  return `${origin.jobNumber} · ${origin.sheetNumber} ${what}`;
}
