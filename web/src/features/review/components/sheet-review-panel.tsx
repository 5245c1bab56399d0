import { useState, type FormEvent } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { Alert, QueryError } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { EmptyState } from '../../../components/ui/empty-state';
import { Spinner } from '../../../components/ui/spinner';
import { TextField } from '../../../components/ui/text-field';
import { formatUtc } from '../../../lib/format';
import { splitFormError } from '../../../lib/form-errors';
import { useRevisions } from '../api/get-revisions';
import { useSheetActivity } from '../api/get-sheet-activity';
import { useSheetReview } from '../api/get-sheet-review';
import { useIssueRevision } from '../api/revision-mutations';
import { REVISION_STATUS_LABELS } from '../api/types';
import { DraftRemarks } from './draft-remarks';
import { statedPurpose } from './stated-purpose';

/** "For construction (set at sign-off; issued “For check”)", or the purpose as issued. */
function purposeLine(r: Parameters<typeof statedPurpose>[0]): string {
  const { text, note } = statedPurpose(r);
  return note ? `${text} (${note})` : text;
}

const ISSUABLE = new Set(['draft', 'returned', 'sealed']);

/**
 * The review strip of a sheet page: Issue for check (authors, when no revision is in check or
 * awaiting its seal) and the link to the latest revision.
 */
export function IssueForCheck({
  sheetId,
  revisionHref,
}: {
  sheetId: number;
  revisionHref: (revisionId: number) => string;
}) {
  const sheet = useSheetReview(sheetId);
  const issue = useIssueRevision(sheetId);
  const navigate = useNavigate();
  const [open, setOpen] = useState(false);
  const [purpose, setPurpose] = useState('For check');
  const { fieldErrors, formError } = splitFormError(issue.error, ['purpose']);

  if (sheet.isPending || sheet.isError) return null;
  const s = sheet.data;
  const canIssue = s.myRoles.includes('author') && ISSUABLE.has(s.status);

  function submit(event: FormEvent) {
    event.preventDefault();
    issue.mutate(purpose, { onSuccess: (rev) => navigate(revisionHref(rev.id)) });
  }

  return (
    <section
      aria-label="Review"
      className="flex flex-col gap-2 rounded-sm border border-rule bg-paper-sheet px-4 py-2"
    >
      <div className="flex flex-wrap items-center gap-3 text-sm">
        {s.latestRevision ? (
          <Link
            to={revisionHref(s.latestRevision.id)}
            className="font-medium text-accent-strong hover:underline"
          >
            Rev {s.latestRevision.number} (
            {REVISION_STATUS_LABELS[
              s.latestRevision.status as keyof typeof REVISION_STATUS_LABELS
            ] ?? s.latestRevision.status}
            )
          </Link>
        ) : (
          <span className="text-ink-soft">Never issued</span>
        )}
        {canIssue && !open ? <Button onClick={() => setOpen(true)}>Issue for check</Button> : null}
      </div>
      <DraftRemarks sheetId={sheetId} revisionHref={revisionHref} />
      {open ? (
        <form
          onSubmit={submit}
          aria-label="Issue for check"
          className="flex flex-col gap-2 border-t border-rule pt-2"
        >
          <p className="text-sm text-ink-soft">
            The server evaluates the saved draft and freezes it, with its results, as Rev{' '}
            {(s.latestRevision?.number ?? 0) + 1}. The checkers are told by mail.
          </p>
          <TextField
            label="Purpose"
            name="purpose"
            value={purpose}
            onChange={(e) => setPurpose(e.target.value)}
            error={fieldErrors.purpose}
            hint='What the revision is issued for, e.g. "For check" or "For construction".'
          />
          {formError ? <Alert title="Not issued.">{formError}</Alert> : null}
          <div className="flex gap-2">
            <Button type="submit" busy={issue.isPending}>
              Issue Rev {(s.latestRevision?.number ?? 0) + 1}
            </Button>
            <Button variant="secondary" onClick={() => setOpen(false)}>
              Cancel
            </Button>
          </div>
        </form>
      ) : null}
    </section>
  );
}

/** Every revision of the sheet, newest first, with who prepared, checked and sealed it. */
export function RevisionList({
  sheetId,
  revisionHref,
}: {
  sheetId: number;
  revisionHref: (revisionId: number) => string;
}) {
  const revisions = useRevisions(sheetId);
  if (revisions.isPending) return <Spinner label="Loading revisions…" />;
  if (revisions.isError) {
    return (
      <QueryError
        what="the revisions"
        error={revisions.error}
        onRetry={() => revisions.refetch()}
      />
    );
  }
  if (revisions.data.length === 0) return <EmptyState title="Not issued yet" />;
  const rows = [...revisions.data].sort((a, b) => b.number - a.number);
  return (
    <table className="w-full border-collapse text-sm" aria-label="Revisions of the sheet">
      <thead>
        <tr className="border-b border-rule text-left text-xs text-ink-soft">
          <th className="py-1 pr-3">Rev</th>
          <th className="py-1 pr-3">Status</th>
          <th className="py-1 pr-3">Purpose</th>
          <th className="py-1 pr-3">Prepared</th>
          <th className="py-1 pr-3">Checked</th>
          <th className="py-1 pr-3">Sealed</th>
        </tr>
      </thead>
      <tbody>
        {rows.map((r) => (
          <tr key={r.id} className="border-b border-rule/60">
            <td className="py-1 pr-3 whitespace-nowrap">
              <Link to={revisionHref(r.id)} className="text-accent-strong hover:underline">
                Rev {r.number}
              </Link>
            </td>
            <td className="py-1 pr-3 whitespace-nowrap">{REVISION_STATUS_LABELS[r.status]}</td>
            <td className="py-1 pr-3">{purposeLine(r)}</td>
            <td className="py-1 pr-3">
              {r.issuedBy.name}, {formatUtc(r.issuedAt)}
            </td>
            <td className="py-1 pr-3">
              {r.checkedBy && r.checkedAt ? `${r.checkedBy.name}, ${formatUtc(r.checkedAt)}` : '—'}
            </td>
            <td className="py-1 pr-3">
              {r.sealedBy && r.sealedAt ? `${r.sealedBy.name}, ${formatUtc(r.sealedAt)}` : '—'}
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

const ACTION_WORDS: Record<string, string> = {
  'sheet.created': 'created the sheet',
  'sheet.updated': 'changed the sheet',
  'sheet.renamed': 'renamed the sheet',
  'sheet.draft_saved': 'saved the draft',
  'sheet.deleted': 'deleted the sheet',
  'upload.added': 'uploaded a matrix file',
  'revision.issued': 'issued a revision for check',
  'revision.returned': 'returned the revision',
  'revision.signed_off': 'signed off the revision',
  'revision.sealed': 'sealed the revision',
  'revision.superseded': 'superseded the revision',
  'remark.added': 'added a remark',
  'remark.carried': 'carried a remark to the new revision',
  'remark.replied': 'replied to a remark',
  'remark.reply_edited': 'edited a reply',
  'remark.reply_withdrawn': 'withdrew a reply',
  'remark.closed': 'closed a remark',
  'remark.reopened': 'reopened a remark',
  'seal.refused': 'was refused a seal',
};

/** The sheet's history: every action on it, newest first. */
export function SheetHistory({ sheetId }: { sheetId: number }) {
  const activity = useSheetActivity(sheetId);
  if (activity.isPending) return <Spinner label="Loading the history…" />;
  if (activity.isError) {
    return (
      <QueryError what="the history" error={activity.error} onRetry={() => activity.refetch()} />
    );
  }
  if (activity.data.length === 0) return <EmptyState title="Nothing has happened here yet" />;
  return (
    <ol aria-label="History of the sheet" className="flex flex-col">
      {activity.data.slice(0, 50).map((entry) => {
        const rev = entry.details?.revisionNumber;
        const reason = entry.details?.reason;
        return (
          <li
            key={entry.id}
            className="grid gap-x-4 border-b border-rule py-1.5 text-sm last:border-b-0 sm:grid-cols-[11rem_1fr]"
          >
            <time dateTime={entry.at} className="font-mono text-xs leading-5 text-ink-faint">
              {formatUtc(entry.at)}
            </time>
            <span>
              <span className="font-medium">{entry.actor?.name ?? 'The system'}</span>{' '}
              {ACTION_WORDS[entry.action] ?? entry.action.replace(/[._]/g, ' ')}
              {typeof rev === 'number' ? ` (Rev ${rev})` : ''}
              {typeof reason === 'string' ? ` — ${reason}` : ''}
            </span>
          </li>
        );
      })}
    </ol>
  );
}
