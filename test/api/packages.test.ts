import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  anonymous,
  createSheetWithDraft,
  createTeamApp,
  saveDraft,
  type ApiClient,
  type TestApp,
} from '../support/api-app';
import { createProjectTeam, unique } from '../support/factories';

// The project calculation package: which revisions it binds, what each carries (the print of the
// revision, its seal, the record of check), and who may have it.

let t: TestApp;
let team: Awaited<ReturnType<typeof createProjectTeam>>;
let author: ApiClient;
let checker: ApiClient;
let principal: ApiClient;
let viewer: ApiClient;
let outsider: ApiClient;
let admin: ApiClient;

// f = sqrt(k/m)/(2π) with k = 24 kN/mm, m = 18 t: 5.81 Hz (single-degree-of-freedom closed form).
const blocks = [
  { id: 'calc', kind: 'calc', source: 'k = 24 kN/mm\nm = 18 t\nf = sqrt(k/m)/(2 pi)' },
  { id: 'crit', kind: 'criteria', source: 'f >= 3 Hz  # walking comfort (common practice)' },
];

let sheetA: number;
let sheetB: number;
let sheetC: number;
let a1: number;
let a2: number;
let b1: number;
let c1: number;
let sealA2: string;
let sealB1: string;

async function issue(sheetId: number): Promise<number> {
  const rev = await author.post(`/api/sheets/${sheetId}/revisions`, {
    purpose: 'For construction',
  });
  expect(rev.status, JSON.stringify(rev.body)).toBe(201);
  return rev.body.revision.id;
}

async function seal(revId: number): Promise<string> {
  expect((await checker.post(`/api/revisions/${revId}/sign-off`)).status).toBe(200);
  const res = await principal.post(`/api/revisions/${revId}/seal`, {
    password: team.principal.password,
  });
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body.seal.code;
}

beforeAll(async () => {
  ({
    t,
    team,
    clients: { author, checker, principal, viewer, outsider, admin },
  } = await createTeamApp(['author', 'checker', 'principal', 'viewer', 'outsider', 'admin']));
  const tag = unique();
  // Numbered so that sheet order (natural: 2 before 10) differs from creation order.
  sheetA = (
    await createSheetWithDraft(
      author,
      team.project.id,
      { number: `PK-10-${tag}`, title: 'Deck' },
      blocks,
    )
  ).id;
  sheetB = (
    await createSheetWithDraft(
      author,
      team.project.id,
      { number: `PK-2-${tag}`, title: 'Frame' },
      blocks,
    )
  ).id;
  sheetC = (
    await createSheetWithDraft(
      author,
      team.project.id,
      { number: `PK-3-${tag}`, title: 'Pump' },
      blocks,
    )
  ).id;
  // Sheet A: Rev 1 returned with a remark answered by the author, Rev 2 sealed.
  a1 = await issue(sheetA);
  const remark = await checker.post(`/api/revisions/${a1}/remarks`, {
    blockId: 'calc',
    line: 2,
    type: 'query',
    text: 'Is 18 t the mass with finishes?',
  });
  expect(remark.status).toBe(201);
  expect(
    (
      await author.post(`/api/remarks/${remark.body.remark.id}/replies`, {
        text: 'Yes, finishes included.',
      })
    ).status,
  ).toBe(201);
  expect((await checker.post(`/api/revisions/${a1}/return`)).status).toBe(200);
  await saveDraft(author, sheetA, blocks);
  a2 = await issue(sheetA);
  const carried = (await checker.get(`/api/revisions/${a2}/remarks`)).body.remarks as {
    id: number;
  }[];
  for (const r of carried) {
    expect((await checker.patch(`/api/remarks/${r.id}`, { state: 'closed' })).status).toBe(200);
  }
  sealA2 = await seal(a2);
  // Sheet B: Rev 1 sealed. Sheet C: Rev 1 in check only.
  b1 = await issue(sheetB);
  sealB1 = await seal(b1);
  c1 = await issue(sheetC);
});

afterAll(async () => {
  await t?.close();
});

const url = () => `/api/projects/${team.project.id}/package`;

describe('GET /api/projects/:projectId/package', () => {
  it('answers 401 signed out and 403 to a person outside the project', async () => {
    expect((await (await anonymous(t.app)).get(url())).status).toBe(401);
    const res = await outsider.get(url());
    expect(res.status).toBe(403);
    expect(res.body.error.message).toBe('You are not a member of this project.');
  });

  it('answers 404 for a project that does not exist', async () => {
    expect((await viewer.get('/api/projects/999999999/package')).status).toBe(404);
  });

  it('binds the latest sealed revision of each sheet by default, in sheet-number order', async () => {
    const res = await viewer.get(url());
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.defaultChoice).toBe(true);
    expect(res.body.project).toMatchObject({
      id: team.project.id,
      jobNumber: team.project.jobNumber,
    });
    expect(res.body.firm.name).toEqual(expect.any(String));
    // Natural order: PK-2 before PK-3 before PK-10.
    expect(res.body.sheets.map((s: { id: number }) => s.id)).toEqual([sheetB, sheetC, sheetA]);
    expect(
      res.body.sheets.map((s: { chosenRevisionId: number | null }) => s.chosenRevisionId),
    ).toEqual([b1, null, a2]);
    expect(res.body.parts.map((p: { revision: { id: number } }) => p.revision.id)).toEqual([
      b1,
      a2,
    ]);
    expect(res.body.parts.map((p: { seal: { code: string } }) => p.seal.code)).toEqual([
      sealB1,
      sealA2,
    ]);
    expect(res.body.parts[1].seal.verifyPath).toBe(`/verify/${sealA2}`);
    const sheetARevs = res.body.sheets[2].revisions;
    expect(sheetARevs).toEqual([
      { id: a2, number: 2, status: 'sealed', sealCode: sealA2 },
      { id: a1, number: 1, status: 'returned', sealCode: null },
    ]);
  });

  it('carries the record of check: the remarks of each revision with their replies', async () => {
    const res = await viewer.get(`${url()}?revisions=${a1},${b1}`);
    expect(res.status).toBe(200);
    expect(res.body.defaultChoice).toBe(false);
    const partA = res.body.parts.find((p: { revision: { id: number } }) => p.revision.id === a1);
    expect(partA.record.revisionId).toBe(a1);
    expect(partA.record.remarks).toHaveLength(1);
    expect(partA.record.remarks[0]).toMatchObject({
      blockId: 'calc',
      line: 2,
      type: 'query',
      text: 'Is 18 t the mass with finishes?',
      author: { id: team.checker.id },
      replies: [{ text: 'Yes, finishes included.', author: { id: team.author.id } }],
    });
    expect(partA.revision.banner).toMatch(/^Preliminary — not for construction/);
    // The carried copy on Rev 2 was closed by the checker.
    const sealed = await viewer.get(url());
    const partA2 = sealed.body.parts.find(
      (p: { revision: { id: number } }) => p.revision.id === a2,
    );
    expect(partA2.record.remarks.map((r: { state: string }) => r.state)).toEqual(['closed']);
  });

  it('binds a revision that is not sealed when asked, and leaves out sheets not named', async () => {
    const res = await admin.get(`${url()}?revisions=${c1}`);
    expect(res.status).toBe(200);
    expect(res.body.parts.map((p: { revision: { id: number } }) => p.revision.id)).toEqual([c1]);
    expect(res.body.parts[0].seal).toBeNull();
  });

  it('answers 422 on revisions for two revisions of one sheet, a revision of another project, and a bad list', async () => {
    const two = await viewer.get(`${url()}?revisions=${a1},${a2}`);
    expect(two.status).toBe(422);
    expect(two.body.error.field).toBe('revisions');
    expect(two.body.error.message).toMatch(/^Choose one revision of sheet PK-10-/);
    const other = await createTeamApp(['author']);
    let elsewhere: number;
    try {
      const sheet = await createSheetWithDraft(
        other.clients.author,
        other.team.project.id,
        { number: `PK-X-${unique()}`, title: 'Elsewhere' },
        blocks,
      );
      const rev = await other.clients.author.post(`/api/sheets/${sheet.id}/revisions`, {
        purpose: 'For check',
      });
      elsewhere = rev.body.revision.id;
    } finally {
      await other.t.close();
    }
    const theirs = await viewer.get(`${url()}?revisions=${elsewhere}`);
    expect(theirs.status).toBe(422);
    expect(theirs.body.error.message).toBe(
      `Revision ${elsewhere} is not a revision of this project.`,
    );
    const foreign = await viewer.get(`${url()}?revisions=999999999`);
    expect(foreign.status).toBe(422);
    expect(foreign.body.error.message).toBe(
      'Revision 999999999 is not a revision of this project.',
    );
    const bad = await viewer.get(`${url()}?revisions=1;2`);
    expect(bad.status).toBe(422);
    expect(bad.body.error.field).toBe('revisions');
  });
});

describe('GET /api/projects/:projectId/package/pdf', () => {
  it('answers 401 signed out and 403 to a person outside the project, before any browser starts', async () => {
    expect((await (await anonymous(t.app)).get(`${url()}/pdf`)).status).toBe(401);
    expect((await outsider.get(`${url()}/pdf`)).status).toBe(403);
  });

  it('answers 422 EMPTY_PACKAGE when no sheet has a sealed revision', async () => {
    const empty = await createTeamApp(['viewer']);
    try {
      const res = await empty.clients.viewer.get(
        `/api/projects/${empty.team.project.id}/package/pdf`,
      );
      expect(res.status).toBe(422);
      expect(res.body.error).toMatchObject({ code: 'EMPTY_PACKAGE', field: 'revisions' });
    } finally {
      await empty.t.close();
    }
  });

  it('answers 422 for a bad choice of revisions', async () => {
    const res = await viewer.get(`${url()}/pdf?revisions=${a1},${a2}`);
    expect(res.status).toBe(422);
  });
});

describe('renderPdf', () => {
  it('refuses with 503 PDF_UNAVAILABLE and points to the browser’s print where Chromium is missing', async () => {
    const { renderPdf } = await import('../../api/modules/packages/packages.pdf');
    const refused = renderPdf(
      { origin: 'http://127.0.0.1:1', publicOrigin: 'http://127.0.0.1:1', path: '/', cookie: null },
      '/nonexistent/chromium',
    );
    await expect(refused).rejects.toMatchObject({
      status: 503,
      code: 'PDF_UNAVAILABLE',
      message: expect.stringContaining('use your browser’s Print → Save as PDF instead'),
    });
  });
});
