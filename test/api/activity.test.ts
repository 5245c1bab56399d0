import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  anonymous,
  createSheetWithDraft,
  createTestApp,
  signedIn,
  type TestApp,
} from '../support/api-app';
import { createProject, createProjectTeam, createUser } from '../support/factories';

let t: TestApp;

beforeAll(async () => {
  t = await createTestApp();
});

afterAll(async () => {
  await t.close();
});

describe('GET /api/projects/:projectId/activity', () => {
  it('answers 401 when signed out', async () => {
    const project = await createProject(t.db);
    const res = await (await anonymous(t.app)).get(`/api/projects/${project.id}/activity`);
    expect(res.status).toBe(401);
  });

  it('answers 403 to someone outside the project', async () => {
    const team = await createProjectTeam(t.db);
    const res = await (
      await signedIn(t.app, team.outsider)
    ).get(`/api/projects/${team.project.id}/activity`);
    expect(res.status).toBe(403);
  });

  it('answers 422 naming projectId for a negative id', async () => {
    const admin = await createUser(t.db, { isAdmin: true });
    const res = await (await signedIn(t.app, admin)).get('/api/projects/-3/activity');
    expect(res.status).toBe(422);
    expect(res.body.error.field).toBe('projectId');
  });

  it('lists what happened in the project, newest first, with the actor', async () => {
    const team = await createProjectTeam(t.db);
    const admin = await signedIn(t.app, team.admin);
    await admin
      .patch(`/api/projects/${team.project.id}`, { site: `${team.project.site} (moved)` })
      .expect(200);
    await admin
      .patch(`/api/projects/${team.project.id}/members/${team.viewer.id}`, { roles: ['checker'] })
      .expect(200);
    await admin.delete(`/api/projects/${team.project.id}/members/${team.checker.id}`).expect(204);
    const res = await (
      await signedIn(t.app, team.author)
    )
      .get(`/api/projects/${team.project.id}/activity`)
      .expect(200);
    expect(res.body.activity.map((a: { action: string }) => a.action)).toEqual([
      'member.removed',
      'member.roles_changed',
      'project.updated',
    ]);
    const [removed] = res.body.activity;
    expect(removed).toEqual({
      id: expect.any(Number),
      at: expect.stringMatching(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{3}Z$/),
      actor: { id: team.admin.id, name: team.admin.name },
      action: 'member.removed',
      objectType: 'user',
      objectId: team.checker.id,
      details: { email: team.checker.email, name: team.checker.name, roles: ['checker'] },
    });
    // Times are UTC: within a minute of the test's own clock (common practice for clock skew).
    expect(Math.abs(Date.parse(removed.at) - Date.now())).toBeLessThan(60_000);
  });
});

describe('activity table', () => {
  it('refuses UPDATE and DELETE (append-only, enforced by triggers)', async () => {
    const admin = await createUser(t.db, { isAdmin: true });
    const [id] = await t.db('activity').insert({
      actor_id: admin.id,
      action: 'user.created',
      object_type: 'user',
      object_id: admin.id,
      details: '{}',
    });
    await expect(t.db('activity').where({ id }).update({ action: 'x' })).rejects.toThrow(
      /append-only: rows cannot be changed/,
    );
    await expect(t.db('activity').where({ id }).delete()).rejects.toThrow(
      /append-only: rows cannot be removed/,
    );
    expect(await t.db('activity').where({ id }).first()).toMatchObject({ action: 'user.created' });
  });
});

describe('activity about a sheet', () => {
  it('names the sheet by its number and title, not only its id', async () => {
    const team = await createProjectTeam(t.db);
    const author = await signedIn(t.app, team.author);
    const sheet = await createSheetWithDraft(
      author,
      team.project.id,
      { number: `ACT-${team.project.id}`, title: 'Deck frequency' },
      [{ id: 'intro', kind: 'text', source: 'Vertical modes of the deck.' }],
    );
    const res = await author.get(`/api/projects/${team.project.id}/activity`).expect(200);
    const aboutSheet = res.body.activity.filter(
      (a: { action: string }) => a.action === 'sheet.created' || a.action === 'sheet.draft_saved',
    );
    expect(aboutSheet).toHaveLength(2);
    for (const entry of aboutSheet) {
      expect(entry.sheet).toEqual({ id: sheet.id, number: sheet.number, title: 'Deck frequency' });
    }
  });
});
