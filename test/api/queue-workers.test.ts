import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadQueueConfig } from '../../api/config/index';
import { createLogger } from '../../api/http/logger';
import { createJobQueue, type JobQueue } from '../../api/workers/job-queue';
import { startWorkerProcess, type WorkerProcess } from '../support/worker-process';

// The evaluation queue with worker processes of its own (a queue prefix no other test uses):
// two workers with 64 MB evaluation threads and a 2 s stalled-job check; one API side whose jobs
// have a 3 s time limit and one whose jobs have two minutes; one whose jobs bound to a request
// have 1 ms and whose background evaluations have two minutes.

const prefix = `mw:test-workers-${process.pid}-${Date.now()}`;
const workerEnv = { MW_QUEUE_PREFIX: prefix, MW_EVAL_MEMORY_MB: '64', MW_QUEUE_STALLED_MS: '2000' };
const settings = { significantFigures: 4 };
const log = createLogger(false);

let workers: WorkerProcess[] = [];
let short: JobQueue;
let long: JobQueue;
let split: JobQueue;

// Slow enough to meet a 3 s limit on any machine (seven products of 800×800 matrices, about
// 3.6e9 floating-point operations) while small in memory.
const slowSource = 'A = ones(800, 800)\nB = A * A * A * A * A * A * A * A';
// Some seconds on this machine (three products of 400×400), long enough to kill its worker.
const mediumSource = 'A = ones(400, 400)\nB = A * A * A * A\nb = B[1, 1]';
// Far above 64 MB, fast to allocate: five 2000×2000 matrices (32 MB each).
const hungrySource = 'A = ones(2000, 2000)\nB = A + 1\nC = A + 2\nD = A + 3\nE = A + 4';

beforeAll(async () => {
  workers = await Promise.all([startWorkerProcess(workerEnv), startWorkerProcess(workerEnv)]);
  const base = loadQueueConfig('modewright_test');
  short = createJobQueue({ ...base, prefix, timeLimitMs: 3000 }, log);
  long = createJobQueue({ ...base, prefix, timeLimitMs: 120_000 }, log);
  split = createJobQueue({ ...base, prefix, timeLimitMs: 1, solveTimeLimitMs: 120_000 }, log);
}, 120_000);

afterAll(async () => {
  await long?.queue.obliterate({ force: true }).catch(() => {});
  await short?.close();
  await long?.close();
  await split?.close();
  await Promise.all(workers.map((w) => w.stop()));
});

describe('evaluation jobs in worker processes', () => {
  it('evaluates a sheet in a worker process, not in this one', async () => {
    const results = await short.runner(
      { blocks: [{ id: 'a', kind: 'calc', source: 'x = 3 m\ny = 2 x' }], settings } as never,
      [],
      {},
    );
    expect(results.errors).toEqual([]);
    const [done] = await short.queue.getJobs(['completed'], 0, 0);
    const pids = workers.map((w) => `:${w.pid}`);
    expect(pids.some((p) => done!.processedBy!.endsWith(p))).toBe(true);
    expect(done!.processedBy!.endsWith(`:${process.pid}`)).toBe(false);
  });

  it('stops a job at its time limit with a message naming its block; the next job is answered', async () => {
    const sheet = {
      blocks: [
        { id: 'first', kind: 'calc', source: 'a = 2' },
        { id: 'slow', kind: 'calc', source: slowSource },
      ],
      settings,
    };
    await expect(short.runner(sheet as never, [], {})).rejects.toMatchObject({
      status: 422,
      code: 'SHEET_LIMIT',
      message: expect.stringMatching(/^Block 2 \(calc\): .*longer than the 3 s limit/),
      details: { blockId: 'slow', blockIndex: 1 },
    });
    const next = await short.runner(
      { blocks: [{ id: 'a', kind: 'calc', source: 'a = 2' }], settings } as never,
      [],
      {},
    );
    expect(next.errors).toEqual([]);
  });

  it('stops a job at the worker heap limit with a message naming its block; the worker goes on', async () => {
    const sheet = { blocks: [{ id: 'mem', kind: 'calc', source: hungrySource }], settings };
    await expect(short.runner(sheet as never, [], {})).rejects.toMatchObject({
      code: 'SHEET_LIMIT',
      message: expect.stringMatching(/^Block 1 \(calc\): .*more than the 64 MB memory limit/),
      details: { blockId: 'mem' },
    });
    for (const w of workers) expect(w.child.exitCode).toBeNull();
  });

  it('gives a background evaluation the long solve limit, and a request-bound one the short limit', async () => {
    // Two products of 200×200 matrices: far more than 1 ms of work, far less than two minutes.
    const sheet = {
      blocks: [{ id: 'p', kind: 'calc', source: 'A = ones(200, 200)\nB = A * A * A\nb = B[1, 1]' }],
      settings,
    } as never;
    const owner = { userId: 1, projectId: 1, sheetId: 1 };
    await expect(split.runner(sheet, [], {})).rejects.toMatchObject({
      code: 'SHEET_LIMIT',
      message: expect.stringMatching(/longer than the 0\.001 s limit/),
    });
    const jobId = await split.evaluations.start(sheet, [], owner);
    const job = await split.queue.getJob(jobId);
    expect(job!.data.timeLimitMs).toBe(120_000);
    await split.evaluations.follow(jobId, {});
    const view = await split.evaluations.view(jobId);
    expect(view).toMatchObject({ state: 'done' });
    // b = (A·A·A)[1,1] with A the 200×200 ones: 200² = 40 000 (closed form, exact).
    const values = JSON.stringify(view!.state === 'done' ? view!.results : null);
    expect(values).toContain('40000');
  });

  it('cancels a running job when the caller goes away; the worker takes the next', async () => {
    const controller = new AbortController();
    const running = long.runner(
      { blocks: [{ id: 'm', kind: 'calc', source: slowSource }], settings } as never,
      [],
      { signal: controller.signal },
    );
    while ((await long.queue.getJobCounts('active')).active === 0) {
      await new Promise((r) => setTimeout(r, 100));
    }
    controller.abort();
    await expect(running).rejects.toMatchObject({ status: 499, code: 'CANCELLED' });
    // The worker stops the job (it stores a CANCELLED reply) and is free again.
    while (((await long.queue.getJobCounts('active')).active ?? 0) > 0) {
      await new Promise((r) => setTimeout(r, 100));
    }
  });

  it('finishes a job on the other worker when the one holding it is killed (kill -9)', async () => {
    const progress: number[] = [];
    const pending = long.runner(
      {
        blocks: [
          { id: 'a', kind: 'calc', source: 'a = 1' },
          { id: 'm', kind: 'calc', source: mediumSource },
        ],
        settings,
      } as never,
      [],
      { onProgress: (p) => progress.push(p.blockIndex) },
    );
    // Wait until a worker holds it and has reached the slow block.
    let holder: string | undefined;
    while (!holder || !progress.includes(1)) {
      const [job] = await long.queue.getJobs(['active'], 0, 0);
      holder = job?.processedBy;
      await new Promise((r) => setTimeout(r, 50));
    }
    const victim = workers.find((w) => holder!.endsWith(`:${w.pid}`))!;
    const survivor = workers.find((w) => w !== victim)!;
    await victim.stop(true);
    const results = await pending;
    expect(results.errors).toEqual([]);
    const [done] = await long.queue.getJobs(['completed'], 0, 0);
    expect(done!.processedBy!.endsWith(`:${survivor.pid}`)).toBe(true);
    // Its replacement (as the supervisor of npm start would start) joins for the next tests.
    workers = [survivor, await startWorkerProcess(workerEnv)];
  });
});
