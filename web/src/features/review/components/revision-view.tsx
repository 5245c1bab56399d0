import { useId, useMemo, useState, type ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { BlockResultView, UnitSystemProvider } from '../../../components/results';
import { unitSystemOf } from '../../../../../core/display-units';
import { Alert, QueryError } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { PurposeField } from '../../../components/ui/purpose-field';
import { EmptyState } from '../../../components/ui/empty-state';
import { Spinner } from '../../../components/ui/spinner';
import { DIGEST_WORDS } from '../../../config/digests';
import { formatUtc } from '../../../lib/format';
import type { User } from '../../../../../core/contract/people';
import { useRemarks } from '../api/get-remarks';
import { useRevision } from '../api/get-revision';
import { useRevisions } from '../api/get-revisions';
import { useReturnRevision, useSignOffRevision, type CheckInput } from '../api/revision-mutations';
import {
  REMARK_STATE_LABELS,
  REMARK_TYPE_LABELS,
  REVISION_STATUS_LABELS,
  type Remark,
  type RemarkState,
  type RemarkType,
  type RevisionDetail,
} from '../api/types';
import { RemarkCard } from './remark-card';
import { RemarkForm } from './remark-form';
import { SpreadsheetButton } from './spreadsheet-button';
import { useDocumentTitle } from '../../../lib/use-document-title';
import { revisionBlockId, revisionLineId } from '../../../lib/use-go-to-place';
import { statedPurpose } from './stated-purpose';

const countRemarks = (n: number) => `${n} remark${n === 1 ? '' : 's'}`;

export type RevisionLinks = {
  sheet: (projectId: number, sheetId: number) => string;
  print: (revisionId: number) => string;
  compare: (sheetId: number, from: number, to: number | 'draft') => string;
  verify: (code: string) => string;
};

const blockLabel = (index: number, kind: string) => `Block ${index + 1} (${kind})`;

/**
 * A revision, read-only: its blocks with line numbers and frozen results, remarks in the gutter
 * and in a side list. A checker clicks a line number to remark on it; the author answers; the
 * checker closes, returns or signs off. `sealAction` is the principal's seal control (its own
 * feature), composed by the route.
 */
export function RevisionView({
  revisionId,
  user,
  links,
  sealAction,
}: {
  revisionId: number;
  user: User;
  links: RevisionLinks;
  sealAction?: (revision: RevisionDetail) => ReactNode;
}) {
  const revision = useRevision(revisionId);
  useDocumentTitle(
    revision.data
      ? `${revision.data.sheet.number} Rev ${revision.data.number}`
      : `Revision ${revisionId}`,
  );
  const remarks = useRemarks(revisionId);

  if (revision.isPending) return <Spinner label="Loading the revision…" />;
  if (revision.isError) {
    return (
      <QueryError what="the revision" error={revision.error} onRetry={() => revision.refetch()} />
    );
  }
  const rev = revision.data;
  const roles = rev.myRoles;
  const isChecker = roles.includes('checker') && rev.issuedBy.id !== user.id;
  const inCheck = rev.status === 'in_check';

  return (
    <div className="flex flex-col gap-4">
      <nav aria-label="Breadcrumb" className="flex flex-wrap gap-x-4 gap-y-1 text-sm">
        <Link
          to={links.sheet(rev.sheet.projectId, rev.sheet.id)}
          className="text-accent-strong hover:underline"
        >
          ← Sheet {rev.sheet.number}
        </Link>
        <Link to={links.print(rev.id)} className="text-accent-strong hover:underline">
          Print
        </Link>
        <SpreadsheetButton revisionId={rev.id} fileStem={`${rev.sheet.number}_Rev${rev.number}`} />
        {rev.number > 1 ? (
          <CompareLink rev={rev} links={links} />
        ) : roles.length > 0 && roles.every((r) => r === 'viewer') ? null : (
          <Link
            to={links.compare(rev.sheetId, rev.id, 'draft')}
            className="text-accent-strong hover:underline"
          >
            Compare with the draft
          </Link>
        )}
      </nav>
      <RevisionHeader rev={rev} links={links} />
      <ReviewActions
        rev={rev}
        isChecker={isChecker}
        remarks={remarks.data ?? []}
        sealAction={sealAction}
      />
      {remarks.isError ? (
        <QueryError what="the remarks" error={remarks.error} onRetry={() => remarks.refetch()} />
      ) : null}
      <div className="grid grid-cols-1 gap-4 lg:grid-cols-[minmax(0,1fr)_22rem]">
        <Blocks rev={rev} remarks={remarks.data ?? []} canRemark={isChecker && inCheck} />
        <RemarkList
          rev={rev}
          remarks={remarks.data ?? []}
          loading={remarks.isPending}
          canReply={
            (inCheck || rev.status === 'returned') &&
            (roles.includes('author') || roles.includes('checker'))
          }
          canClose={isChecker && inCheck}
          me={user.id}
        />
      </div>
    </div>
  );
}

function CompareLink({ rev, links }: { rev: RevisionDetail; links: RevisionLinks }) {
  const revisions = useRevisions(rev.sheetId);
  const previous = revisions.data?.find((r) => r.number === rev.number - 1);
  if (!previous) return null;
  return (
    <Link
      to={links.compare(rev.sheetId, previous.id, rev.id)}
      className="text-accent-strong hover:underline"
    >
      Compare with Rev {previous.number}
    </Link>
  );
}

function RevisionHeader({ rev, links }: { rev: RevisionDetail; links: RevisionLinks }) {
  const purpose = statedPurpose(rev);
  return (
    <header className="rounded-sm border border-rule bg-paper-sheet px-5 py-4 shadow-sheet">
      <p className="text-xs tracking-wide text-ink-soft uppercase">
        Sheet {rev.sheet.number} — revision, read-only
      </p>
      <h1 className="text-xl font-semibold text-ink">
        {rev.sheet.title}: Rev {rev.number}
      </h1>
      <dl className="mt-2 grid grid-cols-1 gap-x-6 gap-y-1 text-sm sm:grid-cols-2">
        <div className="flex gap-2">
          <dt className="text-ink-soft">Status</dt>
          <dd className="font-medium" data-testid="revision-status">
            {REVISION_STATUS_LABELS[rev.status]}
          </dd>
        </div>
        <div className="flex gap-2">
          <dt className="text-ink-soft">Purpose</dt>
          <dd data-testid="revision-purpose">
            {purpose.text}
            {purpose.note ? (
              <>
                {' '}
                <span className="text-ink-soft">({purpose.note})</span>
              </>
            ) : null}
          </dd>
        </div>
        <div className="flex gap-2">
          <dt className="text-ink-soft">Prepared</dt>
          <dd>
            {rev.issuedBy.name}, {formatUtc(rev.issuedAt)}
          </dd>
        </div>
        {rev.returnedBy && rev.returnedAt ? (
          <div className="flex gap-2">
            <dt className="text-ink-soft">Returned</dt>
            <dd>
              {rev.returnedBy.name}, {formatUtc(rev.returnedAt)}
            </dd>
          </div>
        ) : null}
        {rev.checkedBy && rev.checkedAt ? (
          <div className="flex gap-2">
            <dt className="text-ink-soft">Checked</dt>
            <dd>
              {rev.checkedBy.name}, {formatUtc(rev.checkedAt)}
            </dd>
          </div>
        ) : null}
        {rev.seal ? (
          <div className="flex gap-2">
            <dt className="text-ink-soft">Sealed</dt>
            <dd>
              {rev.seal.principal.name} ({rev.seal.principal.licenceNumber}),{' '}
              {formatUtc(rev.seal.sealedAt)}, code{' '}
              <span className="font-mono" data-testid="seal-code">
                {rev.seal.code}
              </span>{' '}
              (
              <Link to={links.verify(rev.seal.code)} className="text-accent-strong hover:underline">
                verify
              </Link>
              )
            </dd>
          </div>
        ) : null}
        {rev.checkNote ? (
          <div className="flex min-w-0 gap-2 sm:col-span-2">
            <dt className="shrink-0 text-ink-soft">Checker’s note</dt>
            <dd className="min-w-0 whitespace-pre-wrap" data-testid="check-note">
              {rev.checkNote}
            </dd>
          </div>
        ) : null}
        <FailedCriteria rev={rev} />
      </dl>
      <Digests rev={rev} />
    </header>
  );
}

/** The labels of the revision's failed criteria, in sheet order. */
function failedCriteria(rev: RevisionDetail): string[] {
  return rev.results.blocks.flatMap((b) =>
    b.kind === 'criteria' ? b.criteria.filter((c) => !c.pass).map((c) => c.label) : [],
  );
}

const countFailed = (n: number) => `${n} failed criteri${n === 1 ? 'on' : 'a'}`;

/** Named, not refused: a failing check can be the finding the sheet records. */
function FailedCriteria({ rev }: { rev: RevisionDetail }) {
  const failed = failedCriteria(rev);
  if (failed.length === 0) return null;
  return (
    <div className="flex min-w-0 gap-2 sm:col-span-2">
      <dt className="shrink-0 text-ink-soft">Criteria</dt>
      <dd className="min-w-0 font-medium text-fail" data-testid="failed-criteria">
        {countFailed(failed.length)}: {failed.join('; ')}
      </dd>
    </div>
  );
}

/** Each digest with what it covers (config/digests.ts), the seal's the one print and verify show. */
function Digests({ rev }: { rev: RevisionDetail }) {
  const rows = [
    { ...DIGEST_WORDS.text, value: rev.digests.canonicalText },
    { ...DIGEST_WORDS.results, value: rev.digests.results },
    ...(rev.seal ? [{ ...DIGEST_WORDS.seal, value: rev.seal.digest }] : []),
  ];
  return (
    <details className="mt-2 text-sm">
      <summary className="cursor-pointer text-ink-soft">
        Digests{rev.seal ? ' (the seal digest is the one print and verify show)' : ''}
      </summary>
      <dl className="mt-1 flex flex-col gap-1" aria-label="Digests">
        {rows.map((d) => (
          <div key={d.label} className="min-w-0">
            <dt className="font-medium">
              {d.label} <span className="font-normal text-ink-soft">— {d.covers}</span>
            </dt>
            <dd className="font-mono text-xs break-all">{d.value}</dd>
          </div>
        ))}
      </dl>
    </details>
  );
}

type Confirming = 'return' | 'sign-off' | null;

function ReviewActions({
  rev,
  isChecker,
  remarks,
  sealAction,
}: {
  rev: RevisionDetail;
  isChecker: boolean;
  remarks: Remark[];
  sealAction: ((revision: RevisionDetail) => ReactNode) | undefined;
}) {
  const returnMutation = useReturnRevision(rev.id);
  const signOff = useSignOffRevision(rev.id);
  const [confirming, setConfirming] = useState<Confirming>(null);
  const unclosed = remarks.filter((r) => r.state !== 'closed').length;
  const failed = failedCriteria(rev);
  const error = returnMutation.error ?? signOff.error;
  const seal = sealAction && rev.status === 'checked' ? sealAction(rev) : null;
  if (!(isChecker && rev.status === 'in_check') && !seal) return null;

  return (
    <section
      aria-label="Review actions"
      className="flex flex-col gap-2 rounded-sm border border-rule bg-paper-sheet px-5 py-3"
    >
      {failed.length > 0 ? (
        <p className="text-sm font-medium text-fail" data-testid="actions-failed-criteria">
          This revision records {countFailed(failed.length)}: {failed.join('; ')}.{' '}
          <span className="font-normal text-ink-soft">
            {rev.status === 'checked' ? 'Sealing' : 'Signing off'} does not refuse it; be sure it is
            the finding the sheet means to record.
          </span>
        </p>
      ) : null}
      {isChecker && rev.status === 'in_check' ? (
        <>
          <p id={`sign-off-help-${rev.id}`} className="text-sm text-ink-soft">
            {unclosed === 0
              ? 'Every remark is closed: the revision can be signed off.'
              : `${countRemarks(unclosed)} not closed: sign off needs every remark closed; return the revision for the author to act on them.`}
          </p>
          {confirming === null ? (
            <div className="flex flex-wrap gap-2">
              <Button
                variant="secondary"
                onClick={() => {
                  signOff.reset();
                  setConfirming('return');
                }}
              >
                Return to author…
              </Button>
              <Button
                disabled={unclosed > 0}
                aria-describedby={`sign-off-help-${rev.id}`}
                onClick={() => {
                  returnMutation.reset();
                  setConfirming('sign-off');
                }}
              >
                Sign off…
              </Button>
            </div>
          ) : (
            <ConfirmCheck
              rev={rev}
              action={confirming}
              unclosed={unclosed}
              busy={returnMutation.isPending || signOff.isPending}
              onCancel={() => setConfirming(null)}
              onConfirm={(input) =>
                (confirming === 'return' ? returnMutation : signOff).mutate(input, {
                  onSuccess: () => setConfirming(null),
                })
              }
            />
          )}
        </>
      ) : null}
      {error ? <Alert title="Refused.">{error.message}</Alert> : null}
      {seal}
    </section>
  );
}

/** The deliberate second step of a return or a sign-off, with the checker's covering note. */
function ConfirmCheck({
  rev,
  action,
  unclosed,
  busy,
  onCancel,
  onConfirm,
}: {
  rev: RevisionDetail;
  action: 'return' | 'sign-off';
  unclosed: number;
  busy: boolean;
  onCancel: () => void;
  onConfirm: (input: CheckInput) => void;
}) {
  const id = useId();
  const [note, setNote] = useState('');
  const [purpose, setPurpose] = useState('');
  const returning = action === 'return';
  const title = returning ? `Return Rev ${rev.number} to the author` : `Sign off Rev ${rev.number}`;
  return (
    <form
      aria-label={title}
      className="flex flex-col gap-2 rounded-sm border border-rule-strong p-3"
      onSubmit={(e) => {
        e.preventDefault();
        onConfirm(returning ? { note } : { note, purpose });
      }}
    >
      <p className="text-sm font-semibold">{title}?</p>
      <p className="text-sm text-ink-soft">
        {returning
          ? `${rev.issuedBy.name} is told by e-mail, with ${countRemarks(unclosed)} not closed and your note; the revision then takes no more remarks.`
          : `The principal is told it awaits the seal. A signed-off revision cannot be returned.`}
      </p>
      {returning ? null : (
        <PurposeField
          label="Checked for"
          current={rev.purpose}
          value={purpose}
          onChange={setPurpose}
        />
      )}
      <div className="flex flex-col gap-1">
        <label htmlFor={`${id}-note`} className="text-xs font-medium">
          {returning ? 'Note to the author (optional)' : 'Note (optional)'}
        </label>
        <textarea
          id={`${id}-note`}
          value={note}
          onChange={(e) => setNote(e.target.value)}
          rows={3}
          maxLength={2000}
          className="rounded-sm border border-rule-strong bg-paper-sheet px-2 py-1 text-sm"
        />
      </div>
      <div className="flex flex-wrap gap-2">
        <Button type="submit" busy={busy}>
          {returning ? `Return Rev ${rev.number}` : `Sign off Rev ${rev.number}`}
        </Button>
        <Button type="button" variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

function Blocks({
  rev,
  remarks,
  canRemark,
}: {
  rev: RevisionDetail;
  remarks: Remark[];
  canRemark: boolean;
}) {
  const [open, setOpen] = useState<{ blockId: string; line: number } | null>(null);
  const byLine = useMemo(() => {
    const m = new Map<string, Remark[]>();
    for (const r of remarks) {
      const key = `${r.blockId}:${r.line}`;
      m.set(key, [...(m.get(key) ?? []), r]);
    }
    return m;
  }, [remarks]);

  if (rev.blocks.length === 0) return <EmptyState title="This revision has no blocks" />;
  return (
    <div className="flex min-w-0 flex-col gap-3" aria-label="Blocks of the revision">
      {canRemark ? (
        <p className="text-sm text-ink-soft">Click a line number to add a remark on that line.</p>
      ) : null}
      {rev.blocks.map((block, index) => {
        const label = blockLabel(index, block.kind);
        const lines = block.source.split('\n');
        const result = rev.results.blocks.find((b) => b.blockId === block.id);
        const whole = byLine.get(`${block.id}:0`) ?? [];
        return (
          <section
            key={block.id}
            id={revisionBlockId(block.id)}
            aria-label={label}
            className="rounded-sm border border-rule bg-paper-sheet shadow-sheet"
          >
            <header className="flex items-center justify-between border-b border-rule px-3 py-1.5 text-xs text-ink-soft">
              <span>{label}</span>
              {canRemark ? (
                <button
                  type="button"
                  className="text-accent-strong underline underline-offset-2"
                  onClick={() => setOpen({ blockId: block.id, line: 0 })}
                >
                  Remark on the block
                </button>
              ) : null}
              {whole.length > 0 ? <span>{countRemarks(whole.length)} on the block</span> : null}
            </header>
            {open && open.blockId === block.id && open.line === 0 ? (
              <div className="px-3">
                <RemarkForm
                  revisionId={rev.id}
                  blockId={block.id}
                  blockLabel={label}
                  line={0}
                  onDone={() => setOpen(null)}
                />
              </div>
            ) : null}
            <ol className="font-mono text-sm" aria-label={`Source of ${label}`}>
              {lines.map((text, i) => {
                const line = i + 1;
                const here = byLine.get(`${block.id}:${line}`) ?? [];
                const unclosed = here.filter((r) => r.state !== 'closed').length;
                return (
                  <li key={line} id={revisionLineId(block.id, line)} data-line={line}>
                    <div
                      className={`flex ${here.length > 0 ? (unclosed > 0 ? 'bg-fail-soft/50' : 'bg-pass-soft/40') : ''}`}
                    >
                      <span className="flex w-16 shrink-0 items-start justify-end gap-1 border-r border-rule pr-2 text-xs leading-6 text-ink-faint select-none">
                        {here.length > 0 ? (
                          <span
                            title={`${countRemarks(here.length)}, ${unclosed} not closed`}
                            aria-label={`${countRemarks(here.length)} on line ${line}`}
                            className={`inline-block rounded-full px-1 text-[10px] font-bold text-paper-sheet ${unclosed > 0 ? 'bg-fail' : 'bg-pass'}`}
                          >
                            {here.length}
                          </span>
                        ) : null}
                        {canRemark ? (
                          <button
                            type="button"
                            aria-label={`Remark on line ${line} of ${label}`}
                            className="hover:text-accent-strong hover:underline"
                            onClick={() => setOpen({ blockId: block.id, line })}
                          >
                            {line}
                          </button>
                        ) : (
                          <span>{line}</span>
                        )}
                      </span>
                      <span className="min-w-0 flex-1 px-3 leading-6 whitespace-pre-wrap [overflow-wrap:anywhere]">
                        {text || ' '}
                      </span>
                    </div>
                    {open && open.blockId === block.id && open.line === line ? (
                      <div className="px-3">
                        <RemarkForm
                          revisionId={rev.id}
                          blockId={block.id}
                          blockLabel={label}
                          line={line}
                          onDone={() => setOpen(null)}
                        />
                      </div>
                    ) : null}
                  </li>
                );
              })}
            </ol>
            {result && result.kind !== 'text' ? (
              <div className="relative min-w-0 overflow-x-auto border-t border-rule px-3 py-2">
                <UnitSystemProvider system={unitSystemOf(rev.settings)}>
                  <BlockResultView
                    result={result}
                    fileStem={`${rev.sheet.number}_Rev${rev.number}`}
                    digits={rev.results.significantFigures}
                  />
                </UnitSystemProvider>
              </div>
            ) : null}
          </section>
        );
      })}
    </div>
  );
}

function RemarkList({
  rev,
  remarks,
  loading,
  canReply,
  canClose,
  me,
}: {
  rev: RevisionDetail;
  remarks: Remark[];
  loading: boolean;
  canReply: boolean;
  canClose: boolean;
  me: number;
}) {
  const id = useId();
  const [state, setState] = useState<RemarkState | ''>('');
  const [type, setType] = useState<RemarkType | ''>('');
  const shown = remarks.filter((r) => (!state || r.state === state) && (!type || r.type === type));
  const indexOf = (blockId: string) => rev.blocks.findIndex((b) => b.id === blockId);

  return (
    <aside aria-label="Remarks" className="flex flex-col gap-3">
      <h2 className="text-base font-semibold text-ink">Remarks ({remarks.length})</h2>
      <div className="flex gap-3">
        <div className="flex flex-col gap-1">
          <label htmlFor={`${id}-state`} className="text-xs font-medium">
            State
          </label>
          <select
            id={`${id}-state`}
            value={state}
            onChange={(e) => setState(e.target.value as RemarkState | '')}
            className="rounded-sm border border-rule-strong bg-paper-sheet px-2 py-1 text-sm"
          >
            <option value="">Any</option>
            {(Object.keys(REMARK_STATE_LABELS) as RemarkState[]).map((s) => (
              <option key={s} value={s}>
                {REMARK_STATE_LABELS[s]}
              </option>
            ))}
          </select>
        </div>
        <div className="flex flex-col gap-1">
          <label htmlFor={`${id}-type`} className="text-xs font-medium">
            Type
          </label>
          <select
            id={`${id}-type`}
            value={type}
            onChange={(e) => setType(e.target.value as RemarkType | '')}
            className="rounded-sm border border-rule-strong bg-paper-sheet px-2 py-1 text-sm"
          >
            <option value="">Any</option>
            {(Object.keys(REMARK_TYPE_LABELS) as RemarkType[]).map((t) => (
              <option key={t} value={t}>
                {REMARK_TYPE_LABELS[t]}
              </option>
            ))}
          </select>
        </div>
      </div>
      {loading ? <Spinner label="Loading remarks…" /> : null}
      {!loading && shown.length === 0 ? (
        <EmptyState title={remarks.length === 0 ? 'No remarks on this revision' : 'None match'} />
      ) : null}
      {shown.map((r) => {
        const index = indexOf(r.blockId);
        const label = index >= 0 ? blockLabel(index, rev.blocks[index]?.kind ?? '') : r.blockId;
        const where = r.line === 0 ? `${label}, whole block` : `${label}, line ${r.line}`;
        return (
          <RemarkCard
            key={r.id}
            remark={r}
            where={where}
            canReply={canReply}
            canClose={canClose}
            me={me}
            onShow={() =>
              document
                .getElementById(
                  r.line === 0 ? revisionBlockId(r.blockId) : revisionLineId(r.blockId, r.line),
                )
                ?.scrollIntoView({ block: 'center' })
            }
          />
        );
      })}
    </aside>
  );
}
