import { mkdtemp, writeFile } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import express from 'express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { ZodError, z } from 'zod';
import { EngineError } from '../../core/index';
import { ConflictError } from '../../api/http/errors';
import { errorMiddleware } from '../../api/http/error-middleware';
import type { Logger } from '../../api/http/logger';
import { anonymous, createTestApp, signedIn, type TestApp } from '../support/api-app';
import { createUser } from '../support/factories';

let t: TestApp;
let clientDir: string;

beforeAll(async () => {
  clientDir = await mkdtemp(path.join(os.tmpdir(), 'modewright-client-'));
  await writeFile(
    path.join(clientDir, 'index.html'),
    '<!doctype html><title>Modewright test shell</title><div id="root"></div>',
  );
  await writeFile(path.join(clientDir, 'app.js'), 'console.log(1);');
  t = await createTestApp({ clientDir, bodyLimitBytes: 2048 });
});

afterAll(async () => {
  await t.close();
});

describe('the built client', () => {
  it('is served with the strict Content-Security-Policy', async () => {
    const res = await request(t.app).get('/').expect(200);
    expect(res.text).toContain('Modewright test shell');
    const csp = res.headers['content-security-policy'];
    for (const directive of [
      "default-src 'self'",
      "style-src 'self' 'unsafe-inline'",
      "img-src 'self' data:",
      "font-src 'self' data:",
      "script-src 'self'",
      "connect-src 'self'",
      "object-src 'none'",
      "frame-ancestors 'none'",
    ]) {
      expect(csp).toContain(directive);
    }
    expect(csp).not.toMatch(/script-src[^;]*unsafe-inline/);
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['x-powered-by']).toBeUndefined();
  });

  it('falls back to index.html for any page address (client-side routing)', async () => {
    const res = await request(t.app).get('/projects/12/sheets/3').expect(200);
    expect(res.text).toContain('Modewright test shell');
  });

  it('serves its files', async () => {
    const res = await request(t.app).get('/app.js').expect(200);
    expect(res.text).toBe('console.log(1);');
  });
});

describe('the API edge', () => {
  it('answers an unknown API address with 404 in the error shape, not the page', async () => {
    const res = await request(t.app).get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.body).toEqual({
      error: { code: 'NOT_FOUND', message: 'There is no API route GET /api/no-such-thing.' },
    });
  });

  it('answers 413 to a body over the limit', async () => {
    const person = await createUser(t.db);
    const client = await anonymous(t.app);
    const res = await client.post('/api/auth/sign-in', {
      email: person.email,
      password: 'x'.repeat(4096),
    });
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('PAYLOAD_TOO_LARGE');
  });

  it('answers 400 to a body that is not JSON', async () => {
    const client = await anonymous(t.app);
    const res = await client.agent
      .post('/api/auth/sign-in')
      .set('X-CSRF-Token', client.csrfToken)
      .set('Content-Type', 'application/json')
      .send('{"email": ');
    expect(res.status).toBe(400);
    expect(res.body.error).toEqual({
      code: 'BAD_REQUEST',
      message: 'The request body is not valid JSON.',
    });
  });

  it('checks CSRF on PATCH and DELETE as well as POST', async () => {
    const admin = await createUser(t.db, { isAdmin: true });
    const client = await signedIn(t.app, admin);
    const patch = await client.agent.patch('/api/projects/1').send({ name: 'x' });
    const del = await client.agent.delete('/api/projects/1/members/1');
    expect(patch.status).toBe(403);
    expect(patch.body.error.code).toBe('CSRF_INVALID');
    expect(del.status).toBe(403);
    expect(del.body.error.code).toBe('CSRF_INVALID');
  });
});

describe('errorMiddleware', () => {
  function appThrowing(error: unknown) {
    const logged: string[] = [];
    const log: Logger = { info: () => undefined, error: (m) => void logged.push(m) };
    const app = express();
    app.get('/boom', () => {
      throw error;
    });
    app.use(errorMiddleware(log));
    return { app, logged };
  }

  it('turns an unknown error into 500 INTERNAL with a log id and no internals', async () => {
    const { app, logged } = appThrowing(new Error('ER_ACCESS_DENIED: secret table mw_internal'));
    const res = await request(app).get('/boom');
    expect(res.status).toBe(500);
    expect(res.body.error.code).toBe('INTERNAL');
    expect(res.body.error.details.logId).toMatch(/^[0-9a-f]{8}$/);
    expect(res.body.error.message).toContain(res.body.error.details.logId);
    expect(JSON.stringify(res.body)).not.toContain('mw_internal');
    expect(logged).toHaveLength(1);
    expect(logged[0]).toContain(res.body.error.details.logId);
  });

  it("maps the engine's typed errors to 422 with their code and details", async () => {
    const { app } = appThrowing(
      new EngineError('MATRIX_NOT_SYMMETRIC', 'K is not symmetric: K[3,7] = 12 but K[7,3] = 11.', {
        row: 3,
        col: 7,
      }),
    );
    const res = await request(app).get('/boom');
    expect(res.status).toBe(422);
    expect(res.body).toEqual({
      error: {
        code: 'MATRIX_NOT_SYMMETRIC',
        message: 'K is not symmetric: K[3,7] = 12 but K[7,3] = 11.',
        details: { row: 3, col: 7 },
      },
    });
  });

  it('maps an engine error that lost its class crossing a worker thread by its name and code', async () => {
    const rebuilt = Object.assign(new Error('Mass matrix is singular at DOF 4.'), {
      name: 'EngineError',
      code: 'MASS_SINGULAR',
    });
    const { app } = appThrowing(rebuilt);
    const res = await request(app).get('/boom');
    expect(res.status).toBe(422);
    expect(res.body.error).toEqual({
      code: 'MASS_SINGULAR',
      message: 'Mass matrix is singular at DOF 4.',
    });
  });

  it('maps a zod error to 422 VALIDATION naming the nested field', async () => {
    const schema = z.object({ load: z.object({ kN: z.number() }) });
    const result = schema.safeParse({ load: { kN: 'ten' } });
    expect(result.success).toBe(false);
    const { app } = appThrowing(result.error as ZodError);
    const res = await request(app).get('/boom');
    expect(res.status).toBe(422);
    expect(res.body.error.field).toBe('load.kN');
  });

  it('maps a duplicate-key refusal from MariaDB to 409 DUPLICATE', async () => {
    const error = Object.assign(
      new Error("Duplicate entry 'BW-1' for key 'projects_job_number_unique'"),
      { code: 'ER_DUP_ENTRY', errno: 1062 },
    );
    const { app } = appThrowing(error);
    const res = await request(app).get('/boom');
    expect(res.status).toBe(409);
    expect(res.body.error).toMatchObject({ code: 'DUPLICATE', field: 'jobNumber' });
  });

  it('renders an AppError as it is', async () => {
    const { app } = appThrowing(new ConflictError('Already there.', { field: 'email' }));
    const res = await request(app).get('/boom');
    expect(res.status).toBe(409);
    expect(res.body).toEqual({
      error: { code: 'CONFLICT', message: 'Already there.', field: 'email' },
    });
  });
});

describe('request log', () => {
  it('writes one line per request with method, path, status and time, and no secrets', async () => {
    const logged = await createTestApp({ logRequests: true });
    const lines: string[] = [];
    const spy = vi.spyOn(process.stdout, 'write').mockImplementation((chunk) => {
      lines.push(String(chunk));
      return true;
    });
    try {
      const person = await createUser(logged.db);
      const client = await anonymous(logged.app);
      await client.post('/api/auth/sign-in?next=%2Fprojects', {
        email: person.email,
        password: person.password,
      });
    } finally {
      spy.mockRestore();
      await logged.close();
    }
    const signIn = lines.filter((l) => l.includes('/api/auth/sign-in'));
    expect(signIn).toHaveLength(1);
    expect(signIn[0]).toMatch(/POST \/api\/auth\/sign-in 200 \d+\.\dms\n$/);
    const all = lines.join('');
    expect(all).not.toContain('factory-password');
    expect(all).not.toContain('argon2');
    expect(all).not.toContain('modewright.sid');
    expect(all).not.toContain('next=');
  });
});
