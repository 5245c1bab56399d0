import { execFileSync } from 'node:child_process';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { anonymous, createTeamApp, type ApiClient, type TestApp } from '../support/api-app';
import { unique } from '../support/factories';

// With MariaDB stopped, every API route answers 503 DATABASE_UNAVAILABLE with Retry-After (the
// server stays up), and the same requests succeed again once MariaDB is back. The test stops and
// restarts this worktree's own MariaDB (scripts/db.sh, port MW_DB_PORT); afterAll restarts it
// whatever happened.

const root = path.resolve(import.meta.dirname, '..', '..');

function db(action: 'start' | 'stop'): void {
  execFileSync('bash', ['scripts/db.sh', action], {
    cwd: root,
    stdio: ['ignore', 'pipe', 'pipe'],
    timeout: 120_000,
  });
}

let t: TestApp;
let author: ApiClient;
let team: Awaited<ReturnType<typeof createTeamApp>>['team'];
let sheetId: number;

beforeAll(async () => {
  ({
    t,
    team,
    clients: { author },
  } = await createTeamApp(['author']));
  const res = await author.post(`/api/projects/${team.project.id}/sheets`, {
    number: `DBU-${unique()}`,
    title: 'Without the database',
  });
  expect(res.status).toBe(201);
  sheetId = res.body.sheet.id;
});

afterAll(async () => {
  db('start');
  await t?.close();
});

function expectUnavailable(res: {
  status: number;
  body: unknown;
  headers: Record<string, string>;
}) {
  expect(res.status, JSON.stringify(res.body)).toBe(503);
  const error = (res.body as { error: { code: string; message: string } }).error;
  expect(error.code).toBe('DATABASE_UNAVAILABLE');
  expect(error.message).toMatch(/cannot reach its database/);
  expect(Number(res.headers['retry-after'])).toBeGreaterThan(0);
}

describe('every API route while MariaDB is stopped', () => {
  it('answers 503 DATABASE_UNAVAILABLE with Retry-After, then works again when it is back', async () => {
    const blocks = [{ id: 'calc', kind: 'calc', source: 'k = 2 kN/mm' }];
    db('stop');
    try {
      expectUnavailable(await author.get('/api/auth/me'));
      expectUnavailable(await author.get(`/api/sheets/${sheetId}`));
      expectUnavailable(await author.get(`/api/projects/${team.project.id}/sheets`));
      expectUnavailable(
        await author.agent
          .put(`/api/sheets/${sheetId}/draft`)
          .set('X-CSRF-Token', author.csrfToken)
          .set('If-Match', '"1"')
          .send({ blocks }),
      );
      expectUnavailable(await author.post(`/api/sheets/${sheetId}/evaluate`, { blocks }));
      const stranger = new (author.constructor as new (app: TestApp['app']) => ApiClient)(t.app);
      expectUnavailable(await stranger.agent.get('/api/auth/csrf'));
      expectUnavailable(await stranger.agent.get('/api/verify/ZZZZZ-ZZZZZ'));
    } finally {
      db('start');
    }
    // The pool reconnects by itself: the save that was refused goes through now.
    const saved = await author.agent
      .put(`/api/sheets/${sheetId}/draft`)
      .set('X-CSRF-Token', author.csrfToken)
      .set('If-Match', '"1"')
      .send({ blocks });
    expect(saved.status, JSON.stringify(saved.body)).toBe(200);
    const row = await t.db('sheets').where({ id: sheetId }).first();
    expect(row.draft.blocks).toEqual(blocks);
    expect((await anonymous(t.app)).csrfToken).not.toBe('');
  });
});
