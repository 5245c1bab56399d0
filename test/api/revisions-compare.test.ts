import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { saveDraft, createTeamApp, type ApiClient, type TestApp } from '../support/api-app';
import { createProjectTeam, unique } from '../support/factories';

// Compare and the print payload, server side.

let t: TestApp;
let team: Awaited<ReturnType<typeof createProjectTeam>>;
let author: ApiClient;
let checker: ApiClient;
let principal: ApiClient;
let outsider: ApiClient;

const calc1 = 'k = 24 kN/mm\nm = 18 t\nf = sqrt(k/m)/(2 pi)';
const crit = 'f >= 5.5 Hz  # walking comfort, vertical (common practice)';
// m from 18 t to 24 t: f falls by √(18/24); 5.81 Hz → 5.03 Hz, so the criterion flips.
const calc2 = '# mass with finishes\nk = 24 kN/mm\nm = 24 t\nf = sqrt(k/m)/(2 pi)';

async function putDraft(sheetId: number, calc: string): Promise<void> {
  await saveDraft(author, sheetId, [
    { id: 'calc', kind: 'calc', source: calc },
    { id: 'crit', kind: 'criteria', source: crit },
  ]);
}

let sheetId: number;
let rev1: number;
let rev2: number;

beforeAll(async () => {
  ({
    t,
    team,
    clients: { author, checker, principal, outsider },
  } = await createTeamApp(['author', 'checker', 'principal', 'outsider']));
  const sheet = await author.post(`/api/projects/${team.project.id}/sheets`, {
    number: `CP-${unique()}`,
    title: 'Compare',
  });
  sheetId = sheet.body.sheet.id;
  await putDraft(sheetId, calc1);
  rev1 = (await author.post(`/api/sheets/${sheetId}/revisions`, { purpose: 'For check' })).body
    .revision.id;
  await checker.post(`/api/revisions/${rev1}/remarks`, {
    blockId: 'calc',
    line: 2,
    type: 'query',
    text: 'Does the mass include finishes?',
  });
  await checker.post(`/api/revisions/${rev1}/return`);
  await putDraft(sheetId, calc2);
  rev2 = (await author.post(`/api/sheets/${sheetId}/revisions`, { purpose: 'For check' })).body
    .revision.id;
});

afterAll(async () => {
  await t?.close();
});

describe('GET /api/sheets/:sheetId/compare', () => {
  it('shows the source hunks, the values that changed, the criterion that flipped and the remarks', async () => {
    const res = await checker.get(`/api/sheets/${sheetId}/compare?from=${rev1}&to=${rev2}`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.from).toMatchObject({ id: rev1, number: 1 });
    expect(res.body.to).toMatchObject({ kind: 'revision', id: rev2, number: 2 });
    expect(res.body.units).toEqual({ from: 'si', to: 'si' });
    const calc = res.body.blocks.find((b: { blockId: string }) => b.blockId === 'calc');
    expect(calc.status).toBe('changed');
    const added = calc.hunks.flatMap((h: { added: string[] }) => h.added);
    expect(added).toContain('m = 24 t');
    expect(res.body.flipped).toEqual([
      expect.objectContaining({ blockId: 'crit', was: true, now: false }),
    ]);
    const f = res.body.results.find(
      (r: { blockId: string; key: string; relativeChange: number | null }) =>
        r.blockId === 'calc' &&
        /f/.test(r.key) &&
        r.relativeChange !== null &&
        r.relativeChange < 0,
    );
    // f ∝ m^(-1/2): relative change √(18/24) − 1 (closed form), to the 4 significant figures shown.
    expect(f.relativeChange).toBeCloseTo(Math.sqrt(18 / 24) - 1, 3);
    const fromRemark = res.body.remarks.find(
      (r: { revisionNumber: number }) => r.revisionNumber === 1,
    );
    // Line 2 (m = 18 t) was edited and a comment line inserted above it.
    expect(fromRemark.mapped.status).toBe('changed');
  });

  it('compares a revision with the draft', async () => {
    await putDraft(sheetId, calc2.replace('24 t', '25 t'));
    const res = await author.get(`/api/sheets/${sheetId}/compare?from=${rev2}&to=draft`);
    expect(res.status).toBe(200);
    expect(res.body.to.kind).toBe('draft');
    const calc = res.body.blocks.find((b: { blockId: string }) => b.blockId === 'calc');
    expect(calc.hunks.flatMap((h: { added: string[] }) => h.added)).toEqual(['m = 25 t']);
  });

  it('names the unit system of each side and gives the SI values of a change', async () => {
    const version = (await author.get(`/api/sheets/${sheetId}`)).body.sheet.draftVersion;
    const saved = await author.agent
      .put(`/api/sheets/${sheetId}/draft`)
      .set('X-CSRF-Token', author.csrfToken)
      .set('If-Match', `"${version}"`)
      .send({
        blocks: [
          { id: 'calc', kind: 'calc', source: calc2.replace('24 t', '32 t') },
          { id: 'crit', kind: 'criteria', source: crit },
        ],
        settings: { significantFigures: 4, units: 'us' },
      });
    expect(saved.status, JSON.stringify(saved.body)).toBe(200);
    const res = await author.get(`/api/sheets/${sheetId}/compare?from=${rev2}&to=draft`);
    expect(res.status).toBe(200);
    expect(res.body.units).toEqual({ from: 'si', to: 'us' });
    const m = res.body.results.find((r: { key: string }) => r.key === 'm');
    // 24 t → 32 t, in SI base units (kg) whatever the sides' display units.
    expect(m.oldValue).toMatchObject({ type: 'quantity', si: 24000, siUnit: 'kg' });
    expect(m.newValue).toMatchObject({ type: 'quantity', si: 32000, siUnit: 'kg' });
  });

  it('refuses a revision of another sheet and a missing parameter, naming the field', async () => {
    const other = await author.post(`/api/projects/${team.project.id}/sheets`, {
      number: `CP-${unique()}`,
      title: 'Other',
    });
    const res = await author.get(
      `/api/sheets/${other.body.sheet.id}/compare?from=${rev1}&to=draft`,
    );
    expect(res.status).toBe(422);
    expect(res.body.error.field).toBe('from');
    const missing = await author.get(`/api/sheets/${sheetId}/compare?from=${rev1}`);
    expect(missing.status).toBe(422);
    expect(missing.body.error.field).toBe('to');
    expect(
      (await outsider.get(`/api/sheets/${sheetId}/compare?from=${rev1}&to=${rev2}`)).status,
    ).toBe(403);
  });
});

describe('GET /api/revisions/:revisionId/print', () => {
  it('gives the title block, history, blocks, results, caution, and a preliminary banner when unsealed', async () => {
    const res = await principal.get(`/api/revisions/${rev2}/print`);
    expect(res.status).toBe(200);
    expect(res.body.firm.name).toMatch(/\S/);
    expect(res.body.project).toMatchObject({
      jobNumber: team.project.jobNumber,
      name: team.project.name,
    });
    expect(res.body.revision).toMatchObject({
      number: 2,
      preliminary: true,
      preparedBy: { id: team.author.id },
    });
    expect(res.body.revision.banner).toMatch(/^Preliminary — not for construction\. For check$/);
    expect(res.body.history.map((h: { number: number }) => h.number)).toEqual([1, 2]);
    expect(res.body.blocks.map((b: { id: string }) => b.id)).toEqual(['calc', 'crit']);
    expect(res.body.results.summary).toMatchObject({ passed: 0, failed: 1 });
    expect(res.body.seal).toBeNull();
    expect(res.body.caution).toMatch(/verified by a qualified engineer/);
    expect((await outsider.get(`/api/revisions/${rev2}/print`)).status).toBe(403);
  });
});
