// The firm template library (/api/firm-templates) through the real app against MariaDB: save a
// sheet's draft or revision as a template, rename and delete it, start a sheet from it; every
// route signed out, with the wrong role and with bad input.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  anonymous,
  createTeamApp,
  signedIn,
  type ApiClient,
  type DraftBlock,
  type TestApp,
} from '../support/api-app';
import { addMember, createUser, jsonColumn, unique } from '../support/factories';

type Team = Awaited<ReturnType<typeof createTeamApp<'author'>>>['team'];
let t: TestApp;
let team: Team;
let admin: ApiClient;
let author: ApiClient;
let checker: ApiClient;
let viewer: ApiClient;
let outsider: ApiClient;
let secondAuthor: ApiClient;

const blocks: DraftBlock[] = [
  { id: 'scope', kind: 'text', source: '## Storey frequency' },
  { id: 'calc', kind: 'calc', source: 'k = 24 kN/mm\nm = 18 t\nf = sqrt(k/m)/(2 pi)' },
  { id: 'crit', kind: 'criteria', source: 'f >= 3 Hz  # walking comfort (common practice)' },
];

async function putDraft(sheetId: number, draft: DraftBlock[], settings: object) {
  const current = await author.get(`/api/sheets/${sheetId}`);
  const res = await author.agent
    .put(`/api/sheets/${sheetId}/draft`)
    .set('X-CSRF-Token', author.csrfToken)
    .set('If-Match', `"${current.body.sheet.draftVersion}"`)
    .send({ blocks: draft, settings });
  expect(res.status, JSON.stringify(res.body)).toBe(200);
}

let sheet: { id: number; number: string };

async function newSheet(): Promise<{ id: number; number: string }> {
  const number = `TP-${unique()}`;
  const res = await author.post(`/api/projects/${team.project.id}/sheets`, {
    number,
    title: 'Storey frequency',
  });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  await putDraft(res.body.sheet.id, blocks, { significantFigures: 5, units: 'us' });
  return { id: res.body.sheet.id, number };
}

async function save(client: ApiClient, body: object) {
  return client.post('/api/firm-templates', body);
}

beforeAll(async () => {
  const made = await createTeamApp(['admin', 'author', 'checker', 'viewer', 'outsider']);
  ({ t, team } = made);
  ({ admin, author, checker, viewer, outsider } = made.clients);
  const other = await createUser(t.db);
  await addMember(t.db, team.project.id, other.id, ['author']);
  secondAuthor = await signedIn(t.app, other);
  sheet = await newSheet();
});

afterAll(async () => {
  await t?.close();
});

describe('POST /api/firm-templates', () => {
  it('refuses a signed-out request with 401', async () => {
    const res = await (
      await anonymous(t.app)
    ).post('/api/firm-templates', {
      sheetId: sheet.id,
      name: 'x',
    });
    expect(res.status).toBe(401);
  });

  it('refuses a checker, a viewer and a person outside the project with 403', async () => {
    for (const client of [checker, viewer]) {
      const res = await save(client, { sheetId: sheet.id, name: `T ${unique()}` });
      expect(res.status).toBe(403);
      expect(res.body.error.message).toBe(
        'Only an author of this project can save a sheet as a firm template.',
      );
    }
    const res = await save(outsider, { sheetId: sheet.id, name: `T ${unique()}` });
    expect(res.status).toBe(403);
  });

  it('refuses a missing name with 422 naming the field, and an unknown sheet with 404', async () => {
    const res = await save(author, { sheetId: sheet.id, name: '  ' });
    expect(res.status).toBe(422);
    expect(res.body.error.field).toBe('name');
    const missing = await save(author, { sheetId: 99999999, name: `T ${unique()}` });
    expect(missing.status).toBe(404);
  });

  it('saves the draft with where it came from, and records the activity', async () => {
    const name = `Storey frequency ${unique()}`;
    const res = await save(author, { sheetId: sheet.id, name, description: 'One storey.' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.template).toMatchObject({
      name,
      description: 'One storey.',
      origin: {
        projectId: team.project.id,
        jobNumber: team.project.jobNumber,
        sheetId: sheet.id,
        sheetNumber: sheet.number,
        revisionId: null,
        revisionNumber: null,
      },
      createdBy: { id: team.author.id, name: team.author.name },
    });
    const row = await t.db('firm_templates').where({ id: res.body.template.id }).first();
    expect(jsonColumn(row.blocks)).toEqual(blocks);
    expect(jsonColumn(row.settings)).toEqual({ significantFigures: 5, units: 'us' });
    const activity = await t
      .db('activity')
      .where({ action: 'template.saved', object_id: res.body.template.id })
      .first();
    expect(activity).toMatchObject({ actor_id: team.author.id, project_id: team.project.id });

    const again = await save(author, { sheetId: sheet.id, name });
    expect(again.status).toBe(409);
    expect(again.body.error.field).toBe('name');
  });

  it('saves a revision as it was issued, not the draft edited since', async () => {
    const own = await newSheet();
    const issued = await author.post(`/api/sheets/${own.id}/revisions`, { purpose: 'For check' });
    expect(issued.status, JSON.stringify(issued.body)).toBe(201);
    await putDraft(own.id, [blocks[0]!], { significantFigures: 4 });
    const res = await save(author, {
      sheetId: own.id,
      revisionId: issued.body.revision.id,
      name: `From Rev 1 ${unique()}`,
    });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.template.origin).toMatchObject({
      sheetNumber: own.number,
      revisionId: issued.body.revision.id,
      revisionNumber: 1,
    });
    const row = await t.db('firm_templates').where({ id: res.body.template.id }).first();
    expect(jsonColumn(row.blocks)).toEqual(blocks);

    // A revision of another sheet is refused at its field.
    const wrong = await save(author, {
      sheetId: sheet.id,
      revisionId: issued.body.revision.id,
      name: `Wrong ${unique()}`,
    });
    expect(wrong.status).toBe(422);
    expect(wrong.body.error.field).toBe('revisionId');
  });

  it('lets an admin outside the project save one (admins manage the library)', async () => {
    const res = await save(admin, { sheetId: sheet.id, name: `Admin ${unique()}` });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
  });
});

describe('GET /api/firm-templates', () => {
  it('refuses a signed-out request with 401, lists the templates for the firm engineers, and refuses a viewer or a person on no project with 403', async () => {
    expect((await (await anonymous(t.app)).get('/api/firm-templates')).status).toBe(401);
    const name = `Listed ${unique()}`;
    await save(author, { sheetId: sheet.id, name });
    for (const client of [checker, admin]) {
      const res = await client.get('/api/firm-templates');
      expect(res.status).toBe(200);
      const listed = res.body.templates.find((x: { name: string }) => x.name === name);
      expect(listed.origin.sheetNumber).toBe(sheet.number);
      expect(listed).not.toHaveProperty('blocks');
    }
    // A viewer is the client's representative; the firm's library is not hers to read.
    for (const client of [viewer, outsider]) {
      const res = await client.get('/api/firm-templates');
      expect(res.status).toBe(403);
      expect(res.body.error.message).toMatch(/for its engineers/);
    }
  });
});

describe('PATCH and DELETE /api/firm-templates/:templateId', () => {
  it('lets the person who saved it and an admin rename it; refuses another author with 403', async () => {
    const made = await save(author, { sheetId: sheet.id, name: `Mine ${unique()}` });
    const id = made.body.template.id;
    const other = await secondAuthor.patch(`/api/firm-templates/${id}`, { name: 'Taken over' });
    expect(other.status).toBe(403);
    expect(other.body.error.message).toMatch(/Only an admin or .+, who saved it/);
    const empty = await author.patch(`/api/firm-templates/${id}`, {});
    expect(empty.status).toBe(422);
    const renamed = `Renamed ${unique()}`;
    const res = await author.patch(`/api/firm-templates/${id}`, { name: renamed });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.template.name).toBe(renamed);
    const byAdmin = await admin.patch(`/api/firm-templates/${id}`, { description: 'Checked.' });
    expect(byAdmin.status).toBe(200);
    expect(byAdmin.body.template).toMatchObject({ name: renamed, description: 'Checked.' });
    expect((await author.patch('/api/firm-templates/99999999', { name: 'x' })).status).toBe(404);
    expect((await author.patch('/api/firm-templates/abc', { name: 'x' })).body.error.field).toBe(
      'templateId',
    );
  });

  it('deletes it for an admin, not for another author, and records who did', async () => {
    const made = await save(author, { sheetId: sheet.id, name: `Doomed ${unique()}` });
    const id = made.body.template.id;
    expect((await secondAuthor.delete(`/api/firm-templates/${id}`)).status).toBe(403);
    expect((await admin.delete(`/api/firm-templates/${id}`)).status).toBe(204);
    expect(await t.db('firm_templates').where({ id }).first()).toBeUndefined();
    const row = await t.db('activity').where({ action: 'template.deleted', object_id: id }).first();
    expect(row.actor_id).toBe(team.admin.id);
    expect((await admin.delete(`/api/firm-templates/${id}`)).status).toBe(404);
  });
});

describe('POST /api/firm-templates/:templateId/sheets', () => {
  it('starts a sheet from the template for an author; refuses a viewer and bad input', async () => {
    const made = await save(author, { sheetId: sheet.id, name: `Start ${unique()}` });
    const id = made.body.template.id;
    const body = {
      projectId: team.project.id,
      number: `TS-${unique()}`,
      title: 'From the library',
    };

    const refused = await viewer.post(`/api/firm-templates/${id}/sheets`, body);
    expect(refused.status).toBe(403);
    const noTitle = await author.post(`/api/firm-templates/${id}/sheets`, { ...body, title: '' });
    expect(noTitle.status).toBe(422);
    expect(noTitle.body.error.field).toBe('title');

    const res = await secondAuthor.post(`/api/firm-templates/${id}/sheets`, body);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.sheet.draft).toEqual({
      blocks,
      settings: { significantFigures: 5, units: 'us' },
    });
    const activity = await t
      .db('activity')
      .where({ action: 'sheet.created', object_id: res.body.sheet.id })
      .first();
    expect(jsonColumn(activity.details)).toMatchObject({
      number: body.number,
      firmTemplate: { id, name: made.body.template.name },
    });

    const again = await author.post(`/api/firm-templates/${id}/sheets`, body);
    expect(again.status).toBe(409);
    expect(again.body.error.field).toBe('number');
    expect((await author.post('/api/firm-templates/99999999/sheets', body)).status).toBe(404);
  });
});
