import createKnex, { type Knex } from 'knex';
import type { AppConfig } from '../config/index';
import { knexConfig } from './knex-config';

/** The database handle services receive; a transaction has the same query interface. */
export type Db = Knex;
export type DbOrTx = Knex | Knex.Transaction;

/**
 * The database's clock, NOW(3) in UTC: the times the services store come from the clock the
 * column defaults use, so the rows of one action agree (and a seed can set the clock of its
 * connection to tell a scenario's history).
 */
export async function dbNow(db: DbOrTx): Promise<Date> {
  const [rows] = (await db.raw('select now(3) as now')) as [{ now: Date }[]];
  const now = rows[0]?.now;
  if (!(now instanceof Date)) throw new Error('the database did not answer NOW(3) with a time');
  return now;
}

export function createDb(db: AppConfig['db']): Db {
  return createKnex(knexConfig(db));
}

const PERMANENT_CODES = new Set([
  'ER_ACCESS_DENIED_ERROR',
  'ER_DBACCESS_DENIED_ERROR',
  'ER_BAD_DB_ERROR',
]);

/** Waits until the database answers `select 1`, or throws one clear line after timeoutMs. */
export async function waitForDb(db: Db, where: AppConfig['db'], timeoutMs = 15_000): Promise<void> {
  const started = Date.now();
  let lastError: unknown;
  while (Date.now() - started < timeoutMs) {
    try {
      await db.raw('select 1');
      return;
    } catch (e) {
      lastError = e;
      // A wrong password or a missing database will not mend itself by waiting.
      if (PERMANENT_CODES.has(String((e as { code?: unknown }).code))) break;
      await new Promise((resolve) => setTimeout(resolve, 250));
    }
  }
  const reason = lastError instanceof Error ? lastError.message : String(lastError);
  const code = String((lastError as { code?: unknown } | undefined)?.code);
  if (PERMANENT_CODES.has(code)) {
    throw new Error(
      `MariaDB at ${where.host}:${where.port} refused database ${where.name}: ${reason}. ` +
        'npm run db:start creates the databases and the app user (run it with MW_DB_NAME set ' +
        'for a database of another name).',
      { cause: lastError },
    );
  }
  throw new Error(
    `MariaDB at ${where.host}:${where.port} (database ${where.name}) does not answer: ${reason}. ` +
      'Start it with npm run db:start and migrate with npm run db:migrate.',
    { cause: lastError },
  );
}

/** True when the error is MariaDB's duplicate-key refusal (ER_DUP_ENTRY). */
export function isDuplicateKeyError(e: unknown): boolean {
  return (
    typeof e === 'object' &&
    e !== null &&
    ((e as { code?: unknown }).code === 'ER_DUP_ENTRY' || (e as { errno?: unknown }).errno === 1062)
  );
}

/** The index name MariaDB quotes in a duplicate-key message, e.g. 'projects_job_number_unique'. */
export function duplicateKeyIndex(e: unknown): string | undefined {
  const message = e instanceof Error ? e.message : '';
  return /for key '([^']+)'/.exec(message)?.[1];
}

/** Reads a JSON column: MariaDB keeps JSON as LONGTEXT, so the driver may hand back a string. */
export function readJson<T>(value: unknown): T {
  if (typeof value === 'string') return JSON.parse(value) as T;
  return value as T;
}
