import { useId, useState, type FormEvent } from 'react';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/alert';
import { formatUtc } from '../../../lib/format';
import { useChangeReply, useReplyToRemark, useSetRemarkState } from '../api/remark-mutations';
import {
  REMARK_STATE_LABELS,
  REMARK_TYPE_LABELS,
  type Remark,
  type RemarkReply,
} from '../api/types';

const stateTone: Record<Remark['state'], string> = {
  open: 'border-fail text-fail',
  answered: 'border-accent text-accent-strong',
  closed: 'border-pass text-pass',
};

/**
 * One remark with its thread; the author answers, the checker closes or reopens. The writer of
 * the last reply may edit or withdraw it until someone acts on it (a reply after it, or a close).
 */
export function RemarkCard({
  remark,
  where,
  canReply,
  canClose,
  me,
  onShow,
}: {
  remark: Remark;
  where: string;
  canReply: boolean;
  canClose: boolean;
  /** The signed-in person's id: their own last reply can be changed. */
  me: number;
  onShow?: () => void;
}) {
  const id = useId();
  const [reply, setReply] = useState('');
  const replyMutation = useReplyToRemark(remark.revisionId);
  const stateMutation = useSetRemarkState(remark.revisionId);
  // A carried remark: who made it on which revision, and the answers given there before these.
  const first = remark.earlier[0];
  const thread: { reply: RemarkReply; onRev: number | null }[] = [
    ...remark.earlier.flatMap((e) =>
      e.replies.map((reply) => ({ reply, onRev: e.revisionNumber })),
    ),
    ...remark.replies.map((reply) => ({ reply, onRev: null })),
  ];

  function submit(event: FormEvent) {
    event.preventDefault();
    replyMutation.mutate({ remarkId: remark.id, text: reply }, { onSuccess: () => setReply('') });
  }

  return (
    <article
      aria-label={`Remark: ${remark.text.slice(0, 60)}`}
      className="flex flex-col gap-2 rounded-sm border border-rule bg-paper-sheet p-3 text-sm"
      data-remark-id={remark.id}
    >
      <header className="flex flex-wrap items-center gap-2">
        <span className="rounded-sm border border-rule-strong px-1.5 text-xs font-medium">
          {REMARK_TYPE_LABELS[remark.type]}
        </span>
        <span
          data-testid="remark-state"
          className={`rounded-sm border px-1.5 text-xs font-semibold ${stateTone[remark.state]}`}
        >
          {REMARK_STATE_LABELS[remark.state]}
        </span>
        {onShow ? (
          <button
            type="button"
            onClick={onShow}
            className="text-xs text-accent-strong underline underline-offset-2"
          >
            {where}
          </button>
        ) : (
          <span className="text-xs text-ink-soft">{where}</span>
        )}
      </header>
      {remark.carriedFrom ? (
        <p className="text-xs text-ink-soft">
          Carried from Rev {remark.carriedFrom.revisionNumber}, line {remark.carriedFrom.line}
        </p>
      ) : null}
      {remark.lineChanged && remark.state !== 'closed' ? (
        <p className="rounded-sm bg-fail-soft px-1.5 py-0.5 text-xs font-semibold text-fail">
          Line changed — the line this remark was on was edited; look again.
        </p>
      ) : remark.lineChanged ? (
        // Closed: the checker has looked again already; the edit is history, not an alarm.
        <p className="text-xs text-ink-soft">The line was edited in this revision.</p>
      ) : null}
      <p className="whitespace-pre-wrap text-ink">{remark.text}</p>
      <p className="text-xs text-ink-faint">
        {first ? (
          <>
            {first.author.name}, {formatUtc(first.createdAt)}, on Rev {first.revisionNumber}
          </>
        ) : (
          <>
            {remark.author.name}, {formatUtc(remark.createdAt)}
          </>
        )}
      </p>
      {thread.length > 0 ? (
        <ol aria-label="Replies" className="flex flex-col gap-1 border-l-2 border-rule pl-3">
          {thread.map(({ reply, onRev }) => (
            <li key={reply.id}>
              <p className="whitespace-pre-wrap">{reply.text}</p>
              <p className="text-xs text-ink-faint">
                {reply.author.name}, {formatUtc(reply.createdAt)}
                {onRev === null ? null : `, on Rev ${onRev}`}
                {reply.editedAt ? `, edited ${formatUtc(reply.editedAt)}` : null}
              </p>
              {canReply &&
              onRev === null &&
              reply.author.id === me &&
              remark.state !== 'closed' &&
              reply.id === remark.replies.at(-1)?.id ? (
                <OwnReply remarkId={remark.id} revisionId={remark.revisionId} reply={reply} />
              ) : null}
            </li>
          ))}
        </ol>
      ) : null}
      {canReply && remark.state !== 'closed' ? (
        <form onSubmit={submit} className="flex flex-col gap-1">
          <label htmlFor={`${id}-reply`} className="text-xs font-medium text-ink">
            Reply
          </label>
          <textarea
            id={`${id}-reply`}
            value={reply}
            onChange={(e) => setReply(e.target.value)}
            rows={2}
            className="rounded-sm border border-rule-strong bg-paper-sheet px-2 py-1 text-sm"
          />
          <div>
            <Button type="submit" variant="secondary" busy={replyMutation.isPending}>
              Send reply
            </Button>
          </div>
          {replyMutation.error ? <Alert>{replyMutation.error.message}</Alert> : null}
        </form>
      ) : null}
      {canClose ? (
        <div>
          <Button
            variant={remark.state === 'closed' ? 'secondary' : 'primary'}
            busy={stateMutation.isPending}
            onClick={() =>
              stateMutation.mutate({
                remarkId: remark.id,
                state: remark.state === 'closed' ? 'open' : 'closed',
              })
            }
          >
            {remark.state === 'closed' ? 'Reopen remark' : 'Close remark'}
          </Button>
          {stateMutation.error ? <Alert>{stateMutation.error.message}</Alert> : null}
        </div>
      ) : null}
    </article>
  );
}

/** Edit or withdraw one's own last reply; a withdrawal asks once more. */
function OwnReply({
  remarkId,
  revisionId,
  reply,
}: {
  remarkId: number;
  revisionId: number;
  reply: RemarkReply;
}) {
  const id = useId();
  const change = useChangeReply(revisionId);
  const [mode, setMode] = useState<'idle' | 'edit' | 'withdraw'>('idle');
  const [text, setText] = useState(reply.text);
  const done = () => setMode('idle');

  if (mode === 'edit') {
    return (
      <form
        aria-label="Edit your reply"
        className="mt-1 flex flex-col gap-1"
        onSubmit={(e) => {
          e.preventDefault();
          change.mutate({ remarkId, replyId: reply.id, text }, { onSuccess: done });
        }}
      >
        <label htmlFor={`${id}-edit`} className="text-xs font-medium">
          Your reply
        </label>
        <textarea
          id={`${id}-edit`}
          value={text}
          onChange={(e) => setText(e.target.value)}
          rows={2}
          className="rounded-sm border border-rule-strong bg-paper-sheet px-2 py-1 text-sm"
        />
        <div className="flex gap-2">
          <Button type="submit" variant="secondary" busy={change.isPending}>
            Save the reply
          </Button>
          <Button type="button" variant="secondary" onClick={done}>
            Cancel
          </Button>
        </div>
        {change.error ? <Alert>{change.error.message}</Alert> : null}
      </form>
    );
  }
  return (
    <div className="mt-1 flex flex-wrap items-center gap-3 text-xs">
      {mode === 'withdraw' ? (
        <>
          <span>
            Withdraw this reply? The remark is open again unless it was answered otherwise.
          </span>
          <button
            type="button"
            className="font-semibold text-fail underline underline-offset-2"
            onClick={() => change.mutate({ remarkId, replyId: reply.id })}
          >
            Withdraw the reply
          </button>
          <button type="button" className="underline underline-offset-2" onClick={done}>
            Keep it
          </button>
        </>
      ) : (
        <>
          <button
            type="button"
            className="text-accent-strong underline underline-offset-2"
            onClick={() => {
              setText(reply.text);
              setMode('edit');
            }}
          >
            Edit
          </button>
          <button
            type="button"
            className="text-accent-strong underline underline-offset-2"
            onClick={() => setMode('withdraw')}
          >
            Withdraw
          </button>
        </>
      )}
      {change.error ? <Alert>{change.error.message}</Alert> : null}
    </div>
  );
}
