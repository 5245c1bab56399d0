import argon2 from 'argon2';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { anonymous, createTestApp, signedIn, type TestApp } from '../support/api-app';
import { createUser, jsonColumn, unique } from '../support/factories';

let t: TestApp;

beforeAll(async () => {
  t = await createTestApp();
});

afterAll(async () => {
  await t.close();
});

function newUserBody() {
  const tag = unique();
  return {
    email: `new-${tag}@factory.example`,
    name: `New Person ${tag}`,
    password: 'a-long-enough-password',
  };
}

describe('GET /api/users', () => {
  it('answers 401 when signed out', async () => {
    expect((await (await anonymous(t.app)).get('/api/users')).status).toBe(401);
  });

  it('answers 403 to someone who is not an admin', async () => {
    const person = await createUser(t.db);
    const res = await (await signedIn(t.app, person)).get('/api/users');
    expect(res.status).toBe(403);
    expect(res.body.error.message).toBe('Only an administrator can do this.');
  });

  it('lists everyone to an admin, without passwords or hashes', async () => {
    const admin = await createUser(t.db, { isAdmin: true });
    const other = await createUser(t.db, { licenceNumber: 'SE-7', jurisdiction: 'Test County' });
    const client = await signedIn(t.app, admin);
    const existing = (await t.db('users').select('id')).map((r: { id: number }) => r.id);
    const res = await client.get('/api/users').expect(200);
    expect(res.body.users.map((u: { id: number }) => u.id)).toEqual(
      expect.arrayContaining(existing),
    );
    expect(res.body.users).toContainEqual({
      id: other.id,
      email: other.email,
      name: other.name,
      isAdmin: false,
      licenceNumber: 'SE-7',
      jurisdiction: 'Test County',
      deactivatedAt: null,
    });
    expect(JSON.stringify(res.body)).not.toMatch(/argon2|password|hash/i);
  });
});

describe('POST /api/users', () => {
  it('answers 401 when signed out', async () => {
    expect((await (await anonymous(t.app)).post('/api/users', newUserBody())).status).toBe(401);
  });

  it('answers 403 to someone who is not an admin, and writes nothing', async () => {
    const person = await createUser(t.db);
    const body = newUserBody();
    const res = await (await signedIn(t.app, person)).post('/api/users', body);
    expect(res.status).toBe(403);
    expect(await t.db('users').where({ email: body.email })).toHaveLength(0);
  });

  it('answers 422 on email for an address without @', async () => {
    const admin = await createUser(t.db, { isAdmin: true });
    const res = await (
      await signedIn(t.app, admin)
    ).post('/api/users', {
      ...newUserBody(),
      email: 'priya.anand',
    });
    expect(res.status).toBe(422);
    expect(res.body.error.field).toBe('email');
  });

  it('answers 422 on password for a short password', async () => {
    const admin = await createUser(t.db, { isAdmin: true });
    const res = await (
      await signedIn(t.app, admin)
    ).post('/api/users', {
      ...newUserBody(),
      password: 'short',
    });
    expect(res.status).toBe(422);
    expect(res.body.error.field).toBe('password');
    expect(res.body.error.message).toBe('password: A password needs at least 12 characters.');
  });

  it('answers 409 DUPLICATE on email for an address already used', async () => {
    const admin = await createUser(t.db, { isAdmin: true });
    const existing = await createUser(t.db);
    const res = await (
      await signedIn(t.app, admin)
    ).post('/api/users', {
      ...newUserBody(),
      email: existing.email,
    });
    expect(res.status).toBe(409);
    expect(res.body.error).toMatchObject({ code: 'DUPLICATE', field: 'email' });
  });

  it('creates the person with an argon2id hash, records user.created, and they can sign in', async () => {
    const admin = await createUser(t.db, { isAdmin: true });
    const body = {
      ...newUserBody(),
      isAdmin: false,
      licenceNumber: 'SE-99',
      jurisdiction: 'Test County',
    };
    const res = await (await signedIn(t.app, admin)).post('/api/users', body);
    expect(res.status).toBe(201);
    expect(res.body.user).toEqual({
      id: expect.any(Number),
      email: body.email,
      name: body.name,
      isAdmin: false,
      licenceNumber: 'SE-99',
      jurisdiction: 'Test County',
    });
    const row = await t.db('users').where({ id: res.body.user.id }).first();
    // PHC string format of argon2id (RFC 9106 §5 and the reference implementation's encoding).
    expect(row.password_hash).toMatch(/^\$argon2id\$v=19\$m=\d+,t=\d+,p=\d+\$/);
    expect(await argon2.verify(row.password_hash, body.password)).toBe(true);
    const activity = await t.db('activity').where({
      action: 'user.created',
      object_id: res.body.user.id,
    });
    expect(activity).toHaveLength(1);
    expect(activity[0]).toMatchObject({
      actor_id: admin.id,
      project_id: null,
      object_type: 'user',
    });
    expect(jsonColumn(activity[0].details)).toEqual({
      email: body.email,
      name: body.name,
      isAdmin: false,
    });
    const me = await (await signedIn(t.app, body)).get('/api/auth/me').expect(200);
    expect(me.body.user.id).toBe(res.body.user.id);
  });
});
