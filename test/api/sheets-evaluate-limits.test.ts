import { uploadsService } from '../../api/modules/uploads/uploads.service';
import { readingUploads } from '../../api/workers/sheet-runner';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createSheetsRouter } from '../../api/modules/sheets/sheets.routes';
import { createEvaluationPool, type EvaluationPool } from '../../api/workers/evaluation-pool';
import { createTeamApp, mountBeforeApi, type ApiClient, type TestApp } from '../support/api-app';
import { unique } from '../support/factories';

// The evaluation limits, through the sheet evaluate route on a worker pool of its own: one
// thread, 5 s, 64 MB, a queue of one.

let t: TestApp;
let pool: EvaluationPool;
let client: ApiClient;
let sheetId: number;

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
/**
 * `sheet` with a comment of its own in the data block: a text no evaluation has stored, so that it
 * is evaluated by the pool and not answered from the results store.
 */
function fresh(label: string) {
  const [intro, data, ...rest] = sheet.blocks;
  return {
    ...sheet,
    blocks: [intro, { ...data!, source: `${data!.source}  # ${label} ${unique()}` }, ...rest],
  };
}

// f₁ = √(k/2m)/(2π) with k = 50e6 N/m, m = 100e3 kg.
const f1 = Math.sqrt(50e6 / (2 * 100e3)) / (2 * Math.PI);
// Slow enough to meet the time limit on any machine (seven products of 800×800 matrices, about
// 3.6e9 floating-point operations) while staying small in memory (a few MB per matrix).
const heavy = {
  blocks: [
    { id: 'big', kind: 'calc', source: 'A = ones(800, 800)\nB = A * A * A * A * A * A * A * A' },
  ],
  settings: { significantFigures: 4 },
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
  settings: { significantFigures: 4 },
};

beforeAll(async () => {
  let clients: { author: ApiClient };
  let team: { project: { id: number } };
  ({ t, team, clients } = await createTeamApp(['author']));
  client = clients.author;
  pool = createEvaluationPool({ threads: 1, timeLimitMs: 5000, memoryLimitMb: 64, maxQueue: 1 });
  mountBeforeApi(
    t,
    createSheetsRouter({
      ...t.ctx,
      runner: readingUploads((ref) => uploadsService.readUpload(t.db, ref), pool.run),
    }),
  );
  const res = await client.post(`/api/projects/${team.project.id}/sheets`, {
    number: `LIM-${unique()}`,
    title: 'Evaluation limits',
  });
  expect(res.status).toBe(201);
  sheetId = res.body.sheet.id;
});

afterAll(async () => {
  await pool?.close();
  await t?.close();
});

const evaluate = (body: unknown) => client.post(`/api/sheets/${sheetId}/evaluate`, body);

describe('POST /api/sheets/:sheetId/evaluate, the limits', () => {
  let first: { results: { blocks: { modes: { frequency: number }[] }[] } };

  it('evaluates a sheet with all five block kinds in a worker', async () => {
    const res = await evaluate(fresh('first'));
    expect(res.status).toBe(200);
    expect(res.body.results.errors).toEqual([]);
    expect(res.body.results.summary).toEqual({ passed: 2, failed: 0, errors: 0 });
    const modes = res.body.results.blocks[3];
    // Relative 1e-10 against the closed form (dense solve of a 2×2 pencil).
    expect(Math.abs(modes.modes[0].frequency - f1) / f1).toBeLessThan(1e-10);
    first = res.body;
  });

  it('stops a huge matrix expression at the time limit, answers 429 when the queue is full, and keeps serving the same results after the worker restart', async () => {
    // One thread and a queue of one: the huge expression runs, the next sheet waits, the third
    // request is refused with 429 and a retry hint.
    const huge = evaluate(heavy).then((r) => r);
    await new Promise((r) => setTimeout(r, 300));
    const queued = evaluate(fresh('queued')).then((r) => r);
    await new Promise((r) => setTimeout(r, 300));
    const refused = await evaluate(fresh('refused'));
    expect(refused.status).toBe(429);
    expect(refused.body.error.code).toBe('RATE_LIMITED');
    expect(Number(refused.headers['retry-after'])).toBeGreaterThanOrEqual(1);
    const res = await huge;
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('SHEET_LIMIT');
    expect(res.body.error.message).toMatch(/longer than the 5 s limit/);
    // The terminated worker is replaced; the queued sheet gives bit-identical frequencies.
    const again = await queued;
    expect(again.status).toBe(200);
    expect(again.body.results.blocks[3].modes).toEqual(first.results.blocks[3]!.modes);
  });

  it('stops an evaluation at the memory limit, replaces the worker and keeps serving', async () => {
    const res = await evaluate(hungry);
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('SHEET_LIMIT');
    expect(res.body.error.message).toMatch(/more than the 64 MB memory limit/);
    const again = await evaluate(fresh('after memory'));
    expect(again.status).toBe(200);
    expect(again.body.results.blocks[3].modes).toEqual(first.results.blocks[3]!.modes);
  });

  it('stops a matrix above the size limit before allocating it', async () => {
    const res = await evaluate({
      blocks: [{ id: 'c', kind: 'calc', source: 'A = zeros(100000, 100000)' }],
      settings: { significantFigures: 4 },
    });
    expect(res.status).toBe(200);
    expect(res.body.results.errors[0]).toMatchObject({
      blockId: 'c',
      line: 1,
      code: 'SHEET_LIMIT',
    });
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
