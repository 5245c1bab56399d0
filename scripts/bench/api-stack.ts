// The product as a user reaches it, for the sheets bench: the project's MariaDB and Redis
// (scripts/db.sh, scripts/redis.sh), a database of the bench's own re-created and migrated
// (scripts/db-reset.sh, schema only), the compiled API server (scripts/build-server.mjs,
// dist/server/server.js) with no workers of its own, one worker process
// (dist/server/job-worker.js) on a queue prefix of the bench's own, and a person who is the
// author of one project. ApiSession then signs in over HTTP as the browser does (session
// cookie, CSRF token) and calls the routes.
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { createServer } from 'node:net';
import { loadDbConfig, loadQueueConfig } from '../../api/config/index';
import { createDb, waitForDb } from '../../api/db/index';
import { createLogger } from '../../api/http/logger';
import { hashPassword } from '../../api/modules/auth/passwords';
import { membersRepository } from '../../api/modules/members/members.repository';
import { projectsRepository } from '../../api/modules/projects/projects.repository';
import { usersRepository } from '../../api/modules/users/users.repository';
import { createJobQueue } from '../../api/workers/job-queue';
import { redisConnection } from '../../api/workers/queue';

export const BENCH_DB = 'modewright_bench';

export interface ApiStack {
  baseUrl: string;
  /** The worker process (its pid is read from /proc for its peak memory). */
  worker: ChildProcess;
  server: ChildProcess;
  email: string;
  password: string;
  projectId: number;
  /** The environment both processes were started with (port, database, queue, limits). */
  env: NodeJS.ProcessEnv;
  close(): Promise<void>;
}

function run(argv: string[], env: NodeJS.ProcessEnv): void {
  const r = spawnSync(argv[0]!, argv.slice(1), { encoding: 'utf8', env });
  if (r.status !== 0) {
    throw new Error(`${argv.join(' ')} failed (${r.status}): ${r.stderr || r.stdout}`);
  }
}

/** MW_PORT when set, else a free port on the loopback. */
async function pickPort(): Promise<number> {
  if (process.env.MW_PORT) return Number(process.env.MW_PORT);
  return new Promise((resolve, reject) => {
    const s = createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const address = s.address();
      const port = typeof address === 'object' && address ? address.port : 0;
      s.close(() => resolve(port));
    });
  });
}

/** Starts a process and answers it once its output includes `ready`. */
function startProcess(
  argv: string[],
  env: NodeJS.ProcessEnv,
  ready: string,
  what: string,
): Promise<ChildProcess> {
  const child = spawn(argv[0]!, argv.slice(1), { env, stdio: ['ignore', 'pipe', 'pipe'] });
  let text = '';
  return new Promise((resolve, reject) => {
    const onData = (chunk: Buffer): void => {
      text += chunk.toString();
      if (text.includes(ready)) resolve(child);
    };
    child.stdout!.on('data', onData);
    child.stderr!.on('data', onData);
    child.once('exit', (code) => reject(new Error(`${what} exited (code ${code}): ${text}`)));
  });
}

function stop(child: ChildProcess): Promise<void> {
  if (child.exitCode !== null || child.signalCode !== null) return Promise.resolve();
  return new Promise((resolve) => {
    child.once('exit', () => resolve());
    child.kill('SIGTERM');
  });
}

/**
 * Starts the stack. `uploadLimitBytes` is the server's MW_UPLOAD_LIMIT_BYTES (the bench sets it
 * to cover its largest file).
 */
export async function startApiStack(uploadLimitBytes: number): Promise<ApiStack> {
  const port = await pickPort();
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    MW_DB_NAME: BENCH_DB,
    MW_PORT: String(port),
    MW_HOST: '127.0.0.1',
    MW_QUEUE_PREFIX: `mw:bench-sheets-${process.pid}-${Date.now()}`,
    MW_WORKERS: '0',
    MW_UPLOAD_LIMIT_BYTES: String(uploadLimitBytes),
    MW_LOG_REQUESTS: '0',
    MW_SESSION_SECRET: randomBytes(32).toString('hex'),
  };
  console.log('… starting MariaDB and Redis, re-creating the database ' + BENCH_DB);
  run(['bash', 'scripts/db.sh', 'start'], env);
  run(['bash', 'scripts/redis.sh', 'start'], env);
  run(['bash', 'scripts/db-reset.sh'], { ...env, MW_DB_SEED: '0' });
  run(['node', 'scripts/build-server.mjs', '--quiet'], env);

  const email = `bench-${process.pid}@bench.example`;
  const password = randomBytes(12).toString('hex');
  const dbConfig = { ...loadDbConfig(), name: BENCH_DB };
  const db = createDb(dbConfig);
  let projectId: number;
  try {
    await waitForDb(db, dbConfig);
    const userId = await usersRepository.insert(db, {
      email,
      name: 'Bench Author',
      passwordHash: await hashPassword(password),
      isAdmin: false,
      licenceNumber: null,
      jurisdiction: null,
    });
    projectId = await projectsRepository.insert(db, {
      jobNumber: `BENCH-${process.pid}`,
      name: 'Sheets bench',
      client: 'Bench client',
      site: 'Bench site',
    });
    await membersRepository.insertRoles(db, projectId, userId, ['author']);
  } finally {
    await db.destroy();
  }

  console.log(`… starting the API server on port ${port} and one worker process`);
  const node = [process.execPath, '--enable-source-maps'];
  const server = await startProcess(
    [...node, 'dist/server/server.js'],
    env,
    'is running at',
    'the API server',
  );
  let worker: ChildProcess;
  try {
    worker = await startProcess(
      [...node, 'dist/server/job-worker.js'],
      env,
      'taking jobs',
      'the worker',
    );
  } catch (e) {
    await stop(server);
    throw e;
  }
  return {
    baseUrl: `http://127.0.0.1:${port}`,
    worker,
    server,
    email,
    password,
    projectId,
    env,
    close: async () => {
      await Promise.all([stop(worker), stop(server)]);
      // The bench's keys on Redis go with it (the queue and the latest-job pointers): their
      // prefix is this run's alone.
      const prefix = env.MW_QUEUE_PREFIX!;
      const queue = { ...loadQueueConfig(BENCH_DB), prefix };
      const jobs = createJobQueue(queue, createLogger(false));
      const redis = redisConnection(queue.redisUrl, false);
      try {
        await jobs.queue.obliterate({ force: true });
        let cursor = '0';
        do {
          const [next, keys] = await redis.scan(cursor, 'MATCH', `${prefix}:*`, 'COUNT', 500);
          if (keys.length > 0) await redis.del(...keys);
          cursor = next;
        } while (cursor !== '0');
      } finally {
        await jobs.close();
        redis.disconnect();
      }
    },
  };
}

/** An error of the API in its one shape, or the status and the start of the body. */
function describeFailure(status: number, text: string): string {
  try {
    const body = JSON.parse(text) as { error?: { code?: string; message?: string } };
    if (body.error) return `${status} ${body.error.code}: ${body.error.message}`;
  } catch {
    // not JSON
  }
  return `${status} ${text.slice(0, 300)}`;
}

/** One signed-in person over HTTP: the session cookie and the CSRF token, as the browser. */
export class ApiSession {
  private cookies = new Map<string, string>();
  private csrfToken = '';

  constructor(private readonly baseUrl: string) {}

  private async request(
    method: string,
    path: string,
    body?: unknown,
    headers: Record<string, string> = {},
  ): Promise<Response> {
    const h: Record<string, string> = { ...headers };
    if (this.cookies.size > 0) {
      h.cookie = [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
    }
    if (method !== 'GET') h['x-csrf-token'] = this.csrfToken;
    let payload: BodyInit | undefined;
    if (body instanceof FormData) payload = body;
    else if (body !== undefined) {
      h['content-type'] = 'application/json';
      payload = JSON.stringify(body);
    }
    const res = await fetch(this.baseUrl + path, { method, headers: h, body: payload });
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(';');
      const at = pair!.indexOf('=');
      this.cookies.set(pair!.slice(0, at).trim(), pair!.slice(at + 1).trim());
    }
    return res;
  }

  /** A request whose status must be one of `ok`; answers the body's text. */
  async text(
    method: string,
    path: string,
    ok: number[],
    body?: unknown,
    headers?: Record<string, string>,
  ): Promise<{ status: number; text: string; headers: Headers }> {
    const res = await this.request(method, path, body, headers);
    const text = await res.text();
    if (!ok.includes(res.status)) {
      throw new Error(`${method} ${path}: ${describeFailure(res.status, text)}`);
    }
    return { status: res.status, text, headers: res.headers };
  }

  async json<T>(
    method: string,
    path: string,
    ok: number[],
    body?: unknown,
    headers?: Record<string, string>,
  ): Promise<{ status: number; body: T; headers: Headers }> {
    const r = await this.text(method, path, ok, body, headers);
    return { status: r.status, body: JSON.parse(r.text) as T, headers: r.headers };
  }

  async signIn(email: string, password: string): Promise<void> {
    this.csrfToken = (
      await this.json<{ csrfToken: string }>('GET', '/api/auth/csrf', [200])
    ).body.csrfToken;
    const r = await this.json<{ csrfToken: string }>('POST', '/api/auth/sign-in', [200], {
      email,
      password,
    });
    this.csrfToken = r.body.csrfToken;
  }
}
