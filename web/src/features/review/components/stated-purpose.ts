import type { RevisionSummary } from '../api/types';

/**
 * What a revision is for now, and where that was said: the principal's purpose at the seal, else
 * the checker's at sign-off, else the purpose it was issued for (then no note).
 */
export function statedPurpose(
  r: Pick<RevisionSummary, 'purpose' | 'checkedPurpose' | 'sealedPurpose'>,
): { text: string; note: string | null } {
  if (r.sealedPurpose) {
    const checked = r.checkedPurpose ? `checked for “${r.checkedPurpose}”; ` : '';
    return { text: r.sealedPurpose, note: `set at seal; ${checked}issued “${r.purpose}”` };
  }
  if (r.checkedPurpose) {
    return { text: r.checkedPurpose, note: `set at sign-off; issued “${r.purpose}”` };
  }
  return { text: r.purpose, note: null };
}
