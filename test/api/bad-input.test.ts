import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTeamApp, type ApiClient, type TestApp } from '../support/api-app';
import { unique } from '../support/factories';

// Malformed requests answer with their 4xx in the one error shape, never a 500: a body in a
// charset other than UTF-8, text that is not valid UTF-16, a file name with a NUL, a cut-off
// multipart body, and a Matrix Market size line past what can be stored.

let t: TestApp;
let author: ApiClient;
let projectId: number;
let sheetId: number;
let draftVersion: number;

beforeAll(async () => {
  let team;
  ({
    t,
    team,
    clients: { author },
  } = await createTeamApp(['author']));
  projectId = team.project.id;
  const res = await author.post(`/api/projects/${projectId}/sheets`, {
    number: `BAD-${unique()}`,
    title: 'Bad input',
  });
  expect(res.status).toBe(201);
  sheetId = res.body.sheet.id;
  draftVersion = res.body.sheet.draftVersion;
});

afterAll(async () => {
  await t?.close();
});

function expectErrorShape(body: unknown): { code: string; message: string; field?: string } {
  const error = (body as { error?: { code?: unknown; message?: unknown } }).error;
  expect(typeof error?.code).toBe('string');
  expect(typeof error?.message).toBe('string');
  return error as { code: string; message: string; field?: string };
}

function rawPut(path: string, contentType: string, body: string | Buffer) {
  return author.agent
    .put(path)
    .set('X-CSRF-Token', author.csrfToken)
    .set('If-Match', `"${draftVersion}"`)
    .set('Content-Type', contentType)
    .send(body);
}

describe('PUT /api/sheets/:sheetId/draft with a body that is not UTF-8 JSON', () => {
  it('answers 415 for a JSON body declared charset=latin1', async () => {
    const res = await rawPut(
      `/api/sheets/${sheetId}/draft`,
      'application/json; charset=latin1',
      Buffer.from('{"blocks":[]}', 'latin1'),
    );
    expect(res.status).toBe(415);
    const error = expectErrorShape(res.body);
    expect(error.code).toBe('UNSUPPORTED_CHARSET');
    expect(error.message).toMatch(/UTF-8/);
  });

  it('answers 422 naming the block and line for a lone surrogate in a block', async () => {
    // JSON may escape half of a surrogate pair; the text is then not valid UTF-16 and cannot be
    // stored as UTF-8.
    const body =
      '{"blocks":[{"id":"intro","kind":"text","source":"ok"},' +
      '{"id":"calc","kind":"calc","source":"k = 2\\nm = \\ud800 3"}]}';
    const res = await rawPut(`/api/sheets/${sheetId}/draft`, 'application/json', body);
    expect(res.status).toBe(422);
    const error = expectErrorShape(res.body);
    expect(error.code).toBe('INVALID_TEXT');
    expect(error.field).toBe('blocks.1.source');
    expect(error.message).toMatch(/^Block calc, line 2 /);
    // Nothing was written: the draft is still the empty one.
    const row = await t.db('sheets').where({ id: sheetId }).first();
    expect(row.draft_version).toBe(draftVersion);
  });

  it('answers 422 for a lone surrogate in a project name, naming the field', async () => {
    const res = await author.agent
      .post(`/api/projects/${projectId}/sheets`)
      .set('X-CSRF-Token', author.csrfToken)
      .set('Content-Type', 'application/json')
      .send(`{"number":"S-${unique()}","title":"Deck \\udc00"}`);
    expect(res.status).toBe(422);
    expect(expectErrorShape(res.body).field).toBe('title');
  });
});

describe('POST /api/sheets/:sheetId/uploads with a malformed upload', () => {
  it('answers 422 for a file name holding a NUL character', async () => {
    const res = await author.agent
      .post(`/api/sheets/${sheetId}/uploads`)
      .set('X-CSRF-Token', author.csrfToken)
      .attach('file', Buffer.from('%%MatrixMarket matrix array real general\n1 1\n2\n'), 'k\0.mtx');
    expect(res.status).toBeGreaterThanOrEqual(400);
    expect(res.status).toBeLessThan(500);
    expect(expectErrorShape(res.body).field).toBe('file');
  });

  it('answers 400 for a multipart body cut off before its end', async () => {
    const boundary = 'cutoffboundary';
    const body =
      `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="k.mtx"\r\n` +
      'Content-Type: text/plain\r\n\r\n%%MatrixMarket matrix array real general\n1 1\n';
    const res = await author.agent
      .post(`/api/sheets/${sheetId}/uploads`)
      .set('X-CSRF-Token', author.csrfToken)
      .set('Content-Type', `multipart/form-data; boundary=${boundary}`)
      .send(body);
    expect(res.status).toBe(400);
    const error = expectErrorShape(res.body);
    expect(error.field).toBe('file');
    expect(error.message).toMatch(/cut off|incomplete|end/i);
  });

  it('answers 422 for a Matrix Market size line of 4294967296 rows', async () => {
    const res = await author.agent
      .post(`/api/sheets/${sheetId}/uploads`)
      .set('X-CSRF-Token', author.csrfToken)
      .attach(
        'file',
        Buffer.from(
          '%%MatrixMarket matrix coordinate real symmetric\n4294967296 4294967296 1\n1 1 2\n',
        ),
        'huge.mtx',
      );
    expect([413, 422]).toContain(res.status);
    const error = expectErrorShape(res.body);
    expect(error.message).toMatch(/line 2/);
  });
});
