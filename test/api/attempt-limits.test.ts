import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { anonymous, createTestApp, signedIn, type TestApp } from '../support/api-app';
import { createUser, TEST_PASSWORD } from '../support/factories';

// Guessing limits: failed sign-ins per address across e-mails as well as per e-mail, wrong
// current passwords per person (password change and seal), and a password change that ends the
// person's other sessions. The client address is set with X-Forwarded-For behind one trusted
// proxy hop, as a deployment behind a reverse proxy sees it.

let t: TestApp;
const ADDRESS_LIMIT = 5;
const EMAIL_LIMIT = 3;
const PASSWORD_LIMIT = 3;

beforeAll(async () => {
  t = await createTestApp({
    trustProxyHops: 1,
    signinLimit: EMAIL_LIMIT,
    signinAddressLimit: ADDRESS_LIMIT,
    passwordCheckLimit: PASSWORD_LIMIT,
  });
});

afterAll(async () => {
  await t?.close();
});

async function signInFrom(address: string, email: string, password: string) {
  const client = await anonymous(t.app);
  return client.agent
    .post('/api/auth/sign-in')
    .set('X-CSRF-Token', client.csrfToken)
    .set('X-Forwarded-For', address)
    .send({ email, password });
}

describe('POST /api/auth/sign-in guessing limits', () => {
  it('stops one address guessing across many e-mails, and lets the right password in from another', async () => {
    const people = await Promise.all(
      Array.from({ length: ADDRESS_LIMIT + 1 }, () => createUser(t.db)),
    );
    for (let i = 0; i < ADDRESS_LIMIT; i++) {
      const res = await signInFrom('203.0.113.7', people[i]!.email, 'wrong-guess');
      expect(res.status).toBe(401);
    }
    const last = people[ADDRESS_LIMIT]!;
    const blocked = await signInFrom('203.0.113.7', last.email, TEST_PASSWORD);
    expect(blocked.status).toBe(429);
    expect(blocked.body.error.code).toBe('RATE_LIMITED');
    expect(blocked.body.error.message).toMatch(/from this address/);
    expect(Number(blocked.headers['retry-after'])).toBeGreaterThan(0);
    const elsewhere = await signInFrom('203.0.113.8', last.email, TEST_PASSWORD);
    expect(elsewhere.status).toBe(200);
  });

  it('keeps the lockout of one e-mail from an address, and lets its right password in from another', async () => {
    const person = await createUser(t.db);
    for (let i = 0; i < EMAIL_LIMIT; i++) {
      expect((await signInFrom('198.51.100.1', person.email, 'wrong')).status).toBe(401);
    }
    const locked = await signInFrom('198.51.100.1', person.email, TEST_PASSWORD);
    expect(locked.status).toBe(429);
    expect(locked.body.error.message).toMatch(/for this e-mail address/);
    expect((await signInFrom('198.51.100.2', person.email, TEST_PASSWORD)).status).toBe(200);
  });
});

describe('current-password checks (POST /api/auth/password, POST /api/revisions/:id/seal)', () => {
  it('are limited per person, across routes and addresses, and leave others alone', async () => {
    const person = await createUser(t.db);
    const client = await signedIn(t.app, person);
    const change = (currentPassword: string, address: string) =>
      client.agent
        .post('/api/auth/password')
        .set('X-CSRF-Token', client.csrfToken)
        .set('X-Forwarded-For', address)
        .send({ currentPassword, newPassword: 'another-password-77' });
    for (let i = 0; i < PASSWORD_LIMIT; i++) {
      const res = await change('not-it', `192.0.2.${i + 1}`);
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe('WRONG_PASSWORD');
    }
    const blocked = await change(TEST_PASSWORD, '192.0.2.99');
    expect(blocked.status).toBe(429);
    expect(blocked.body.error.message).toMatch(/Too many wrong passwords/);
    // The seal's password check counts against the same person.
    const seal = await client.post('/api/revisions/1/seal', { password: TEST_PASSWORD });
    expect(seal.status).toBe(429);
    // Someone else is not held back by it.
    const other = await createUser(t.db);
    const otherClient = await signedIn(t.app, other);
    const ok = await otherClient.post('/api/auth/password', {
      currentPassword: TEST_PASSWORD,
      newPassword: 'another-password-78',
    });
    expect(ok.status).toBe(200);
  });
});

describe('POST /api/auth/password', () => {
  it("ends the person's other sessions, keeps the one that asked, and says so", async () => {
    const person = await createUser(t.db);
    const here = await signedIn(t.app, person);
    const laptop = await signedIn(t.app, person);
    const phone = await signedIn(t.app, person);
    const stranger = await signedIn(t.app, await createUser(t.db));
    const res = await here.post('/api/auth/password', {
      currentPassword: TEST_PASSWORD,
      newPassword: 'a-fresh-password-12',
    });
    expect(res.status).toBe(200);
    expect(res.body.otherSessionsEnded).toBe(2);
    expect((await here.get('/api/auth/me')).status).toBe(200);
    expect((await laptop.get('/api/auth/me')).status).toBe(401);
    expect((await phone.get('/api/auth/me')).status).toBe(401);
    expect((await stranger.get('/api/auth/me')).status).toBe(200);
    const activity = await t
      .db('activity')
      .where({ action: 'account.password_changed', actor_id: person.id })
      .first();
    const details =
      typeof activity.details === 'string' ? JSON.parse(activity.details) : activity.details;
    expect(details.otherSessionsEnded).toBe(2);
  });
});
