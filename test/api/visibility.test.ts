import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  createSheetWithDraft,
  createTeamApp,
  type ApiClient,
  type TestApp,
} from '../support/api-app';
import { createProjectTeam, unique } from '../support/factories';

// What a project's viewer (the client's representative) reads: the issued revisions and the
// client-facing activity, not the unissued draft, the remarks or the firm's refusals
// (api/http/access.ts 'sheet.read_internal'; core/vocabulary.ts CLIENT_FACING_ACTIONS).

let t: TestApp;
let team: Awaited<ReturnType<typeof createProjectTeam>>;
let author: ApiClient;
let checker: ApiClient;
let viewer: ApiClient;
let sheetId: number;
let revId: number;

beforeAll(async () => {
  ({
    t,
    team,
    clients: { author, checker, viewer },
  } = await createTeamApp(['author', 'checker', 'viewer']));
  const sheet = await createSheetWithDraft(
    author,
    team.project.id,
    { number: `VS-${unique()}`, title: 'Visibility' },
    [{ id: 'calc', kind: 'calc', source: 'k = 24 kN/mm\nm = 18 t' }],
  );
  sheetId = sheet.id;
  const rev = await author.post(`/api/sheets/${sheetId}/revisions`, { purpose: 'For check' });
  expect(rev.status).toBe(201);
  revId = rev.body.revision.id;
  const remark = await checker.post(`/api/revisions/${revId}/remarks`, {
    blockId: 'calc',
    line: 1,
    type: 'query',
    text: 'Internal question',
  });
  expect(remark.status).toBe(201);
});

afterAll(async () => {
  await t?.close();
});

describe('GET /api/sheets/:sheetId for a viewer', () => {
  it('withholds the draft from a viewer and gives it to the checker', async () => {
    const seen = await viewer.get(`/api/sheets/${sheetId}`);
    expect(seen.status).toBe(200);
    expect(seen.body.sheet).toMatchObject({ id: sheetId, draftHidden: true, myRoles: ['viewer'] });
    expect(seen.body.sheet.draft.blocks).toEqual([]);
    const full = await checker.get(`/api/sheets/${sheetId}`);
    expect(full.body.sheet.draft.blocks).toHaveLength(1);
    expect(full.body.sheet.draftHidden).toBeUndefined();
    // The issued revision stays the viewer's to read.
    expect((await viewer.get(`/api/revisions/${revId}`)).status).toBe(200);
  });
});

describe('activity for a viewer', () => {
  it('gives a viewer the client-facing part of a sheet’s history only', async () => {
    const firm = await checker.get(`/api/sheets/${sheetId}/activity`);
    const firmActions = firm.body.activity.map((e: { action: string }) => e.action);
    expect(firmActions).toEqual(expect.arrayContaining(['remark.added', 'revision.issued']));
    const seen = await viewer.get(`/api/sheets/${sheetId}/activity`);
    expect(seen.status).toBe(200);
    const actions = seen.body.activity.map((e: { action: string }) => e.action);
    expect(actions).toContain('revision.issued');
    expect(actions).not.toContain('remark.added');
    expect(actions).not.toContain('sheet.draft_saved');
  });

  it('leaves the remarks and refusals out of a viewer’s project activity', async () => {
    const seen = await viewer.get(`/api/projects/${team.project.id}/activity`);
    expect(seen.status).toBe(200);
    const actions = new Set(seen.body.activity.map((e: { action: string }) => e.action));
    expect(actions.has('revision.issued')).toBe(true);
    for (const internal of ['remark.added', 'sheet.draft_saved', 'seal.refused']) {
      expect(actions.has(internal)).toBe(false);
    }
    const firm = await author.get(`/api/projects/${team.project.id}/activity`);
    expect(firm.body.activity.map((e: { action: string }) => e.action)).toContain('remark.added');
  });
});

describe('GET /api/sheets/:sheetId/compare against the draft', () => {
  it('refuses a viewer the draft side, naming who may, and answers the checker', async () => {
    const url = `/api/sheets/${sheetId}/compare?from=${revId}&to=draft`;
    const refused = await viewer.get(url);
    expect(refused.status).toBe(403);
    expect(refused.body.error.message).toMatch(/unissued draft/);
    expect((await checker.get(url)).status).toBe(200);
  });
});
