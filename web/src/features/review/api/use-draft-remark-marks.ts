import { useMemo } from 'react';
import { REMARK_STATE_LABELS, REMARK_TYPE_LABELS } from './types';
import { useRemarks } from './get-remarks';
import { useSheetReview } from './get-sheet-review';

/** What the editor's gutter shows for one remark (the editor's RemarkMark). */
export type DraftRemarkMark = { line: number; message: string };

const ACTIVE = new Set(['returned', 'in_check']);

/**
 * For the author of a sheet whose latest revision is returned or in check: its remarks that are
 * not closed, by block id, as marks for the draft's gutter ("Error remark, open — Tomasz Reyes:
 * …"). Undefined otherwise; a stable map while the remarks do not change.
 */
export function useDraftRemarkMarks(
  sheetId: number,
): ReadonlyMap<string, readonly DraftRemarkMark[]> | undefined {
  const sheet = useSheetReview(sheetId, sheetId > 0);
  const latest = sheet.data?.latestRevision ?? null;
  const active = !!latest && ACTIVE.has(latest.status) && !!sheet.data?.myRoles.includes('author');
  // The query runs only for an active revision (a disabled query for id 0 otherwise).
  const remarks = useRemarks(active && latest ? latest.id : 0, active);
  return useMemo(() => {
    if (!active || !latest || !remarks.data) return undefined;
    const byBlock = new Map<string, DraftRemarkMark[]>();
    for (const r of remarks.data) {
      if (r.state === 'closed') continue;
      const marks = byBlock.get(r.blockId) ?? [];
      marks.push({
        line: r.line,
        message: `${REMARK_TYPE_LABELS[r.type]} remark on line ${r.line} of Rev ${latest.number}, ${REMARK_STATE_LABELS[r.state].toLowerCase()} — ${r.author.name}: ${r.text}`,
      });
      byBlock.set(r.blockId, marks);
    }
    return byBlock;
  }, [active, latest, remarks.data]);
}
