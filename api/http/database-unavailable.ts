import { AppError } from './errors';

/** Seconds a client is asked to wait before trying again while the database is away. */
export const DATABASE_RETRY_AFTER_SECONDS = 5;

// What mysql2, Knex and tarn say when MariaDB cannot be reached or goes away mid-request; a
// refusal by a running server (a constraint, a duplicate key) is none of these.
const CONNECTION_CODES = new Set([
  'ECONNREFUSED',
  'ECONNRESET',
  'ETIMEDOUT',
  'EPIPE',
  'EHOSTUNREACH',
  'ENOTFOUND',
  'PROTOCOL_CONNECTION_LOST',
  'PROTOCOL_SEQUENCE_TIMEOUT',
  'ER_CON_COUNT_ERROR',
  'ER_SERVER_SHUTDOWN',
  'ER_SERVER_GONE_ERROR',
  'ER_SERVER_LOST',
  'ER_CONNECTION_KILLED',
]);

function codeOf(e: unknown): string {
  return typeof e === 'object' && e !== null ? String((e as { code?: unknown }).code ?? '') : '';
}

/** True when an error says MariaDB cannot be reached (not that it refused a statement). */
export function isDatabaseUnavailable(e: unknown): boolean {
  for (let cur = e, depth = 0; cur && depth < 5; depth++) {
    if (CONNECTION_CODES.has(codeOf(cur))) return true;
    if (cur instanceof Error) {
      if (cur.name === 'KnexTimeoutError') return true;
      if (/Timeout acquiring a connection|connection is in closed state/i.test(cur.message)) {
        return true;
      }
    }
    // AggregateError (several addresses refused) and errors wrapped with a cause
    const inner = cur as { cause?: unknown; errors?: unknown[] };
    cur = inner.errors?.[0] ?? inner.cause;
  }
  return false;
}

/**
 * 503 DATABASE_UNAVAILABLE with Retry-After: the server is up but cannot reach its database.
 * Nothing the client sent is wrong, so it may send the same request again; the pool reconnects
 * by itself when MariaDB is back.
 */
export class DatabaseUnavailableError extends AppError {
  constructor() {
    super(
      503,
      'DATABASE_UNAVAILABLE',
      'The server cannot reach its database just now, so this request was not carried out. Try again in a few seconds.',
      { details: { retryAfterSeconds: DATABASE_RETRY_AFTER_SECONDS } },
    );
  }
}
