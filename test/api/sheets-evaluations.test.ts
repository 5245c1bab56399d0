import { readFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createLogger } from '../../api/http/logger';
import { resultsDigest } from '../../api/modules/sheets/sheets.evaluate';
import { uploadsService } from '../../api/modules/uploads/uploads.service';
import { createJobQueue, type JobQueue } from '../../api/workers/job-queue';
import { jobName } from '../../api/workers/queue';
import { evaluateSheet, type Sheet } from '../../core/index';
import {
  createSheetWithDraft,
  createTeamApp,
  type ApiClient,
  type TestApp,
} from '../support/api-app';
import { asText, parseEvents } from '../support/event-stream';

// Evaluations not bound to a request: started, followed by server-sent events, found again as
// the person's latest, cancelled; only their owner follows or cancels them; an unchanged text is
// answered from the results store with no job; a job names its uploads and carries no file.
// Done by the test worker process of the global setup.

const fixtures = path.resolve(import.meta.dirname, '..', 'fixtures', 'uploads');
let t: TestApp;
let team: { project: { id: number }; author: { id: number } };
let clients: Record<'author' | 'checker' | 'outsider', ApiClient>;
let sheetId: number;
/** The app's queue, read through BullMQ's Queue API (same Redis and prefix as the app's). */
let jobs: JobQueue;
const settings = { significantFigures: 4 };
// Each text carries this run's tag, so that no result stored by an earlier run answers it.
const run = `${process.pid}-${Date.now()}`;
let runs = 0;
/** `blocks` after a text block no evaluation has seen yet. */
const fresh = (blocks: unknown[]) => [
  { id: 'run', kind: 'text', source: `Run ${run}-${++runs}.` },
  ...blocks,
];
// Two storeys, 2m and m over 2k and k (Chopra ch. 10, from memory): ω₁² = k/(2m).
const frame = [
  {
    id: 'data',
    kind: 'calc',
    source: 'frame = storey_chain([200 t, 100 t], [100 kN/mm, 50 kN/mm])',
  },
  { id: 'm', kind: 'modes', source: 'stiffness: frame.K\nmass: frame.M\ncount: 2\nname: sway' },
];

function events(client: ApiClient, jobId: string) {
  return asText(client.get(`/api/sheets/${sheetId}/evaluations/${jobId}/events`));
}

beforeAll(async () => {
  ({ t, team, clients } = await createTeamApp(['author', 'checker', 'outsider']));
  sheetId = (
    await createSheetWithDraft(clients.author, team.project.id, { number: 'BG-1', title: 'Bg' }, [])
  ).id;
  jobs = createJobQueue(t.config.queue, createLogger(false));
});

afterAll(async () => {
  await jobs?.close();
  await t?.close();
});

/** The evaluation jobs of the author on `sheet` the queue holds, in any state. */
async function jobsOn(sheet: number) {
  const name = jobName('evaluate', {
    userId: team.author.id,
    projectId: team.project.id,
    sheetId: sheet,
  });
  const all = await jobs.queue.getJobs(
    ['completed', 'failed', 'active', 'waiting', 'prioritized', 'delayed'],
    0,
    -1,
  );
  return all.filter((j) => j.name === name);
}

/** Starts a background evaluation of `blocks` on `sheet` and follows it to its last event. */
async function startAndFollow(sheet: number, blocks: unknown[]) {
  const start = await clients.author.post(`/api/sheets/${sheet}/evaluations`, {
    blocks,
    settings,
  });
  expect(start.status, JSON.stringify(start.body)).toBe(202);
  const jobId = start.body.job.id as string;
  const res = await asText(clients.author.get(`/api/sheets/${sheet}/evaluations/${jobId}/events`));
  return { jobId, last: parseEvents(res.body as string).at(-1)! };
}

/** A new sheet of the project with an empty draft, numbered `<prefix>-<run>`. */
async function emptySheet(prefix: string, title: string): Promise<number> {
  const sheet = { number: `${prefix}-${run}`, title };
  return (await createSheetWithDraft(clients.author, team.project.id, sheet, [])).id;
}

async function upload(sheet: number, name: string, bytes: Buffer) {
  const res = await clients.author.agent
    .post(`/api/sheets/${sheet}/uploads`)
    .set('X-CSRF-Token', clients.author.csrfToken)
    .attach('file', bytes, name);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
}

describe('evaluations in the background', () => {
  it('starts one, follows it to its results and finds it again as the latest', async () => {
    const blocks = fresh(frame);
    const start = await clients.author.post(`/api/sheets/${sheetId}/evaluations`, {
      blocks,
      settings,
    });
    expect(start.status).toBe(202);
    const jobId = start.body.job.id as string;
    const res = await events(clients.author, jobId);
    expect(res.status).toBe(200);
    const list = parseEvents(res.body as string);
    const result = list.at(-1)!;
    expect(result.event).toBe('result');
    const job = result.data as { state: string; results: { errors: unknown[] }; digests: object };
    expect(job.state).toBe('done');
    expect(job.results.errors).toEqual([]);
    expect(job.digests).toBeTruthy();

    const latest = await clients.author.get(`/api/sheets/${sheetId}/evaluations/latest`);
    expect(latest.status).toBe(200);
    expect(latest.body.job).toMatchObject({
      id: jobId,
      state: 'done',
      fromStore: false,
      draft: { blocks },
    });
    // ω₁ = √(k/2m) with k = 50e6 N/m, m = 100e3 kg (the closed form of the two-storey chain);
    // relative 1e-9: the engine's default tolerance on λ is 1e-10.
    const f1 = Math.sqrt(50e6 / 200e3) / (2 * Math.PI);
    const resultBlocks = latest.body.job.results.blocks as {
      name?: string;
      modes?: { frequency: number }[];
    }[];
    const sway = resultBlocks.find((b) => b.name === 'sway')!.modes!;
    expect(Math.abs(sway[0]!.frequency / f1 - 1)).toBeLessThan(1e-9);
  });

  it('keeps it to its owner: another member gets 404, an outsider 403', async () => {
    const start = await clients.author.post(`/api/sheets/${sheetId}/evaluations`, {
      blocks: fresh(frame),
      settings,
    });
    expect(start.status).toBe(202);
    const jobId = start.body.job.id as string;
    expect((await events(clients.checker, jobId)).status).toBe(404);
    expect(
      (await clients.checker.delete(`/api/sheets/${sheetId}/evaluations/${jobId}`)).status,
    ).toBe(404);
    expect((await clients.checker.get(`/api/sheets/${sheetId}/evaluations/latest`)).body.job).toBe(
      null,
    );
    const outsider = await clients.outsider.post(`/api/sheets/${sheetId}/evaluations`, {
      blocks: frame,
      settings,
    });
    expect(outsider.status).toBe(403);
    await events(clients.author, jobId);
  });

  it('cancels a running one at its owner’s request', async () => {
    const start = await clients.author.post(`/api/sheets/${sheetId}/evaluations`, {
      blocks: fresh([
        { id: 'slow', kind: 'calc', source: 'A = ones(800, 800)\nB = A * A * A * A * A' },
      ]),
      settings,
    });
    const jobId = start.body.job.id as string;
    let state = '';
    while (state !== 'running') {
      state = (await clients.author.get(`/api/sheets/${sheetId}/evaluations/latest`)).body.job
        .state;
      await new Promise((r) => setTimeout(r, 100));
    }
    expect(
      (await clients.author.delete(`/api/sheets/${sheetId}/evaluations/${jobId}`)).status,
    ).toBe(204);
    const res = await events(clients.author, jobId);
    const last = parseEvents(res.body as string).at(-1)!;
    expect(last.event).toBe('error');
    expect(last.data).toMatchObject({ error: { code: 'CANCELLED' } });
  });
});

describe('background evaluations and the results store', () => {
  it('answers an unchanged text from the store at once and queues no job', async () => {
    const blocks = fresh(frame);
    const first = await startAndFollow(sheetId, blocks);
    expect(first.last.event).toBe('result');
    const done = first.last.data as { results: unknown; digests: unknown; fromStore: boolean };
    expect(done.fromStore).toBe(false);
    // The worker kept the results under the sheet's digest (no uploads on this sheet).
    const digest = resultsDigest({ blocks, settings } as unknown as Sheet, []);
    expect(await t.db('evaluation_results').where({ digest }).first('digest')).toBeTruthy();
    const before = await jobsOn(sheetId);
    expect(before.some((j) => j.id === first.jobId)).toBe(true);

    const again = await clients.author.post(`/api/sheets/${sheetId}/evaluations`, {
      blocks,
      settings,
    });
    expect(again.status).toBe(200);
    expect(again.body.job).toMatchObject({ id: null, state: 'done', fromStore: true });
    expect(again.body.job.results).toEqual(done.results);
    expect(again.body.job.digests).toEqual(done.digests);
    // No job was queued for it.
    expect((await jobsOn(sheetId)).map((j) => j.id).sort()).toEqual(before.map((j) => j.id).sort());

    // A changed text is evaluated by a job again.
    const changed = await startAndFollow(sheetId, [
      ...blocks,
      { id: 'more', kind: 'calc', source: 'y = 2 m' },
    ]);
    expect(changed.last.data).toMatchObject({ state: 'done', fromStore: false });
  });

  it('evaluates again when the sheet gains an upload, and keys on the engine version', async () => {
    const sheet = await emptySheet('BG-U', 'Uploads');
    await upload(sheet, 'chain3-k.mtx', readFileSync(path.join(fixtures, 'chain3-k.mtx')));
    const blocks = fresh([
      { id: 'k', kind: 'matrix', source: 'name: K\nunit: N/m\nfrom: chain3-k.mtx' },
    ]);
    // Results kept for the same text and uploads by another engine version do not answer it.
    const refs = await uploadsService.refsForSheet(t.db, sheet);
    const sheetText = { blocks, settings } as unknown as Sheet;
    const older = resultsDigest(sheetText, refs, 'an-older-engine');
    expect(older).not.toBe(resultsDigest(sheetText, refs));
    await t.db('evaluation_results').insert({
      digest: older,
      engine_version: 'an-older-engine',
      results_json: JSON.stringify({ blocks: [], errors: [], summary: {} }),
      created_at: t.db.raw('NOW(3)'),
      used_at: t.db.raw('NOW(3)'),
    });
    const first = await startAndFollow(sheet, blocks);
    expect(first.last.data).toMatchObject({ state: 'done', fromStore: false });
    const stored = await clients.author.post(`/api/sheets/${sheet}/evaluations`, {
      blocks,
      settings,
    });
    expect(stored.body.job).toMatchObject({ state: 'done', fromStore: true });

    // A second file on the sheet changes the key: a job evaluates the same text again.
    await upload(sheet, 'chain3-m.mtx', readFileSync(path.join(fixtures, 'chain3-m.mtx')));
    const after = await startAndFollow(sheet, blocks);
    expect(after.last.data).toMatchObject({ state: 'done', fromStore: false });
  });

  it('names the uploads in the job by id and digest, never their text, with the same results', async () => {
    const sheet = await emptySheet('BG-F', 'Files');
    const texts = ['chain3-k.mtx', 'chain3-m.mtx'].map((name) => ({
      name,
      text: readFileSync(path.join(fixtures, name), 'utf8'),
    }));
    for (const f of texts) await upload(sheet, f.name, Buffer.from(f.text));
    const blocks = fresh([
      { id: 'k', kind: 'matrix', source: 'name: K\nunit: N/m\nfrom: chain3-k.mtx' },
      { id: 'm', kind: 'matrix', source: 'name: M\nunit: kg\nfrom: chain3-m.mtx' },
      { id: 'solve', kind: 'modes', source: 'name: chain\nstiffness: K\nmass: M\ncount: 3' },
    ]);
    const { jobId, last } = await startAndFollow(sheet, blocks);
    expect(last.event).toBe('result');

    const job = (await jobs.queue.getJob(jobId))!;
    const refs = await uploadsService.refsForSheet(t.db, sheet);
    expect(job.data).toMatchObject({ kind: 'evaluate', uploads: refs });
    if (job.data.kind !== 'evaluate') throw new Error('not an evaluation job');
    for (const ref of job.data.uploads) {
      expect(Object.keys(ref).sort()).toEqual(['id', 'name', 'sha256', 'size']);
    }
    // Not a line of either file is in the job's data as Redis holds it.
    const raw = JSON.stringify(job.data);
    for (const f of texts) {
      for (const line of f.text.split('\n').filter((l) => /^\d+ \d+ /.test(l))) {
        expect(raw).not.toContain(line);
      }
    }
    expect(raw).not.toContain('%%MatrixMarket');

    // The same results as the engine gives in this process with the files' texts.
    const results = (last.data as { results: unknown }).results;
    expect(results).toEqual(
      JSON.parse(
        JSON.stringify(
          evaluateSheet({ blocks, settings } as unknown as Sheet, {
            uploads: texts,
          }),
        ),
      ),
    );
  });

  it('refuses stored bytes that are not the size and digest the job names', async () => {
    const sheet = await emptySheet('BG-D', 'Digest');
    await upload(sheet, 'chain3-k.mtx', readFileSync(path.join(fixtures, 'chain3-k.mtx')));
    const [ref] = await uploadsService.refsForSheet(t.db, sheet);
    await expect(uploadsService.readUpload(t.db, ref!)).resolves.toMatchObject({
      name: 'chain3-k.mtx',
    });
    await expect(
      uploadsService.readUpload(t.db, { ...ref!, sha256: '0'.repeat(64) }),
    ).rejects.toMatchObject({ status: 409, code: 'UPLOAD_CHANGED' });
    // A smaller size named than the bytes stored: inflating stops at it.
    await expect(
      uploadsService.readUpload(t.db, { ...ref!, size: ref!.size - 10 }),
    ).rejects.toMatchObject({ status: 409, code: 'UPLOAD_CHANGED' });
  });
});
