// The real app in-process for supertest, against the test database, plus clients that carry the
// session cookie and the CSRF token the way the web client does.
import express, { type Router } from 'express';
import request from 'supertest';
import type { Knex } from 'knex';
import { createApp, type AppOptions, type CreatedApp } from '../../api/app';
import { loadSessionUser } from '../../api/http/auth';
import { csrfProtection } from '../../api/http/csrf';
import { usersService } from '../../api/modules/users/users.service';
import { createProjectTeam } from './factories';

export const TEST_SESSION_SECRET = 'test-session-secret-that-is-long-enough-0123456789';

export interface TestApp extends CreatedApp {
  db: Knex;
}

/** Builds the app against modewright_test (refusing any database not named *_test). */
export async function createTestApp(options: AppOptions = {}): Promise<TestApp> {
  const name = process.env.MW_DB_NAME ?? 'modewright_test';
  if (!name.endsWith('_test')) {
    throw new Error(`API tests run only against a *_test database, not "${name}".`);
  }
  process.env.MW_DB_NAME = name;
  const created = await createApp({
    sessionSecret: TEST_SESSION_SECRET,
    logRequests: false,
    sessionCleanupMs: 0,
    signinLimit: 1000,
    signinAddressLimit: 1000,
    passwordCheckLimit: 1000,
    ...options,
  });
  return created;
}

/**
 * Puts `routes` in front of the app's own /api router (after the session middleware), with the
 * CSRF check and the session user that router applies: a test can serve a module on its own
 * worker pool and watch it.
 */
export function mountBeforeApi(t: TestApp, routes: Router): void {
  const router = express.Router();
  router.use(csrfProtection);
  router.use(loadSessionUser((userId) => usersService.findById(t.db, userId)));
  router.use(routes);
  t.app.use('/api', router);
  const stack = (t.app as unknown as { router: { stack: { handle: unknown }[] } }).router.stack;
  const mine = stack.pop()!;
  // The app's own /api router is the layer whose handle has a stack of its own.
  const apiIndex = stack.findIndex(
    (l, i) => i > 0 && typeof l.handle === 'function' && 'stack' in (l.handle as object),
  );
  stack.splice(apiIndex >= 0 ? apiIndex : stack.length, 0, mine);
}

type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';

/** A browser-like client: keeps cookies, sends X-CSRF-Token on every state-changing request. */
export class ApiClient {
  readonly agent: ReturnType<typeof request.agent>;
  csrfToken = '';

  constructor(readonly app: CreatedApp['app']) {
    this.agent = request.agent(app);
  }

  /** Fetches a CSRF token (this creates the anonymous session). */
  async init(): Promise<this> {
    const res = await this.agent.get('/api/auth/csrf').expect(200);
    this.csrfToken = res.body.csrfToken;
    return this;
  }

  private send(method: Method, url: string, body?: unknown) {
    const req = this.agent[method](url);
    if (method !== 'get') req.set('X-CSRF-Token', this.csrfToken);
    return body === undefined ? req : req.send(body as object);
  }

  get(url: string) {
    return this.send('get', url);
  }
  post(url: string, body?: unknown) {
    return this.send('post', url, body);
  }
  patch(url: string, body?: unknown) {
    return this.send('patch', url, body);
  }
  delete(url: string) {
    return this.send('delete', url);
  }

  /** Signs in (expecting success) and keeps the fresh token the server returns. */
  async signIn(email: string, password: string): Promise<this> {
    if (!this.csrfToken) await this.init();
    const res = await this.post('/api/auth/sign-in', { email, password });
    if (res.status !== 200) {
      throw new Error(`sign-in of ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
    }
    this.csrfToken = res.body.csrfToken;
    return this;
  }
}

/** A signed-out client that already holds a CSRF token. */
export function anonymous(app: CreatedApp['app']): Promise<ApiClient> {
  return new ApiClient(app).init();
}

export function signedIn(
  app: CreatedApp['app'],
  person: { email: string; password: string },
): Promise<ApiClient> {
  return new ApiClient(app).signIn(person.email, person.password);
}

/** The members of a project team (test/support/factories.ts createProjectTeam) by role. */
export type TeamMember = 'admin' | 'author' | 'checker' | 'principal' | 'viewer' | 'outsider';

/**
 * The common preamble of an API test file: the app, a fresh project team, and a signed-in
 * client for each member named (signed in in parallel).
 */
export async function createTeamApp<M extends TeamMember>(
  members: readonly M[],
  options: AppOptions = {},
): Promise<{
  t: TestApp;
  team: Awaited<ReturnType<typeof createProjectTeam>>;
  clients: Record<M, ApiClient>;
}> {
  const t = await createTestApp(options);
  const team = await createProjectTeam(t.db);
  const signed = await Promise.all(members.map((m) => signedIn(t.app, team[m])));
  const clients = Object.fromEntries(members.map((m, i) => [m, signed[i]!])) as Record<
    M,
    ApiClient
  >;
  return { t, team, clients };
}

/** A sheet block as a draft holds it. */
export interface DraftBlock {
  id: string;
  kind: string;
  source: string;
}

/**
 * Saves a sheet's draft as the editor does (If-Match on the draft version; fetched first when
 * not given), with four significant figures; throws unless the server answers 200.
 */
export async function saveDraft(
  client: ApiClient,
  sheetId: number,
  blocks: DraftBlock[],
  draftVersion?: number,
): Promise<void> {
  const version =
    draftVersion ?? (await client.get(`/api/sheets/${sheetId}`)).body.sheet.draftVersion;
  const res = await client.agent
    .put(`/api/sheets/${sheetId}/draft`)
    .set('X-CSRF-Token', client.csrfToken)
    .set('If-Match', `"${version}"`)
    .send({ blocks, settings: { significantFigures: 4 } });
  if (res.status !== 200) {
    throw new Error(
      `saving the draft of sheet ${sheetId} failed: ${res.status} ${JSON.stringify(res.body)}`,
    );
  }
}

/**
 * Creates a sheet in the project through the API and saves `blocks` as its draft; throws unless
 * both succeed.
 */
export async function createSheetWithDraft(
  client: ApiClient,
  projectId: number,
  sheet: { number: string; title: string },
  blocks: DraftBlock[],
): Promise<{ id: number; number: string }> {
  const res = await client.post(`/api/projects/${projectId}/sheets`, sheet);
  if (res.status !== 201) {
    throw new Error(
      `creating sheet ${sheet.number} failed: ${res.status} ${JSON.stringify(res.body)}`,
    );
  }
  await saveDraft(client, res.body.sheet.id, blocks, res.body.sheet.draftVersion);
  return { id: res.body.sheet.id, number: res.body.sheet.number };
}
