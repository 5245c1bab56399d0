// Global setup of the e2e project; runs after test/support/db-global-setup.ts has started and
// migrated the test database. Seeds the demo scenario, builds the client when it is missing or
// older than its sources, and starts the real app on a free loopback port for the browser tests.
import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, readdirSync, statSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import type { TestProject } from 'vitest/node';

const root = path.resolve(import.meta.dirname, '..', '..');
const TEST_DB = 'modewright_test';

function run(command: string, args: string[], what: string, env: NodeJS.ProcessEnv = {}): void {
  try {
    execFileSync(command, args, {
      cwd: root,
      env: { ...process.env, ...env },
      stdio: ['ignore', 'pipe', 'pipe'],
      timeout: 180_000,
    });
  } catch (error) {
    const e = error as { stdout?: Buffer; stderr?: Buffer; message: string };
    throw new Error(
      `e2e setup: ${what} failed.\n${e.stdout?.toString() ?? ''}${e.stderr?.toString() ?? ''}\n${e.message}`,
      { cause: error },
    );
  }
}

function newestMtime(target: string): number {
  const stat = statSync(target);
  if (!stat.isDirectory()) return stat.mtimeMs;
  let newest = stat.mtimeMs;
  for (const entry of readdirSync(target)) {
    if (entry === 'node_modules') continue;
    newest = Math.max(newest, newestMtime(path.join(target, entry)));
  }
  return newest;
}

function clientIsStale(): boolean {
  const built = path.join(root, 'dist', 'client', 'index.html');
  if (!existsSync(built)) return true;
  const sources = ['web', 'vite.config.ts', 'tailwind.config.ts', 'package-lock.json']
    .map((p) => path.join(root, p))
    .filter((p) => existsSync(p));
  return Math.max(...sources.map(newestMtime)) > statSync(built).mtimeMs;
}

export default async function setup(project: TestProject) {
  // The seeds are safe to re-run: they put the demo people and projects back as DESIGN §11 says.
  run(
    process.execPath,
    ['--import', 'tsx', 'node_modules/knex/bin/cli.js', '--knexfile', 'knexfile.ts', 'seed:run'],
    `seeding ${TEST_DB} with the demo scenario`,
    { MW_DB_NAME: TEST_DB },
  );

  if (clientIsStale()) {
    // Engineers run browser tests side by side: one build at a time into dist/client.
    const lock = path.join(root, '.data', 'vite-build.lock');
    mkdirSync(path.dirname(lock), { recursive: true });
    run(
      'flock',
      ['-w', '170', lock, 'npx', 'vite', 'build'],
      'building the client (npx vite build)',
    );
  }

  // The app reads its configuration from the environment when createApp() runs.
  process.env.MW_DB_NAME = TEST_DB;
  const { createApp } = await import('../../api/app');
  const { app, close } = await createApp({
    // Each spec signs people in many times; the limit itself is covered by the API tests.
    signinLimit: 10_000,
    logRequests: false,
  });
  const server = await new Promise<import('node:http').Server>((resolve, reject) => {
    const s = app.listen(0, '127.0.0.1', () => resolve(s));
    s.once('error', reject);
  });
  const { port } = server.address() as AddressInfo;
  project.provide('e2eBaseUrl', `http://127.0.0.1:${port}`);

  return async () => {
    await new Promise<void>((resolve) => {
      server.closeAllConnections();
      server.close(() => resolve());
    });
    await close();
  };
}
