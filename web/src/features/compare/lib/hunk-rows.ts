import type { LineHunk } from '../../../../../core/index';

/** One row of a block's source diff as the reader sees it. */
export type HunkRow =
  | {
      kind: 'changed';
      oldLine: number;
      newLine: number;
      /** The text both sides share before and after the edit, and the edit itself. */
      prefix: string;
      removed: string;
      added: string;
      suffix: string;
    }
  | { kind: 'removed'; oldLine: number; text: string }
  | { kind: 'added'; newLine: number; text: string };

/** Splits two versions of a line into the common start, the two differing middles and the end. */
export function lineEdit(
  before: string,
  after: string,
): { prefix: string; removed: string; added: string; suffix: string } {
  let start = 0;
  while (start < before.length && start < after.length && before[start] === after[start]) start++;
  let end = 0;
  while (
    end < before.length - start &&
    end < after.length - start &&
    before[before.length - 1 - end] === after[after.length - 1 - end]
  ) {
    end++;
  }
  return {
    prefix: before.slice(0, start),
    removed: before.slice(start, before.length - end),
    added: after.slice(start, after.length - end),
    suffix: before.slice(before.length - end),
  };
}

/**
 * The rows of one hunk: a line replaced by one line is one changed line (its edit marked), not a
 * removal and an addition; lines beyond the pairs are removed or added.
 */
export function hunkRows(hunk: LineHunk): HunkRow[] {
  const rows: HunkRow[] = [];
  const pairs = Math.min(hunk.removed.length, hunk.added.length);
  for (let i = 0; i < pairs; i++) {
    rows.push({
      kind: 'changed',
      oldLine: hunk.oldStart + i,
      newLine: hunk.newStart + i,
      ...lineEdit(hunk.removed[i]!, hunk.added[i]!),
    });
  }
  hunk.removed
    .slice(pairs)
    .forEach((text, i) => rows.push({ kind: 'removed', oldLine: hunk.oldStart + pairs + i, text }));
  hunk.added
    .slice(pairs)
    .forEach((text, i) => rows.push({ kind: 'added', newLine: hunk.newStart + pairs + i, text }));
  return rows;
}

/**
 * How many remark threads a list holds: a remark carried to the next revision is the same thread
 * as the one it was carried from, so it is counted once.
 */
export function remarkThreads(
  remarks: readonly { id: number; carriedFrom?: { remarkId: number } | null }[],
): number {
  const ids = new Set(remarks.map((r) => r.id));
  return remarks.filter((r) => !(r.carriedFrom && ids.has(r.carriedFrom.remarkId))).length;
}
