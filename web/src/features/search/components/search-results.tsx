import { Link } from 'react-router-dom';
import { QueryError } from '../../../components/ui/alert';
import { EmptyState } from '../../../components/ui/empty-state';
import { Spinner } from '../../../components/ui/spinner';
import { paths } from '../../../config/paths';
import { useSearch, type RemarkResult, type SearchAnswer, type SheetResult } from '../api/search';

const FIELD_WORDS = { number: 'sheet number', title: 'title', subject: 'subject' } as const;

/** The results of one search: sheets first, then remarks and replies, each linking to its place. */
export function SearchResults({ q }: { q: string }) {
  const found = useSearch(q);
  if (!q.trim()) {
    return (
      <EmptyState title="Type what to look for">
        Search finds sheet numbers, titles, subjects, the text and calc lines of drafts (of issued
        revisions, for a viewer), and remark threads in the projects you can open. A result opens on
        its line.
      </EmptyState>
    );
  }
  if (found.isPending) return <Spinner label="Searching…" />;
  if (found.isError) {
    return <QueryError what="the search" error={found.error} onRetry={() => found.refetch()} />;
  }
  const answer = found.data;
  return (
    <div className="flex flex-col gap-4">
      <Skipped answer={answer} />
      {answer.results.length === 0 ? (
        <EmptyState title={`Nothing found for “${answer.query}”`}>
          Only the projects you are a member of are searched; every word must appear.
        </EmptyState>
      ) : (
        <>
          <p className="text-sm text-ink-soft">
            {answer.results.length} result{answer.results.length === 1 ? '' : 's'}
            {answer.truncated ? ' (the best ones; add a word to narrow the search)' : ''}
          </p>
          <ol aria-label="Search results" className="flex flex-col divide-y divide-rule">
            {answer.results.map((r) =>
              r.kind === 'sheet' ? (
                <SheetItem key={`s${r.sheet.id}`} result={r} />
              ) : (
                <RemarkItem key={`${r.kind}${r.remarkId}-${r.text.length}`} result={r} />
              ),
            )}
          </ol>
        </>
      )}
    </div>
  );
}

function Skipped({ answer }: { answer: SearchAnswer }) {
  if (answer.skipped.length === 0) return null;
  const short = answer.skipped.filter((s) => s.reason === 'short').map((s) => s.word);
  const common = answer.skipped.filter((s) => s.reason === 'common').map((s) => s.word);
  return (
    <p className="text-sm text-ink-soft">
      Not searched:{' '}
      {short.length > 0 ? `${short.join(', ')} (words need at least 3 characters)` : ''}
      {short.length > 0 && common.length > 0 ? '; ' : ''}
      {common.length > 0 ? `${common.join(', ')} (too common to be indexed)` : ''}.
    </p>
  );
}

function Where({ project, sheet }: { project: SheetResult['project']; sheet: { number: string } }) {
  return (
    <span className="text-xs text-ink-soft">
      <span className="font-mono">{project.jobNumber}</span> {project.name} ·{' '}
      <span className="font-mono">{sheet.number}</span>
    </span>
  );
}

/** Where a sheet result goes: the line in the draft, or in the revision a viewer reads. */
function sheetResultHref({ project, sheet, place }: SheetResult): string {
  if (!place) return paths.sheet.href(project.id, sheet.id);
  return place.revision
    ? paths.revision.href(place.revision.id, place)
    : paths.sheet.href(project.id, sheet.id, place);
}

function SheetItem({ result }: { result: SheetResult }) {
  const { place } = result;
  return (
    <li className="flex flex-col gap-1 py-3">
      <Where project={result.project} sheet={result.sheet} />
      <Link to={sheetResultHref(result)} className="font-medium text-accent-strong hover:underline">
        {result.sheet.number} — {result.sheet.title}
      </Link>
      {result.fields.length > 0 ? (
        <span className="text-sm text-ink-soft">
          In the {result.fields.map((f) => FIELD_WORDS[f]).join(', ')}
          {result.fields.includes('subject') && result.sheet.subject
            ? `: ${result.sheet.subject}`
            : ''}
        </span>
      ) : null}
      {place ? (
        <span className="text-sm">
          <span className="text-ink-soft">
            {`${place.revision ? `Rev ${place.revision.number}` : 'Draft'}, block ${place.blockIndex} (${place.blockKind}), line ${place.line}:`}
          </span>{' '}
          <code className="font-mono text-xs break-all">{place.text}</code>
        </span>
      ) : null}
    </li>
  );
}

function RemarkItem({ result }: { result: RemarkResult }) {
  return (
    <li className="flex flex-col gap-1 py-3">
      <Where project={result.project} sheet={result.sheet} />
      <Link
        to={paths.revision.href(result.revision.id, {
          blockId: result.blockId,
          line: result.line,
          remarkId: result.remarkId,
        })}
        className="font-medium text-accent-strong hover:underline"
      >
        {result.sheet.number} Rev {result.revision.number} —{' '}
        {result.kind === 'remark' ? 'remark' : 'reply to a remark'} on block {result.blockId}, line{' '}
        {result.line}
      </Link>
      <span className="text-sm">{result.text}</span>
    </li>
  );
}
