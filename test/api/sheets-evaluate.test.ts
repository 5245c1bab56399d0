import { readFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { anonymous, createTeamApp, type ApiClient, type TestApp } from '../support/api-app';
import { createProjectTeam, unique } from '../support/factories';
import { asText, parseEvents } from '../support/event-stream';

// Evaluating a sheet's draft on the server: the three templates,
// uploads resolved by name, the streamed variant, roles.

const fixtures = path.resolve(import.meta.dirname, '..', 'fixtures', 'uploads');

let t: TestApp;
let team: Awaited<ReturnType<typeof createProjectTeam>>;
let author: ApiClient;
let checker: ApiClient;
let viewer: ApiClient;
let admin: ApiClient;
let outsider: ApiClient;

beforeAll(async () => {
  ({
    t,
    team,
    clients: { author, checker, viewer, admin, outsider },
  } = await createTeamApp(['author', 'checker', 'viewer', 'admin', 'outsider']));
});

afterAll(async () => {
  await t?.close();
});

interface Block {
  id: string;
  kind: string;
  source: string;
}

async function newSheet(template?: string): Promise<{ id: number; blocks: Block[] }> {
  const res = await author.post(`/api/projects/${team.project.id}/sheets`, {
    number: `EV-${unique()}`,
    title: 'Evaluation',
    ...(template ? { template } : {}),
  });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return { id: res.body.sheet.id, blocks: res.body.sheet.draft.blocks };
}

function evaluate(client: ApiClient, sheetId: number, blocks: Block[]) {
  return client.post(`/api/sheets/${sheetId}/evaluate`, {
    blocks,
    settings: { significantFigures: 4 },
  });
}

/** The number a calc line assigned, read from the results (display unit as given there). */
function calcValue(results: ResultsLike, name: string): number {
  for (const b of results.blocks) {
    for (const l of b.lines ?? []) if (l.name === name) return l.value.value as number;
  }
  throw new Error(`no calc line assigns ${name}`);
}

function modesBlock(results: ResultsLike, name: string) {
  const b = results.blocks.find((x) => x.kind === 'modes' && x.name === name);
  if (!b?.modes) throw new Error(`no modes block named ${name}`);
  return b.modes;
}

interface ResultsLike {
  blocks: {
    kind: string;
    name?: string | null;
    lines?: { name: string | null; value: { value: unknown } }[];
    modes?: { mode: number; frequency: number; cumulative: number | null }[];
    criteria?: { pass: boolean; label: string }[];
  }[];
  errors: { message: string; line: number; blockId: string }[];
  summary: { passed: number; failed: number; errors: number };
}

function criteriaOf(results: ResultsLike) {
  return results.blocks.flatMap((b) => b.criteria ?? []);
}

const criteriaLineCount = (blocks: Block[]) =>
  blocks
    .filter((b) => b.kind === 'criteria')
    .flatMap((b) => b.source.split('\n'))
    .filter((l) => l.trim() !== '' && !l.trim().startsWith('#')).length;

describe('POST /api/sheets/:sheetId/evaluate with the templates', () => {
  it('evaluates the footbridge template without errors; the beam model matches the closed form', async () => {
    const sheet = await newSheet('footbridge');
    const res = await evaluate(author, sheet.id, sheet.blocks);
    expect(res.status, JSON.stringify(res.body.error)).toBe(200);
    const results: ResultsLike = res.body.results;
    expect(results.errors).toEqual([]);
    expect(results.summary.errors).toBe(0);
    expect(results.summary.passed + results.summary.failed).toBe(criteriaLineCount(sheet.blocks));
    expect(criteriaOf(results).every((c) => typeof c.pass === 'boolean')).toBe(true);
    expect(res.body.engineVersion).toEqual(expect.any(String));
    expect(res.body.digests.canonicalText).toMatch(/^[0-9a-f]{64}$/);
    expect(res.body.digests.results).toMatch(/^[0-9a-f]{64}$/);

    // Closed form for a pinned–pinned Euler–Bernoulli beam, f_n = (nπ)² / (2π L²) √(EI/m)
    // (REFERENCES.md item 1, βL = nπ), with the template's own numbers: L = 28 m, E = 210 GPa,
    // I_v = 0.033 m⁴, m = 2400 kg/m. Hermite cubic elements converge from above; 16 elements
    // are within 0.1 % for the first mode (tolerance chosen for that mesh).
    const L = 28;
    const EI = 210e9 * 0.033;
    const m = 2400;
    const f1 = (Math.PI / (2 * L * L)) * Math.sqrt(EI / m);
    const deck = modesBlock(results, 'deck_v');
    expect(deck[0]!.frequency).toBeGreaterThanOrEqual(f1 * (1 - 1e-9));
    expect(Math.abs(deck[0]!.frequency / f1 - 1)).toBeLessThan(1e-3);
    expect(calcValue(results, 'f_hand')).toBeCloseTo(f1, 2);
    // f1 ≈ 3.40 Hz: passes the 3.0 Hz and 1.3 Hz guide values and the closed-form check.
    const passes = criteriaOf(results).map((c) => c.pass);
    expect(passes).toEqual([true, true, true]);
  });

  it('evaluates the four-storey frame template; mass ratios add up as the storey chain says', async () => {
    const sheet = await newSheet('four-storey-frame');
    const res = await evaluate(author, sheet.id, sheet.blocks);
    expect(res.status).toBe(200);
    const results: ResultsLike = res.body.results;
    expect(results.errors).toEqual([]);
    expect(results.summary.passed + results.summary.failed).toBe(criteriaLineCount(sheet.blocks));
    const sway = modesBlock(results, 'sway');
    expect(sway).toHaveLength(3);
    // Cumulative effective mass ratios rise and stay at or below 1 (all four modes would give
    // exactly 1: REFERENCES.md "Properties", effective masses add up to rᵀMr).
    const cumulative = sway.map((x) => x.cumulative ?? NaN);
    expect(cumulative[0]!).toBeGreaterThan(0.5);
    expect(cumulative[1]!).toBeGreaterThan(cumulative[0]!);
    expect(cumulative[2]!).toBeGreaterThan(cumulative[1]!);
    expect(cumulative[2]!).toBeLessThanOrEqual(1 + 1e-12);
    expect(criteriaOf(results).every((c) => c.pass)).toBe(true);
  });

  it("evaluates a response block on the frame template's modes and returns its results as they are", async () => {
    const sheet = await newSheet('four-storey-frame');
    const blocks = [
      ...sheet.blocks,
      {
        id: 'rsa',
        kind: 'response',
        source:
          'modes: sway\nanalysis: spectrum\nspectrum: ASCE 7-16\nSDS: 1.0\nSD1: 0.6\nTL: 8 s\nR: 8\ndamping: 0.05\nheights: h\nname: rsa',
      },
      {
        id: 'bad',
        kind: 'response',
        source: 'modes: sway\nanalysis: walking\ndamping: 0.01\nspan: 3',
      },
    ];
    const res = await evaluate(author, sheet.id, blocks);
    expect(res.status).toBe(200);
    const rsa = res.body.results.blocks.find((b: { blockId: string }) => b.blockId === 'rsa');
    expect(rsa).toMatchObject({ kind: 'response', ok: true, analysis: 'spectrum', modes: 'sway' });
    expect(rsa.spectrum.directions[0].modes).toHaveLength(3);
    expect(rsa.spectrum.directions[0].storeys.drift).toHaveLength(4);
    expect(rsa.caution).toMatch(/Code checks remain the engineer’s responsibility/);
    expect(res.body.results.errors).toEqual([
      expect.objectContaining({ blockId: 'bad', line: 4, code: 'SHEET_PARSE' }),
    ]);
    expect(res.body.results.errors[0].message).toMatch(/Unknown key "span"/);
  });

  it('evaluates the pump foundation template; the shifted solve finds both closed-form modes', async () => {
    const sheet = await newSheet('pump-foundation');
    const res = await evaluate(author, sheet.id, sheet.blocks);
    expect(res.status).toBe(200);
    const results: ResultsLike = res.body.results;
    expect(results.errors).toEqual([]);
    expect(results.summary.passed + results.summary.failed).toBe(criteriaLineCount(sheet.blocks));
    // Two-mass chain (closed form): det(K − λM) = 0 with K = [[k1+k2, −k2], [−k2, k2]],
    // M = diag(m1, m2): m1 m2 λ² − (m1 k2 + m2 (k1 + k2)) λ + k1 k2 = 0. The template's numbers:
    // m1 = 48 t, m2 = 7.2 t, k1 = 600 kN/mm, k2 = 300 kN/mm.
    const [m1, m2, k1, k2] = [48e3, 7.2e3, 600e6, 300e6];
    const a = m1 * m2;
    const b = -(m1 * k2 + m2 * (k1 + k2));
    const c = k1 * k2;
    const disc = Math.sqrt(b * b - 4 * a * c);
    const lambdas = [(-b - disc) / (2 * a), (-b + disc) / (2 * a)];
    const expected = lambdas.map((l) => Math.sqrt(l) / (2 * Math.PI));
    const vert = modesBlock(results, 'vert');
    expect(vert).toHaveLength(2);
    vert.forEach((mode, i) => {
      // Relative 1e-9: iterative solve to the engine's default tolerance on λ (1e-10).
      expect(Math.abs(mode.frequency / expected[i]! - 1)).toBeLessThan(1e-9);
    });
    // 1480 rpm = 1480/60 Hz (SI minute): mode 1 sits at 0.66×, mode 2 at 1.44× the running
    // speed, so both clear ±20 % and the 0.5× / 1.5× rule fails.
    expect(criteriaOf(results).map((x) => x.pass)).toEqual([true, true, false]);
  });
});

describe('POST /api/sheets/:sheetId/evaluate', () => {
  it('reads matrix blocks from the sheet uploads by name and solves them', async () => {
    const sheet = await newSheet();
    for (const name of ['chain3-k.mtx', 'chain3-m.mtx']) {
      const up = await author.agent
        .post(`/api/sheets/${sheet.id}/uploads`)
        .set('X-CSRF-Token', author.csrfToken)
        .attach('file', readFileSync(path.join(fixtures, name)), name);
      expect(up.status).toBe(201);
    }
    const blocks: Block[] = [
      { id: 'k', kind: 'matrix', source: 'name: K\nunit: N/m\nfrom: chain3-k.mtx' },
      { id: 'm', kind: 'matrix', source: 'name: M\nunit: kg\nfrom: chain3-m.mtx' },
      { id: 'solve', kind: 'modes', source: 'name: frame\nstiffness: K\nmass: M\ncount: 3' },
    ];
    // The checker evaluates the author's uploads too.
    const res = await evaluate(checker, sheet.id, blocks);
    expect(res.status).toBe(200);
    const results: ResultsLike = res.body.results;
    expect(results.errors).toEqual([]);
    // Reference: the same chain assembled in the test, K = [[48, −24, 0], [−24, 44, −20],
    // [0, −20, 20]]·10⁶ N/m, M = diag(18, 18, 16)·10³ kg; check each λ = ω² by det(K − λM) = 0,
    // relative to ‖K‖ (a residual test independent of how the engine solved it).
    const K = [
      [48e6, -24e6, 0],
      [-24e6, 44e6, -20e6],
      [0, -20e6, 20e6],
    ];
    const M = [18e3, 18e3, 16e3];
    const det3 = (A: number[][]) =>
      A[0]![0]! * (A[1]![1]! * A[2]![2]! - A[1]![2]! * A[2]![1]!) -
      A[0]![1]! * (A[1]![0]! * A[2]![2]! - A[1]![2]! * A[2]![0]!) +
      A[0]![2]! * (A[1]![0]! * A[2]![1]! - A[1]![1]! * A[2]![0]!);
    const modes = modesBlock(results, 'frame');
    expect(modes).toHaveLength(3);
    for (const mode of modes) {
      const lambda = (2 * Math.PI * mode.frequency) ** 2;
      const shifted = K.map((row, i) => row.map((v, j) => v - (i === j ? lambda * M[i]! : 0)));
      // |det(K − λM)| / ‖K‖³ (‖K‖ ≈ 9e7 in the max-row-sum norm): 1e-9 leaves room for λ's
      // relative error of about 1e-10 amplified by the other two factors of the determinant.
      expect(Math.abs(det3(shifted)) / 9e7 ** 3).toBeLessThan(1e-9);
    }
  });

  it('reports an upload name the sheet does not have at its block and line', async () => {
    const sheet = await newSheet();
    const res = await evaluate(author, sheet.id, [
      { id: 'k', kind: 'matrix', source: 'name: K\nunit: N/m\nfrom: missing.mtx' },
    ]);
    expect(res.status).toBe(200);
    const errors = res.body.results.errors as ResultsLike['errors'];
    expect(errors).toHaveLength(1);
    expect(errors[0]).toMatchObject({ blockId: 'k', line: 3 });
    expect(errors[0]!.message).toContain('missing.mtx');
  });

  it('reports a non-symmetric typed matrix used in a modes block with its block', async () => {
    const sheet = await newSheet();
    const res = await evaluate(author, sheet.id, [
      { id: 'k', kind: 'matrix', source: 'name: K\nunit: N/m\n10, 2\n3, 8' },
      { id: 'm', kind: 'matrix', source: 'name: M\nunit: kg\n1, 0\n0, 1' },
      { id: 's', kind: 'modes', source: 'stiffness: K\nmass: M\ncount: 1' },
    ]);
    expect(res.status).toBe(200);
    const errors = res.body.results.errors as ResultsLike['errors'];
    expect(errors.length).toBeGreaterThan(0);
    expect(errors[0]!.blockId).toBe('k');
    expect(errors[0]!.message.toLowerCase()).toContain('symmetric');
  });

  it('refuses someone outside the project with 403 and a signed-out caller with 401', async () => {
    const sheet = await newSheet();
    const blocks = [{ id: 'a', kind: 'calc', source: 'x = 1 m' }];
    expect((await evaluate(outsider, sheet.id, blocks)).status).toBe(403);
    expect((await evaluate(await anonymous(t.app), sheet.id, blocks)).status).toBe(401);
  });

  it('refuses a viewer and an admin outside the project with 403 on every evaluation route', async () => {
    const sheet = await newSheet();
    const body = {
      blocks: [{ id: 'a', kind: 'calc', source: 'x = 1 m' }],
      settings: { significantFigures: 4 },
    };
    const jobId = '00000000-0000-4000-8000-000000000000';
    for (const client of [viewer, admin]) {
      const answers = await Promise.all([
        client.post(`/api/sheets/${sheet.id}/evaluate`, body),
        client.post(`/api/sheets/${sheet.id}/evaluate/stream`, body),
        client.post(`/api/sheets/${sheet.id}/evaluations`, body),
        client.delete(`/api/sheets/${sheet.id}/evaluations/${jobId}`),
      ]);
      for (const res of answers) {
        expect(res.status, JSON.stringify(res.body)).toBe(403);
        expect(res.body.error).toMatchObject({
          code: 'FORBIDDEN',
          message: 'Only an author, checker or principal of this project can evaluate a sheet.',
        });
      }
    }
    // The same text from the author is evaluated.
    expect((await author.post(`/api/sheets/${sheet.id}/evaluate`, body)).status).toBe(200);
  });

  it('refuses a malformed body with 422 naming the field', async () => {
    const sheet = await newSheet();
    const res = await author.post(`/api/sheets/${sheet.id}/evaluate`, { blocks: [{ id: 'a' }] });
    expect(res.status).toBe(422);
    expect(res.body.error.field).toBe('blocks.0.kind');
  });
});

/**
 * `blocks` after a text block of its own: a text no evaluation has stored, so that a worker
 * evaluates it (with its progress) and the results store does not answer it.
 */
function fresh(blocks: unknown[]): unknown[] {
  return [{ id: 'run', kind: 'text', source: `Run ${unique()}.` }, ...blocks];
}

/** POST …/evaluate/stream, the whole event stream read as text. */
function stream(client: ApiClient, sheetId: number, blocks: unknown[]) {
  return asText(
    client.post(`/api/sheets/${sheetId}/evaluate/stream`, {
      blocks,
      settings: { significantFigures: 4 },
    }),
  );
}

describe('POST /api/sheets/:sheetId/evaluate/stream', () => {
  it('streams progress for each block, then the result', async () => {
    const sheet = await newSheet('four-storey-frame');
    const blocks = fresh(sheet.blocks);
    const res = await stream(checker, sheet.id, blocks);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toContain('text/event-stream');
    const events = parseEvents(res.body as string);
    const progress = events.filter((e) => e.event === 'progress');
    expect(progress.length).toBeGreaterThanOrEqual(sheet.blocks.length);
    const last = events.at(-1)!;
    expect(last.event).toBe('result');
    const out = last.data as { results: ResultsLike; digests: { results: string } };
    expect(out.results.errors).toEqual([]);
    expect(out.digests.results).toMatch(/^[0-9a-f]{64}$/);
    // The same text evaluated plainly gives the same results digest.
    const plain = await evaluate(author, sheet.id, blocks as Block[]);
    expect(plain.body.digests.results).toBe(out.digests.results);
  });

  it("streams the solver's progress while a modes block solves", async () => {
    const sheet = await newSheet();
    const blocks = [
      {
        id: 'g',
        kind: 'calc',
        source:
          'girder = beam({E: 210 GPa, I: 0.02 m^4, mass: 1.5 t/m, length: 60 m, elements: 30, ends: "pinned-pinned"})',
      },
      {
        id: 's',
        kind: 'modes',
        source:
          'name: girder_modes\nstiffness: girder.K\nmass: girder.M\nmethod: inverse\ncount: 4',
      },
    ];
    const res = await stream(author, sheet.id, fresh(blocks));
    expect(res.status).toBe(200);
    const solving = parseEvents(res.body as string)
      .filter((e) => e.event === 'progress')
      .map((e) => e.data as { stage?: string; modesConverged?: number; fraction: number })
      .filter((p) => p.stage !== undefined);
    expect(solving.length).toBeGreaterThanOrEqual(4);
    expect(solving.at(-1)).toMatchObject({ stage: 'inverse iteration', modesConverged: 4 });
    // Block 2 of 2 with all four modes converged: the fraction is (1 + 4/4) / 2 = 1.
    expect(solving.at(-1)!.fraction).toBe(1);
  });

  it('refuses someone outside the project with a plain 403 before the stream opens', async () => {
    const sheet = await newSheet();
    const res = await outsider.post(`/api/sheets/${sheet.id}/evaluate/stream`, {
      blocks: [],
      settings: { significantFigures: 4 },
    });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('FORBIDDEN');
  });
});
