/**
 * Keeps `count` worker processes (./job-worker.ts) running beside the API of `npm start`: each is
 * a child process of its own, and one that dies (a crash, the RSS watchdog, kill -9) is started
 * again after a short pause, longer when it keeps dying at once. The workers go when this
 * process goes (they exit when their IPC channel closes).
 */
import { fork, type ChildProcess } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import type { Logger } from '../http/logger';

const COMPILED = import.meta.url.endsWith('.js');
const WORKER_FILE = fileURLToPath(
  new URL(COMPILED ? './job-worker.js' : './job-worker.ts', import.meta.url),
);

export interface Supervisor {
  /** The worker processes' ids now. */
  pids(): number[];
  /** How many worker processes have been started in all (restarts included). */
  started(): number;
  close(): Promise<void>;
}

export function superviseWorkers(count: number, log: Logger): Supervisor {
  const children = new Set<ChildProcess>();
  let started = 0;
  let stopping = false;

  const spawn = (slot: number, failures: number) => {
    const child = fork(WORKER_FILE, [], {
      execArgv: COMPILED ? ['--enable-source-maps'] : ['--import', 'tsx'],
      stdio: ['ignore', 'inherit', 'inherit', 'ipc'],
    });
    started++;
    children.add(child);
    const bornAt = Date.now();
    child.once('exit', (code, signal) => {
      children.delete(child);
      if (stopping) return;
      const quick = Date.now() - bornAt < 10_000;
      const next = quick ? failures + 1 : 0;
      const pause = Math.min(30_000, 500 * 2 ** Math.min(next, 6));
      log.error(
        `evaluation worker ${child.pid} (slot ${slot}) exited (${signal ?? `code ${code}`}); starting another in ${pause} ms`,
      );
      setTimeout(() => {
        if (!stopping) spawn(slot, next);
      }, pause).unref();
    });
  };
  for (let slot = 0; slot < count; slot++) spawn(slot, 0);

  return {
    pids: () => [...children].map((c) => c.pid!).filter(Boolean),
    started: () => started,
    close: async () => {
      stopping = true;
      await Promise.all(
        [...children].map(
          (child) =>
            new Promise<void>((resolve) => {
              child.once('exit', () => resolve());
              child.kill('SIGTERM');
              setTimeout(() => {
                child.kill('SIGKILL');
                resolve();
              }, 5000).unref();
            }),
        ),
      );
    },
  };
}
