import { useState } from 'react';
import { Button } from '../../../components/ui/button';
import { Spinner } from '../../../components/ui/spinner';
import { QueryError } from '../../../components/ui/alert';
import { EmptyState } from '../../../components/ui/empty-state';
import { formatUtc } from '../../../lib/format';
import { useProjectActivity } from '../api/get-project-activity';
import { describeActivity } from './describe-activity';

// The newest entries first; the whole log is one click away.
const FIRST_SHOWN = 15;

export function ActivityList({ projectId }: { projectId: number }) {
  const activity = useProjectActivity(projectId);
  const [showAll, setShowAll] = useState(false);

  if (activity.isPending) return <Spinner label="Loading activity…" />;
  if (activity.isError) {
    return (
      <QueryError what="the activity" error={activity.error} onRetry={() => activity.refetch()} />
    );
  }
  if (activity.data.length === 0) return <EmptyState title="Nothing has happened here yet" />;

  const entries = showAll ? activity.data : activity.data.slice(0, FIRST_SHOWN);
  const hidden = activity.data.length - entries.length;

  return (
    <>
      <ol aria-label="Activity" className="flex flex-col">
        {entries.map((entry) => {
          const { text, facts } = describeActivity(entry);
          return (
            <li
              key={entry.id}
              className="grid gap-x-4 border-b border-rule py-2 text-sm last:border-b-0 sm:grid-cols-[11rem_1fr]"
            >
              <time dateTime={entry.at} className="font-mono text-xs leading-5 text-ink-faint">
                {formatUtc(entry.at)}
              </time>
              <div>
                <p>
                  <span className="font-medium">{entry.actor?.name ?? 'Someone'}</span> {text}
                </p>
                {facts.length > 0 ? (
                  <p className="text-xs text-ink-soft">{facts.join(' · ')}</p>
                ) : null}
              </div>
            </li>
          );
        })}
      </ol>
      {hidden > 0 ? (
        <Button variant="quiet" className="mt-2" onClick={() => setShowAll(true)}>
          Show all {activity.data.length} entries
        </Button>
      ) : null}
    </>
  );
}
