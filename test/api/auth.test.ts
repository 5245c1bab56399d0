import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { anonymous, ApiClient, createTestApp, signedIn, type TestApp } from '../support/api-app';
import { createUser, TEST_PASSWORD } from '../support/factories';

let t: TestApp;

beforeAll(async () => {
  t = await createTestApp();
});

afterAll(async () => {
  await t.close();
});

async function activityFor(userId: number, action: string) {
  return t.db('activity').where({ actor_id: userId, action }).orderBy('id');
}

describe('GET /api/auth/csrf', () => {
  it('hands out a token and a session cookie that is httpOnly and SameSite=Lax', async () => {
    const res = await new ApiClient(t.app).agent.get('/api/auth/csrf').expect(200);
    expect(typeof res.body.csrfToken).toBe('string');
    // 32 random bytes in base64url are 43 characters (RFC 4648 §5, no padding).
    expect(res.body.csrfToken).toMatch(/^[A-Za-z0-9_-]{43}$/);
    const cookie = String(res.headers['set-cookie']);
    expect(cookie).toMatch(/^modewright\.sid=/);
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(cookie).not.toMatch(/Secure/i);
  });

  it('gives the same token again within one session', async () => {
    const client = await anonymous(t.app);
    const again = await client.get('/api/auth/csrf').expect(200);
    expect(again.body.csrfToken).toBe(client.csrfToken);
  });
});

describe('POST /api/auth/sign-in', () => {
  it('signs a person in, returns them without any password or hash, and records the sign-in', async () => {
    const person = await createUser(t.db, { licenceNumber: 'SE-1', jurisdiction: 'Test County' });
    const client = await anonymous(t.app);
    const before = client.csrfToken;
    const res = await client.post('/api/auth/sign-in', {
      email: person.email,
      password: TEST_PASSWORD,
    });
    expect(res.status).toBe(200);
    expect(res.body.user).toEqual({
      id: person.id,
      email: person.email,
      name: person.name,
      isAdmin: false,
      licenceNumber: 'SE-1',
      jurisdiction: 'Test County',
    });
    expect(JSON.stringify(res.body)).not.toMatch(/argon2|password|hash/i);
    expect(res.body.csrfToken).not.toBe(before);
    const rows = await activityFor(person.id, 'auth.signed_in');
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ object_type: 'user', object_id: person.id, project_id: null });
  });

  it('accepts the e-mail address in any case and with spaces around it', async () => {
    const person = await createUser(t.db);
    const client = await anonymous(t.app);
    const res = await client.post('/api/auth/sign-in', {
      email: `  ${person.email.toUpperCase()} `,
      password: TEST_PASSWORD,
    });
    expect(res.status).toBe(200);
    expect(res.body.user.id).toBe(person.id);
  });

  it('regenerates the session id at sign-in', async () => {
    const person = await createUser(t.db);
    const client = new ApiClient(t.app);
    const first = await client.agent.get('/api/auth/csrf');
    const sidBefore = /modewright\.sid=([^;]+)/.exec(String(first.headers['set-cookie']))?.[1];
    client.csrfToken = first.body.csrfToken;
    const res = await client.post('/api/auth/sign-in', {
      email: person.email,
      password: TEST_PASSWORD,
    });
    const sidAfter = /modewright\.sid=([^;]+)/.exec(String(res.headers['set-cookie']))?.[1];
    expect(sidBefore).toBeTruthy();
    expect(sidAfter).toBeTruthy();
    expect(sidAfter).not.toBe(sidBefore);
    // The session row of the old id is gone: it cannot be replayed.
    const oldSid = decodeURIComponent(sidBefore ?? '')
      .replace(/^s:/, '')
      .split('.')[0];
    expect(await t.db('sessions').where({ sid: oldSid })).toHaveLength(0);
  });

  it('answers a wrong password and an unknown e-mail with the same 401 and words', async () => {
    const person = await createUser(t.db);
    const client = await anonymous(t.app);
    const wrong = await client.post('/api/auth/sign-in', {
      email: person.email,
      password: 'not-the-password',
    });
    const unknown = await client.post('/api/auth/sign-in', {
      email: `nobody-${person.id}@factory.example`,
      password: 'not-the-password',
    });
    for (const res of [wrong, unknown]) {
      expect(res.status).toBe(401);
      expect(res.body).toEqual({
        error: { code: 'INVALID_CREDENTIALS', message: 'The e-mail or password is not right.' },
      });
    }
    expect(await activityFor(person.id, 'auth.signed_in')).toHaveLength(0);
  });

  it('names the missing field with 422', async () => {
    const client = await anonymous(t.app);
    const res = await client.post('/api/auth/sign-in', { email: 'someone@factory.example' });
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('VALIDATION');
    expect(res.body.error.field).toBe('password');
    expect(res.body.error.message).toMatch(/^password: /);
    expect(res.body.error.details.issues[0].field).toBe('password');
  });

  it('refuses a sign-in without the CSRF token (403 CSRF_INVALID)', async () => {
    const person = await createUser(t.db);
    const res = await new ApiClient(t.app).agent
      .post('/api/auth/sign-in')
      .send({ email: person.email, password: TEST_PASSWORD });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('CSRF_INVALID');
  });

  it('refuses a token from another session', async () => {
    const person = await createUser(t.db);
    const mine = await anonymous(t.app);
    const theirs = await anonymous(t.app);
    mine.csrfToken = theirs.csrfToken;
    const res = await mine.post('/api/auth/sign-in', {
      email: person.email,
      password: TEST_PASSWORD,
    });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('CSRF_INVALID');
  });
});

describe('POST /api/auth/sign-in rate limit', () => {
  // Its own app: the limit lives in that app's memory store.
  let limited: TestApp;
  const limit = 3;

  beforeAll(async () => {
    limited = await createTestApp({ signinLimit: limit });
  });

  afterAll(async () => {
    await limited.close();
  });

  it('answers 429 with Retry-After after too many failed attempts, even with the right password', async () => {
    const person = await createUser(limited.db);
    const client = await anonymous(limited.app);
    for (let i = 0; i < limit; i += 1) {
      const res = await client.post('/api/auth/sign-in', {
        email: person.email,
        password: 'wrong',
      });
      expect(res.status).toBe(401);
    }
    const blocked = await client.post('/api/auth/sign-in', {
      email: person.email,
      password: TEST_PASSWORD,
    });
    expect(blocked.status).toBe(429);
    expect(blocked.body.error.code).toBe('RATE_LIMITED');
    expect(blocked.body.error.message).toMatch(/Too many sign-in attempts/);
    const retryAfter = Number(blocked.headers['retry-after']);
    // The window is 15 minutes (the contract's default), so the wait is between 1 s and 900 s.
    expect(retryAfter).toBeGreaterThan(0);
    expect(retryAfter).toBeLessThanOrEqual(900);
  });

  it('counts per e-mail: another person from the same address can still sign in', async () => {
    const other = await createUser(limited.db);
    const client = await anonymous(limited.app);
    const res = await client.post('/api/auth/sign-in', {
      email: other.email,
      password: TEST_PASSWORD,
    });
    expect(res.status).toBe(200);
  });

  it('does not count successful sign-ins', async () => {
    const person = await createUser(limited.db);
    for (let i = 0; i < limit + 2; i += 1) {
      const client = await anonymous(limited.app);
      const res = await client.post('/api/auth/sign-in', {
        email: person.email,
        password: TEST_PASSWORD,
      });
      expect(res.status).toBe(200);
    }
  });
});

describe('GET /api/auth/me', () => {
  it('answers 401 UNAUTHENTICATED when signed out', async () => {
    const res = await (await anonymous(t.app)).get('/api/auth/me');
    expect(res.status).toBe(401);
    expect(res.body.error).toEqual({ code: 'UNAUTHENTICATED', message: 'Sign in to continue.' });
  });

  it('returns the signed-in person', async () => {
    const person = await createUser(t.db, { isAdmin: true });
    const client = await signedIn(t.app, person);
    const res = await client.get('/api/auth/me').expect(200);
    expect(res.body).toEqual({
      user: {
        id: person.id,
        email: person.email,
        name: person.name,
        isAdmin: true,
        licenceNumber: null,
        jurisdiction: null,
      },
    });
  });
});

describe('POST /api/auth/sign-out', () => {
  it('answers 401 when signed out', async () => {
    const res = await (await anonymous(t.app)).post('/api/auth/sign-out');
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('UNAUTHENTICATED');
  });

  it('answers 403 CSRF_INVALID without the token, and the session stays', async () => {
    const person = await createUser(t.db);
    const client = await signedIn(t.app, person);
    const res = await client.agent.post('/api/auth/sign-out');
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('CSRF_INVALID');
    await client.get('/api/auth/me').expect(200);
  });

  it('ends the session: 204, the row is gone, the cookie no longer works, activity recorded', async () => {
    const person = await createUser(t.db);
    const client = await signedIn(t.app, person);
    const sessionsBefore = await t
      .db('sessions')
      .whereRaw('sess like ?', [`%"userId":${person.id}%`]);
    expect(sessionsBefore).toHaveLength(1);
    const res = await client.post('/api/auth/sign-out');
    expect(res.status).toBe(204);
    const sessionsAfter = await t
      .db('sessions')
      .whereRaw('sess like ?', [`%"userId":${person.id}%`]);
    expect(sessionsAfter).toHaveLength(0);
    await client.get('/api/auth/me').expect(401);
    const rows = await activityFor(person.id, 'auth.signed_out');
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ object_type: 'user', object_id: person.id });
  });
});
