import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { gunzipSync } from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  anonymous,
  createTeamApp,
  signedIn,
  type ApiClient,
  type TestApp,
} from '../support/api-app';
import { createProjectTeam, unique } from '../support/factories';

// Uploading matrix files to a sheet: good Matrix Market and CSV files, bad ones
// refused at their line, the size limit, roles. Fixture contents: test/fixtures/uploads/README.md.

const fixtures = path.resolve(import.meta.dirname, '..', 'fixtures', 'uploads');
const fixture = (name: string) => readFileSync(path.join(fixtures, name));

let t: TestApp;
let team: Awaited<ReturnType<typeof createProjectTeam>>;
let author: ApiClient;
let viewer: ApiClient;
let checker: ApiClient;
let sheetId: number;

beforeAll(async () => {
  ({
    t,
    team,
    clients: { author, viewer, checker },
  } = await createTeamApp(['author', 'viewer', 'checker']));
  const res = await author.post(`/api/projects/${team.project.id}/sheets`, {
    number: `UPL-${unique()}`,
    title: 'Uploads',
  });
  expect(res.status).toBe(201);
  sheetId = res.body.sheet.id;
});

afterAll(async () => {
  await t?.close();
});

function upload(client: ApiClient, name: string, bytes: Buffer, target = sheetId) {
  return client.agent
    .post(`/api/sheets/${target}/uploads`)
    .set('X-CSRF-Token', client.csrfToken)
    .attach('file', bytes, name);
}

const sha256 = (b: Buffer) => createHash('sha256').update(b).digest('hex');

describe('POST /api/sheets/:sheetId/uploads', () => {
  it('stores a Matrix Market coordinate symmetric file with its shape, digest and bytes', async () => {
    const bytes = fixture('chain3-k.mtx');
    const res = await upload(author, 'chain3-k.mtx', bytes);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    // Shape from the file: 3 × 3, lower triangle stored (3 diagonal + 2 off-diagonal), so the
    // full matrix has 3 + 2·2 = 7 nonzeros.
    expect(res.body.upload).toMatchObject({
      name: 'chain3-k.mtx',
      format: 'matrix-market',
      size: bytes.length,
      sha256: sha256(bytes),
      rows: 3,
      cols: 3,
      nonzeros: 7,
      symmetric: true,
      worstAsymmetry: null,
    });
    expect(Date.parse(res.body.upload.createdAt)).not.toBeNaN();

    const row = await t.db('uploads').where({ id: res.body.upload.id }).first();
    expect(row.sheet_id).toBe(sheetId);
    expect(row.encoding).toBe('gzip');
    expect(gunzipSync(row.bytes).equals(bytes)).toBe(true);
    const activity = await t
      .db('activity')
      .where({ action: 'upload.added', object_type: 'upload', object_id: res.body.upload.id })
      .select('actor_id', 'project_id');
    expect(activity).toEqual([{ actor_id: team.author.id, project_id: team.project.id }]);
  });

  it('stores a Matrix Market array general file (column-major, zeros not counted)', async () => {
    const bytes = fixture('chain3-m.mtx');
    const res = await upload(author, 'chain3-m.mtx', bytes);
    expect(res.status).toBe(201);
    expect(res.body.upload).toMatchObject({
      format: 'matrix-market',
      rows: 3,
      cols: 3,
      nonzeros: 3,
      symmetric: true,
    });
  });

  it('stores a CSV of dense rows', async () => {
    const res = await upload(author, 'chain3-k.csv', fixture('chain3-k.csv'));
    expect(res.status).toBe(201);
    expect(res.body.upload).toMatchObject({
      format: 'csv',
      rows: 3,
      cols: 3,
      nonzeros: 7,
      symmetric: true,
    });
  });

  it('reads i,j,value triplets when the CSV starts with that header', async () => {
    const bytes = Buffer.from('i,j,value\n1,1,4\n2,2,5\n1,2,-1\n2,1,-1\n');
    const res = await upload(author, `triplets-${unique()}.csv`, bytes);
    expect(res.status).toBe(201);
    expect(res.body.upload).toMatchObject({ rows: 2, cols: 2, nonzeros: 4, symmetric: true });
  });

  it('reports the worst asymmetry of a non-symmetric matrix', async () => {
    const res = await upload(author, 'skewed.csv', fixture('skewed.csv'));
    expect(res.status).toBe(201);
    // skewed.csv: K[1,3] = 5, K[3,1] = 4, every other pair equal; max |a| = 10.
    expect(res.body.upload.symmetric).toBe(false);
    expect(res.body.upload.worstAsymmetry).toEqual({
      row: 1,
      col: 3,
      upper: 5,
      lower: 4,
      relative: Math.abs(5 - 4) / 10,
    });
  });

  it('refuses a Matrix Market file with a non-numeric entry, naming its line', async () => {
    const res = await upload(author, 'bad-entry.mtx', fixture('bad-entry.mtx'));
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('MATRIX_FILE_INVALID');
    expect(res.body.error.details.line).toBe(6);
    expect(res.body.error.message).toContain('line 6');
    expect(res.body.error.message).toContain("'twelve' is not a number");
    expect(await t.db('uploads').where({ sheet_id: sheetId, name: 'bad-entry.mtx' }).first()).toBe(
      undefined,
    );
  });

  it('refuses a CSV that is not a matrix, naming line 1', async () => {
    const res = await upload(author, 'not-a-matrix.csv', fixture('not-a-matrix.csv'));
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('MATRIX_FILE_INVALID');
    expect(res.body.error.details.line).toBe(1);
    expect(res.body.error.message).toContain("'part' is not a number");
  });

  it('refuses a coordinate file whose size line promises more entries than it holds', async () => {
    const text = '%%MatrixMarket matrix coordinate real general\n2 2 3\n1 1 1\n2 2 1\n';
    const res = await upload(author, `short-${unique()}.mtx`, Buffer.from(text));
    expect(res.status).toBe(422);
    expect(res.body.error.message).toContain('announces 3 but the file has 2');
  });

  it('refuses an entry outside the declared size, naming its line', async () => {
    const text = '%%MatrixMarket matrix coordinate real general\n2 2 2\n1 1 1\n3 1 1\n';
    const res = await upload(author, `outside-${unique()}.mtx`, Buffer.from(text));
    expect(res.status).toBe(422);
    expect(res.body.error.details.line).toBe(4);
    expect(res.body.error.message).toContain('row index 3 is out of range 1…2');
  });

  it('refuses a file that is neither .mtx nor .csv with 422 on the file field', async () => {
    const res = await upload(author, 'stiffness.xlsx', Buffer.from('1,2\n3,4\n'));
    expect(res.status).toBe(422);
    expect(res.body.error.field).toBe('file');
  });

  it('answers the stored upload again for the same file, and 409 for other bytes under its name', async () => {
    const name = `repeat-${unique()}.csv`;
    const first = await upload(author, name, Buffer.from('1,0\n0,1\n'));
    expect(first.status).toBe(201);
    const again = await upload(author, name, Buffer.from('1,0\n0,1\n'));
    expect(again.status).toBe(200);
    expect(again.body.upload.id).toBe(first.body.upload.id);
    const changed = await upload(author, name, Buffer.from('2,0\n0,2\n'));
    expect(changed.status).toBe(409);
    expect(changed.body.error.field).toBe('file');
    expect(await t.db('uploads').where({ sheet_id: sheetId, name }).count({ n: '*' })).toEqual([
      { n: 1 },
    ]);
  });

  it('refuses a name that differs from a stored one only in capitals with 409', async () => {
    const name = `Case-${unique()}.csv`;
    expect((await upload(author, name, Buffer.from('1,0\n0,1\n'))).status).toBe(201);
    const lower = await upload(author, name.toLowerCase(), Buffer.from('1,0\n0,1\n'));
    expect(lower.status).toBe(409);
    expect(lower.body.error.message).toContain(name);
  });

  it('refuses a file over the upload limit with 413 PAYLOAD_TOO_LARGE', async () => {
    // One byte over the default limit (64 MiB): a CSV row of zeros.
    const bytes = Buffer.alloc(64 * 1024 * 1024 + 1, '0');
    const res = await upload(author, `huge-${unique()}.csv`, bytes);
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('PAYLOAD_TOO_LARGE');
    expect(res.body.error.message).toContain('64 MB');
    expect(res.body.error.message).toContain('MW_UPLOAD_LIMIT_BYTES');
  });

  it('refuses a request without a file with 422 on the file field', async () => {
    const res = await author.agent
      .post(`/api/sheets/${sheetId}/uploads`)
      .set('X-CSRF-Token', author.csrfToken)
      .field('note', 'no file');
    expect(res.status).toBe(422);
    expect(res.body.error.field).toBe('file');
  });

  it('refuses a checker and a viewer with 403 and a signed-out caller with 401', async () => {
    const bytes = fixture('chain3-k.mtx');
    expect((await upload(checker, 'by-checker.mtx', bytes)).status).toBe(403);
    expect((await upload(viewer, 'by-viewer.mtx', bytes)).status).toBe(403);
    expect((await upload(await anonymous(t.app), 'anon.mtx', bytes)).status).toBe(401);
    expect(
      await t
        .db('uploads')
        .where({ sheet_id: sheetId })
        .whereIn('name', ['by-checker.mtx', 'by-viewer.mtx', 'anon.mtx'])
        .first(),
    ).toBe(undefined);
  });

  it('answers 404 for a sheet that does not exist', async () => {
    expect((await upload(author, 'x.mtx', fixture('chain3-k.mtx'), 999999999)).status).toBe(404);
  });
});

describe('GET /api/sheets/:sheetId/uploads', () => {
  it('lets a viewer list the uploads by name, without their bytes', async () => {
    const res = await viewer.get(`/api/sheets/${sheetId}/uploads`);
    expect(res.status).toBe(200);
    const names = res.body.uploads.map((u: { name: string }) => u.name);
    expect(names).toContain('chain3-k.mtx');
    expect(names).toEqual([...names].sort());
    expect(res.body.uploads[0].bytes).toBeUndefined();
  });

  it('refuses someone outside the project with 403', async () => {
    const outsider = await signedIn(t.app, team.outsider);
    expect((await outsider.get(`/api/sheets/${sheetId}/uploads`)).status).toBe(403);
  });
});
