import { Link } from 'react-router-dom';
import { QueryError } from '../../../components/ui/alert';
import { goToEditorLine } from '../../../lib/editor-line';
import { useRevision } from '../api/get-revision';
import { usePendingRemarks } from '../api/pending-remarks';
import { REMARK_STATE_LABELS, REMARK_TYPE_LABELS, type Remark } from '../api/types';

/**
 * The remarks of the latest revision that are not closed, above the draft: what the author has
 * to act on after a return (or can answer while the revision is in check), each with a way to the
 * line in the draft and to the thread on the revision.
 */
export function DraftRemarks({
  sheetId,
  revisionHref,
}: {
  sheetId: number;
  revisionHref: (revisionId: number) => string;
}) {
  const { revision, remarks: pending, query } = usePendingRemarks(sheetId);
  const detail = useRevision(revision?.id ?? 0, revision !== null);
  // "Block 2 (calc)", as the revision page names the block the remark is on.
  const blockLabel = (blockId: string) => {
    const blocks = detail.data?.blocks ?? [];
    const i = blocks.findIndex((b) => b.id === blockId);
    return i < 0 ? `Block ${blockId}` : `Block ${i + 1} (${blocks[i]!.kind})`;
  };
  if (!revision) return null;
  if (query.isError) {
    return (
      <QueryError
        what={`the remarks on Rev ${revision.number}`}
        error={query.error}
        onRetry={() => query.refetch()}
      />
    );
  }
  if (!pending || pending.length === 0) return null;
  const returned = revision.status === 'returned';
  return (
    <div
      role="region"
      aria-label="Remarks to act on"
      className="flex flex-col gap-2 border-t border-rule pt-2 text-sm"
    >
      <p className="text-ink-soft">
        {returned
          ? `Rev ${revision.number} was returned with ${pending.length} remark${pending.length === 1 ? '' : 's'} not closed. Change the draft, answer on `
          : `${pending.length} remark${pending.length === 1 ? '' : 's'} on Rev ${revision.number} not closed yet; answer on `}
        <Link to={revisionHref(revision.id)} className="text-accent-strong hover:underline">
          Rev {revision.number}
        </Link>
        {returned
          ? ', then issue the next revision: open remarks carry over to it.'
          : '; changes here go into the next revision.'}
      </p>
      <ul className="flex flex-col gap-1">
        {pending.map((r) => (
          <PendingRemark key={r.id} remark={r} where={blockLabel(r.blockId)} />
        ))}
      </ul>
    </div>
  );
}

function PendingRemark({ remark, where }: { remark: Remark; where: string }) {
  // A carried remark's thread goes on from the earlier revision's answers.
  const last = remark.replies.at(-1) ?? remark.earlier.flatMap((e) => e.replies).at(-1);
  return (
    <li className="flex flex-wrap items-baseline gap-x-3 gap-y-1 rounded-sm bg-paper-deep px-2 py-1">
      <span className="rounded-sm border border-rule-strong px-1.5 text-xs font-medium">
        {REMARK_TYPE_LABELS[remark.type]}
      </span>
      <span className="text-xs font-semibold text-ink-soft">
        {REMARK_STATE_LABELS[remark.state]}
      </span>
      <button
        type="button"
        onClick={() => void goToEditorLine(remark.blockId, remark.line)}
        className="text-xs text-accent-strong underline underline-offset-2"
        aria-label={`Go to ${where}, line ${remark.line} in the draft`}
      >
        {where}, line {remark.line}
      </button>
      <span className="min-w-0 grow basis-64">
        {remark.text} <span className="text-xs text-ink-faint">— {remark.author.name}</span>
        {last ? (
          <span className="block text-xs text-ink-soft">
            Last reply, {last.author.name}: {last.text}
          </span>
        ) : null}
      </span>
    </li>
  );
}
