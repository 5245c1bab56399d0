// Vitest global setup of the api and e2e projects: makes sure the project's MariaDB and Redis
// answer (starting them with scripts/db.sh and scripts/redis.sh when they do not), migrates the
// test database with the knex CLI (inside Vitest, knex.migrate cannot import .ts migrations:
// STACK.md) and points the test workers at modewright_test.
import { execFileSync } from 'node:child_process';
import net from 'node:net';
import path from 'node:path';
import type { TestProject } from 'vitest/node';
import { startWorkerProcess } from './worker-process';

declare module 'vitest' {
  export interface ProvidedContext {
    /** The database the API and browser tests use. */
    testDbName: string;
  }
}

const root = path.resolve(import.meta.dirname, '..', '..');
export const TEST_DB = 'modewright_test';

function answers(host: string, port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const socket = net.connect({ host, port });
    const done = (ok: boolean) => {
      socket.destroy();
      resolve(ok);
    };
    socket.setTimeout(1500, () => done(false));
    socket.once('connect', () => done(true));
    socket.once('error', () => done(false));
  });
}

function run(command: string, args: string[], what: string): void {
  try {
    execFileSync(command, args, {
      cwd: root,
      env: { ...process.env, MW_DB_NAME: TEST_DB },
      stdio: ['ignore', 'pipe', 'pipe'],
      timeout: 240_000,
    });
  } catch (error) {
    const e = error as { stdout?: Buffer; stderr?: Buffer; message: string };
    throw new Error(
      `test database setup: ${what} failed.\n${e.stdout?.toString() ?? ''}${e.stderr?.toString() ?? ''}`,
      { cause: error },
    );
  }
}

export default async function setup(project: TestProject): Promise<() => Promise<void>> {
  const host = process.env.MW_DB_HOST ?? '127.0.0.1';
  const port = Number(process.env.MW_DB_PORT ?? 3407);
  if (!(await answers(host, port))) {
    run('bash', ['scripts/db.sh', 'start'], 'starting MariaDB (scripts/db.sh start)');
  }
  // The evaluation queue's Redis (scripts/redis.sh), unless MW_REDIS_URL names an existing one.
  if (!process.env.MW_REDIS_URL) {
    const redisPort = Number(process.env.MW_REDIS_PORT ?? 6407);
    if (!(await answers('127.0.0.1', redisPort))) {
      run('bash', ['scripts/redis.sh', 'start'], 'starting Redis (scripts/redis.sh start)');
    }
  }
  run(
    process.execPath,
    [
      '--import',
      'tsx',
      'node_modules/knex/bin/cli.js',
      '--knexfile',
      'knexfile.ts',
      'migrate:latest',
    ],
    `migrating ${TEST_DB}`,
  );
  // Workers start after global setup and inherit this environment.
  process.env.MW_DB_NAME = TEST_DB;
  project.provide('testDbName', TEST_DB);
  // One evaluation worker process takes the test queue's jobs, as `npm run worker` does.
  const worker = await startWorkerProcess({ MW_DB_NAME: TEST_DB });
  return () => worker.stop();
}
