import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { anonymous, createTestApp, signedIn, type TestApp } from '../support/api-app';
import { createProject, createProjectTeam, createUser, jsonColumn } from '../support/factories';

let t: TestApp;

beforeAll(async () => {
  t = await createTestApp();
});

afterAll(async () => {
  await t.close();
});

async function rolesInDb(projectId: number, userId: number): Promise<string[]> {
  const rows = await t
    .db('project_members')
    .where({ project_id: projectId, user_id: userId })
    .orderBy('role');
  return rows.map((r: { role: string }) => r.role);
}

async function lastActivity(projectId: number, action: string) {
  const rows = await t
    .db('activity')
    .where({ project_id: projectId, action })
    .orderBy('id', 'desc');
  return rows[0] ? { ...rows[0], details: jsonColumn(rows[0].details) } : undefined;
}

describe('GET /api/projects/:projectId/members', () => {
  it('answers 401 when signed out', async () => {
    const project = await createProject(t.db);
    const res = await (await anonymous(t.app)).get(`/api/projects/${project.id}/members`);
    expect(res.status).toBe(401);
  });

  it('answers 403 to someone outside the project', async () => {
    const team = await createProjectTeam(t.db);
    const res = await (
      await signedIn(t.app, team.outsider)
    ).get(`/api/projects/${team.project.id}/members`);
    expect(res.status).toBe(403);
  });

  it('answers 404 for a project that does not exist', async () => {
    const admin = await createUser(t.db, { isAdmin: true });
    const res = await (await signedIn(t.app, admin)).get('/api/projects/4000000000/members');
    expect(res.status).toBe(404);
  });

  it('lists every member with their roles to a viewer of the project', async () => {
    const team = await createProjectTeam(t.db);
    const res = await (
      await signedIn(t.app, team.viewer)
    )
      .get(`/api/projects/${team.project.id}/members`)
      .expect(200);
    const byId = new Map(
      res.body.members.map((m: { userId: number; roles: string[] }) => [m.userId, m]),
    );
    expect(res.body.members).toHaveLength(4);
    expect(byId.get(team.author.id)).toEqual({
      userId: team.author.id,
      email: team.author.email,
      name: team.author.name,
      roles: ['author'],
    });
    expect(byId.get(team.checker.id)).toMatchObject({ roles: ['checker'] });
    expect(byId.get(team.principal.id)).toMatchObject({ roles: ['principal'] });
    expect(byId.get(team.viewer.id)).toMatchObject({ roles: ['viewer'] });
    expect(JSON.stringify(res.body)).not.toMatch(/password|hash/i);
  });
});

describe('POST /api/projects/:projectId/members', () => {
  it('answers 401 when signed out', async () => {
    const team = await createProjectTeam(t.db);
    const res = await (
      await anonymous(t.app)
    ).post(`/api/projects/${team.project.id}/members`, {
      email: team.outsider.email,
      roles: ['viewer'],
    });
    expect(res.status).toBe(401);
  });

  it('answers 403 to the principal of the project', async () => {
    const team = await createProjectTeam(t.db);
    const res = await (
      await signedIn(t.app, team.principal)
    ).post(`/api/projects/${team.project.id}/members`, {
      email: team.outsider.email,
      roles: ['viewer'],
    });
    expect(res.status).toBe(403);
    expect(await rolesInDb(team.project.id, team.outsider.id)).toEqual([]);
  });

  it('answers 422 on email for an address nobody has', async () => {
    const team = await createProjectTeam(t.db);
    const res = await (
      await signedIn(t.app, team.admin)
    ).post(`/api/projects/${team.project.id}/members`, {
      email: 'nobody-at-all@factory.example',
      roles: ['viewer'],
    });
    expect(res.status).toBe(422);
    expect(res.body.error).toMatchObject({ code: 'VALIDATION', field: 'email' });
    expect(res.body.error.message).toContain('nobody-at-all@factory.example');
  });

  it('answers 422 on roles.0 for a role that does not exist, and on roles for none', async () => {
    const team = await createProjectTeam(t.db);
    const admin = await signedIn(t.app, team.admin);
    const bad = await admin.post(`/api/projects/${team.project.id}/members`, {
      email: team.outsider.email,
      roles: ['reviewer'],
    });
    expect(bad.status).toBe(422);
    expect(bad.body.error.field).toBe('roles.0');
    expect(bad.body.error.message).toMatch(/author, checker, principal, viewer/);
    const none = await admin.post(`/api/projects/${team.project.id}/members`, {
      email: team.outsider.email,
      roles: [],
    });
    expect(none.status).toBe(422);
    expect(none.body.error.field).toBe('roles');
  });

  it('answers 409 for someone who is already a member', async () => {
    const team = await createProjectTeam(t.db);
    const res = await (
      await signedIn(t.app, team.admin)
    ).post(`/api/projects/${team.project.id}/members`, {
      email: team.checker.email,
      roles: ['viewer'],
    });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('CONFLICT');
    expect(await rolesInDb(team.project.id, team.checker.id)).toEqual(['checker']);
  });

  it('adds the person with their roles (201) and records member.added', async () => {
    const team = await createProjectTeam(t.db);
    const res = await (
      await signedIn(t.app, team.admin)
    ).post(`/api/projects/${team.project.id}/members`, {
      email: team.outsider.email.toUpperCase(),
      roles: ['checker', 'author', 'checker'],
    });
    expect(res.status).toBe(201);
    expect(res.body.member).toEqual({
      userId: team.outsider.id,
      email: team.outsider.email,
      name: team.outsider.name,
      roles: ['author', 'checker'],
    });
    expect(await rolesInDb(team.project.id, team.outsider.id)).toEqual(['author', 'checker']);
    const activity = await lastActivity(team.project.id, 'member.added');
    expect(activity).toMatchObject({
      actor_id: team.admin.id,
      object_type: 'user',
      object_id: team.outsider.id,
    });
    expect(activity?.details).toMatchObject({
      email: team.outsider.email,
      roles: ['author', 'checker'],
    });
  });
});

describe('PATCH /api/projects/:projectId/members/:userId', () => {
  it('answers 401 when signed out', async () => {
    const team = await createProjectTeam(t.db);
    const res = await (
      await anonymous(t.app)
    ).patch(`/api/projects/${team.project.id}/members/${team.viewer.id}`, { roles: ['checker'] });
    expect(res.status).toBe(401);
  });

  it('answers 403 to the checker', async () => {
    const team = await createProjectTeam(t.db);
    const res = await (
      await signedIn(t.app, team.checker)
    ).patch(`/api/projects/${team.project.id}/members/${team.viewer.id}`, { roles: ['checker'] });
    expect(res.status).toBe(403);
    expect(await rolesInDb(team.project.id, team.viewer.id)).toEqual(['viewer']);
  });

  it('answers 422 on roles when no role is left', async () => {
    const team = await createProjectTeam(t.db);
    const res = await (
      await signedIn(t.app, team.admin)
    ).patch(`/api/projects/${team.project.id}/members/${team.viewer.id}`, { roles: [] });
    expect(res.status).toBe(422);
    expect(res.body.error.field).toBe('roles');
  });

  it('answers 422 on userId for a person id that is not a number', async () => {
    const team = await createProjectTeam(t.db);
    const res = await (
      await signedIn(t.app, team.admin)
    ).patch(`/api/projects/${team.project.id}/members/lena`, { roles: ['viewer'] });
    expect(res.status).toBe(422);
    expect(res.body.error.field).toBe('userId');
  });

  it('answers 404 for someone who is not a member', async () => {
    const team = await createProjectTeam(t.db);
    const res = await (
      await signedIn(t.app, team.admin)
    ).patch(`/api/projects/${team.project.id}/members/${team.outsider.id}`, { roles: ['viewer'] });
    expect(res.status).toBe(404);
    expect(await rolesInDb(team.project.id, team.outsider.id)).toEqual([]);
  });

  it('replaces the roles and records from and to', async () => {
    const team = await createProjectTeam(t.db);
    const res = await (
      await signedIn(t.app, team.admin)
    ).patch(`/api/projects/${team.project.id}/members/${team.viewer.id}`, {
      roles: ['checker', 'principal'],
    });
    expect(res.status).toBe(200);
    expect(res.body.member).toMatchObject({
      userId: team.viewer.id,
      roles: ['checker', 'principal'],
    });
    expect(await rolesInDb(team.project.id, team.viewer.id)).toEqual(['checker', 'principal']);
    const activity = await lastActivity(team.project.id, 'member.roles_changed');
    expect(activity).toMatchObject({ actor_id: team.admin.id, object_id: team.viewer.id });
    expect(activity?.details).toMatchObject({ from: ['viewer'], to: ['checker', 'principal'] });
  });
});

describe('DELETE /api/projects/:projectId/members/:userId', () => {
  it('answers 401 when signed out', async () => {
    const team = await createProjectTeam(t.db);
    const res = await (
      await anonymous(t.app)
    ).delete(`/api/projects/${team.project.id}/members/${team.viewer.id}`);
    expect(res.status).toBe(401);
  });

  it('answers 403 to the author', async () => {
    const team = await createProjectTeam(t.db);
    const res = await (
      await signedIn(t.app, team.author)
    ).delete(`/api/projects/${team.project.id}/members/${team.viewer.id}`);
    expect(res.status).toBe(403);
    expect(await rolesInDb(team.project.id, team.viewer.id)).toEqual(['viewer']);
  });

  it('answers 404 for someone who is not a member', async () => {
    const team = await createProjectTeam(t.db);
    const res = await (
      await signedIn(t.app, team.admin)
    ).delete(`/api/projects/${team.project.id}/members/${team.outsider.id}`);
    expect(res.status).toBe(404);
  });

  it('removes every role (204), records member.removed, and the person loses access', async () => {
    const team = await createProjectTeam(t.db);
    const viewer = await signedIn(t.app, team.viewer);
    await viewer.get(`/api/projects/${team.project.id}`).expect(200);
    const res = await (
      await signedIn(t.app, team.admin)
    ).delete(`/api/projects/${team.project.id}/members/${team.viewer.id}`);
    expect(res.status).toBe(204);
    expect(await rolesInDb(team.project.id, team.viewer.id)).toEqual([]);
    const activity = await lastActivity(team.project.id, 'member.removed');
    expect(activity).toMatchObject({ actor_id: team.admin.id, object_id: team.viewer.id });
    expect(activity?.details).toMatchObject({ roles: ['viewer'] });
    // Roles are read on every request, so the still-open session loses access at once.
    await viewer.get(`/api/projects/${team.project.id}`).expect(403);
  });
});
