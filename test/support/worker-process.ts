// Evaluation worker processes for the tests: the same entry as `npm run worker`, run from source.
import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';

const root = path.resolve(import.meta.dirname, '..', '..');

export interface WorkerProcess {
  child: ChildProcess;
  pid: number;
  /** Everything the process wrote, for a failing test's message. */
  output(): string;
  /** Stops it (SIGTERM, or SIGKILL when `hard`) and waits for it to exit. */
  stop(hard?: boolean): Promise<void>;
}

/**
 * Starts `api/workers/job-worker.ts` with this environment plus `env`, and waits until it says it
 * is taking jobs (up to a minute: mathjs and tsx load first).
 */
export async function startWorkerProcess(env: NodeJS.ProcessEnv = {}): Promise<WorkerProcess> {
  const child = spawn(process.execPath, ['--import', 'tsx', 'api/workers/job-worker.ts'], {
    cwd: root,
    env: { ...process.env, ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let text = '';
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  await new Promise<void>((resolve, reject) => {
    const timer = setTimeout(
      () => reject(new Error(`the worker process did not start within 60 s:\n${text}`)),
      60_000,
    );
    const onData = (chunk: Buffer) => {
      text += chunk.toString();
      if (text.includes('taking jobs')) {
        clearTimeout(timer);
        resolve();
      }
    };
    child.stdout!.on('data', onData);
    child.stderr!.on('data', (chunk: Buffer) => (text += chunk.toString()));
    child.once('exit', (code) => {
      clearTimeout(timer);
      reject(new Error(`the worker process exited (code ${code}) before it started:\n${text}`));
    });
  });
  return {
    child,
    pid: child.pid!,
    output: () => text,
    stop: async (hard = false) => {
      if (child.exitCode !== null || child.signalCode !== null) return;
      child.kill(hard ? 'SIGKILL' : 'SIGTERM');
      await exited;
    },
  };
}
