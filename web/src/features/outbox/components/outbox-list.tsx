import { useId, useState } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { QueryError } from '../../../components/ui/alert';
import { EmptyState } from '../../../components/ui/empty-state';
import { Spinner } from '../../../components/ui/spinner';
import { formatUtc } from '../../../lib/format';
import { useOutbox } from '../api/get-outbox';

const recipients = (to: string[] | string) => (Array.isArray(to) ? to.join(', ') : to);

/**
 * The mail the local fake transport kept (no SMTP configured), newest first: all of it for an
 * administrator, the messages addressed to the signed-in person for everyone else.
 */
export function OutboxList() {
  const id = useId();
  const outbox = useOutbox();
  const [filter, setFilter] = useState('');
  const [openId, setOpenId] = useState<number | null>(null);
  if (outbox.isPending) return <Spinner label="Loading the outbox…" />;
  if (outbox.isError) {
    return <QueryError what="the outbox" error={outbox.error} onRetry={() => outbox.refetch()} />;
  }
  const words = filter.trim().toLowerCase();
  const mine = outbox.data.scope === 'mine';
  const shown = outbox.data.messages.filter(
    (m) =>
      !words ||
      m.subject.toLowerCase().includes(words) ||
      recipients(m.to).toLowerCase().includes(words),
  );
  return (
    <div className="flex flex-col gap-3">
      <div className="flex max-w-sm flex-col gap-1">
        <label htmlFor={`${id}-filter`} className="text-sm font-medium">
          Filter by subject or recipient
        </label>
        <input
          id={`${id}-filter`}
          value={filter}
          onChange={(e) => setFilter(e.target.value)}
          className="rounded-sm border border-rule-strong bg-paper-sheet px-2.5 py-1.5"
        />
      </div>
      {shown.length === 0 ? (
        <EmptyState
          title={
            outbox.data.messages.length === 0
              ? mine
                ? 'No mail for you yet'
                : 'No messages'
              : 'No message matches the filter'
          }
        />
      ) : null}
      <ol aria-label="Messages" className="flex flex-col">
        {shown.map((m) => (
          <li key={m.id} className="border-b border-rule py-2 text-sm last:border-b-0">
            <button
              type="button"
              aria-expanded={openId === m.id}
              onClick={() => setOpenId(openId === m.id ? null : m.id)}
              className="grid w-full gap-x-4 text-left sm:grid-cols-[11rem_16rem_1fr]"
            >
              <time dateTime={m.createdAt} className="font-mono text-xs leading-5 text-ink-faint">
                {formatUtc(m.createdAt)}
              </time>
              <span className="truncate text-ink-soft">{recipients(m.to)}</span>
              <span className="font-medium text-ink">{m.subject}</span>
            </button>
            {openId === m.id ? (
              <div className="mt-2 rounded-sm bg-paper-deep p-3">
                <pre className="font-sans text-sm whitespace-pre-wrap">{m.text}</pre>
                {m.relatedSheetId !== null && m.relatedProjectId !== null ? (
                  <Link
                    to={paths.sheet.href(m.relatedProjectId, m.relatedSheetId)}
                    className="mt-2 inline-block text-sm font-medium text-accent-strong hover:underline"
                  >
                    Open the sheet
                  </Link>
                ) : null}
              </div>
            ) : null}
          </li>
        ))}
      </ol>
    </div>
  );
}
