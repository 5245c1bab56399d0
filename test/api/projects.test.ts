import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { anonymous, createTestApp, signedIn, type TestApp } from '../support/api-app';
import {
  addMember,
  createProject,
  createProjectTeam,
  createUser,
  jsonColumn,
  unique,
} from '../support/factories';

let t: TestApp;

beforeAll(async () => {
  t = await createTestApp();
});

afterAll(async () => {
  await t.close();
});

const isoUtc = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{3}Z$/;

function newProjectBody() {
  const tag = unique();
  return {
    jobNumber: `NP-${tag}`,
    name: `New project ${tag}`,
    client: `Client ${tag}`,
    site: `Site ${tag}`,
  };
}

describe('GET /api/projects', () => {
  it('answers 401 when signed out', async () => {
    const res = await (await anonymous(t.app)).get('/api/projects');
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('UNAUTHENTICATED');
  });

  it("lists only the person's own projects with their roles and the member count", async () => {
    const team = await createProjectTeam(t.db);
    const elsewhere = await createProject(t.db);
    await addMember(t.db, team.project.id, team.checker.id, ['author']);
    const client = await signedIn(t.app, team.checker);
    const res = await client.get('/api/projects').expect(200);
    expect(res.body.projects).toHaveLength(1);
    const [project] = res.body.projects;
    expect(project).toEqual({
      id: team.project.id,
      jobNumber: team.project.jobNumber,
      name: team.project.name,
      client: team.project.client,
      site: team.project.site,
      myRoles: ['author', 'checker'],
      // author, checker (twice: author and checker roles), principal, viewer: four people
      memberCount: 4,
      createdAt: expect.stringMatching(isoUtc),
      updatedAt: expect.stringMatching(isoUtc),
    });
    expect(res.body.projects.map((p: { id: number }) => p.id)).not.toContain(elsewhere.id);
  });

  it('gives a person with no projects an empty list', async () => {
    const loner = await createUser(t.db);
    const res = await (await signedIn(t.app, loner)).get('/api/projects').expect(200);
    expect(res.body).toEqual({ projects: [] });
  });

  it('shows an admin every project, with no roles where they are not a member', async () => {
    const team = await createProjectTeam(t.db);
    const other = await createProject(t.db);
    const client = await signedIn(t.app, team.admin);
    // Other test files may add projects meanwhile: every project that existed before must show.
    const existing = (await t.db('projects').select('id')).map((r: { id: number }) => r.id);
    const res = await client.get('/api/projects').expect(200);
    const ids = res.body.projects.map((p: { id: number }) => p.id);
    expect(ids).toContain(team.project.id);
    expect(ids).toContain(other.id);
    const row = res.body.projects.find((p: { id: number }) => p.id === other.id);
    expect(row.myRoles).toEqual([]);
    expect(row.memberCount).toBe(0);
    expect(ids).toEqual(expect.arrayContaining(existing));
  });
});

describe('POST /api/projects', () => {
  it('answers 401 when signed out', async () => {
    const res = await (await anonymous(t.app)).post('/api/projects', newProjectBody());
    expect(res.status).toBe(401);
  });

  it('answers 403 to a principal (projects are made by an admin)', async () => {
    const team = await createProjectTeam(t.db);
    const body = newProjectBody();
    const res = await (await signedIn(t.app, team.principal)).post('/api/projects', body);
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('FORBIDDEN');
    expect(await t.db('projects').where({ job_number: body.jobNumber })).toHaveLength(0);
  });

  it('answers 422 naming the field when the site is missing', async () => {
    const admin = await createUser(t.db, { isAdmin: true });
    const { site: _site, ...body } = newProjectBody();
    const res = await (await signedIn(t.app, admin)).post('/api/projects', body);
    expect(res.status).toBe(422);
    expect(res.body.error).toMatchObject({ code: 'VALIDATION', field: 'site' });
    expect(res.body.error.message).toMatch(/^site: Enter the site\.$/);
  });

  it('answers 422 naming the field for a job number with spaces', async () => {
    const admin = await createUser(t.db, { isAdmin: true });
    const res = await (
      await signedIn(t.app, admin)
    ).post('/api/projects', {
      ...newProjectBody(),
      jobNumber: 'BW 1',
    });
    expect(res.status).toBe(422);
    expect(res.body.error.field).toBe('jobNumber');
  });

  it('answers 422 for an unknown field', async () => {
    const admin = await createUser(t.db, { isAdmin: true });
    const res = await (
      await signedIn(t.app, admin)
    ).post('/api/projects', {
      ...newProjectBody(),
      budget: 12,
    });
    expect(res.status).toBe(422);
    expect(res.body.error.message).toMatch(/budget/);
  });

  it('creates the project (201) and records project.created', async () => {
    const admin = await createUser(t.db, { isAdmin: true });
    const body = newProjectBody();
    const res = await (
      await signedIn(t.app, admin)
    ).post('/api/projects', {
      ...body,
      name: `  ${body.name}  `,
    });
    expect(res.status).toBe(201);
    expect(res.body.project).toEqual({
      id: expect.any(Number),
      ...body,
      myRoles: [],
      memberCount: 0,
      createdAt: expect.stringMatching(isoUtc),
      updatedAt: expect.stringMatching(isoUtc),
    });
    const row = await t.db('projects').where({ id: res.body.project.id }).first();
    expect(row).toMatchObject({
      job_number: body.jobNumber,
      name: body.name,
      client: body.client,
      site: body.site,
    });
    const activity = await t.db('activity').where({ project_id: res.body.project.id });
    expect(activity).toHaveLength(1);
    expect(activity[0]).toMatchObject({
      actor_id: admin.id,
      action: 'project.created',
      object_type: 'project',
      object_id: res.body.project.id,
    });
    expect(jsonColumn(activity[0].details)).toEqual(body);
  });

  it('answers 409 DUPLICATE on jobNumber for a job number already in use', async () => {
    const admin = await createUser(t.db, { isAdmin: true });
    const existing = await createProject(t.db);
    const res = await (
      await signedIn(t.app, admin)
    ).post('/api/projects', {
      ...newProjectBody(),
      jobNumber: existing.jobNumber,
    });
    expect(res.status).toBe(409);
    expect(res.body.error).toMatchObject({ code: 'DUPLICATE', field: 'jobNumber' });
    expect(res.body.error.message).toContain(existing.jobNumber);
  });
});

describe('GET /api/projects/:projectId', () => {
  it('answers 401 when signed out', async () => {
    const project = await createProject(t.db);
    expect((await (await anonymous(t.app)).get(`/api/projects/${project.id}`)).status).toBe(401);
  });

  it('answers 403 to someone who is not a member', async () => {
    const team = await createProjectTeam(t.db);
    const res = await (
      await signedIn(t.app, team.outsider)
    ).get(`/api/projects/${team.project.id}`);
    expect(res.status).toBe(403);
    expect(res.body.error).toEqual({
      code: 'FORBIDDEN',
      message: 'You are not a member of this project.',
    });
  });

  it('answers 404 for a project that does not exist', async () => {
    const admin = await createUser(t.db, { isAdmin: true });
    const res = await (await signedIn(t.app, admin)).get('/api/projects/4000000000');
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('NOT_FOUND');
  });

  it('answers 422 naming projectId for an id that is not a number', async () => {
    const admin = await createUser(t.db, { isAdmin: true });
    const res = await (await signedIn(t.app, admin)).get('/api/projects/kestrel');
    expect(res.status).toBe(422);
    expect(res.body.error.field).toBe('projectId');
  });

  it('shows a viewer the project with their role', async () => {
    const team = await createProjectTeam(t.db);
    const res = await (
      await signedIn(t.app, team.viewer)
    )
      .get(`/api/projects/${team.project.id}`)
      .expect(200);
    expect(res.body.project).toMatchObject({
      id: team.project.id,
      jobNumber: team.project.jobNumber,
      myRoles: ['viewer'],
      memberCount: 4,
    });
  });
});

describe('PATCH /api/projects/:projectId', () => {
  it('answers 401 when signed out', async () => {
    const project = await createProject(t.db);
    const res = await (await anonymous(t.app)).patch(`/api/projects/${project.id}`, { name: 'x' });
    expect(res.status).toBe(401);
  });

  it('answers 403 to the project author', async () => {
    const team = await createProjectTeam(t.db);
    const res = await (
      await signedIn(t.app, team.author)
    ).patch(`/api/projects/${team.project.id}`, { name: 'Renamed by the author' });
    expect(res.status).toBe(403);
    const row = await t.db('projects').where({ id: team.project.id }).first();
    expect(row.name).toBe(team.project.name);
  });

  it('answers 422 for an empty change and for an empty name', async () => {
    const team = await createProjectTeam(t.db);
    const admin = await signedIn(t.app, team.admin);
    const empty = await admin.patch(`/api/projects/${team.project.id}`, {});
    expect(empty.status).toBe(422);
    expect(empty.body.error.message).toMatch(/at least one/);
    const blank = await admin.patch(`/api/projects/${team.project.id}`, { name: '   ' });
    expect(blank.status).toBe(422);
    expect(blank.body.error.field).toBe('name');
  });

  it('answers 404 for a project that does not exist', async () => {
    const admin = await createUser(t.db, { isAdmin: true });
    const res = await (
      await signedIn(t.app, admin)
    ).patch('/api/projects/4000000000', {
      name: 'Nothing',
    });
    expect(res.status).toBe(404);
  });

  it('answers 409 on jobNumber when taking another project’s job number', async () => {
    const team = await createProjectTeam(t.db);
    const other = await createProject(t.db);
    const res = await (
      await signedIn(t.app, team.admin)
    ).patch(`/api/projects/${team.project.id}`, { jobNumber: other.jobNumber });
    expect(res.status).toBe(409);
    expect(res.body.error).toMatchObject({ code: 'DUPLICATE', field: 'jobNumber' });
  });

  it('updates the given fields only and records what changed', async () => {
    const team = await createProjectTeam(t.db);
    const newName = `Renamed ${unique()}`;
    const res = await (
      await signedIn(t.app, team.admin)
    ).patch(`/api/projects/${team.project.id}`, { name: newName, client: team.project.client });
    expect(res.status).toBe(200);
    expect(res.body.project).toMatchObject({
      id: team.project.id,
      name: newName,
      client: team.project.client,
      site: team.project.site,
      jobNumber: team.project.jobNumber,
    });
    expect(Date.parse(res.body.project.updatedAt)).toBeGreaterThanOrEqual(
      Date.parse(res.body.project.createdAt),
    );
    const row = await t.db('projects').where({ id: team.project.id }).first();
    expect(row.name).toBe(newName);
    const activity = await t.db('activity').where({
      project_id: team.project.id,
      action: 'project.updated',
    });
    expect(activity).toHaveLength(1);
    expect(activity[0].actor_id).toBe(team.admin.id);
    // Only the name changed: the client was sent with its current value.
    expect(jsonColumn(activity[0].details)).toEqual({
      changes: { name: { from: team.project.name, to: newName } },
    });
  });
});
