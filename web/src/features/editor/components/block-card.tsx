import { useMemo, type DragEvent } from 'react';
import type { BlockResult, SheetIssue } from '../api/results';
import type { Block } from '../api/types';
import { renderMarkdown } from '../../../components/results/markdown';
import { ResponseResults } from '../../../components/results/response-results';
import { blockAnchor } from '../lib/outline';
import type { ScopeName } from '../lib/scope';
import { BlockSource, type RemarkMark } from './block-source';
import { CalcResult } from './calc-result';
import { CriteriaResult } from './criteria-result';
import { MatrixResult } from './matrix-result';
import { ModesResult } from './modes-result';

export const KIND_LABELS: Record<Block['kind'], string> = {
  text: 'Text',
  calc: 'Calculation',
  matrix: 'Matrix',
  modes: 'Modes',
  response: 'Response',
  criteria: 'Criteria',
};

export type BlockCardProps = {
  block: Block;
  index: number;
  count: number;
  readOnly: boolean;
  result: BlockResult | undefined;
  issues: readonly SheetIssue[];
  remarks?: readonly RemarkMark[];
  stale: boolean;
  digits: number;
  names: (line: number) => ScopeName[];
  uploads: () => string[];
  onChange: (source: string) => void;
  onMove: (delta: -1 | 1) => void;
  onDuplicate: () => void;
  onDelete: () => void;
  onDragStart: (event: DragEvent) => void;
  onDragOver: (event: DragEvent) => void;
  onDrop: (event: DragEvent) => void;
  dropTarget: boolean;
  /** Names the CSV files of a modes block: "DYN-03_draft" gives DYN-03_draft_vert_modes.csv. */
  fileStem: string;
};

function Results({
  result,
  digits,
  fileStem,
}: {
  result: BlockResult;
  digits: number;
  fileStem: string;
}) {
  switch (result.kind) {
    case 'calc':
      return <CalcResult result={result} digits={digits} />;
    case 'matrix':
      return <MatrixResult result={result} digits={digits} />;
    case 'modes':
      return (
        <ModesResult
          result={result}
          digits={digits}
          fileStem={`${fileStem}_${result.name ?? 'modes'}`}
        />
      );
    case 'response':
      return <ResponseResults result={result} />;
    case 'criteria':
      return <CriteriaResult result={result} digits={digits} />;
    default:
      return null;
  }
}

// Markdown's own elements, styled here (the base styles reset them).
const MARKDOWN_CLASSES = [
  'markdown px-1 text-sm leading-relaxed text-ink',
  '[&_h1]:mt-1 [&_h1]:text-lg [&_h1]:font-semibold',
  '[&_h2]:mt-1 [&_h2]:text-base [&_h2]:font-semibold',
  '[&_h3]:mt-1 [&_h3]:text-sm [&_h3]:font-semibold',
  '[&_p]:my-1.5 [&_ul]:my-1.5 [&_ul]:list-disc [&_ul]:pl-5 [&_ol]:my-1.5 [&_ol]:list-decimal [&_ol]:pl-5',
  '[&_a]:text-accent-strong [&_a]:underline [&_code]:text-[12px] [&_code]:bg-paper-deep [&_code]:px-1',
  '[&_table]:my-2 [&_td]:border [&_td]:border-rule [&_td]:px-2 [&_th]:border [&_th]:border-rule [&_th]:px-2',
  '[&_blockquote]:border-l-4 [&_blockquote]:border-rule-strong [&_blockquote]:pl-3 [&_blockquote]:text-ink-soft',
].join(' ');

const iconButton =
  'rounded-sm px-1.5 py-0.5 text-xs text-ink-soft hover:bg-paper-deep hover:text-ink disabled:opacity-40 disabled:hover:bg-transparent';

/** A block's errors, or its notes, each with its line. */
function IssueList({
  issues,
  label,
  tone,
}: {
  issues: readonly SheetIssue[];
  label: string;
  tone: string;
}) {
  if (issues.length === 0) return null;
  return (
    <ul className={`flex flex-col gap-0.5 text-sm ${tone}`} aria-label={label}>
      {issues.map((issue, i) => (
        <li key={i}>
          {issue.line > 0 ? <span className="font-medium">Line {issue.line}: </span> : null}
          {issue.message}
        </li>
      ))}
    </ul>
  );
}

/** One block: its toolbar, its source in CodeMirror, its errors and its results underneath. */
export function BlockCard(props: BlockCardProps) {
  const { block, index, count, readOnly, result, issues, stale } = props;
  const label = `Block ${index + 1}, ${KIND_LABELS[block.kind].toLowerCase()}`;
  const errors = issues.filter((i) => i.severity !== 'note');
  const notes = issues.filter((i) => i.severity === 'note');
  const markdown = useMemo(
    () => (block.kind === 'text' ? renderMarkdown(block.source) : ''),
    [block.kind, block.source],
  );
  return (
    <section
      aria-label={label}
      id={blockAnchor(block.id)}
      data-block-id={block.id}
      data-kind={block.kind}
      onDragOver={props.onDragOver}
      onDrop={props.onDrop}
      className={`group scroll-mt-28 rounded-sm border bg-paper-sheet shadow-sheet ${
        props.dropTarget ? 'border-accent ring-2 ring-accent/30' : 'border-rule'
      }`}
    >
      <header className="flex items-center gap-2 border-b border-rule px-2 py-1">
        {!readOnly ? (
          <button
            type="button"
            draggable
            onDragStart={props.onDragStart}
            onKeyDown={(e) => {
              if (e.key === 'ArrowUp') {
                e.preventDefault();
                props.onMove(-1);
              } else if (e.key === 'ArrowDown') {
                e.preventDefault();
                props.onMove(1);
              }
            }}
            aria-label={`Move ${label.toLowerCase()} (drag, or arrow keys)`}
            title="Drag to move, or focus and press ↑ / ↓"
            className="cursor-grab px-1 text-ink-faint hover:text-ink"
          >
            ⠿
          </button>
        ) : null}
        <span className="text-xs font-semibold tracking-wide text-ink-soft uppercase">
          {KIND_LABELS[block.kind]}
        </span>
        <span className="num text-xs text-ink-faint">#{index + 1}</span>
        {errors.length > 0 ? (
          <span className="text-xs font-medium text-fail">
            {errors.length} error{errors.length === 1 ? '' : 's'}
          </span>
        ) : notes.length > 0 ? (
          <span className="text-xs font-medium text-ink-soft">not evaluated</span>
        ) : null}
        {!readOnly ? (
          <div className="ml-auto flex items-center gap-0.5 opacity-70 group-focus-within:opacity-100 group-hover:opacity-100">
            <button
              type="button"
              className={iconButton}
              disabled={index === 0}
              onClick={() => props.onMove(-1)}
              aria-label={`Move ${label.toLowerCase()} up`}
            >
              ↑
            </button>
            <button
              type="button"
              className={iconButton}
              disabled={index === count - 1}
              onClick={() => props.onMove(1)}
              aria-label={`Move ${label.toLowerCase()} down`}
            >
              ↓
            </button>
            <button
              type="button"
              className={iconButton}
              onClick={props.onDuplicate}
              aria-label={`Duplicate ${label.toLowerCase()}`}
            >
              Duplicate
            </button>
            <button
              type="button"
              className={`${iconButton} hover:text-fail`}
              onClick={props.onDelete}
              aria-label={`Delete ${label.toLowerCase()}`}
            >
              Delete
            </button>
          </div>
        ) : null}
      </header>
      <div className="flex flex-col gap-2 p-2">
        {!(readOnly && block.kind === 'text') ? (
          <BlockSource
            blockId={block.id}
            kind={block.kind}
            value={block.source}
            readOnly={readOnly}
            issues={issues}
            {...(props.remarks ? { remarks: props.remarks } : {})}
            onChange={props.onChange}
            names={props.names}
            uploads={props.uploads}
            onMove={props.onMove}
            label={`Source of ${label.toLowerCase()}`}
          />
        ) : null}
        <IssueList issues={errors} label={`Errors in ${label.toLowerCase()}`} tone="text-fail" />
        {/* Lines an error above left unevaluated: said once each, quietly, so the error stands out. */}
        <IssueList
          issues={notes}
          label={`Not evaluated in ${label.toLowerCase()}`}
          tone="text-ink-soft"
        />
        {block.kind === 'text' ? (
          <div className={MARKDOWN_CLASSES} dangerouslySetInnerHTML={{ __html: markdown }} />
        ) : result ? (
          <div
            className={`px-1 transition-opacity ${stale ? 'opacity-60' : ''}`}
            aria-live="polite"
          >
            <Results result={result} digits={props.digits} fileStem={props.fileStem} />
          </div>
        ) : null}
      </div>
    </section>
  );
}
