import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { anonymous, createTeamApp, type ApiClient, type TestApp } from '../support/api-app';
import { createProjectTeam, unique } from '../support/factories';

// The sheets API against the real MariaDB: create, read, rename, draft saves
// with optimistic concurrency, delete of never-issued drafts, roles.

let t: TestApp;
let team: Awaited<ReturnType<typeof createProjectTeam>>;
let author: ApiClient;
let checker: ApiClient;
let viewer: ApiClient;
let outsider: ApiClient;
let admin: ApiClient;

beforeAll(async () => {
  ({
    t,
    team,
    clients: { author, checker, viewer, outsider, admin },
  } = await createTeamApp(['author', 'checker', 'viewer', 'outsider', 'admin']));
});

afterAll(async () => {
  await t?.close();
});

const sheetsUrl = () => `/api/projects/${team.project.id}/sheets`;

async function createSheet(
  body: Record<string, unknown> = {},
): Promise<{ id: number; draftVersion: number; number: string }> {
  const res = await author.post(sheetsUrl(), {
    number: `DYN-${unique()}`,
    title: 'Test sheet',
    ...body,
  });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.sheet;
}

function putDraft(client: ApiClient, sheetId: number, ifMatch: string | null, body: unknown) {
  const req = client.agent
    .put(`/api/sheets/${sheetId}/draft`)
    .set('X-CSRF-Token', client.csrfToken);
  if (ifMatch !== null) req.set('If-Match', ifMatch);
  return req.send(body as object);
}

async function activityFor(sheetId: number, action: string) {
  return t
    .db('activity')
    .where({ object_type: 'sheet', object_id: sheetId, action })
    .select('actor_id', 'project_id', 'details');
}

describe('GET /api/sheet-templates', () => {
  it('lists the three templates with a title and description', async () => {
    const res = await viewer.get('/api/sheet-templates');
    expect(res.status).toBe(200);
    expect(res.body.templates.map((x: { key: string }) => x.key)).toEqual([
      'footbridge',
      'four-storey-frame',
      'pump-foundation',
    ]);
    for (const x of res.body.templates) {
      expect(x.title.length).toBeGreaterThan(5);
      expect(x.description.length).toBeGreaterThan(20);
    }
  });

  it('refuses a signed-out caller with 401', async () => {
    const res = await (await anonymous(t.app)).get('/api/sheet-templates');
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('UNAUTHENTICATED');
  });
});

describe('POST /api/projects/:projectId/sheets', () => {
  it('creates an empty draft sheet and records sheet.created', async () => {
    const number = `DYN-${unique()}`;
    const res = await author.post(sheetsUrl(), {
      number,
      title: 'Floor frequency, level 2',
      subject: 'Walking excitation',
    });
    expect(res.status).toBe(201);
    const sheet = res.body.sheet;
    expect(sheet).toMatchObject({
      projectId: team.project.id,
      number,
      title: 'Floor frequency, level 2',
      subject: 'Walking excitation',
      status: 'draft',
      latestRevision: null,
      draftVersion: 1,
      updatedBy: { id: team.author.id, name: team.author.name },
      projectJobNumber: team.project.jobNumber,
      projectName: team.project.name,
      myRoles: ['author'],
    });
    expect(sheet.draft.settings).toEqual({ significantFigures: 4 });
    expect(sheet.draft.blocks).toEqual([{ id: 'b1', kind: 'text', source: '' }]);

    const row = await t.db('sheets').where({ id: sheet.id }).first();
    expect(row).toMatchObject({ project_id: team.project.id, number, status: 'draft' });
    expect(row.created_by).toBe(team.author.id);
    const activity = await activityFor(sheet.id, 'sheet.created');
    expect(activity).toHaveLength(1);
    expect(activity[0]).toMatchObject({ actor_id: team.author.id, project_id: team.project.id });
  });

  it('starts a sheet from a template with its blocks', async () => {
    const sheet = await createSheet({ template: 'four-storey-frame' });
    const res = await checker.get(`/api/sheets/${sheet.id}`);
    const kinds = res.body.sheet.draft.blocks.map((b: { kind: string }) => b.kind);
    expect(kinds).toEqual(['text', 'calc', 'modes', 'calc', 'criteria']);
    const source = res.body.sheet.draft.blocks.map((b: { source: string }) => b.source).join('\n');
    expect(source).toContain('storey_chain(');
    expect(source).toContain('ASCE 7-16 §12.9.1.1');
  });

  it('refuses a sheet number already used in the project with 409 on the number field', async () => {
    const sheet = await createSheet();
    const res = await author.post(sheetsUrl(), { number: sheet.number, title: 'Again' });
    expect(res.status).toBe(409);
    expect(res.body.error.field).toBe('number');
    expect(res.body.error.message).toContain(sheet.number);
  });

  it('refuses a missing title with 422 naming the field', async () => {
    const res = await author.post(sheetsUrl(), { number: `DYN-${unique()}` });
    expect(res.status).toBe(422);
    expect(res.body.error.field).toBe('title');
  });

  it('refuses an unknown template with 422 naming the field', async () => {
    const res = await author.post(sheetsUrl(), {
      number: `DYN-${unique()}`,
      title: 'x',
      template: 'tower',
    });
    expect(res.status).toBe(422);
    expect(res.body.error.field).toBe('template');
  });

  it('refuses a checker, a viewer and an admin who is not an author with 403', async () => {
    for (const client of [checker, viewer, admin]) {
      const res = await client.post(sheetsUrl(), { number: `DYN-${unique()}`, title: 'x' });
      expect(res.status).toBe(403);
      expect(res.body.error.message).toContain('author');
    }
    const res = await outsider.post(sheetsUrl(), { number: `DYN-${unique()}`, title: 'x' });
    expect(res.status).toBe(403);
    expect(res.body.error.message).toContain('not a member');
  });

  it('answers 404 for a project that does not exist', async () => {
    const res = await author.post('/api/projects/999999999/sheets', { number: 'A', title: 'x' });
    expect(res.status).toBe(404);
  });

  it('refuses a signed-out caller with 401', async () => {
    const res = await (await anonymous(t.app)).post(sheetsUrl(), { number: 'A', title: 'x' });
    expect(res.status).toBe(401);
  });
});

describe('GET /api/projects/:projectId/sheets', () => {
  it('lets a viewer list the sheets with the table fields', async () => {
    const sheet = await createSheet({ title: 'Listed sheet' });
    const res = await viewer.get(sheetsUrl());
    expect(res.status).toBe(200);
    const listed = res.body.sheets.find((s: { id: number }) => s.id === sheet.id);
    expect(listed).toMatchObject({
      id: sheet.id,
      projectId: team.project.id,
      number: sheet.number,
      title: 'Listed sheet',
      status: 'draft',
      latestRevision: null,
      draftVersion: 1,
      updatedBy: { id: team.author.id, name: team.author.name },
    });
    expect(Date.parse(listed.updatedAt)).not.toBeNaN();
    expect(listed.draft).toBeUndefined();
  });

  it('refuses someone outside the project with 403', async () => {
    const res = await outsider.get(sheetsUrl());
    expect(res.status).toBe(403);
  });

  it('lets an admin outside the project read', async () => {
    const res = await admin.get(sheetsUrl());
    expect(res.status).toBe(200);
  });
});

describe('GET /api/sheets/:sheetId', () => {
  it('lets a checker read the draft, with their roles and the draft version as ETag', async () => {
    const sheet = await createSheet({ template: 'footbridge' });
    const res = await checker.get(`/api/sheets/${sheet.id}`);
    expect(res.status).toBe(200);
    expect(res.headers.etag).toBe('"1"');
    expect(res.body.sheet.myRoles).toEqual(['checker']);
    expect(res.body.sheet.draft.blocks.length).toBe(7);
  });

  it('gives a viewer the sheet without its unissued draft (test/api/visibility.test.ts)', async () => {
    const sheet = await createSheet({ template: 'footbridge' });
    const res = await viewer.get(`/api/sheets/${sheet.id}`);
    expect(res.status).toBe(200);
    expect(res.body.sheet).toMatchObject({ myRoles: ['viewer'], draftHidden: true });
    expect(res.body.sheet.draft.blocks).toEqual([]);
  });

  it('answers 404 for a sheet that does not exist and 422 for a bad id', async () => {
    expect((await viewer.get('/api/sheets/999999999')).status).toBe(404);
    const bad = await viewer.get('/api/sheets/abc');
    expect(bad.status).toBe(422);
    expect(bad.body.error.field).toBe('sheetId');
  });

  it('refuses someone outside the project with 403', async () => {
    const sheet = await createSheet();
    expect((await outsider.get(`/api/sheets/${sheet.id}`)).status).toBe(403);
  });
});

describe('PATCH /api/sheets/:sheetId', () => {
  it('renames a sheet and records sheet.renamed with the old and new values', async () => {
    const sheet = await createSheet({ title: 'Old title' });
    const number = `DYN-${unique()}`;
    const res = await author.patch(`/api/sheets/${sheet.id}`, { number, title: 'New title' });
    expect(res.status).toBe(200);
    expect(res.body.sheet).toMatchObject({ number, title: 'New title' });
    const activity = await activityFor(sheet.id, 'sheet.renamed');
    expect(activity).toHaveLength(1);
    const details =
      typeof activity[0].details === 'string'
        ? JSON.parse(activity[0].details)
        : activity[0].details;
    expect(details).toEqual({
      from: { number: sheet.number, title: 'Old title' },
      to: { number, title: 'New title' },
    });
  });

  it('refuses an empty change with 422 and a viewer with 403', async () => {
    const sheet = await createSheet();
    expect((await author.patch(`/api/sheets/${sheet.id}`, {})).status).toBe(422);
    expect((await viewer.patch(`/api/sheets/${sheet.id}`, { title: 'x' })).status).toBe(403);
  });

  it('refuses a number another sheet of the project has with 409 on the number field', async () => {
    const a = await createSheet();
    const b = await createSheet();
    const res = await author.patch(`/api/sheets/${b.id}`, { number: a.number });
    expect(res.status).toBe(409);
    expect(res.body.error.field).toBe('number');
  });
  it('keeps the number of an issued sheet with 409, while the title may still change', async () => {
    const sheet = await createSheet();
    // Rev 1 as the review module writes it (inserted directly: this file tests the sheets API).
    await t.db('revisions').insert({
      sheet_id: sheet.id,
      number: 1,
      status: 'in_check',
      purpose: 'For check',
      blocks: '[]',
      settings: '{}',
      canonical_text: '',
      results: '{}',
      canonical_text_digest: '0'.repeat(64),
      results_digest: '0'.repeat(64),
      engine_version: 'test',
      issued_by: team.author.id,
      issued_at: t.db.fn.now(3),
    });
    await t.db('sheets').where({ id: sheet.id }).update({ status: 'in_check' });
    const renumber = await author.patch(`/api/sheets/${sheet.id}`, { number: `X-${unique()}` });
    expect(renumber.status).toBe(409);
    expect(renumber.body.error.field).toBe('number');
    const retitle = await author.patch(`/api/sheets/${sheet.id}`, { title: 'Corrected title' });
    expect(retitle.status).toBe(200);
    expect(retitle.body.sheet.latestRevision).toMatchObject({ number: 1, status: 'in_check' });
    const listed = await viewer.get(sheetsUrl());
    const row = listed.body.sheets.find((x: { id: number }) => x.id === sheet.id);
    expect(row.latestRevision).toMatchObject({ number: 1, status: 'in_check' });
    expect(row.status).toBe('in_check');
    // Issued sheets are kept: delete is refused.
    expect((await author.delete(`/api/sheets/${sheet.id}`)).status).toBe(409);
  });
});

describe('PUT /api/sheets/:sheetId/draft', () => {
  const draftA = {
    blocks: [
      { id: 'storeys', kind: 'calc', source: 'k_1 = 24 kN/mm\nm_1 = 18 t' },
      { id: 'note', kind: 'text', source: 'First storey only.' },
    ],
    settings: { significantFigures: 5 },
  };
  const draftB = {
    blocks: [{ id: 'storeys', kind: 'calc', source: 'k_1 = 30 kN/mm\nm_1 = 18 t' }],
    settings: { significantFigures: 4 },
  };

  it('saves with the current version and moves the version on by one', async () => {
    const sheet = await createSheet();
    const res = await putDraft(author, sheet.id, '"1"', draftA);
    expect(res.status).toBe(200);
    expect(res.body.draftVersion).toBe(2);
    expect(res.headers.etag).toBe('"2"');
    const read = await checker.get(`/api/sheets/${sheet.id}`);
    expect(read.body.sheet.draft).toEqual(draftA);
    expect(read.body.sheet.draftVersion).toBe(2);
    const row = await t.db('sheets').where({ id: sheet.id }).first('draft_version');
    expect(row.draft_version).toBe(2);
  });

  it('refuses a stale version with 409 DRAFT_CONFLICT carrying the current draft, writing nothing', async () => {
    const sheet = await createSheet();
    expect((await putDraft(author, sheet.id, '"1"', draftA)).status).toBe(200);
    // A second tab still holds version 1.
    const stale = await putDraft(author, sheet.id, '"1"', draftB);
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('DRAFT_CONFLICT');
    const current = stale.body.error.details.current;
    expect(current.blocks).toEqual(draftA.blocks);
    expect(current.settings).toEqual(draftA.settings);
    expect(current.draftVersion).toBe(2);
    expect(current.updatedBy).toEqual({ id: team.author.id, name: team.author.name });
    expect(Date.parse(current.updatedAt)).not.toBeNaN();
    const read = await checker.get(`/api/sheets/${sheet.id}`);
    expect(read.body.sheet.draft).toEqual(draftA);
    // Keeping the second tab's text: save it on top of the current version.
    const resolved = await putDraft(author, sheet.id, `"${current.draftVersion}"`, draftB);
    expect(resolved.status).toBe(200);
    expect(resolved.body.draftVersion).toBe(3);
  });

  it('asks for If-Match with 428 naming the header', async () => {
    const sheet = await createSheet();
    const res = await putDraft(author, sheet.id, null, draftA);
    expect(res.status).toBe(428);
    expect(res.body.error.field).toBe('If-Match');
    expect(res.body.error.message).toContain('If-Match');
  });

  it('refuses repeated block ids and unknown kinds with 422 naming the block', async () => {
    const sheet = await createSheet();
    const repeated = await putDraft(author, sheet.id, '"1"', {
      blocks: [
        { id: 'a', kind: 'calc', source: 'x = 1' },
        { id: 'a', kind: 'text', source: '' },
      ],
      settings: { significantFigures: 4 },
    });
    expect(repeated.status).toBe(422);
    expect(repeated.body.error.field).toBe('blocks.1.id');
    const unknownKind = await putDraft(author, sheet.id, '"1"', {
      blocks: [{ id: 'a', kind: 'table', source: '' }],
    });
    expect(unknownKind.status).toBe(422);
    expect(unknownKind.body.error.field).toBe('blocks.0.kind');
  });

  it('refuses a checker and a viewer with 403', async () => {
    const sheet = await createSheet();
    expect((await putDraft(checker, sheet.id, '"1"', draftA)).status).toBe(403);
    expect((await putDraft(viewer, sheet.id, '"1"', draftA)).status).toBe(403);
    const row = await t.db('sheets').where({ id: sheet.id }).first('draft_version');
    expect(row.draft_version).toBe(1);
  });

  it('records at most one sheet.draft_saved per person per sheet within ten minutes', async () => {
    const sheet = await createSheet();
    for (let v = 1; v <= 3; v++) {
      expect((await putDraft(author, sheet.id, `"${v}"`, v % 2 ? draftA : draftB)).status).toBe(
        200,
      );
    }
    const activity = await activityFor(sheet.id, 'sheet.draft_saved');
    expect(activity).toHaveLength(1);
    expect(activity[0]).toMatchObject({ actor_id: team.author.id, project_id: team.project.id });
  });
  it('records a new sheet.draft_saved once the last one is more than ten minutes old', async () => {
    const sheet = await createSheet();
    // An autosave eleven minutes ago (activity rows can be added, never changed).
    await t.db('activity').insert({
      actor_id: team.author.id,
      project_id: team.project.id,
      action: 'sheet.draft_saved',
      object_type: 'sheet',
      object_id: sheet.id,
      details: JSON.stringify({}),
      at: t.db.raw('now(3) - interval 11 minute'),
    });
    expect((await putDraft(author, sheet.id, '"1"', draftA)).status).toBe(200);
    expect(await activityFor(sheet.id, 'sheet.draft_saved')).toHaveLength(2);
  });
});

describe('DELETE /api/sheets/:sheetId', () => {
  it('deletes a never-issued draft and records sheet.deleted', async () => {
    const sheet = await createSheet();
    const res = await author.delete(`/api/sheets/${sheet.id}`);
    expect(res.status).toBe(204);
    expect(await t.db('sheets').where({ id: sheet.id }).first()).toBeUndefined();
    expect(await activityFor(sheet.id, 'sheet.deleted')).toHaveLength(1);
    expect((await viewer.get(`/api/sheets/${sheet.id}`)).status).toBe(404);
  });

  it('refuses a sheet that has left the draft status with 409', async () => {
    const sheet = await createSheet();
    // The review module moves the status on issue; set it directly here.
    await t.db('sheets').where({ id: sheet.id }).update({ status: 'in_check' });
    const res = await author.delete(`/api/sheets/${sheet.id}`);
    expect(res.status).toBe(409);
    expect(res.body.error.message).toContain('issued');
    expect(await t.db('sheets').where({ id: sheet.id }).first('id')).toBeDefined();
  });

  it('refuses a checker with 403', async () => {
    const sheet = await createSheet();
    expect((await checker.delete(`/api/sheets/${sheet.id}`)).status).toBe(403);
  });
});
