// GET /api/revisions/:revisionId/spreadsheet: a revision's results tables as .xlsx, read back with
// the same package (ExcelJS) that wrote it. Also the sheet setting it follows: settings.units.
import ExcelJS from 'exceljs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  anonymous,
  createTeamApp,
  type ApiClient,
  type DraftBlock,
  type TestApp,
} from '../support/api-app';
import { unique } from '../support/factories';

let t: TestApp;
let team: Awaited<ReturnType<typeof createTeamApp<'author' | 'viewer' | 'outsider'>>>['team'];
let author: ApiClient;
let viewer: ApiClient;
let outsider: ApiClient;

// Two-storey shear frame of REFERENCES.md item 3 (Chopra, Dynamics of Structures, ch. 10, from
// memory): masses 2m and m, stiffnesses 2k and k; ω₁ = √(k/2m), effective masses 8/9 and 1/9 of 3m.
const M = 100e3; // kg (100 t)
const K = 50e6; // N/m (50 kN/mm)
const blocks: DraftBlock[] = [
  {
    id: 'data',
    kind: 'calc',
    source:
      'm_0 = 100 t\nk_0 = 50 kN/mm\nh = 3.5 m\nframe = storey_chain([2 m_0, m_0], [2 k_0, k_0])',
  },
  {
    id: 'solve',
    kind: 'modes',
    source: 'name: floor\nstiffness: frame.K\nmass: frame.M\nmethod: dense\ncount: 2\ndirection: x',
  },
  {
    id: 'rsa',
    kind: 'response',
    source:
      'modes: floor\nanalysis: spectrum\nspectrum: ASCE 7-16\nSDS: 1.0\nSD1: 0.6\nTL: 8 s\nR: 8\ndamping: 0.05\nheights: h\nname: rsa',
  },
  { id: 'crit', kind: 'criteria', source: 'floor.f[1] >= 1 Hz  # common practice' },
];

// 1 lbf·s²/in = 0.45359237 kg × 9.80665 m/s² / 0.0254 m/s² (NIST SP 811, 2008, Appendix B.8).
const LBF_S2_PER_IN = (0.45359237 * 9.80665) / 0.0254;
const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

async function putDraft(sheetId: number, settings: Record<string, unknown>) {
  const current = await author.get(`/api/sheets/${sheetId}`);
  return author.agent
    .put(`/api/sheets/${sheetId}/draft`)
    .set('X-CSRF-Token', author.csrfToken)
    .set('If-Match', `"${current.body.sheet.draftVersion}"`)
    .send({ blocks, settings });
}

async function issuedRevision(units: 'si' | 'us'): Promise<{ id: number; number: string }> {
  const number = `XL-${unique()}`;
  const created = await author.post(`/api/projects/${team.project.id}/sheets`, {
    number,
    title: 'Two-storey frame',
  });
  expect(created.status, JSON.stringify(created.body)).toBe(201);
  const saved = await putDraft(created.body.sheet.id, { significantFigures: 4, units });
  expect(saved.status, JSON.stringify(saved.body)).toBe(200);
  const rev = await author.post(`/api/sheets/${created.body.sheet.id}/revisions`, {
    purpose: 'For check',
  });
  expect(rev.status, JSON.stringify(rev.body)).toBe(201);
  return { id: rev.body.revision.id, number };
}

async function download(client: ApiClient, revisionId: number) {
  return client.agent
    .get(`/api/revisions/${revisionId}/spreadsheet`)
    .buffer(true)
    .parse((res, done) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => done(null, Buffer.concat(chunks)));
    });
}

async function readBook(bytes: Buffer): Promise<ExcelJS.Workbook> {
  const book = new ExcelJS.Workbook();
  await book.xlsx.load(bytes as unknown as ArrayBuffer);
  return book;
}

/** A worksheet as rows of cell values (1-based columns dropped to 0-based). */
function rows(ws: ExcelJS.Worksheet): unknown[][] {
  const out: unknown[][] = [];
  ws.eachRow((row) => out.push((row.values as unknown[]).slice(1)));
  return out;
}

let usRev: { id: number; number: string };
let siRev: { id: number; number: string };

beforeAll(async () => {
  const made = await createTeamApp(['author', 'viewer', 'outsider']);
  ({ t, team } = made);
  ({ author, viewer, outsider } = made.clients);
  usRev = await issuedRevision('us');
  siRev = await issuedRevision('si');
});

afterAll(async () => {
  await t?.close();
});

describe('PUT /api/sheets/:id/draft settings.units', () => {
  it('refuses a unit system it does not know with 422 naming settings.units', async () => {
    const created = await author.post(`/api/projects/${team.project.id}/sheets`, {
      number: `XL-${unique()}`,
      title: 'Units',
    });
    const res = await putDraft(created.body.sheet.id, { significantFigures: 4, units: 'imperial' });
    expect(res.status).toBe(422);
    expect(res.body.error.field).toBe('settings.units');
    expect(res.body.error.message).toMatch(/si, us/);
  });

  it('keeps units: us in the draft and the revision, with the same results as SI', async () => {
    const us = await author.get(`/api/revisions/${usRev.id}`);
    const si = await author.get(`/api/revisions/${siRev.id}`);
    expect(us.body.revision.settings).toEqual({ significantFigures: 4, units: 'us' });
    // Display only: the stored results are the same SI numbers either way.
    expect(us.body.revision.results).toEqual(si.body.revision.results);
    expect(us.body.revision.digests.results).toBe(si.body.revision.digests.results);
    // The print view reads the same setting to show its tables in US customary units.
    const print = await viewer.get(`/api/revisions/${usRev.id}/print`);
    expect(print.status).toBe(200);
    expect(print.body.settings).toEqual({ significantFigures: 4, units: 'us' });
  });
});

describe('GET /api/revisions/:revisionId/spreadsheet', () => {
  it('refuses a signed-out request with 401', async () => {
    const res = await (await anonymous(t.app)).get(`/api/revisions/${usRev.id}/spreadsheet`);
    expect(res.status).toBe(401);
  });

  it('refuses a person outside the project with 403', async () => {
    const res = await outsider.get(`/api/revisions/${usRev.id}/spreadsheet`);
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('FORBIDDEN');
  });

  it('answers 404 for a revision that does not exist and 422 for an id that is not one', async () => {
    expect((await viewer.get('/api/revisions/99999999/spreadsheet')).status).toBe(404);
    const bad = await viewer.get('/api/revisions/abc/spreadsheet');
    expect(bad.status).toBe(422);
    expect(bad.body.error.field).toBe('revisionId');
  });

  it('gives a viewer the modes, response and criteria tables in US customary units', async () => {
    const res = await download(viewer, usRev.id);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/spreadsheetml\.sheet/);
    expect(res.headers['content-disposition']).toContain(`${usRev.number}_Rev1_tables.xlsx`);
    const book = await readBook(res.body as Buffer);
    expect(book.worksheets.map((w) => w.name)).toEqual([
      'Revision',
      'Modes floor',
      'Spectrum rsa x',
      'Storeys rsa x',
      'Criteria',
    ]);
    expect(rows(book.getWorksheet('Revision')!)).toContainEqual([
      'Units',
      'US customary (kip, in, lbf·s²/in)',
    ]);

    const [head, ...modes] = rows(book.getWorksheet('Modes floor')!);
    expect(head).toContain('Effective mass (lbf*s^2/in)');
    expect(head).toContain('Gamma ((lbf*s^2/in)^0.5)');
    const col = (name: string) => head!.indexOf(name);
    // ω₁ = √(k/2m) (closed form), stays in Hz: relative 1e-10 (dense solve, separated modes).
    const f1 = Math.sqrt(K / (2 * M)) / (2 * Math.PI);
    expect(rel(modes[0]![col('f (Hz)')] as number, f1)).toBeLessThan(1e-10);
    // Effective masses 8/9 and 1/9 of 3m, in lbf·s²/in (NIST SP 811 B.8): relative 1e-9.
    const eff = col('Effective mass (lbf*s^2/in)');
    expect(rel(modes[0]![eff] as number, ((8 / 9) * 3 * M) / LBF_S2_PER_IN)).toBeLessThan(1e-9);
    expect(rel(modes[1]![eff] as number, ((1 / 9) * 3 * M) / LBF_S2_PER_IN)).toBeLessThan(1e-9);

    // Modal base shear V_n = M*_n S_a (REFERENCES.md response analysis; Chopra ch. 13, from
    // memory): in lbf·s²/in × in/s² = lbf, so kip = that / 1000 — a check across the columns.
    const [sh, ...sp] = rows(book.getWorksheet('Spectrum rsa x')!);
    expect(sh).toEqual([
      'Mode',
      'T (s)',
      'Damping ratio',
      'S_a (in/s^2)',
      'Gamma ((lbf*s^2/in)^0.5)',
      'Effective mass (lbf*s^2/in)',
      'Modal base shear (kip)',
    ]);
    for (const r of sp) {
      const [, , , sa, , m, v] = r as number[];
      expect(rel(v!, (m! * sa!) / 1000)).toBeLessThan(1e-9);
    }
    const storeys = rows(book.getWorksheet('Storeys rsa x')!);
    expect(storeys[0]).toContain('Overturning moment (kip*ft)');
    expect(storeys).toHaveLength(3);

    expect(rows(book.getWorksheet('Criteria')!)).toEqual([
      ['Block', 'Line', 'Criterion', 'Result', 'Left side', 'Right side'],
      [4, 1, 'common practice', 'pass', expect.any(String), '1 Hz'],
    ]);
  });

  it('gives the same tables in SI for a sheet shown in SI (effective mass in kg)', async () => {
    const res = await download(author, siRev.id);
    expect(res.status).toBe(200);
    const book = await readBook(res.body as Buffer);
    const [head, first] = rows(book.getWorksheet('Modes floor')!);
    const eff = head!.indexOf('Effective mass (kg)');
    expect(eff).toBeGreaterThan(0);
    // 8/9 of 3m (closed form above), relative 1e-9.
    expect(rel(first![eff] as number, (8 / 9) * 3 * M)).toBeLessThan(1e-9);
    const [sh] = rows(book.getWorksheet('Spectrum rsa x')!);
    expect(sh).toContain('Modal base shear (kN)');
  });
});
