import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadQueueConfig } from '../../api/config/index';
import { createLogger } from '../../api/http/logger';
import { uploadsService } from '../../api/modules/uploads/uploads.service';
import { createJobQueue, type JobQueue } from '../../api/workers/job-queue';
import {
  createSheetWithDraft,
  createTeamApp,
  type ApiClient,
  type TestApp,
} from '../support/api-app';
import { startWorkerProcess, type WorkerProcess } from '../support/worker-process';

// The queue's fair shares through POST /api/sheets/:id/evaluate, on a queue of their own (a
// prefix no other test uses) with one worker process: two evaluations per person, three per
// project, uploads of 100 bytes and more make a large solve. The queue is paused while the jobs
// are queued, so that they wait.

const prefix = `mw:test-shares-${process.pid}-${Date.now()}`;
const settings = { significantFigures: 4 };
const shares = { perPerson: 2, perProject: 3, largeBytes: 100 };

let t: TestApp;
let worker: WorkerProcess;
let clients: Record<'author' | 'checker' | 'principal' | 'outsider', ApiClient>;
let jobs: JobQueue;
const sheets: number[] = [];

// Each text carries this run's tag, so that no result stored by an earlier run answers it (the
// results store answers an unchanged text without a job).
const run = `${process.pid}-${Date.now()}`;
const draft = (source: string) => ({
  blocks: [{ id: 'c', kind: 'calc', source: `${source}  # run ${run}` }],
  settings,
});

async function waitingCount(): Promise<number> {
  const counts = await jobs.queue.getJobCounts('waiting', 'prioritized');
  return (counts.waiting ?? 0) + (counts.prioritized ?? 0);
}

async function untilWaiting(n: number): Promise<void> {
  while ((await waitingCount()) < n) await new Promise((r) => setTimeout(r, 50));
}

beforeAll(async () => {
  worker = await startWorkerProcess({ MW_QUEUE_PREFIX: prefix });
  const queue = { ...loadQueueConfig('modewright_test'), prefix, ...shares };
  let team: { project: { id: number } };
  ({ t, team, clients } = await createTeamApp(['author', 'checker', 'principal', 'outsider'], {
    queue,
  }));
  for (let i = 0; i < 3; i++) {
    const s = await createSheetWithDraft(
      clients.author,
      team.project.id,
      { number: `Q-${i}`, title: `Queue ${i}` },
      [{ id: 'c', kind: 'calc', source: 'a = 1' }],
    );
    sheets.push(s.id);
  }
  jobs = createJobQueue(queue, createLogger(false));
}, 120_000);

afterAll(async () => {
  await jobs?.queue.obliterate({ force: true }).catch(() => {});
  await jobs?.close();
  await t?.close();
  await worker?.stop();
});

describe('fair shares of the evaluation queue', () => {
  it('refuses a person who is not a member of the sheet’s project before queuing', async () => {
    const res = await clients.outsider.post(`/api/sheets/${sheets[0]}/evaluate`, draft('a = 1'));
    expect(res.status).toBe(403);
    expect(await waitingCount()).toBe(0);
  });

  it('replaces a person’s older waiting evaluation of the same sheet with the newer one', async () => {
    await jobs.queue.pause();
    const older = clients.author
      .post(`/api/sheets/${sheets[0]}/evaluate`, draft('a = 1'))
      .then((r) => r);
    await untilWaiting(1);
    const newer = clients.author
      .post(`/api/sheets/${sheets[0]}/evaluate`, draft('a = 2'))
      .then((r) => r);
    const first = await older;
    expect(first.status).toBe(409);
    expect(first.body.error.code).toBe('SUPERSEDED');
    expect(first.body.error.message).toMatch(/newer evaluation/);
    expect(await waitingCount()).toBe(1);
    await jobs.queue.resume();
    const second = await newer;
    expect(second.status).toBe(200);
    expect(second.body.results.errors).toEqual([]);
  });

  it('caps the evaluations of one person, then those of one project', async () => {
    await jobs.queue.pause();
    const a0 = clients.author
      .post(`/api/sheets/${sheets[0]}/evaluate`, draft('a = 1'))
      .then((r) => r);
    const a1 = clients.author
      .post(`/api/sheets/${sheets[1]}/evaluate`, draft('a = 1'))
      .then((r) => r);
    await untilWaiting(2);
    const third = await clients.author.post(`/api/sheets/${sheets[2]}/evaluate`, draft('a = 1'));
    expect(third.status).toBe(429);
    expect(third.body.error.message).toMatch(/limit per person is 2/);
    expect(Number(third.headers['retry-after'])).toBeGreaterThanOrEqual(1);

    // The checker's one fills the project's three; the principal's is refused.
    const c0 = clients.checker
      .post(`/api/sheets/${sheets[2]}/evaluate`, draft('a = 1'))
      .then((r) => r);
    await untilWaiting(3);
    const p0 = await clients.principal.post(`/api/sheets/${sheets[2]}/evaluate`, draft('a = 1'));
    expect(p0.status).toBe(429);
    expect(p0.body.error.message).toMatch(/limit per project is 3/);

    await jobs.queue.resume();
    for (const r of await Promise.all([a0, a1, c0])) expect(r.status).toBe(200);
    // Once they are done, the principal's goes through.
    const later = await clients.principal.post(`/api/sheets/${sheets[2]}/evaluate`, draft('a = 1'));
    expect(later.status).toBe(200);
  });

  it('takes a small evaluation ahead of a large solve queued before it', async () => {
    // A file of 160 bytes (over the 100 of a large solve), stored on a sheet; the job names it.
    const up = await clients.author.agent
      .post(`/api/sheets/${sheets[0]}/uploads`)
      .set('X-CSRF-Token', clients.author.csrfToken)
      .attach('file', Buffer.from('1,0\n0,1\n'.repeat(20)), 'big.csv');
    expect(up.status, JSON.stringify(up.body)).toBe(201);
    const big = await uploadsService.refsForSheet(t.db, sheets[0]!);
    expect(big).toMatchObject([{ name: 'big.csv', size: 160 }]);
    await jobs.queue.pause();
    const large = jobs.runner(draft('a = 1') as never, big, {});
    await untilWaiting(1);
    const small = jobs.runner(draft('b = 1') as never, [], {});
    await untilWaiting(2);
    await jobs.queue.resume();
    await Promise.all([large, small]);
    const done = await jobs.queue.getJobs(['completed'], 0, 1);
    const largeJob = done.find((j) => j.data.kind === 'evaluate' && j.data.uploads.length === 1)!;
    const smallJob = done.find((j) => j.data.kind === 'evaluate' && j.data.uploads.length === 0)!;
    expect(largeJob.priority).toBeGreaterThan(smallJob.priority);
    // One worker: the small one, queued second, was started first.
    expect(smallJob.processedOn!).toBeLessThanOrEqual(largeJob.processedOn!);
    expect(smallJob.finishedOn!).toBeLessThanOrEqual(largeJob.processedOn!);
  });
});
