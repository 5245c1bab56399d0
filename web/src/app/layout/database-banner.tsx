import { useEffect } from 'react';
import { api } from '../../lib/api-client';
import { useDatabaseUnavailable } from '../../lib/database-status';

/** How often the banner asks whether the database is back, in ms. */
const CHECK_MS = 5000;

/**
 * A calm banner while the server cannot reach its database. Typing stays in the editor and the
 * draft is saved when the database answers again; the banner asks every few seconds and goes
 * away on the first answer that is not a 503 DATABASE_UNAVAILABLE.
 */
export function DatabaseBanner() {
  const down = useDatabaseUnavailable();
  useEffect(() => {
    if (!down) return;
    const timer = setInterval(() => {
      api.get('/api/auth/me').catch(() => undefined);
    }, CHECK_MS);
    return () => clearInterval(timer);
  }, [down]);
  if (!down) return null;
  return (
    <div role="status" className="border-b border-rule bg-paper-deep">
      <p className="mx-auto max-w-6xl px-6 py-2 text-sm text-ink">
        The server cannot reach its database; your typing is kept and will be saved when it is back.
      </p>
    </div>
  );
}
