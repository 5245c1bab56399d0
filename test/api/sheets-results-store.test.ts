import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sheetsService } from '../../api/modules/sheets/sheets.service';
import { resultsDigest } from '../../api/modules/sheets/sheets.evaluate';
import type { SheetRunner } from '../../api/workers/sheet-runner';
import {
  createSheetWithDraft,
  createTeamApp,
  type ApiClient,
  type TestApp,
} from '../support/api-app';

// Results by digest: the editor's evaluation of a sheet evaluated before, unchanged, is answered
// from the results store and no job is run; a changed text or settings is evaluated again; the
// path sealing uses re-runs afresh whatever is stored. The app's runner (the queue) is wrapped to
// count the evaluations it is asked for.

let t: TestApp;
let author: ApiClient;
let sheetId: number;
let runs = 0;
const tag = `${process.pid}-${Date.now()}`;
// Two storeys, 2m and m over 2k and k (Chopra ch. 10, from memory): ω₁² = k/(2m). The unique
// line keeps this file's texts out of any other run's store.
const blocks = (k: string) => [
  { id: 'tag', kind: 'calc', source: `run = "${tag}"` },
  {
    id: 'data',
    kind: 'calc',
    source: `frame = storey_chain([200 t, 100 t], [${k}, 50 kN/mm])`,
  },
  { id: 'm', kind: 'modes', source: 'stiffness: frame.K\nmass: frame.M\ncount: 2\nname: sway' },
];

const evaluate = (draft: unknown[], significantFigures = 4) =>
  author.post(`/api/sheets/${sheetId}/evaluate`, {
    blocks: draft,
    settings: { significantFigures },
  });

beforeAll(async () => {
  let team: { project: { id: number } };
  ({
    t,
    team,
    clients: { author },
  } = await createTeamApp(['author']));
  sheetId = (
    await createSheetWithDraft(author, team.project.id, { number: 'RS-1', title: 'Store' }, [])
  ).id;
  const runner: SheetRunner = t.ctx.runner;
  t.ctx.runner = (sheet, uploads, options) => {
    runs++;
    return runner(sheet, uploads, options);
  };
});

afterAll(async () => {
  await t?.close();
});

describe('results by digest', () => {
  it('answers an unchanged sheet from the store and evaluates a changed one', async () => {
    const first = await evaluate(blocks('100 kN/mm'));
    expect(first.status).toBe(200);
    expect(first.body.results.errors).toEqual([]);
    expect(runs).toBe(1);
    const digest = resultsDigest(
      { blocks: blocks('100 kN/mm'), settings: { significantFigures: 4 } } as never,
      [],
    );
    expect(await t.db('evaluation_results').where({ digest }).first('digest')).toBeTruthy();

    const again = await evaluate(blocks('100 kN/mm'));
    expect(again.status).toBe(200);
    expect(runs).toBe(1);
    expect(again.body.results).toEqual(first.body.results);
    expect(again.body.digests).toEqual(first.body.digests);

    const changed = await evaluate(blocks('120 kN/mm'));
    expect(changed.status).toBe(200);
    expect(runs).toBe(2);
    expect(changed.body.digests.results).not.toBe(first.body.digests.results);

    const otherSettings = await evaluate(blocks('100 kN/mm'), 5);
    expect(otherSettings.status).toBe(200);
    expect(runs).toBe(3);
  });

  it('keeps no results that carry a sheet error', async () => {
    const broken = [{ id: 'x', kind: 'calc', source: `run = "${tag}"\ny = undefined_name + 1` }];
    const first = await evaluate(broken);
    expect(first.status).toBe(200);
    expect(first.body.results.errors.length).toBeGreaterThan(0);
    const before = runs;
    await evaluate(broken);
    expect(runs).toBe(before + 1);
  });

  it('issues an unchanged draft for check from the store', async () => {
    const draft = await author.get(`/api/sheets/${sheetId}`);
    const saved = await author.agent
      .put(`/api/sheets/${sheetId}/draft`)
      .set('X-CSRF-Token', author.csrfToken)
      .set('If-Match', `"${draft.body.sheet.draftVersion}"`)
      .send({ blocks: blocks('100 kN/mm'), settings: { significantFigures: 4 } });
    expect(saved.status).toBe(200);
    const before = runs;
    const res = await author.post(`/api/sheets/${sheetId}/revisions`, { purpose: 'For check' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(runs).toBe(before);
  });

  it('re-runs afresh on the path sealing takes, whatever is stored', async () => {
    const sheet = { blocks: blocks('100 kN/mm'), settings: { significantFigures: 4 } } as never;
    const before = runs;
    const fresh = await sheetsService.evaluate(t.ctx, sheetId, sheet);
    expect(runs).toBe(before + 1);
    expect(fresh.results.errors).toEqual([]);
  });
});
