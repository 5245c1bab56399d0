import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createUploadsRouter } from '../../api/modules/uploads/uploads.routes';
import { createEvaluationPool, type EvaluationPool } from '../../api/workers/evaluation-pool';
import { createTeamApp, mountBeforeApi, type ApiClient, type TestApp } from '../support/api-app';
import { createProjectTeam, unique } from '../support/factories';

// Uploaded matrix files are read in the worker pool, not on the API's event loop: while a large
// file is being parsed in a worker, the server answers other requests.

let t: TestApp;
let pool: EvaluationPool;
let team: Awaited<ReturnType<typeof createProjectTeam>>;
let author: ApiClient;
let sheetId: number;

beforeAll(async () => {
  ({
    t,
    team,
    clients: { author },
  } = await createTeamApp(['author']));
  pool = createEvaluationPool({ threads: 1, timeLimitMs: 60_000, memoryLimitMb: 512 });
  mountBeforeApi(t, createUploadsRouter({ ...t.ctx, describeMatrixFile: pool.describeMatrixFile }));
  const res = await author.post(`/api/projects/${team.project.id}/sheets`, {
    number: `UPW-${unique()}`,
    title: 'Uploads in workers',
  });
  expect(res.status).toBe(201);
  sheetId = res.body.sheet.id;
});

afterAll(async () => {
  await pool?.close();
  await t?.close();
});

function upload(name: string, bytes: Buffer) {
  return author.agent
    .post(`/api/sheets/${sheetId}/uploads`)
    .set('X-CSRF-Token', author.csrfToken)
    .attach('file', bytes, name);
}

/** A symmetric tridiagonal n × n chain stiffness as a Matrix Market coordinate file (lower part). */
function chainFile(n: number): Buffer {
  const lines = ['%%MatrixMarket matrix coordinate real symmetric', `${n} ${n} ${2 * n - 1}`];
  for (let i = 1; i <= n; i++) {
    lines.push(`${i} ${i} ${i === n ? '1.000000000000e+00' : '2.000000000000e+00'}`);
    if (i < n) lines.push(`${i + 1} ${i} -1.000000000000e+00`);
  }
  return Buffer.from(lines.join('\n') + '\n');
}

describe('POST /api/sheets/:sheetId/uploads in the worker pool', () => {
  it('parses a large file in a worker while the server answers other requests', async () => {
    // Start the worker first (loading the engine takes seconds) so the parse is what we watch.
    await pool.describeMatrixFile('1,0\n0,1\n', 'csv', 'warm.csv');
    const before = pool.stats().describes.completed;
    const n = 300_000; // about 14 MB: seconds of parsing
    const bytes = chainFile(n);
    expect(bytes.length).toBeGreaterThan(10 * 2 ** 20);
    const pending = upload('chain.mtx', bytes).then((r) => r);
    // Wait until the worker has the file (the body has arrived and the parse has begun).
    while (pool.stats().describes.running === 0) {
      await new Promise((r) => setTimeout(r, 5));
    }
    // The event loop is free: another request is answered while the parse is still running.
    const list = await author.get(`/api/sheets/${sheetId}/uploads`);
    expect(list.status).toBe(200);
    expect(pool.stats().describes.running).toBe(1);
    const res = await pending;
    expect(res.status).toBe(201);
    expect(res.body.upload).toMatchObject({
      name: 'chain.mtx',
      rows: n,
      cols: n,
      nonzeros: 3 * n - 2,
      symmetric: true,
    });
    expect(pool.stats().describes).toEqual({ completed: before + 1, running: 0 });
  });

  it('refuses a bad file from the worker with the file and line named', async () => {
    const text = '%%MatrixMarket matrix coordinate real general\n2 2 2\n1 1 4\n2 x 5\n';
    const res = await upload('bad.mtx', Buffer.from(text));
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('MATRIX_FILE_INVALID');
    expect(res.body.error.field).toBe('file');
    expect(res.body.error.message).toContain('bad.mtx');
    expect(res.body.error.details).toMatchObject({ line: 4, file: 'bad.mtx' });
  });
});
