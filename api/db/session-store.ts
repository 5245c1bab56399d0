import { ConnectSessionKnexStore } from 'connect-session-knex';
import type { SessionData } from 'express-session';
import type { Db, DbOrTx } from './index';

/**
 * connect-session-knex 5 with its rough edges filed off:
 * - its methods call the callback with an error and then also reject the promise they return;
 *   express-session ignores those promises, so an unhandled rejection would end the process.
 * - its touch() rejects without calling the callback, which would leave the response hanging.
 * The table is made by a migration (createTable: false).
 */
class GuardedKnexStore extends ConnectSessionKnexStore {
  override get(
    sid: string,
    callback: (err: unknown, session?: SessionData | null) => void,
  ): Promise<SessionData | null> {
    const p = super.get(sid, callback);
    p.catch(() => undefined);
    return p;
  }

  override set(
    sid: string,
    session: SessionData,
    callback?: (err?: unknown) => void,
  ): Promise<void> {
    const p = super.set(sid, session, callback);
    p.catch(() => undefined);
    return p;
  }

  override destroy(sid: string, callback?: (err?: unknown) => void): Promise<number> {
    const p = super.destroy(sid, callback);
    p.catch(() => undefined);
    return p;
  }

  override async touch(sid: string, session: SessionData, callback?: () => void): Promise<void> {
    const done = callback as ((err?: unknown) => void) | undefined;
    try {
      await super.touch(sid, session);
      done?.();
    } catch (e) {
      done?.(e);
    }
  }
}

export interface SessionStoreHandle {
  store: ConnectSessionKnexStore;
  close(): void;
}

export async function createSessionStore(
  db: Db,
  options: { cleanupIntervalMs: number; onError: (e: unknown) => void },
): Promise<SessionStoreHandle> {
  let closed = false;
  const store = new GuardedKnexStore({
    knex: db,
    tableName: 'sessions',
    sidFieldName: 'sid',
    createTable: false,
    cleanupInterval: options.cleanupIntervalMs,
    onDbCleanupError: (e) => {
      if (!closed) options.onError(e);
    },
  });
  try {
    await store.ready;
  } catch (e) {
    const reason = e instanceof Error ? e.message : String(e);
    throw new Error(`The session store cannot start (${reason}). Run npm run db:migrate first.`, {
      cause: e,
    });
  }
  return {
    store,
    close() {
      closed = true;
      if (store.nextDbCleanup) clearTimeout(store.nextDbCleanup);
    },
  };
}

/**
 * Ends every session of a person except `keepSid` (the one that asked): after a password change
 * a session opened with the old password, perhaps by someone else, is worth nothing. Returns how
 * many were ended.
 */
export async function endOtherSessions(
  db: DbOrTx,
  userId: number,
  keepSid: string,
): Promise<number> {
  return db('sessions')
    .whereRaw("JSON_VALUE(sess, '$.userId') = ?", [userId])
    .whereNot('sid', keepSid)
    .del();
}

/** Ends every session of a person (deactivation, a password reset by link). Returns how many. */
export async function endAllSessions(db: DbOrTx, userId: number): Promise<number> {
  return db('sessions').whereRaw("JSON_VALUE(sess, '$.userId') = ?", [userId]).del();
}
