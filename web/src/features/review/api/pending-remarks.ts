import { useMemo } from 'react';
import { REMARK_STATE_LABELS, REMARK_TYPE_LABELS, type Remark } from './types';
import { useRemarks } from './get-remarks';
import { useSheetReview } from './get-sheet-review';

const ACTIVE = new Set(['returned', 'in_check']);

/**
 * What the author of a sheet has to act on: when its latest revision is returned or in check, that
 * revision and its remarks that are not closed. `revision` is null for anyone else, or when no
 * revision is returned or in check; `remarks` is undefined until they are loaded.
 */
export function usePendingRemarks(sheetId: number) {
  const sheet = useSheetReview(sheetId, sheetId > 0);
  const latest = sheet.data?.latestRevision ?? null;
  const active = !!latest && ACTIVE.has(latest.status) && !!sheet.data?.myRoles.includes('author');
  // The query runs only for an active revision (a disabled query for id 0 otherwise).
  const query = useRemarks(active && latest ? latest.id : 0, active);
  const remarks = useMemo(
    () => query.data?.filter((r: Remark) => r.state !== 'closed'),
    [query.data],
  );
  return { revision: active ? latest : null, remarks, query };
}

/** What the editor's gutter shows for one remark (the editor's RemarkMark). */
export type DraftRemarkMark = { line: number; message: string };

/**
 * The pending remarks as marks for the draft's gutter, by block id ("Error remark on line 3 of
 * Rev 1, open — Tomasz Reyes: …"); undefined when there is nothing to act on. A stable map while
 * the remarks do not change.
 */
export function useDraftRemarkMarks(
  sheetId: number,
): ReadonlyMap<string, readonly DraftRemarkMark[]> | undefined {
  const { revision, remarks } = usePendingRemarks(sheetId);
  const number = revision?.number ?? null;
  return useMemo(() => {
    if (number === null || !remarks) return undefined;
    const byBlock = new Map<string, DraftRemarkMark[]>();
    for (const r of remarks) {
      const marks = byBlock.get(r.blockId) ?? [];
      marks.push({
        line: r.line,
        message: `${REMARK_TYPE_LABELS[r.type]} remark on line ${r.line} of Rev ${number}, ${REMARK_STATE_LABELS[r.state].toLowerCase()} — ${r.author.name}: ${r.text}`,
      });
      byBlock.set(r.blockId, marks);
    }
    return byBlock;
  }, [number, remarks]);
}
