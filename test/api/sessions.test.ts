import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { createTestApp, signedIn } from '../support/api-app';
import { createUser } from '../support/factories';

function sessionCookie(setCookie: unknown): string {
  const all = Array.isArray(setCookie) ? setCookie : [String(setCookie)];
  const found = all.find((c: string) => c.startsWith('modewright.sid='));
  if (!found) throw new Error('no session cookie was set');
  return found.split(';')[0] ?? '';
}

describe('sessions in MariaDB', () => {
  it('survive a server restart: a second app with the same secret accepts the cookie', async () => {
    const first = await createTestApp();
    const person = await createUser(first.db);
    const client = await signedIn(first.app, person);
    const me = await client.get('/api/auth/me').expect(200);
    const cookie = sessionCookie(me.headers['set-cookie']);
    const token = client.csrfToken;
    await first.close();

    const second = await createTestApp();
    try {
      const again = await request(second.app).get('/api/auth/me').set('Cookie', cookie);
      expect(again.status).toBe(200);
      expect(again.body.user.id).toBe(person.id);
      // The CSRF token lives in the session too, so writes keep working after the restart.
      const out = await request(second.app)
        .post('/api/auth/sign-out')
        .set('Cookie', cookie)
        .set('X-CSRF-Token', token);
      expect(out.status).toBe(204);
      const after = await request(second.app).get('/api/auth/me').set('Cookie', cookie);
      expect(after.status).toBe(401);
    } finally {
      await second.close();
    }
  });

  it('are refused by an app with another secret (the cookie is signed)', async () => {
    const first = await createTestApp();
    const person = await createUser(first.db);
    const client = await signedIn(first.app, person);
    const me = await client.get('/api/auth/me').expect(200);
    const cookie = sessionCookie(me.headers['set-cookie']);
    await first.close();

    const other = await createTestApp({
      sessionSecret: 'a-different-secret-for-this-one-test-0000',
    });
    try {
      const res = await request(other.app).get('/api/auth/me').set('Cookie', cookie);
      expect(res.status).toBe(401);
    } finally {
      await other.close();
    }
  });

  it('store the session row with its expiry about 12 hours ahead', async () => {
    const t = await createTestApp();
    try {
      const person = await createUser(t.db);
      await signedIn(t.app, person);
      const rows = await t.db('sessions').whereRaw('sess like ?', [`%"userId":${person.id}%`]);
      expect(rows).toHaveLength(1);
      // 12 h cookie lifetime (api/app.ts); a minute either way for the test's own run time.
      const hoursAhead = (new Date(rows[0].expired).getTime() - Date.now()) / 3_600_000;
      expect(hoursAhead).toBeGreaterThan(12 - 1 / 60);
      expect(hoursAhead).toBeLessThan(12 + 1 / 60);
    } finally {
      await t.close();
    }
  });
});
