import type { Block } from '../api/types';
import { blockAnchor, OUTLINE_MIN_BLOCKS, sheetOutline } from '../lib/outline';

const KIND_WORDS: Record<Block['kind'], string> = {
  text: 'Text',
  calc: 'Calc',
  matrix: 'Matrix',
  modes: 'Modes',
  response: 'Response',
  criteria: 'Criteria',
};

/**
 * A compact list of a long sheet's blocks to jump to, with each block's errors counted; folded
 * away until asked for, so it costs one line of the screen.
 */
export function SheetOutline({
  blocks,
  errorsByBlock,
}: {
  blocks: readonly Block[];
  errorsByBlock: ReadonlyMap<string, number>;
}) {
  if (blocks.length < OUTLINE_MIN_BLOCKS) return null;
  const entries = sheetOutline(blocks);
  return (
    <nav aria-label="Outline of the sheet" className="text-sm">
      <details className="rounded-sm border border-rule bg-paper-sheet px-3 py-1.5">
        <summary className="cursor-pointer text-ink-soft">
          Outline <span className="text-ink-faint">· {entries.length} blocks</span>
        </summary>
        <ol className="mt-1 grid gap-x-6 gap-y-0.5 sm:grid-cols-2">
          {entries.map((entry) => {
            const errors = errorsByBlock.get(entry.id) ?? 0;
            return (
              <li key={entry.id} className="flex min-w-0 items-baseline gap-2">
                <span className="num w-6 shrink-0 text-right text-xs text-ink-faint">
                  {entry.index}
                </span>
                <a
                  href={`#${blockAnchor(entry.id)}`}
                  className="min-w-0 truncate text-accent-strong hover:underline"
                >
                  <span className="text-xs tracking-wide text-ink-soft uppercase">
                    {KIND_WORDS[entry.kind]}
                  </span>{' '}
                  {entry.title}
                </a>
                {errors > 0 ? (
                  <span className="shrink-0 text-xs font-medium text-fail">
                    {errors} error{errors === 1 ? '' : 's'}
                  </span>
                ) : null}
              </li>
            );
          })}
        </ol>
      </details>
    </nav>
  );
}
