import { useId } from 'react';
import { Link } from 'react-router-dom';
import { QueryError } from '../../../components/ui/alert';
import { EmptyState } from '../../../components/ui/empty-state';
import { Spinner } from '../../../components/ui/spinner';
import { isGeneratedBlockId } from '../../../lib/block-ids';
import {
  useComparison,
  useRevisionChoices,
  type BlockChange,
  type CompareSide,
  type Comparison,
  type ResultChange,
  type RevisionChoice,
} from '../api/get-compare';
import { UNIT_SYSTEM_LABELS, type UnitSystem } from '../../../../../core/display-units';
import { hunkRows, remarkThreads } from '../lib/hunk-rows';
import { changeValues } from '../lib/shown-values';
import { useDocumentTitle } from '../../../lib/use-document-title';

const count = (n: number, word: string) => `${n} ${word}${n === 1 ? '' : 's'}`;

const sideLabel = (side: CompareSide) =>
  side.kind === 'draft' ? `the draft (version ${side.draftVersion})` : `Rev ${side.number}`;

/**
 * A block as the reader knows it: its place and kind ("Block 2 (calc)", the place in the newer
 * side), with its id when the author named it.
 */
function blockName(comparison: Comparison, blockId: string): string {
  const b = comparison.blocks.find((x) => x.blockId === blockId);
  if (!b) return `Block ${blockId}`;
  const index = b.newIndex ?? b.oldIndex;
  const place = index === null ? 'Block' : `Block ${index + 1}`;
  return `${place} (${b.kind})${isGeneratedBlockId(blockId) ? '' : ` · ${blockId}`}`;
}

const STATUS_WORDS: Record<BlockChange['status'], string> = {
  added: 'added',
  removed: 'removed',
  changed: 'changed',
  moved: 'moved',
  unchanged: 'unchanged',
};

/**
 * Two revisions, or a revision and the draft, side by side: source changes per block as line
 * hunks, the results that changed, the criteria that flipped, and the remarks where their lines
 * are now. `from`/`to` are null until chosen; the defaults are the last two revisions.
 */
export function CompareView({
  sheetId,
  from,
  to,
  onChange,
  revisionHref,
}: {
  sheetId: number;
  from: number | null;
  to: number | 'draft' | null;
  onChange: (from: number, to: number | 'draft') => void;
  revisionHref: (revisionId: number) => string;
}) {
  const choices = useRevisionChoices(sheetId);
  useDocumentTitle('Compare revisions');
  const list = choices.data ?? [];
  const last = list.at(-1);
  const fromId = from ?? (list.length >= 2 ? (list.at(-2)?.id ?? null) : (last?.id ?? null));
  const toId = to ?? (list.length >= 2 ? (last?.id ?? null) : 'draft');
  const comparison = useComparison(sheetId, fromId, fromId === null ? null : toId);

  if (choices.isPending) return <Spinner label="Loading the revisions…" />;
  if (choices.isError) {
    return (
      <QueryError what="the revisions" error={choices.error} onRetry={() => choices.refetch()} />
    );
  }
  if (list.length === 0) {
    return <EmptyState title="Nothing to compare">The sheet has not been issued yet.</EmptyState>;
  }

  return (
    <div className="flex flex-col gap-4">
      <Pickers list={list} from={fromId} to={toId} onChange={onChange} />
      {comparison.isPending ? <Spinner label="Comparing…" /> : null}
      {comparison.isError ? (
        <QueryError
          what="the comparison"
          error={comparison.error}
          onRetry={() => comparison.refetch()}
        />
      ) : null}
      {comparison.data ? <Result comparison={comparison.data} revisionHref={revisionHref} /> : null}
    </div>
  );
}

function Pickers({
  list,
  from,
  to,
  onChange,
}: {
  list: RevisionChoice[];
  from: number | null;
  to: number | 'draft' | null;
  onChange: (from: number, to: number | 'draft') => void;
}) {
  const id = useId();
  const select = 'rounded-sm border border-rule-strong bg-paper-sheet px-2 py-1.5 text-sm';
  return (
    <div className="flex flex-wrap items-end gap-4">
      <div className="flex flex-col gap-1">
        <label htmlFor={`${id}-from`} className="text-sm font-medium">
          From
        </label>
        <select
          id={`${id}-from`}
          className={select}
          value={from ?? ''}
          onChange={(e) => onChange(Number(e.target.value), to ?? 'draft')}
        >
          {list.map((r) => (
            <option key={r.id} value={r.id}>
              Rev {r.number}
            </option>
          ))}
        </select>
      </div>
      <div className="flex flex-col gap-1">
        <label htmlFor={`${id}-to`} className="text-sm font-medium">
          To
        </label>
        <select
          id={`${id}-to`}
          className={select}
          value={to ?? 'draft'}
          onChange={(e) =>
            onChange(
              from ?? list[0]?.id ?? 0,
              e.target.value === 'draft' ? 'draft' : Number(e.target.value),
            )
          }
        >
          {list.map((r) => (
            <option key={r.id} value={r.id}>
              Rev {r.number}
            </option>
          ))}
          <option value="draft">The draft</option>
        </select>
      </div>
    </div>
  );
}

function Result({
  comparison,
  revisionHref,
}: {
  comparison: Comparison;
  revisionHref: (revisionId: number) => string;
}) {
  const { from, to, summary } = comparison;
  const changedBlocks = comparison.blocks.filter((b) => b.status !== 'unchanged');
  // A re-run of the same model differs in the last binary digits; those are not changes to check.
  // So does a mass ratio of a mode that does not move in the direction (zero but for rounding).
  const isRounding = (r: ResultChange) =>
    (r.relativeChange !== null && Math.abs(r.relativeChange) < ROUNDING) ||
    (r.key.endsWith(' ratio') && tiny(r.old) && tiny(r.new));
  const real = comparison.results.filter((r) => !isRounding(r));
  const rounding = comparison.results.filter(isRounding);
  return (
    <>
      <p className="text-sm" role="status">
        From {sideLabel(from)} to {sideLabel(to)}: {count(summary.changed, 'block')} changed,{' '}
        {summary.added} added, {summary.removed} removed, {summary.moved} moved;{' '}
        {count(summary.resultsChanged, 'result')} changed;{' '}
        {summary.flipped === 1 ? '1 criterion' : `${summary.flipped} criteria`} flipped.
      </p>
      {comparison.flipped.length > 0 ? (
        <section aria-label="Criteria that flipped" className="flex flex-col gap-1">
          <h2 className="text-base font-semibold">Criteria that flipped</h2>
          <ul className="text-sm">
            {comparison.flipped.map((f) => (
              <li key={`${f.blockId}-${f.line}`} className={f.now ? 'text-pass' : 'text-fail'}>
                {f.label} (line {f.line}): {f.was ? 'passed' : 'failed'} →{' '}
                {f.now ? 'passes' : 'fails'}
              </li>
            ))}
          </ul>
        </section>
      ) : null}
      <section aria-label="Result changes" className="flex flex-col gap-1">
        <h2 className="text-base font-semibold">Results that changed</h2>
        <UnitsNote comparison={comparison} />
        {comparison.results.length === 0 ? (
          <p className="text-sm text-ink-soft">No result changed.</p>
        ) : (
          <>
            {real.length > 0 ? <ResultTable rows={real} comparison={comparison} /> : null}
            {rounding.length > 0 ? (
              <details className="text-sm text-ink-soft">
                <summary className="cursor-pointer">
                  {count(rounding.length, 'result')} differ only by rounding (less than 1 part in
                  10⁹)
                </summary>
                <ResultTable rows={rounding} comparison={comparison} />
              </details>
            ) : null}
          </>
        )}
      </section>
      <section aria-label="Source changes" className="flex flex-col gap-2">
        <h2 className="text-base font-semibold">Source changes</h2>
        {changedBlocks.length === 0 ? (
          <p className="text-sm text-ink-soft">No block changed.</p>
        ) : null}
        {changedBlocks.map((b) => (
          <BlockDiff key={b.blockId} change={b} comparison={comparison} />
        ))}
      </section>
      <section aria-label="Remarks in context" className="flex flex-col gap-1">
        <h2 className="text-base font-semibold">Remarks</h2>
        {comparison.remarks.length === 0 ? (
          <p className="text-sm text-ink-soft">No remarks on either side.</p>
        ) : (
          <ul className="flex flex-col gap-1 text-sm">
            {comparison.remarks.map((r) => (
              <li key={r.id} className="border-b border-rule/60 py-1">
                <Link
                  to={revisionHref(r.revisionId)}
                  className="text-accent-strong hover:underline"
                >
                  Rev {r.revisionNumber}
                </Link>
                , {blockName(comparison, r.blockId)}, line {r.line} ({r.type}, {r.state}): {r.text}
                <span className="ml-2 text-xs text-ink-soft">
                  {r.mapped.status === 'gone'
                    ? '— that line is gone on the other side'
                    : r.mapped.status === 'changed'
                      ? `— now line ${r.mapped.line}, which changed`
                      : r.mapped.line !== r.line
                        ? `— now line ${r.mapped.line}`
                        : ''}
                </span>
              </li>
            ))}
          </ul>
        )}
      </section>
    </>
  );
}

function BlockDiff({ change, comparison }: { change: BlockChange; comparison: Comparison }) {
  const remarksHere = comparison.remarks.filter((r) => r.blockId === change.blockId);
  return (
    <article
      aria-label={blockName(comparison, change.blockId)}
      className="rounded-sm border border-rule bg-paper-sheet"
    >
      <header className="border-b border-rule px-3 py-1 text-xs text-ink-soft">
        {blockName(comparison, change.blockId)} — {STATUS_WORDS[change.status]}
        {change.moved && change.status !== 'moved' ? ', moved' : ''}
        {change.oldIndex !== null && change.newIndex !== null && change.oldIndex !== change.newIndex
          ? ` (position ${change.oldIndex + 1} → ${change.newIndex + 1})`
          : ''}
      </header>
      {change.hunks.map((h) => (
        <div key={`${h.oldStart}-${h.newStart}`} className="font-mono text-xs">
          <p className="bg-paper-deep px-3 py-0.5 text-ink-faint">
            {h.oldCount === h.newCount
              ? `@ line ${h.oldStart}${h.oldStart === h.newStart ? '' : ` → line ${h.newStart}`}: ${count(h.newCount, 'line')} changed`
              : `@ line ${h.oldStart} (−${h.oldCount}) → line ${h.newStart} (+${h.newCount})`}
          </p>
          {hunkRows(h).map((row) =>
            row.kind === 'changed' ? (
              <p
                key={`c${row.oldLine}`}
                className="bg-paper-deep/60 px-3 whitespace-pre-wrap"
                aria-label={`Line ${row.newLine} changed`}
              >
                <span className="text-ink-faint">~ </span>
                {row.prefix}
                {row.removed ? <del className="bg-fail-soft text-fail">{row.removed}</del> : null}
                {row.added ? (
                  <ins className="bg-pass-soft text-pass no-underline">{row.added}</ins>
                ) : null}
                {row.suffix}
              </p>
            ) : row.kind === 'removed' ? (
              <p
                key={`r${row.oldLine}`}
                className="bg-fail-soft px-3 whitespace-pre-wrap text-fail"
              >
                − {row.text}
              </p>
            ) : (
              <p
                key={`a${row.newLine}`}
                className="bg-pass-soft px-3 whitespace-pre-wrap text-pass"
              >
                + {row.text}
              </p>
            ),
          )}
        </div>
      ))}
      {remarksHere.length > 0 ? (
        <p className="px-3 py-1 text-xs text-ink-soft">
          {count(remarkThreads(remarksHere), 'remark')} on this block (listed below).
        </p>
      ) : null}
    </article>
  );
}

const ROUNDING = 1e-9;

const tiny = (value: string | null) => value !== null && Math.abs(Number(value)) < ROUNDING;

/** The unit system results are shown in: the newer side's. */
const shownSystem = (comparison: Comparison): UnitSystem => comparison.units.to;

/** Says which units the results are in when the two sides were shown in different ones. */
function UnitsNote({ comparison }: { comparison: Comparison }) {
  const units = comparison.units;
  if (units.from === units.to) return null;
  return (
    <p className="text-xs text-ink-soft" data-testid="compare-units-note">
      Results are shown in {UNIT_SYSTEM_LABELS[units.to]}, the units of {sideLabel(comparison.to)};{' '}
      {sideLabel(comparison.from)} shows {UNIT_SYSTEM_LABELS[units.from]}.
    </p>
  );
}

function ResultTable({ rows, comparison }: { rows: ResultChange[]; comparison: Comparison }) {
  const system = shownSystem(comparison);
  return (
    <div
      className="max-w-full overflow-x-auto"
      role="region"
      aria-label="Results that changed (scrolls sideways)"
      tabIndex={0}
    >
      <table className="w-full border-collapse text-sm">
        <thead>
          <tr className="border-b border-rule text-left text-xs text-ink-soft">
            <th className="py-1 pr-3">Block</th>
            <th className="py-1 pr-3">Result</th>
            <th className="py-1 pr-3">Was</th>
            <th className="py-1 pr-3">Now</th>
            <th className="py-1 pr-3">Change</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => {
            const shown = changeValues(r, system);
            return (
              <tr key={`${r.blockId}-${r.key}`} className="border-b border-rule/60">
                <td className="py-1 pr-3 text-xs whitespace-nowrap">
                  {blockName(comparison, r.blockId)}
                </td>
                <td className="py-1 pr-3">{r.key}</td>
                <td className="py-1 pr-3 font-mono text-xs" title={r.old ?? undefined}>
                  {shown.old}
                </td>
                <td className="py-1 pr-3 font-mono text-xs" title={r.new ?? undefined}>
                  {shown.new}
                </td>
                <td className="py-1 pr-3 font-mono text-xs">
                  {r.relativeChange === null
                    ? '—'
                    : `${r.relativeChange >= 0 ? '+' : '−'}${Math.abs(r.relativeChange * 100).toPrecision(3)} %`}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
