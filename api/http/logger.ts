import type { RequestHandler } from 'express';

/**
 * One line per request (method, path without query, status, milliseconds) and one per error.
 * Never bodies, headers or cookies: passwords, hashes and session ids stay out of the log.
 */
export interface Logger {
  info(message: string): void;
  error(message: string, error?: unknown): void;
}

// Knex puts a failed query's SQL with its values into the error message; a password hash must
// not reach the log even then.
const HASH_PATTERN = /\$argon2(?:id|i|d)\$[^\s'",)]+/g;

export function redact(text: string): string {
  return text.replace(HASH_PATTERN, '[password hash]');
}

export function createLogger(enabled: boolean): Logger {
  return {
    info(message) {
      if (enabled) process.stdout.write(`${new Date().toISOString()} ${message}\n`);
    },
    error(message, error) {
      const stack = error instanceof Error ? (error.stack ?? error.message) : '';
      process.stderr.write(
        redact(`${new Date().toISOString()} ERROR ${message}${stack ? `\n${stack}` : ''}\n`),
      );
    },
  };
}

export function requestLogger(log: Logger): RequestHandler {
  return (req, res, next) => {
    const started = process.hrtime.bigint();
    res.on('finish', () => {
      const ms = Number(process.hrtime.bigint() - started) / 1e6;
      const path = req.originalUrl.split('?')[0];
      log.info(`${req.method} ${path} ${res.statusCode} ${ms.toFixed(1)}ms`);
    });
    next();
  };
}
