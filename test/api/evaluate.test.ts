import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createEvaluateRouter } from '../../api/modules/evaluate/evaluate.routes';
import { createEvaluationPool, type EvaluationPool } from '../../api/workers/evaluation-pool';
import {
  anonymous,
  createTestApp,
  mountBeforeApi,
  signedIn,
  type ApiClient,
  type TestApp,
} from '../support/api-app';
import { createUser } from '../support/factories';

let t: TestApp;
let pool: EvaluationPool;
let client: ApiClient;

// A sheet with all five kinds of block: two-storey shear frame of REFERENCES.md item 3
// (masses 2m and m, stiffnesses 2k and k; ω₁ = √(k/2m), Chopra ch. 10, from memory).
const sheet = {
  blocks: [
    {
      id: 'intro',
      kind: 'text',
      source: 'Two-storey frame, sway modes. $f_1$ from the storey chain.',
    },
    {
      id: 'data',
      kind: 'calc',
      source:
        'm_0 = 100 t  # roof mass\nk_0 = 50 kN/mm  # top storey\nframe = storey_chain([2 m_0, m_0], [2 k_0, k_0])',
    },
    { id: 'kmat', kind: 'matrix', source: 'name: K_typed\nunit: kN/mm\n150, -50\n-50, 50' },
    {
      id: 'solve',
      kind: 'modes',
      source: 'stiffness: frame.K\nmass: frame.M\ncount: 2\nname: floor',
    },
    {
      id: 'checks',
      kind: 'criteria',
      source:
        'floor.f[1] >= 2 Hz  # fundamental above 2 Hz\nfloor.cumulative[2] >= 0.9  # 90 % of the mass (ASCE 7-16 §12.9.1.1, from memory)',
    },
  ],
  settings: { significantFigures: 4 },
};
// f₁ = √(k/2m)/(2π) with k = 50e6 N/m, m = 100e3 kg.
const f1 = Math.sqrt(50e6 / (2 * 100e3)) / (2 * Math.PI);
// Slow enough to meet the time limit on any machine (seven products of 800×800 matrices, about
// 3.6e9 floating-point operations) while staying small in memory (a few MB per matrix).
const heavy = {
  blocks: [
    { id: 'big', kind: 'calc', source: 'A = ones(800, 800)\nB = A * A * A * A * A * A * A * A' },
  ],
};
// Fast to allocate and far above 64 MB: five 2000×2000 matrices (4e6 doubles, 32 MB each).
const hungry = {
  blocks: [
    {
      id: 'mem',
      kind: 'calc',
      source: 'A = ones(2000, 2000)\nB = A + 1\nC = A + 2\nD = A + 3\nE = A + 4',
    },
  ],
};

beforeAll(async () => {
  t = await createTestApp();
  pool = createEvaluationPool({ threads: 1, timeLimitMs: 5000, memoryLimitMb: 64, maxQueue: 1 });
  mountBeforeApi(
    t,
    createEvaluateRouter({ db: t.db, config: t.config, log: console } as never, { run: pool.run }),
  );
  client = await signedIn(t.app, await createUser(t.db));
});

afterAll(async () => {
  await pool?.close();
  await t?.close();
});

describe('POST /api/evaluate', () => {
  let first: { digests: { canonicalText: string; results: string } };

  it('answers 401 when signed out', async () => {
    const res = await (await anonymous(t.app)).post('/api/evaluate', sheet);
    expect(res.status).toBe(401);
  });

  it('answers 422 naming the field for a repeated block id', async () => {
    const res = await client.post('/api/evaluate', { blocks: [sheet.blocks[0], sheet.blocks[0]] });
    expect(res.status).toBe(422);
    expect(res.body.error.field).toBe('blocks.1.id');
  });

  it('evaluates a sheet with all five block kinds in a worker', async () => {
    const res = await client.post('/api/evaluate', sheet);
    expect(res.status).toBe(200);
    expect(res.body.results.errors).toEqual([]);
    expect(res.body.results.summary).toEqual({ passed: 2, failed: 0, errors: 0 });
    const modes = res.body.results.blocks[3];
    // Relative 1e-10 against the closed form (dense solve of a 2×2 pencil).
    expect(Math.abs(modes.modes[0].frequency - f1) / f1).toBeLessThan(1e-10);
    expect(res.body.digests.canonicalText).toMatch(/^[0-9a-f]{64}$/);
    expect(res.body.digests.results).toMatch(/^[0-9a-f]{64}$/);
    expect(res.body.engineVersion).toMatch(/modewright-sheet/);
    expect(res.body.canonicalText.startsWith('#% text intro\n')).toBe(true);
    first = res.body;
  });

  it('gives the same digests on a second run', async () => {
    const res = await client.post('/api/evaluate', sheet);
    expect(res.body.digests).toEqual(first.digests);
  });

  it('stops a huge matrix expression at the time limit, answers 429 when the queue is full, and keeps serving with the same digests after the worker restart', async () => {
    // One thread and a queue of one: the huge expression runs, the next sheet waits, the third
    // request is refused with 429 and a retry hint.
    const huge = client.post('/api/evaluate', heavy).then((r) => r);
    await new Promise((r) => setTimeout(r, 300));
    const queued = client.post('/api/evaluate', sheet).then((r) => r);
    await new Promise((r) => setTimeout(r, 300));
    const refused = await client.post('/api/evaluate', sheet);
    expect(refused.status).toBe(429);
    expect(refused.body.error.code).toBe('RATE_LIMITED');
    expect(Number(refused.headers['retry-after'])).toBeGreaterThanOrEqual(1);
    const res = await huge;
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('SHEET_LIMIT');
    expect(res.body.error.message).toMatch(/longer than the 5 s limit/);
    // The terminated worker is replaced; the queued sheet gives byte-identical digests.
    const again = await queued;
    expect(again.status).toBe(200);
    expect(again.body.digests).toEqual(first.digests);
  });

  it('stops an evaluation at the memory limit, replaces the worker and keeps serving', async () => {
    const res = await client.post('/api/evaluate', hungry);
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('SHEET_LIMIT');
    expect(res.body.error.message).toMatch(/more than the 64 MB memory limit/);
    const again = await client.post('/api/evaluate', sheet);
    expect(again.status).toBe(200);
    expect(again.body.digests).toEqual(first.digests);
  });

  it('stops a matrix above the size limit before allocating it', async () => {
    const res = await client.post('/api/evaluate', {
      blocks: [{ id: 'c', kind: 'calc', source: 'A = zeros(100000, 100000)' }],
    });
    expect(res.status).toBe(200);
    expect(res.body.results.errors[0]).toMatchObject({
      blockId: 'c',
      line: 1,
      code: 'SHEET_LIMIT',
    });
  });
});

describe('POST /api/evaluate/stream', () => {
  it('streams progress per block, then the result', async () => {
    const res = await client
      .post('/api/evaluate/stream', sheet)
      .buffer(true)
      .parse((r, cb) => {
        let text = '';
        r.on('data', (c: Buffer) => (text += c.toString('utf8')));
        r.on('end', () => cb(null, text));
      });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/event-stream/);
    const events = String(res.body)
      .split('\n\n')
      .filter((e) => e.trim() !== '')
      .map((e) => {
        const [ev, data] = e.split('\n');
        return { event: ev!.replace('event: ', ''), data: JSON.parse(data!.replace('data: ', '')) };
      });
    expect(events.map((e) => e.event).join(' '), String(res.body)).toMatch(/result$/);
    expect(events.filter((e) => e.event === 'progress').map((e) => e.data.blockId)).toEqual(
      sheet.blocks.map((b) => b.id),
    );
    const last = events[events.length - 1]!;
    expect(last.event).toBe('result');
    expect(last.data.results.summary.passed).toBe(2);
  });

  it('answers 401 when signed out', async () => {
    const res = await (await anonymous(t.app)).post('/api/evaluate/stream', sheet);
    expect(res.status).toBe(401);
  });
});

describe('POST /api/evaluate/diff', () => {
  it('diffs a sheet against an edited copy: lines, results and flipped criteria', async () => {
    const edited = structuredClone(sheet);
    // Roof mass 100 t → 400 t halves f₁ (f ∝ 1/√m): 2.52 Hz → 1.26 Hz, so the 2 Hz check flips.
    edited.blocks[1]!.source = edited.blocks[1]!.source.replace('m_0 = 100 t', 'm_0 = 400 t');
    const res = await client.post('/api/evaluate/diff', { old: sheet, new: edited });
    expect(res.status).toBe(200);
    const data = res.body.diff.blocks.find((b: { blockId: string }) => b.blockId === 'data');
    expect(data.status).toBe('changed');
    expect(data.hunks[0]).toMatchObject({
      oldStart: 1,
      removed: ['m_0 = 100 t  # roof mass'],
      added: ['m_0 = 400 t  # roof mass'],
    });
    const f = res.body.diff.results.find((r: { key: string }) => r.key === 'mode 1 f');
    expect(Math.abs(f.relativeChange - (0.5 - 1))).toBeLessThan(1e-10);
    expect(res.body.diff.flipped).toEqual([
      { blockId: 'checks', label: 'fundamental above 2 Hz', line: 1, was: true, now: false },
    ]);
    expect(res.body.old.digests.canonicalText).not.toBe(res.body.new.digests.canonicalText);
  });

  it('answers 422 when a sheet is missing', async () => {
    const res = await client.post('/api/evaluate/diff', { old: sheet });
    expect(res.status).toBe(422);
    expect(res.body.error.field).toBe('new');
  });
});

describe('evaluation pool', () => {
  it('cancels an evaluation when its signal aborts', async () => {
    const controller = new AbortController();
    const p = pool.run(heavy as never, [], { signal: controller.signal });
    setTimeout(() => controller.abort(), 200);
    await expect(p).rejects.toMatchObject({ status: 499, code: 'CANCELLED' });
  });
});
