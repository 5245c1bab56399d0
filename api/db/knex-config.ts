import type { Knex } from 'knex';
import path from 'node:path';
import { loadConfig, projectRoot, type AppConfig } from '../config/index';

/**
 * The one Knex configuration, for the app, the CLI and the tests. No `charset` in the connection:
 * it would force utf8mb4_general_ci on every table (the server default is utf8mb4_unicode_ci).
 */
export function knexConfig(
  db: AppConfig['db'] = loadConfig({ sessionSecret: 'unused' }).db,
): Knex.Config {
  return {
    client: 'mysql2',
    connection: {
      host: db.host,
      port: db.port,
      database: db.name,
      user: db.user,
      password: db.password,
      timezone: 'Z',
      // DATETIME columns hold UTC; read them back as UTC instants.
      dateStrings: false,
      supportBigNumbers: true,
      bigNumberStrings: false,
    },
    pool: { min: 0, max: 10 },
    // Knex's own warnings (a refused connection, say) as one line each, not a stack per retry.
    log: {
      warn: (message: string) => process.stderr.write(`knex: ${firstLine(message)}\n`),
      error: (message: string) => process.stderr.write(`knex: ${firstLine(message)}\n`),
      deprecate: (method: string, alternative: string) =>
        process.stderr.write(`knex: ${method} is deprecated; use ${alternative}\n`),
      debug: () => undefined,
    },
    migrations: {
      directory: path.join(projectRoot, 'migrations'),
      tableName: 'knex_migrations',
      loadExtensions: ['.ts'],
      extension: 'ts',
    },
    seeds: {
      directory: path.join(projectRoot, 'seeds'),
      loadExtensions: ['.ts'],
      extension: 'ts',
    },
  };
}

function firstLine(message: unknown): string {
  return String(message).split('\n')[0] ?? '';
}
