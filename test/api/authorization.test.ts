import express from 'express';
import session from 'express-session';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { currentUser, loadSessionUser, requireAdmin, requireSignedIn } from '../../api/http/auth';
import { usersService } from '../../api/modules/users/users.service';
import { errorMiddleware } from '../../api/http/error-middleware';
import { createLogger } from '../../api/http/logger';
import { createTestApp, type TestApp } from '../support/api-app';
import { addMember, createProjectTeam } from '../support/factories';

// The helpers on a bare app whose session is set by a test-only route, so each rule is checked
// on its own, apart from sign-in and CSRF.
let t: TestApp;
let app: express.Express;

beforeAll(async () => {
  t = await createTestApp();
  app = express();
  app.use(session({ secret: 'authorization-test', resave: false, saveUninitialized: false }));
  app.get('/as/:userId', (req, res) => {
    req.session.userId = Number(req.params.userId);
    res.status(204).end();
  });
  app.use(loadSessionUser((userId) => usersService.findById(t.db, userId)));
  const { access } = t.ctx;
  // Rules of their own, so each part of the policy is checked apart from the product's table.
  const anyOf = (roles: ('checker' | 'principal')[]) => ({
    roles,
    adminWithoutRole: true,
    doing: 'do this',
  });
  app.get('/signed-in', requireSignedIn, (req, res) => res.json({ id: currentUser(req).id }));
  app.get('/admin', requireAdmin, (_req, res) => res.json({ ok: true }));
  app.get('/projects/:projectId/any', access.requireProject('project.read'), (_req, res) =>
    res.json({ ok: 1 }),
  );
  app.get(
    '/projects/:projectId/review',
    access.requireProject(anyOf(['checker', 'principal'])),
    (_r, res) => res.json({ ok: 1 }),
  );
  app.get('/projects/:projectId/seal', access.requireProject(anyOf(['principal'])), (_r, res) =>
    res.json({ ok: 1 }),
  );
  app.use(errorMiddleware(createLogger(false)));
});

afterAll(async () => {
  await t.close();
});

async function as(userId: number) {
  const agent = request.agent(app);
  await agent.get(`/as/${userId}`).expect(204);
  return agent;
}

describe('authorization helpers (api/http/auth.ts)', () => {
  it('tells signed out (401) apart from not allowed (403)', async () => {
    const team = await createProjectTeam(t.db);
    const signedOut = await request(app).get('/admin');
    expect(signedOut.status).toBe(401);
    expect(signedOut.body.error.code).toBe('UNAUTHENTICATED');
    const notAdmin = await (await as(team.author.id)).get('/admin');
    expect(notAdmin.status).toBe(403);
    expect(notAdmin.body.error.code).toBe('FORBIDDEN');
    await (await as(team.admin.id)).get('/admin').expect(200);
  });

  it('treats a session whose person no longer exists as signed out', async () => {
    const res = await (await as(2_000_000_000)).get('/signed-in');
    expect(res.status).toBe(401);
  });

  it('lets any member through when no role is named, and an admin who is not a member', async () => {
    const team = await createProjectTeam(t.db);
    for (const person of [team.author, team.checker, team.principal, team.viewer, team.admin]) {
      await (await as(person.id)).get(`/projects/${team.project.id}/any`).expect(200);
    }
    await (await as(team.outsider.id)).get(`/projects/${team.project.id}/any`).expect(403);
  });

  it('lets through only the named roles, and says which roles may', async () => {
    const team = await createProjectTeam(t.db);
    await (await as(team.checker.id)).get(`/projects/${team.project.id}/review`).expect(200);
    await (await as(team.principal.id)).get(`/projects/${team.project.id}/review`).expect(200);
    const author = await (await as(team.author.id)).get(`/projects/${team.project.id}/review`);
    expect(author.status).toBe(403);
    expect(author.body.error.message).toBe(
      'Only a checker or principal of this project can do this.',
    );
    const viewer = await (await as(team.viewer.id)).get(`/projects/${team.project.id}/seal`);
    expect(viewer.status).toBe(403);
    expect(viewer.body.error.message).toBe('Only the principal of this project can do this.');
  });

  it('counts every role a person holds', async () => {
    const team = await createProjectTeam(t.db);
    await addMember(t.db, team.project.id, team.author.id, ['principal']);
    await (await as(team.author.id)).get(`/projects/${team.project.id}/seal`).expect(200);
  });

  it('answers 404 for a missing project before looking at roles, and 422 for a bad id', async () => {
    const team = await createProjectTeam(t.db);
    const missing = await (await as(team.author.id)).get('/projects/4000000000/any');
    expect(missing.status).toBe(404);
    const bad = await (await as(team.author.id)).get('/projects/1.5/any');
    expect(bad.status).toBe(422);
    expect(bad.body.error.field).toBe('projectId');
  });
});
