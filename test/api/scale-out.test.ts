import { spawn, type ChildProcess } from 'node:child_process';
import net from 'node:net';
import path from 'node:path';
import { Queue } from 'bullmq';
import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { loadConfig, loadQueueConfig } from '../../api/config/index';
import { createDb } from '../../api/db/index';
import { QUEUE_NAME, redisConnection, type JobData, type JobReply } from '../../api/workers/queue';
import { TEST_SESSION_SECRET } from '../support/api-app';
import { parseEvents } from '../support/event-stream';
import { createProjectTeam, type TestUser } from '../support/factories';
import { startWorkerProcess, type WorkerProcess } from '../support/worker-process';

// More than one machine, on one: two API processes on two ports (MW_WORKERS=0, as on an API-only
// machine) and two worker processes (the entry of `npm run worker`), sharing the test MariaDB and
// one Redis under a queue prefix no other test uses. The stalled-job check runs every 2 s so that
// a worker killed with kill -9 hands its job over quickly.

const root = path.resolve(import.meta.dirname, '..', '..');
const prefix = `mw:test-scale-${process.pid}-${Date.now()}`;
const settings = { significantFigures: 4 };

const shared = {
  MW_DB_NAME: inject('testDbName'),
  MW_QUEUE_PREFIX: prefix,
  MW_QUEUE_STALLED_MS: '2000',
  MW_SESSION_SECRET: TEST_SESSION_SECRET,
};

interface ApiProcess {
  child: ChildProcess;
  base: string;
  output(): string;
}

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as net.AddressInfo;
      server.close(() => resolve(port));
    });
  });
}

/** Starts `api/server.ts` (the entry `npm start` compiles) on a free port, with no workers. */
async function startApiProcess(): Promise<ApiProcess> {
  const port = await freePort();
  const child = spawn(process.execPath, ['--import', 'tsx', 'api/server.ts'], {
    cwd: root,
    env: {
      ...process.env,
      ...shared,
      MW_HOST: '127.0.0.1',
      MW_PORT: String(port),
      MW_WORKERS: '0',
      MW_LOG_REQUESTS: '0',
      MW_QUEUE_PER_PERSON: '20',
      MW_QUEUE_PER_PROJECT: '40',
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let text = '';
  await new Promise<void>((resolve, reject) => {
    const timer = setTimeout(
      () => reject(new Error(`the API process did not start within 60 s:\n${text}`)),
      60_000,
    );
    child.stdout!.on('data', (chunk: Buffer) => {
      text += chunk.toString();
      if (text.includes('Modewright is running at')) {
        clearTimeout(timer);
        resolve();
      }
    });
    child.stderr!.on('data', (chunk: Buffer) => (text += chunk.toString()));
    child.once('exit', (code) => {
      clearTimeout(timer);
      reject(new Error(`the API process exited (code ${code}) before it started:\n${text}`));
    });
  });
  return { child, base: `http://127.0.0.1:${port}`, output: () => text };
}

function stopProcess(child: ChildProcess): Promise<void> {
  if (child.exitCode !== null || child.signalCode !== null) return Promise.resolve();
  return new Promise((resolve) => {
    child.once('exit', () => resolve());
    child.kill('SIGTERM');
    setTimeout(() => child.kill('SIGKILL'), 5000).unref();
  });
}

/** The parts of the API's answers this test reads. */
interface ApiBody {
  csrfToken?: string;
  sheet?: { id: number };
  job?: { id: string };
  results?: { errors: unknown[] };
}

/** A browser's session, used against any API process: its cookie and its CSRF token. */
interface Session {
  cookie: string;
  csrf: string;
}

async function call(
  api: ApiProcess,
  session: Session,
  method: string,
  url: string,
  body?: unknown,
): Promise<{ status: number; body: ApiBody; text: string }> {
  const res = await fetch(api.base + url, {
    method,
    headers: {
      cookie: session.cookie,
      ...(method === 'GET' ? {} : { 'x-csrf-token': session.csrf }),
      ...(body === undefined ? {} : { 'content-type': 'application/json' }),
    },
    ...(body === undefined ? {} : { body: JSON.stringify(body) }),
  });
  const setCookie = res.headers.getSetCookie();
  if (setCookie.length > 0) session.cookie = setCookie.map((c) => c.split(';')[0]).join('; ');
  const text = await res.text();
  let parsed: ApiBody = {};
  try {
    parsed = JSON.parse(text) as ApiBody;
  } catch {
    // server-sent events: read as text
  }
  return { status: res.status, body: parsed, text };
}

async function signIn(api: ApiProcess, person: TestUser): Promise<Session> {
  const session: Session = { cookie: '', csrf: '' };
  session.csrf = (await call(api, session, 'GET', '/api/auth/csrf')).body.csrfToken!;
  const res = await call(api, session, 'POST', '/api/auth/sign-in', {
    email: person.email,
    password: person.password,
  });
  expect(res.status).toBe(200);
  session.csrf = res.body.csrfToken!;
  return session;
}

let db: Knex;
let queue: Queue<JobData, JobReply>;
let apis: ApiProcess[] = [];
let workers: WorkerProcess[] = [];
let author: TestUser;
let projectId: number;

/** A sheet of the test project, made through `api`. */
async function newSheet(api: ApiProcess, session: Session, n: number): Promise<number> {
  const res = await call(api, session, 'POST', `/api/projects/${projectId}/sheets`, {
    number: `SC-${n}-${Date.now() % 100000}`,
    title: `Scale ${n}`,
  });
  expect(res.status).toBe(201);
  return res.body.sheet!.id;
}

/** The worker (of `workers`) whose name a job's processedBy carries (`host:pid`). */
function workerOf(processedBy: string | undefined): WorkerProcess | undefined {
  return workers.find((w) => processedBy?.endsWith(`:${w.pid}`));
}

beforeAll(async () => {
  db = createDb(loadConfig({ sessionSecret: TEST_SESSION_SECRET }).db);
  const team = await createProjectTeam(db);
  author = team.author;
  projectId = team.project.id;
  const queueConfig = loadQueueConfig(inject('testDbName'));
  queue = new Queue<JobData, JobReply>(QUEUE_NAME, {
    connection: redisConnection(queueConfig.redisUrl, false),
    prefix,
  });
  [apis, workers] = await Promise.all([
    Promise.all([startApiProcess(), startApiProcess()]),
    Promise.all([startWorkerProcess(shared), startWorkerProcess(shared)]),
  ]);
}, 180_000);

afterAll(async () => {
  await Promise.all([...apis.map((a) => stopProcess(a.child)), ...workers.map((w) => w.stop())]);
  await queue?.obliterate({ force: true }).catch(() => {});
  await queue?.close();
  await db?.destroy();
}, 60_000);

describe('two API processes and two worker processes on one MariaDB and one Redis', () => {
  it('keeps a session made on one API process on the other', async () => {
    const session = await signIn(apis[0]!, author);
    const me = await call(apis[1]!, session, 'GET', '/api/auth/me');
    expect(me.status).toBe(200);
    expect(JSON.stringify(me.body)).toContain(author.email);
    // A state-changing request on the second process with the token of the first.
    const sheetId = await newSheet(apis[1]!, session, 0);
    const read = await call(apis[0]!, session, 'GET', `/api/sheets/${sheetId}`);
    expect(read.status).toBe(200);
  });

  it('has the evaluations queued through either API process done by either worker', async () => {
    const session = await signIn(apis[0]!, author);
    const sheets = await Promise.all([1, 2, 3, 4, 5, 6].map((n) => newSheet(apis[0]!, session, n)));
    // Each a few hundred milliseconds of work (products of 200×200 matrices), so that while one
    // worker holds a job the other takes the next.
    const answers = await Promise.all(
      sheets.map((sheetId, i) =>
        call(apis[i % 2]!, session, 'POST', `/api/sheets/${sheetId}/evaluate`, {
          blocks: [
            {
              id: 'p',
              kind: 'calc',
              source: `A = ${i + 1} * ones(200, 200)\nB = A * A * A\nb = B[1, 1] / ${(i + 1) ** 3}`,
            },
          ],
          settings,
        }),
      ),
    );
    for (const res of answers) {
      expect(res.status).toBe(200);
      expect(res.body.results!.errors).toEqual([]);
      // (n·J)³[1,1] / n³ = 200² = 40 000 for J the 200×200 ones (J² = 200 J; closed form).
      expect(JSON.stringify(res.body.results)).toContain('40000');
    }
    const done = await queue.getJobs(['completed'], 0, -1);
    expect(done).toHaveLength(6);
    const by = new Set(done.map((job) => workerOf(job.processedBy)?.pid));
    expect(by).toEqual(new Set(workers.map((w) => w.pid)));
  });

  it('finishes a long solve on the other worker when the one holding it is killed, and loses no accepted job', async () => {
    const session = await signIn(apis[1]!, author);
    const longSheet = await newSheet(apis[1]!, session, 10);
    const others = await Promise.all([11, 12].map((n) => newSheet(apis[0]!, session, n)));
    const start = await call(apis[1]!, session, 'POST', `/api/sheets/${longSheet}/evaluations`, {
      blocks: [
        { id: 'a', kind: 'calc', source: 'a = 1' },
        // Some seconds of work (three products of 400×400 matrices): long enough to kill its
        // worker in the middle. (J⁴)[1,1] = 400³ for J the 400×400 ones (closed form, exact).
        { id: 'm', kind: 'calc', source: 'A = ones(400, 400)\nB = A * A * A * A\nb = B[1, 1]' },
      ],
      settings,
    });
    expect(start.status).toBe(202);
    const jobId = start.body.job!.id;
    // Wait until a worker holds it and has reached the slow block.
    let holder: WorkerProcess | undefined;
    for (;;) {
      const job = await queue.getJob(jobId);
      const progress = job?.progress as { blockIndex?: number } | undefined;
      holder = workerOf(job?.processedBy);
      if (holder && (await job!.getState()) === 'active' && progress?.blockIndex === 1) break;
      await new Promise((r) => setTimeout(r, 50));
    }
    // More jobs accepted while it runs, through the other API process.
    const waiting = others.map((sheetId) =>
      call(apis[0]!, session, 'POST', `/api/sheets/${sheetId}/evaluate`, {
        blocks: [{ id: 'x', kind: 'calc', source: 'x = 3 m\ny = 2 x' }],
        settings,
      }),
    );
    const survivor = workers.find((w) => w !== holder)!;
    await holder.stop(true);
    // Followed from the other API process: its events end with the job's results.
    const events = await call(
      apis[0]!,
      session,
      'GET',
      `/api/sheets/${longSheet}/evaluations/${jobId}/events`,
    );
    expect(events.status).toBe(200);
    const last = parseEvents(events.text).at(-1)!;
    expect(last.event).toBe('result');
    const job = last.data as { state: string; results: { errors: unknown[] } };
    expect(job.state).toBe('done');
    expect(job.results.errors).toEqual([]);
    expect(JSON.stringify(job.results)).toContain(String(400 ** 3));
    for (const res of await Promise.all(waiting)) {
      expect(res.status).toBe(200);
      expect(res.body.results!.errors).toEqual([]);
    }
    const finished = await queue.getJob(jobId);
    expect(finished!.processedBy!.endsWith(`:${survivor.pid}`)).toBe(true);
    // Nothing failed, nothing is left waiting or running: every accepted job was done.
    const counts = await queue.getJobCounts('failed', 'waiting', 'prioritized', 'active');
    expect(counts).toEqual({ failed: 0, waiting: 0, prioritized: 0, active: 0 });
    expect((await queue.getJobs(['completed'], 0, -1)).length).toBe(6 + 3);
  }, 180_000);
});
