import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { z } from 'zod';
import { activityResponse } from '../../core/contract/activity';
import { outboxResponse } from '../../core/contract/outbox';
import { meResponse, signInResponse, usersResponse } from '../../core/contract/people';
import { compareResponse } from '../../core/contract/compare';
import { membersResponse, projectResponse, projectsResponse } from '../../core/contract/projects';
import { packageResponse, printResponse } from '../../core/contract/print';
import { remarkResponse, remarksResponse } from '../../core/contract/remarks';
import {
  revisionDetailResponse,
  revisionResponse,
  revisionsResponse,
  sealResponse,
} from '../../core/contract/revisions';
import { searchAnswer } from '../../core/contract/search';
import {
  draftConflictDetails,
  draftSaved,
  errorEvent,
  evaluationJob,
  evaluationResponse,
  evaluationStarted,
  latestEvaluationResponse,
  progressEvent,
  firmTemplatesResponse,
  sheetResponse,
  sheetResults,
  sheetsResponse,
  sheetTemplatesResponse,
} from '../../core/contract/sheets';
import { uploadResponse, uploadsResponse } from '../../core/contract/uploads';
import { verifyResult } from '../../core/contract/verify';
import { anonymous, createTeamApp, type ApiClient, type TestApp } from '../support/api-app';
import { asText, parseEvents } from '../support/event-stream';
import { createProjectTeam, unique } from '../support/factories';

// The response contract (core/contract/) against the real server: every GET the client makes and
// the main writes, on a fresh team, each answer parsed with its schema. The schemas are strict, so
// a field renamed, added or dropped on the server fails here as well as in tsc. The sheet is a
// single-degree-of-freedom oscillator, f = √(k/m) / 2π (closed form, any dynamics text).

let t: TestApp;
let team: Awaited<ReturnType<typeof createProjectTeam>>;
let admin: ApiClient;
let author: ApiClient;
let checker: ApiClient;
let principal: ApiClient;

const WORD = `contract${unique().replace(/[^a-z0-9]/gi, '')}`;
const blocks = [
  { id: 'intro', kind: 'text', source: `Pump plinth, ${WORD} check.` },
  { id: 'calc', kind: 'calc', source: 'k = 2000 kN/m\nm_s = 5 t\nf = sqrt(k / m_s) / (2 * pi)' },
  { id: 'crit', kind: 'criteria', source: 'f >= 3 Hz  # walking comfort (common practice)' },
];

/** The body of a response with the status expected, parsed with its schema. */
function answer<S extends z.ZodType>(
  res: { status: number; body: unknown },
  status: number,
  schema: S,
): z.output<S> {
  expect(res.status, JSON.stringify(res.body)).toBe(status);
  const parsed = schema.safeParse(res.body);
  if (!parsed.success) {
    throw new Error(`The response does not keep the contract: ${parsed.error.message}`);
  }
  return parsed.data;
}

let sheetId = 0;
let draftVersion = 0;
let revisionId = 0;
let sealCode = '';

beforeAll(async () => {
  ({
    t,
    team,
    clients: { admin, author, checker, principal },
  } = await createTeamApp(['admin', 'author', 'checker', 'principal']));
});

afterAll(async () => {
  await t?.close();
});

describe('the response contract, on the real server', () => {
  it('the person: sign-in and me; the administrator: people and the outbox', async () => {
    const fresh = await anonymous(t.app);
    const signIn = answer(
      await fresh.post('/api/auth/sign-in', {
        email: team.author.email,
        password: team.author.password,
      }),
      200,
      signInResponse,
    );
    expect(signIn.user.id).toBe(team.author.id);
    expect(answer(await author.get('/api/auth/me'), 200, meResponse).user.email).toBe(
      team.author.email,
    );
    const users = answer(await admin.get('/api/users'), 200, usersResponse).users;
    expect(users.map((u) => u.id)).toContain(team.principal.id);
  });

  it('projects, one project, its members; the sheet templates and the firm library', async () => {
    const projects = answer(await author.get('/api/projects'), 200, projectsResponse).projects;
    expect(projects.map((p) => p.id)).toContain(team.project.id);
    const one = answer(await author.get(`/api/projects/${team.project.id}`), 200, projectResponse);
    expect(one.project.myRoles).toEqual(['author']);
    const members = answer(
      await author.get(`/api/projects/${team.project.id}/members`),
      200,
      membersResponse,
    ).members;
    expect(members).toHaveLength(4);
    const templates = answer(
      await author.get('/api/sheet-templates'),
      200,
      sheetTemplatesResponse,
    ).templates;
    expect(templates.length).toBeGreaterThan(0);
    answer(await author.get('/api/firm-templates'), 200, firmTemplatesResponse);
  });

  it('a sheet: created, its draft saved, listed, read with its draft, evaluated', async () => {
    const created = answer(
      await author.post(`/api/projects/${team.project.id}/sheets`, {
        number: `CT-${unique()}`,
        title: 'Pump plinth frequency',
      }),
      201,
      sheetResponse,
    );
    sheetId = created.sheet.id;
    const saved = answer(
      await author.agent
        .put(`/api/sheets/${sheetId}/draft`)
        .set('X-CSRF-Token', author.csrfToken)
        .set('If-Match', `"${created.sheet.draftVersion}"`)
        .send({ blocks, settings: { significantFigures: 4 } }),
      200,
      draftSaved,
    );
    expect(saved.draftVersion).toBe(created.sheet.draftVersion + 1);
    draftVersion = saved.draftVersion;
    const list = answer(
      await author.get(`/api/projects/${team.project.id}/sheets`),
      200,
      sheetsResponse,
    ).sheets;
    expect(list.map((s) => s.id)).toContain(sheetId);
    const sheet = answer(await author.get(`/api/sheets/${sheetId}`), 200, sheetResponse).sheet;
    expect(sheet.draft.blocks.map((b) => b.id)).toEqual(['intro', 'calc', 'crit']);
    const evaluated = answer(
      await author.post(`/api/sheets/${sheetId}/evaluate`, {
        blocks,
        settings: { significantFigures: 4 },
      }),
      200,
      evaluationResponse,
    );
    expect(evaluated.results.summary).toEqual({ passed: 1, failed: 0, errors: 0 });
  });

  it('a stale draft save: the 409 carries the current draft', async () => {
    const res = await author.agent
      .put(`/api/sheets/${sheetId}/draft`)
      .set('X-CSRF-Token', author.csrfToken)
      .set('If-Match', `"${draftVersion - 1}"`)
      .send({ blocks: [], settings: { significantFigures: 4 } });
    expect(res.status, JSON.stringify(res.body)).toBe(409);
    const body = res.body as { error: { code: string; details: unknown } };
    expect(body.error.code).toBe('DRAFT_CONFLICT');
    const { current } = answer(
      { status: 409, body: body.error.details },
      409,
      draftConflictDetails,
    );
    expect(current.draftVersion).toBe(draftVersion);
    expect(current.blocks.map((b) => b.id)).toEqual(['intro', 'calc', 'crit']);
  });

  it('uploads: a matrix file sent, sent again, listed', async () => {
    // A 2 × 2 symmetric stiffness in Matrix Market coordinate form (NIST's format, lower half).
    const file = Buffer.from(
      '%%MatrixMarket matrix coordinate real symmetric\n2 2 3\n1 1 2\n2 1 -1\n2 2 2\n',
    );
    const send = () =>
      author.agent
        .post(`/api/sheets/${sheetId}/uploads`)
        .set('X-CSRF-Token', author.csrfToken)
        .attach('file', file, 'k-contract.mtx');
    const first = answer(await send(), 201, uploadResponse).upload;
    // Symmetric storage lists 3 entries; the matrix has 4 nonzeros (the mirror counted).
    expect(first).toMatchObject({ rows: 2, cols: 2, nonzeros: 4, symmetric: true });
    expect(answer(await send(), 200, uploadResponse).upload.id).toBe(first.id);
    const list = answer(await author.get(`/api/sheets/${sheetId}/uploads`), 200, uploadsResponse);
    expect(list.uploads.map((u) => u.name)).toEqual(['k-contract.mtx']);
  });

  it('evaluations: over a stream, in the background with their events, the latest, from the store', async () => {
    // The data of every event of a stream, each parsed with the schema of its event.
    const eventsOf = (text: string) =>
      parseEvents(text).map(({ event, data }) => {
        const schema = { progress: progressEvent, error: errorEvent }[event];
        return { event, data: schema ? answer({ status: 200, body: data }, 200, schema) : data };
      });
    const stream = await asText(
      author.agent
        .post(`/api/sheets/${sheetId}/evaluate/stream`)
        .set('X-CSRF-Token', author.csrfToken)
        .set('Accept', 'text/event-stream')
        .send({ blocks, settings: { significantFigures: 4 } }),
    );
    expect(stream.status).toBe(200);
    const streamed = eventsOf(stream.body as string);
    expect(streamed.filter((e) => e.event === 'progress').length).toBeGreaterThan(0);
    expect(streamed.at(-1)!.event).toBe('result');
    answer({ status: 200, body: streamed.at(-1)!.data }, 200, evaluationResponse);

    // A text no evaluation has seen (this run's word and time), so a job is queued.
    const fresh = [{ id: 'run', kind: 'text', source: `Run ${WORD} ${Date.now()}.` }, ...blocks];
    const draft = { blocks: fresh, settings: { significantFigures: 4 } };
    const started = answer(
      await author.post(`/api/sheets/${sheetId}/evaluations`, draft),
      202,
      evaluationStarted,
    ).job;
    expect(started.state).toBe('waiting');
    const jobId = started.id!;
    const res = await asText(author.get(`/api/sheets/${sheetId}/evaluations/${jobId}/events`));
    expect(res.status).toBe(200);
    const followed = eventsOf(res.body as string);
    expect(followed.at(-1)!.event).toBe('result');
    const done = answer({ status: 200, body: followed.at(-1)!.data }, 200, evaluationJob);
    expect(done).toMatchObject({ id: jobId, state: 'done', fromStore: false });
    expect(done.results?.summary).toEqual({ passed: 1, failed: 0, errors: 0 });

    const latest = answer(
      await author.get(`/api/sheets/${sheetId}/evaluations/latest`),
      200,
      latestEvaluationResponse,
    ).job;
    expect(latest?.id).toBe(jobId);
    const stored = answer(
      await author.post(`/api/sheets/${sheetId}/evaluations`, draft),
      200,
      evaluationStarted,
    ).job;
    expect(stored).toMatchObject({ id: null, state: 'done', fromStore: true });
    expect((await author.delete(`/api/sheets/${sheetId}/evaluations/${jobId}`)).status).toBe(204);
  });

  it('a revision: issued, listed, read; remarks made, answered, listed, closed; signed off', async () => {
    const issued = answer(
      await author.post(`/api/sheets/${sheetId}/revisions`, { purpose: 'For check' }),
      201,
      revisionResponse,
    );
    revisionId = issued.revision.id;
    const revisions = answer(
      await author.get(`/api/sheets/${sheetId}/revisions`),
      200,
      revisionsResponse,
    ).revisions;
    expect(revisions.map((r) => r.id)).toEqual([revisionId]);
    const detail = answer(
      await checker.get(`/api/revisions/${revisionId}`),
      200,
      revisionDetailResponse,
    ).revision;
    expect(detail.seal).toBeNull();
    // The stored results keep the evaluation's shape.
    expect(sheetResults.parse(detail.results).summary.passed).toBe(1);

    const made = answer(
      await checker.post(`/api/revisions/${revisionId}/remarks`, {
        blockId: 'calc',
        line: 3,
        type: 'query',
        text: `Is the ${WORD} mass with the pump running?`,
      }),
      201,
      remarkResponse,
    ).remark;
    answer(
      await author.post(`/api/remarks/${made.id}/replies`, { text: 'Yes, operating mass.' }),
      201,
      remarkResponse,
    );
    const remarks = answer(
      await checker.get(`/api/revisions/${revisionId}/remarks`),
      200,
      remarksResponse,
    ).remarks;
    expect(remarks[0]?.replies).toHaveLength(1);
    answer(
      await checker.patch(`/api/remarks/${made.id}`, { state: 'closed' }),
      200,
      remarkResponse,
    );
    const off = answer(
      await checker.post(`/api/revisions/${revisionId}/sign-off`, { purpose: 'For construction' }),
      200,
      revisionResponse,
    );
    expect(off.revision.status).toBe('checked');
  });

  it('the seal, and its public verification', async () => {
    const sealed = answer(
      await principal.post(`/api/revisions/${revisionId}/seal`, {
        password: team.principal.password,
      }),
      200,
      sealResponse,
    );
    sealCode = sealed.seal.code;
    const detail = answer(
      await principal.get(`/api/revisions/${revisionId}`),
      200,
      revisionDetailResponse,
    ).revision;
    expect(detail.seal?.code).toBe(sealCode);
    const visitor = await anonymous(t.app);
    const verdict = answer(await visitor.get(`/api/verify/${sealCode}`), 200, verifyResult);
    expect(verdict.verdict).toBe('genuine');
    const unknown = answer(await visitor.get('/api/verify/AAAAA-AAAAA'), 200, verifyResult);
    expect(unknown.verdict).toBe('unknown-code');
  });

  it('compare with the draft, the print of the sealed revision, the project package', async () => {
    const compared = answer(
      await author.get(`/api/sheets/${sheetId}/compare?from=${revisionId}&to=draft`),
      200,
      compareResponse,
    );
    expect(compared.from).toMatchObject({ kind: 'revision', id: revisionId });
    expect(compared.to.kind).toBe('draft');
    const print = answer(
      await checker.get(`/api/revisions/${revisionId}/print`),
      200,
      printResponse,
    );
    expect(print.seal?.code).toBe(sealCode);
    expect(print.revision.banner).toBeNull();
    const pkg = answer(
      await principal.get(`/api/projects/${team.project.id}/package`),
      200,
      packageResponse,
    );
    expect(pkg.parts.map((p) => p.revision.id)).toEqual([revisionId]);
    expect(pkg.parts[0]!.record.remarks.length).toBeGreaterThan(0);
  });

  it('the activity of the project and of the sheet, search, and the outbox of a member', async () => {
    const project = answer(
      await author.get(`/api/projects/${team.project.id}/activity`),
      200,
      activityResponse,
    ).activity;
    expect(project.map((e) => e.action)).toContain('revision.sealed');
    const sheet = answer(
      await author.get(`/api/sheets/${sheetId}/activity`),
      200,
      activityResponse,
    ).activity;
    expect(sheet.map((e) => e.action)).toContain('revision.signed_off');
    const found = answer(
      await author.get(`/api/search?q=${encodeURIComponent(WORD)}`),
      200,
      searchAnswer,
    );
    // The sheet (its text block) and the remark both hold the word.
    expect(new Set(found.results.map((r) => r.kind))).toEqual(new Set(['sheet', 'remark']));
    const mine = answer(await author.get('/api/outbox'), 200, outboxResponse);
    expect(mine.scope).toBe('mine');
    expect(mine.messages.length).toBeGreaterThan(0);
    const all = answer(await admin.get('/api/outbox'), 200, outboxResponse);
    expect(all.scope).toBe('all');
  });

  it('a strict schema refuses a response with a field added or one missing', () => {
    const person = { id: 1, email: 'a@b.example', name: 'A', isAdmin: false };
    const full = { ...person, licenceNumber: null, jurisdiction: null };
    expect(meResponse.safeParse({ user: full }).success).toBe(true);
    expect(meResponse.safeParse({ user: person }).success).toBe(false);
    expect(meResponse.safeParse({ user: { ...full, passwordHash: 'x' } }).success).toBe(false);
  });
});
