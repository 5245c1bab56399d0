import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { anonymous, createTestApp, signedIn, type TestApp } from '../support/api-app';
import { createUser, jsonColumn, TEST_PASSWORD } from '../support/factories';

let t: TestApp;

beforeAll(async () => {
  t = await createTestApp();
});

afterAll(async () => {
  await t.close();
});

async function admin() {
  return signedIn(t.app, await createUser(t.db, { isAdmin: true }));
}

async function sessionsOf(userId: number): Promise<number> {
  const rows = await t.db('sessions').whereRaw("JSON_VALUE(sess, '$.userId') = ?", [userId]);
  return rows.length;
}

/** The token of the newest reset mail to `email`, as a person would copy it from the link. */
async function tokenMailedTo(email: string): Promise<string> {
  const row = await t
    .db('outbox')
    .where({ kind: 'user.password_reset_sent' })
    .andWhere('to_addresses', 'like', `%${email}%`)
    .orderBy('id', 'desc')
    .first();
  const match = /\/reset-password#([A-Za-z0-9_-]{43})/.exec(row?.text ?? '');
  if (!match) throw new Error(`no reset link mailed to ${email}`);
  return match[1]!;
}

describe('POST /api/users/:userId/deactivate and /reactivate', () => {
  it('answers 401 signed out and 403 to a person who is not an admin', async () => {
    const person = await createUser(t.db);
    const target = await createUser(t.db);
    expect((await (await anonymous(t.app)).post(`/api/users/${target.id}/deactivate`)).status).toBe(
      401,
    );
    const res = await (await signedIn(t.app, person)).post(`/api/users/${target.id}/deactivate`);
    expect(res.status).toBe(403);
    expect((await t.db('users').where({ id: target.id }).first()).deactivated_at).toBeNull();
  });

  it('answers 422 for a bad id and 404 for a missing person', async () => {
    const client = await admin();
    const bad = await client.post('/api/users/abc/deactivate');
    expect(bad.status).toBe(422);
    expect(bad.body.error.field).toBe('userId');
    const missing = await client.post('/api/users/999999999/deactivate');
    expect(missing.status).toBe(404);
  });

  it('refuses an admin deactivating themselves', async () => {
    const me = await createUser(t.db, { isAdmin: true });
    const res = await (await signedIn(t.app, me)).post(`/api/users/${me.id}/deactivate`);
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('SELF_DEACTIVATION');
  });

  it('ends the person’s sessions at once, refuses their sign-in, and keeps the history', async () => {
    const client = await admin();
    const target = await createUser(t.db);
    const theirs = await signedIn(t.app, target);
    await theirs.get('/api/auth/me').expect(200);
    expect(await sessionsOf(target.id)).toBe(1);

    const res = await client.post(`/api/users/${target.id}/deactivate`).expect(200);
    expect(res.body.sessionsEnded).toBe(1);
    expect(res.body.user).toMatchObject({ id: target.id, deactivatedAt: expect.any(String) });
    expect(await sessionsOf(target.id)).toBe(0);
    expect((await theirs.get('/api/auth/me')).status).toBe(401);

    const again = await (
      await anonymous(t.app)
    ).post('/api/auth/sign-in', {
      email: target.email,
      password: TEST_PASSWORD,
    });
    expect(again.status).toBe(403);
    expect(again.body.error).toMatchObject({
      code: 'ACCOUNT_DEACTIVATED',
      message:
        'This account has been deactivated. Ask an administrator of your firm to reactivate it.',
    });
    // A wrong password still gets the usual words: no hint that the account exists.
    const wrong = await (
      await anonymous(t.app)
    ).post('/api/auth/sign-in', {
      email: target.email,
      password: 'not-the-password-at-all',
    });
    expect(wrong.status).toBe(401);
    expect(wrong.body.error.code).toBe('INVALID_CREDENTIALS');

    expect((await client.post(`/api/users/${target.id}/deactivate`)).status).toBe(409);
    const back = await client.post(`/api/users/${target.id}/reactivate`).expect(200);
    expect(back.body.user.deactivatedAt).toBeNull();
    await signedIn(t.app, target);
    expect((await client.post(`/api/users/${target.id}/reactivate`)).status).toBe(409);

    const history = await t
      .db('activity')
      .where({ object_type: 'user', object_id: target.id })
      .whereIn('action', ['user.deactivated', 'user.reactivated'])
      .orderBy('id');
    expect(history.map((r: { action: string }) => r.action)).toEqual([
      'user.deactivated',
      'user.reactivated',
    ]);
    expect(jsonColumn(history[0].details)).toMatchObject({ sessionsEnded: 1 });
    expect(await t.db('users').where({ id: target.id })).toHaveLength(1);
  });

  it('answers 403 to a non-admin reactivating', async () => {
    const person = await createUser(t.db);
    const target = await createUser(t.db);
    const res = await (await signedIn(t.app, person)).post(`/api/users/${target.id}/reactivate`);
    expect(res.status).toBe(403);
  });
});

describe('PATCH /api/users/:userId', () => {
  it('answers 401 signed out and 403 to a person who is not an admin', async () => {
    const target = await createUser(t.db);
    expect(
      (await (await anonymous(t.app)).patch(`/api/users/${target.id}`, { name: 'X' })).status,
    ).toBe(401);
    const person = await createUser(t.db);
    const res = await (
      await signedIn(t.app, person)
    ).patch(`/api/users/${target.id}`, {
      name: 'X',
    });
    expect(res.status).toBe(403);
  });

  it('answers 422 naming the field for a bad e-mail and an unknown field', async () => {
    const client = await admin();
    const target = await createUser(t.db);
    const bad = await client.patch(`/api/users/${target.id}`, { email: 'no-at-sign' });
    expect(bad.status).toBe(422);
    expect(bad.body.error.field).toBe('email');
    const unknown = await client.patch(`/api/users/${target.id}`, { isAdmin: true });
    expect(unknown.status).toBe(422);
  });

  it('answers 409 DUPLICATE for an e-mail another person has', async () => {
    const client = await admin();
    const target = await createUser(t.db);
    const other = await createUser(t.db);
    const res = await client.patch(`/api/users/${target.id}`, { email: other.email });
    expect(res.status).toBe(409);
    expect(res.body.error).toMatchObject({ code: 'DUPLICATE', field: 'email' });
  });

  it('changes name, e-mail and licence, records what they were, and the person signs in with the new e-mail', async () => {
    const client = await admin();
    const target = await createUser(t.db, { licenceNumber: 'SE-1' });
    const email = `renamed-${target.id}@factory.example`;
    const res = await client
      .patch(`/api/users/${target.id}`, {
        name: 'Renamed Person',
        email: email.toUpperCase(),
        licenceNumber: 'PE-42',
        jurisdiction: 'Test County',
      })
      .expect(200);
    expect(res.body.user).toMatchObject({
      id: target.id,
      name: 'Renamed Person',
      email,
      licenceNumber: 'PE-42',
      jurisdiction: 'Test County',
    });
    const row = await t
      .db('activity')
      .where({ action: 'user.updated', object_id: target.id })
      .first();
    expect(jsonColumn(row.details)).toEqual({
      changed: {
        name: { from: target.name, to: 'Renamed Person' },
        email: { from: target.email, to: email },
        licenceNumber: { from: 'SE-1', to: 'PE-42' },
        jurisdiction: { from: null, to: 'Test County' },
      },
    });
    await signedIn(t.app, { email, password: TEST_PASSWORD });

    const cleared = await client.patch(`/api/users/${target.id}`, { licenceNumber: '' });
    expect(cleared.body.user.licenceNumber).toBeNull();
    expect(cleared.body.user.name).toBe('Renamed Person');
  });
});

describe('POST /api/users/:userId/password-reset and POST /api/auth/password-reset', () => {
  it('answers 401 signed out and 403 to a person who is not an admin, and mails nothing', async () => {
    const target = await createUser(t.db);
    expect(
      (await (await anonymous(t.app)).post(`/api/users/${target.id}/password-reset`)).status,
    ).toBe(401);
    const person = await createUser(t.db);
    const res = await (
      await signedIn(t.app, person)
    ).post(`/api/users/${target.id}/password-reset`);
    expect(res.status).toBe(403);
    expect(await t.db('password_resets').where({ user_id: target.id })).toHaveLength(0);
  });

  it('mails a one-time link whose token is stored only hashed; the link sets the password once', async () => {
    const client = await admin();
    const target = await createUser(t.db);
    const theirs = await signedIn(t.app, target);
    const sent = await client.post(`/api/users/${target.id}/password-reset`).expect(202);
    const hours = (Date.parse(sent.body.expiresAt) - Date.now()) / 3.6e6;
    expect(hours).toBeGreaterThan(23.9); // 24 h link, less the request's own time
    expect(hours).toBeLessThanOrEqual(24);

    const token = await tokenMailedTo(target.email);
    const stored = await t.db('password_resets').where({ user_id: target.id });
    expect(stored).toHaveLength(1);
    expect(stored[0].token_hash).toMatch(/^[0-9a-f]{64}$/);
    expect(stored[0].token_hash).not.toContain(token);

    const short = await (
      await anonymous(t.app)
    ).post('/api/auth/password-reset', {
      token,
      newPassword: 'short',
    });
    expect(short.status).toBe(422);
    expect(short.body.error.field).toBe('newPassword');

    const newPassword = 'a-brand-new-password-77';
    const done = await (
      await anonymous(t.app)
    )
      .post('/api/auth/password-reset', { token, newPassword })
      .expect(200);
    expect(done.body.email).toBe(target.email);
    expect((await theirs.get('/api/auth/me')).status).toBe(401);
    await signedIn(t.app, { email: target.email, password: newPassword });
    const old = await (
      await anonymous(t.app)
    ).post('/api/auth/sign-in', {
      email: target.email,
      password: TEST_PASSWORD,
    });
    expect(old.status).toBe(401);

    const twice = await (
      await anonymous(t.app)
    ).post('/api/auth/password-reset', {
      token,
      newPassword: 'yet-another-password-88',
    });
    expect(twice.status).toBe(410);
    expect(twice.body.error.code).toBe('RESET_LINK_INVALID');

    const actions = await t
      .db('activity')
      .where({ object_id: target.id, object_type: 'user' })
      .whereIn('action', ['user.password_reset_sent', 'account.password_reset'])
      .orderBy('id')
      .pluck('action');
    expect(actions).toEqual(['user.password_reset_sent', 'account.password_reset']);
  });

  it('refuses an expired link and a link replaced by a newer one', async () => {
    const client = await admin();
    const target = await createUser(t.db);
    await client.post(`/api/users/${target.id}/password-reset`).expect(202);
    const first = await tokenMailedTo(target.email);
    await client.post(`/api/users/${target.id}/password-reset`).expect(202);
    const second = await tokenMailedTo(target.email);
    expect(second).not.toBe(first);
    const replaced = await (
      await anonymous(t.app)
    ).post('/api/auth/password-reset', {
      token: first,
      newPassword: 'a-brand-new-password-77',
    });
    expect(replaced.status).toBe(410);

    await t
      .db('password_resets')
      .where({ user_id: target.id })
      .update({ expires_at: new Date(Date.now() - 1000) });
    const expired = await (
      await anonymous(t.app)
    ).post('/api/auth/password-reset', {
      token: second,
      newPassword: 'a-brand-new-password-77',
    });
    expect(expired.status).toBe(410);
    expect(expired.body.error.code).toBe('RESET_LINK_EXPIRED');
  });

  it('answers 422 on token for a malformed token', async () => {
    const res = await (
      await anonymous(t.app)
    ).post('/api/auth/password-reset', {
      token: 'abc',
      newPassword: 'a-brand-new-password-77',
    });
    expect(res.status).toBe(422);
    expect(res.body.error.field).toBe('token');
  });

  it('refuses to send a link to a deactivated person', async () => {
    const client = await admin();
    const target = await createUser(t.db);
    await client.post(`/api/users/${target.id}/deactivate`).expect(200);
    const res = await client.post(`/api/users/${target.id}/password-reset`);
    expect(res.status).toBe(409);
  });
});
