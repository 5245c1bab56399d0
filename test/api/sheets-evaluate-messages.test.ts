import { readFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTeamApp, type ApiClient, type TestApp } from '../support/api-app';
import { createProjectTeam, unique } from '../support/factories';

// What POST /api/sheets/:id/evaluate says about a sheet's mistakes: one error where the slip is
// and notes on what it left unevaluated, the library's messages in the sheet's terms, and the
// DOF labels of uploaded matrices (with the place when they disagree with the matrix).

const fixtures = path.resolve(import.meta.dirname, '..', 'fixtures', 'uploads');

let t: TestApp;
let team: Awaited<ReturnType<typeof createProjectTeam>>;
let author: ApiClient;

beforeAll(async () => {
  ({
    t,
    team,
    clients: { author },
  } = await createTeamApp(['author']));
});

afterAll(async () => {
  await t?.close();
});

interface Issue {
  blockId: string;
  blockIndex: number;
  line: number;
  message: string;
  code: string;
  severity?: string;
}

async function newSheet(): Promise<number> {
  const res = await author.post(`/api/projects/${team.project.id}/sheets`, {
    number: `EM-${unique()}`,
    title: 'Messages',
  });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.sheet.id as number;
}

async function upload(sheetId: number, name: string, content: Buffer | string) {
  const res = await author.agent
    .post(`/api/sheets/${sheetId}/uploads`)
    .set('X-CSRF-Token', author.csrfToken)
    .attach('file', Buffer.from(content), name);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
}

async function evaluate(sheetId: number, blocks: { id: string; kind: string; source: string }[]) {
  const res = await author.post(`/api/sheets/${sheetId}/evaluate`, {
    blocks,
    settings: { significantFigures: 4 },
  });
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body.results as {
    errors: Issue[];
    summary: { errors: number };
    blocks: { kind: string; participationReason?: string | null; modes?: { ratio: number }[] }[];
  };
}

describe('POST /api/sheets/:id/evaluate: messages', () => {
  it('reports a unit slip once and notes the blocks it left unevaluated', async () => {
    const id = await newSheet();
    const r = await evaluate(id, [
      {
        id: 'b1a2b3c4d5e6f',
        kind: 'calc',
        source: 'k_storey = 30 kN\nframe = storey_chain([20 t, 20 t], [k_storey, k_storey])',
      },
      {
        id: 'b1a2b3c4d5e60',
        kind: 'modes',
        source: 'name: plant_x\nstiffness: frame.K\nmass: frame.M\ncount: 2\ndirection: x',
      },
      { id: 'b1a2b3c4d5e61', kind: 'criteria', source: 'plant_x.f[1] >= 1 Hz  # above 1 Hz' },
    ]);
    expect(r.summary.errors).toBe(1);
    expect(r.errors.map((e) => [e.blockIndex, e.line, e.severity ?? 'error'])).toEqual([
      [0, 2, 'error'],
      [1, 2, 'note'],
      [2, 1, 'note'],
    ]);
    expect(r.errors[1]!.message).toBe(
      'Not evaluated: depends on "frame", which failed on line 2 of block 1.',
    );
    expect(r.errors.some((e) => /Unknown name/.test(e.message))).toBe(false);
  });

  it('names a misspelt key of a modes result with its keys and the nearest', async () => {
    const id = await newSheet();
    const r = await evaluate(id, [
      { id: 'c', kind: 'calc', source: 'frame = storey_chain([20 t, 20 t], [30 kN/mm, 30 kN/mm])' },
      {
        id: 'm',
        kind: 'modes',
        source: 'name: plant_x\nstiffness: frame.K\nmass: frame.M\ncount: 2\ndirection: x',
      },
      { id: 'use', kind: 'calc', source: 'share = plant_x.cumulativ[1]' },
    ]);
    expect(r.errors).toEqual([
      expect.objectContaining({
        blockId: 'use',
        line: 1,
        code: 'SHEET_EVAL',
        message: expect.stringMatching(
          /^No key "cumulativ" on "plant_x"; its keys are .*cumulative.* — did you mean "cumulative"\?$/,
        ),
      }),
    ]);
  });

  it('builds direction x of an uploaded model from its DOF map; refuses a map of the wrong size and too large a count at their lines', async () => {
    const id = await newSheet();
    for (const name of ['chain3-k.mtx', 'chain3-m.mtx']) {
      await upload(id, name, readFileSync(path.join(fixtures, name)));
    }
    // The chain's three floors, each one DOF along x: node, component 1 (ux).
    await upload(id, 'chain3-dofs.csv', '1, 1\n2, 1\n3, 1\n');
    await upload(id, 'chain2-dofs.csv', '1, 1\n2, 1\n');
    const blocks = (map: string, count: number) => [
      {
        id: 'k',
        kind: 'matrix',
        source: `name: K\nunit: N/m\nfrom: chain3-k.mtx\ndofs: from ${map}`,
      },
      { id: 'm', kind: 'matrix', source: 'name: M\nunit: kg\nfrom: chain3-m.mtx' },
      {
        id: 's',
        kind: 'modes',
        source: `name: frame\nstiffness: K\nmass: M\nmethod: dense\ncount: ${count}\ndirection: x`,
      },
    ];
    const ok = await evaluate(id, blocks('chain3-dofs.csv', 3));
    expect(ok.errors).toEqual([]);
    // Every floor moves with the ground along x: the effective masses add up to the total
    // (common practice: all modes of a model carry all of rᵀMr). Absolute 1e-12.
    const ratios = ok.blocks[2]!.modes!.map((m) => m.ratio);
    expect(Math.abs(ratios.reduce((a, b) => a + b, 0) - 1)).toBeLessThan(1e-12);

    const short = await evaluate(id, blocks('chain2-dofs.csv', 3));
    expect(short.errors[0]).toMatchObject({
      blockId: 'k',
      line: 4,
      code: 'MATRIX_SIZE_MISMATCH',
      message:
        'The DOF map chain2-dofs.csv gives 2 DOF labels but K (3×3) has 3 rows: one label per row of the matrix, in its order.',
    });
    expect(short.summary.errors).toBe(1);

    const many = await evaluate(id, blocks('chain3-dofs.csv', 5));
    expect(many.errors).toEqual([
      expect.objectContaining({
        blockId: 's',
        line: 5,
        code: 'INVALID_OPTION',
        message:
          '"count: 5" asks for more modes than the model has: K is 3×3, so it has 3 modes. Write "count: 3" for all of them, or fewer.',
      }),
    ]);
  });

  it('states why participation is empty when an uploaded model has no direction', async () => {
    const id = await newSheet();
    for (const name of ['chain3-k.mtx', 'chain3-m.mtx']) {
      await upload(id, name, readFileSync(path.join(fixtures, name)));
    }
    const r = await evaluate(id, [
      { id: 'k', kind: 'matrix', source: 'name: K\nunit: N/m\nfrom: chain3-k.mtx' },
      { id: 'm', kind: 'matrix', source: 'name: M\nunit: kg\nfrom: chain3-m.mtx' },
      { id: 's', kind: 'modes', source: 'name: frame\nstiffness: K\nmass: M\ncount: 3' },
    ]);
    expect(r.errors).toEqual([]);
    expect(r.blocks[2]!.participationReason).toMatch(/^no direction given: write "direction:"/);
  });
});
