import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  anonymous,
  createTeamApp,
  signedIn,
  type ApiClient,
  type TestApp,
} from '../support/api-app';
import { addMember, createProjectTeam, createUser, unique } from '../support/factories';

// Issue for check, return and sign off through the real app against
// MariaDB: every transition with the right role, the wrong role and in the wrong state.

let t: TestApp;
let team: Awaited<ReturnType<typeof createProjectTeam>>;
let author: ApiClient;
let checker: ApiClient;
let principal: ApiClient;
let viewer: ApiClient;
let outsider: ApiClient;
let authorChecker: { id: number; client: ApiClient };

interface Block {
  id: string;
  kind: string;
  source: string;
}

// A one-storey oscillator: f = √(k/m) / 2π. Closed form, computed here rather than pasted.
const K_N_PER_M = 24e6; // 24 kN/mm
const M_KG = 18e3; // 18 t
const F_HZ = Math.sqrt(K_N_PER_M / M_KG) / (2 * Math.PI);

const baseBlocks: Block[] = [
  { id: 'intro', kind: 'text', source: 'Single storey, fixed base.' },
  { id: 'calc', kind: 'calc', source: 'k = 24 kN/mm\nm = 18 t\nf = sqrt(k/m)/(2 pi)' },
  { id: 'crit', kind: 'criteria', source: 'f >= 3 Hz  # walking comfort (common practice)' },
];

async function putDraft(client: ApiClient, sheetId: number, blocks: Block[]): Promise<void> {
  const current = await client.get(`/api/sheets/${sheetId}`);
  expect(current.status, JSON.stringify(current.body)).toBe(200);
  const res = await client.agent
    .put(`/api/sheets/${sheetId}/draft`)
    .set('X-CSRF-Token', client.csrfToken)
    .set('If-Match', `"${current.body.sheet.draftVersion}"`)
    .send({ blocks, settings: { significantFigures: 4 } });
  expect(res.status, JSON.stringify(res.body)).toBe(200);
}

async function newSheet(client: ApiClient = author, blocks: Block[] = baseBlocks): Promise<number> {
  const res = await client.post(`/api/projects/${team.project.id}/sheets`, {
    number: `RV-${unique()}`,
    title: 'Storey frequency',
  });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  await putDraft(client, res.body.sheet.id, blocks);
  return res.body.sheet.id;
}

async function issue(client: ApiClient, sheetId: number, purpose = 'For check') {
  return client.post(`/api/sheets/${sheetId}/revisions`, { purpose });
}

async function issued(client: ApiClient, sheetId: number): Promise<number> {
  const res = await issue(client, sheetId);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.revision.id;
}

beforeAll(async () => {
  ({
    t,
    team,
    clients: { author, checker, principal, viewer, outsider },
  } = await createTeamApp(['author', 'checker', 'principal', 'viewer', 'outsider']));
  const both = await createUser(t.db);
  await addMember(t.db, team.project.id, both.id, ['author', 'checker']);
  authorChecker = { id: both.id, client: await signedIn(t.app, both) };
});

afterAll(async () => {
  await t?.close();
});

describe('POST /api/sheets/:sheetId/revisions', () => {
  it('freezes the draft as Rev 1 with its canonical text, results and both digests', async () => {
    const sheetId = await newSheet();
    const res = await issue(author, sheetId, 'For check — first issue');
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.revision).toMatchObject({
      sheetId,
      number: 1,
      status: 'in_check',
      purpose: 'For check — first issue',
      issuedBy: { id: team.author.id, name: team.author.name },
      checkedBy: null,
      sealedBy: null,
      sealCode: null,
    });

    const row = await t.db('revisions').where({ id: res.body.revision.id }).first();
    expect(JSON.parse(row.blocks)).toEqual(baseBlocks);
    // The canonical text format of core/sheet/README.md: a `#% <kind> <id>` header per block.
    expect(row.canonical_text).toBe(
      '#% text intro\nSingle storey, fixed base.\n#% calc calc\nk = 24 kN/mm\nm = 18 t\n' +
        'f = sqrt(k/m)/(2 pi)\n#% criteria crit\nf >= 3 Hz  # walking comfort (common practice)\n',
    );
    // SHA-256 (FIPS 180-4) recomputed here with node:crypto, independently of the engine's hash.
    const sha = (s: string) => createHash('sha256').update(s, 'utf8').digest('hex');
    expect(row.canonical_text_digest).toBe(sha(row.canonical_text));
    expect(row.results_digest).toBe(sha(row.results));
    expect(row.engine_version).toMatch(/\S/);

    const detail = await viewer.get(`/api/revisions/${res.body.revision.id}`);
    expect(detail.status).toBe(200);
    expect(detail.body.revision.digests).toEqual({
      canonicalText: row.canonical_text_digest,
      results: row.results_digest,
    });
    expect(detail.body.revision.seal).toBeNull();
    const calc = detail.body.revision.results.blocks.find(
      (b: { blockId: string }) => b.blockId === 'calc',
    );
    const f = calc.lines.find((l: { name: string }) => l.name === 'f');
    // Relative 1e-9 against the closed form √(k/m)/2π, SI values.
    expect(Math.abs(f.value.si - F_HZ) / F_HZ).toBeLessThan(1e-9);
    expect(detail.body.revision.results.summary).toMatchObject({ passed: 1, failed: 0, errors: 0 });

    const sheet = await t.db('sheets').where({ id: sheetId }).first();
    expect(sheet.status).toBe('in_check');
    const activity = await t
      .db('activity')
      .where({ action: 'revision.issued', object_id: res.body.revision.id });
    expect(activity).toHaveLength(1);
    expect(activity[0]).toMatchObject({ actor_id: team.author.id, project_id: team.project.id });
  });

  it('lists the sheet’s revisions for every member', async () => {
    const sheetId = await newSheet();
    const revId = await issued(author, sheetId);
    const res = await viewer.get(`/api/sheets/${sheetId}/revisions`);
    expect(res.status).toBe(200);
    expect(res.body.revisions).toHaveLength(1);
    expect(res.body.revisions[0]).toMatchObject({ id: revId, number: 1, status: 'in_check' });
    expect((await outsider.get(`/api/sheets/${sheetId}/revisions`)).status).toBe(403);
  });

  it('refuses a checker, a viewer and an outsider, and a signed-out caller', async () => {
    const sheetId = await newSheet();
    for (const client of [checker, viewer, principal, outsider]) {
      const res = await issue(client, sheetId);
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe('FORBIDDEN');
    }
    expect((await issue(await anonymous(t.app), sheetId)).status).toBe(401);
    expect(await t.db('revisions').where({ sheet_id: sheetId })).toHaveLength(0);
  });

  it('refuses an empty purpose naming the field', async () => {
    const sheetId = await newSheet();
    const res = await author.post(`/api/sheets/${sheetId}/revisions`, { purpose: '  ' });
    expect(res.status).toBe(422);
    expect(res.body.error.field).toBe('purpose');
  });

  it('refuses a second issue while Rev 1 is in check', async () => {
    const sheetId = await newSheet();
    await issued(author, sheetId);
    const res = await issue(author, sheetId);
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('REVISION_IN_CHECK');
    expect(res.body.error.message).toMatch(/Rev 1 is in check/);
  });

  it('refuses a draft with an error, naming its block and line', async () => {
    const sheetId = await newSheet(author, [
      { id: 'calc', kind: 'calc', source: 'k = 24 kN/mm\nf = sqrt(k/mass)' },
    ]);
    const res = await issue(author, sheetId);
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('SHEET_HAS_ERRORS');
    expect(res.body.error.message).toMatch(/block 1 \(calc\), line 2/);
    expect(await t.db('revisions').where({ sheet_id: sheetId })).toHaveLength(0);
  });
});

describe('POST /api/revisions/:revisionId/return', () => {
  it('returns a revision in check to the author', async () => {
    const sheetId = await newSheet();
    const revId = await issued(author, sheetId);
    const res = await checker.post(`/api/revisions/${revId}/return`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.revision).toMatchObject({
      id: revId,
      status: 'returned',
      returnedBy: { id: team.checker.id },
    });
    expect((await t.db('sheets').where({ id: sheetId }).first()).status).toBe('returned');
    const activity = await t
      .db('activity')
      .where({ action: 'revision.returned', object_id: revId });
    expect(activity).toHaveLength(1);
  });

  it('refuses the author, a viewer and the principal', async () => {
    const revId = await issued(author, await newSheet());
    for (const client of [author, viewer, principal]) {
      const res = await client.post(`/api/revisions/${revId}/return`);
      expect(res.status).toBe(403);
    }
  });

  it('refuses a checker who authored the revision', async () => {
    const revId = await issued(authorChecker.client, await newSheet(authorChecker.client));
    const res = await authorChecker.client.post(`/api/revisions/${revId}/return`);
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('CHECKER_IS_AUTHOR');
    expect((await t.db('revisions').where({ id: revId }).first()).status).toBe('in_check');
  });

  it('refuses a revision that is not in check', async () => {
    const revId = await issued(author, await newSheet());
    expect((await checker.post(`/api/revisions/${revId}/return`)).status).toBe(200);
    const res = await checker.post(`/api/revisions/${revId}/return`);
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('REVISION_NOT_IN_CHECK');
  });

  it('answers 422 naming the address for an id that is not a number', async () => {
    const res = await checker.get('/api/revisions/rev-one');
    expect(res.status).toBe(422);
    expect(res.body.error.field).toBe('revisionId');
  });

  it('answers 404 for a revision that does not exist', async () => {
    const res = await checker.post('/api/revisions/999999999/return');
    expect(res.status).toBe(404);
  });
});

describe('POST /api/revisions/:revisionId/sign-off', () => {
  it('refuses while a remark is open, then signs off once it is closed', async () => {
    const sheetId = await newSheet();
    const revId = await issued(author, sheetId);
    const remark = await checker.post(`/api/revisions/${revId}/remarks`, {
      blockId: 'calc',
      line: 2,
      type: 'query',
      text: 'Is 18 t the full storey mass including finishes?',
    });
    expect(remark.status).toBe(201);

    const refused = await checker.post(`/api/revisions/${revId}/sign-off`);
    expect(refused.status).toBe(409);
    expect(refused.body.error.code).toBe('OPEN_REMARKS');
    expect(refused.body.error.details).toEqual({ notClosed: 1 });

    const closed = await checker.patch(`/api/remarks/${remark.body.remark.id}`, {
      state: 'closed',
    });
    expect(closed.status).toBe(200);
    const res = await checker.post(`/api/revisions/${revId}/sign-off`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.revision).toMatchObject({
      status: 'checked',
      checkedBy: { id: team.checker.id },
    });
    expect((await t.db('sheets').where({ id: sheetId }).first()).status).toBe('checked');

    // Checked but not sealed: the next issue waits for the seal.
    const next = await issue(author, sheetId);
    expect(next.status).toBe(409);
    expect(next.body.error.code).toBe('REVISION_AWAITING_SEAL');
  });

  it('refuses the author and the principal', async () => {
    const revId = await issued(author, await newSheet());
    for (const client of [author, principal, viewer]) {
      expect((await client.post(`/api/revisions/${revId}/sign-off`)).status).toBe(403);
    }
  });

  it('refuses a checker who authored the revision', async () => {
    const revId = await issued(authorChecker.client, await newSheet(authorChecker.client));
    const res = await authorChecker.client.post(`/api/revisions/${revId}/sign-off`);
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('CHECKER_IS_AUTHOR');
  });

  it('refuses a returned revision', async () => {
    const revId = await issued(author, await newSheet());
    await checker.post(`/api/revisions/${revId}/return`);
    const res = await checker.post(`/api/revisions/${revId}/sign-off`);
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('REVISION_NOT_IN_CHECK');
  });
});

describe('remark carry-over on issue of the next revision', () => {
  it('moves a remark below inserted lines to its new line, and flags a remark whose line changed', async () => {
    const sheetId = await newSheet();
    const rev1 = await issued(author, sheetId);
    // On line 3 (f = …) and on line 2 (m = …), which the author will edit.
    const onF = await checker.post(`/api/revisions/${rev1}/remarks`, {
      blockId: 'calc',
      line: 3,
      type: 'error',
      text: 'State which mode this frequency is.',
    });
    const onM = await checker.post(`/api/revisions/${rev1}/remarks`, {
      blockId: 'calc',
      line: 2,
      type: 'query',
      text: 'Does 18 t include the finishes?',
    });
    const closed = await checker.post(`/api/revisions/${rev1}/remarks`, {
      blockId: 'intro',
      line: 1,
      type: 'editorial',
      text: 'Typo.',
    });
    await checker.patch(`/api/remarks/${closed.body.remark.id}`, { state: 'closed' });
    await author.post(`/api/remarks/${onM.body.remark.id}/replies`, {
      text: 'No: 1 t of finishes added in the next revision.',
    });
    expect((await checker.post(`/api/revisions/${rev1}/return`)).status).toBe(200);

    // Two comment lines inserted above, and the mass line edited.
    await putDraft(author, sheetId, [
      baseBlocks[0]!,
      {
        id: 'calc',
        kind: 'calc',
        source:
          '# storey stiffness from the frame analysis, run 14\n# mass includes finishes\n' +
          'k = 24 kN/mm\nm = 19 t\nf = sqrt(k/m)/(2 pi)',
      },
      baseBlocks[2]!,
    ]);
    const rev2 = await issued(author, sheetId);
    const res = await checker.get(`/api/revisions/${rev2}/remarks`);
    expect(res.status).toBe(200);
    const remarks = res.body.remarks as {
      text: string;
      blockId: string;
      line: number;
      state: string;
      lineChanged: boolean;
      carriedFrom: { revisionNumber: number; line: number } | null;
    }[];
    expect(remarks).toHaveLength(2); // the closed one stays behind
    const f = remarks.find((r) => r.text.startsWith('State which mode'));
    expect(f).toMatchObject({
      blockId: 'calc',
      line: 5,
      state: 'open',
      lineChanged: false,
      carriedFrom: { revisionNumber: 1, line: 3 },
    });
    const m = remarks.find((r) => r.text.startsWith('Does 18 t'));
    expect(m).toMatchObject({
      blockId: 'calc',
      line: 4,
      state: 'answered',
      lineChanged: true,
      carriedFrom: { revisionNumber: 1, line: 2 },
    });
    // The old revision keeps its own remarks as they were.
    const old = await checker.get(`/api/revisions/${rev1}/remarks`);
    expect(old.body.remarks).toHaveLength(3);
    expect(onF.status).toBe(201);
  });

  it('brings the thread of the earlier revisions with a carried remark, oldest first', async () => {
    const sheetId = await newSheet();
    const rev1 = await issued(author, sheetId);
    const made = await checker.post(`/api/revisions/${rev1}/remarks`, {
      blockId: 'calc',
      line: 2,
      type: 'query',
      text: 'Does 18 t include the finishes?',
    });
    await author.post(`/api/remarks/${made.body.remark.id}/replies`, { text: 'No; added.' });
    await checker.post(`/api/revisions/${rev1}/return`);
    await putDraft(author, sheetId, baseBlocks);
    const rev2 = await issued(author, sheetId);
    const onRev2 = (await checker.get(`/api/revisions/${rev2}/remarks`)).body.remarks[0];
    await checker.post(`/api/remarks/${onRev2.id}/replies`, { text: 'Where is it added?' });
    await checker.post(`/api/revisions/${rev2}/return`);
    const rev3 = await issued(author, sheetId);

    const [carried] = (await checker.get(`/api/revisions/${rev3}/remarks`)).body.remarks;
    expect(carried.carriedFrom).toMatchObject({ revisionNumber: 2, line: 2 });
    expect(carried.replies).toEqual([]);
    expect(carried.earlier).toMatchObject([
      {
        remarkId: made.body.remark.id,
        revisionNumber: 1,
        line: 2,
        author: { id: team.checker.id, name: team.checker.name },
        createdAt: made.body.remark.createdAt,
        replies: [{ text: 'No; added.', author: { id: team.author.id } }],
      },
      {
        remarkId: onRev2.id,
        revisionNumber: 2,
        replies: [{ text: 'Where is it added?', author: { id: team.checker.id } }],
      },
    ]);
    // A remark made on the revision itself has no earlier thread.
    expect(made.body.remark.earlier).toEqual([]);
  });
});

describe('GET /api/sheets/:sheetId/activity', () => {
  it('shows the sheet’s history, newest first, to members only (a viewer its client-facing part)', async () => {
    const sheetId = await newSheet();
    const revId = await issued(author, sheetId);
    await checker.post(`/api/revisions/${revId}/return`);
    const res = await checker.get(`/api/sheets/${sheetId}/activity`);
    expect(res.status).toBe(200);
    const actions = res.body.activity.map((a: { action: string }) => a.action);
    expect(actions.slice(0, 2)).toEqual(['revision.returned', 'revision.issued']);
    expect(actions).toContain('sheet.created');
    // The return is the firm's working record (test/api/visibility.test.ts).
    const seen = await viewer.get(`/api/sheets/${sheetId}/activity`);
    expect(seen.body.activity.map((a: { action: string }) => a.action).slice(0, 1)).toEqual([
      'revision.issued',
    ]);
    expect((await outsider.get(`/api/sheets/${sheetId}/activity`)).status).toBe(403);
  });
});

describe('a covering note on return and sign-off, and the purpose set at sign-off', () => {
  it('keeps the return note on the revision, in the activity and in the author’s mail', async () => {
    const sheetId = await newSheet();
    const revId = await issued(author, sheetId);
    const note = 'Please state the mass basis before I look at the criteria.';
    const res = await checker.post(`/api/revisions/${revId}/return`, { note });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.revision).toMatchObject({ status: 'returned', checkNote: note });
    expect((await t.db('revisions').where({ id: revId }).first()).check_note).toBe(note);
    const activity = await t
      .db('activity')
      .where({ action: 'revision.returned', object_id: revId })
      .first();
    expect(activity.details).toMatchObject({ note });
    const mail = await t
      .db('outbox')
      .where({ kind: 'revision.returned', related_sheet_id: sheetId })
      .first();
    expect(mail.text).toContain(`The checker's note:\n${note}`);
    // Seen by every member who reads the revision.
    expect((await viewer.get(`/api/revisions/${revId}`)).body.revision.checkNote).toBe(note);
  });

  it('signs off for the purpose the checker sets and names a failed criterion in the mail', async () => {
    // f = 5.8 Hz here (closed form above) fails a 6 Hz criterion: a finding, not a refusal.
    const sheetId = await newSheet(author, [
      ...baseBlocks.slice(0, 2),
      { id: 'crit', kind: 'criteria', source: 'f >= 6 Hz  # clear of the pump speed' },
    ]);
    const revId = await issued(author, sheetId);
    const res = await checker.post(`/api/revisions/${revId}/sign-off`, {
      note: 'Checked against the pump data sheet.',
      purpose: 'For construction',
    });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.revision).toMatchObject({
      status: 'checked',
      purpose: 'For check',
      checkedPurpose: 'For construction',
      checkNote: 'Checked against the pump data sheet.',
    });
    const mail = await t
      .db('outbox')
      .where({ kind: 'revision.signed_off', related_sheet_id: sheetId })
      .first();
    expect(mail.text).toContain('signed off Rev 1 for construction');
    expect(mail.text).toContain('It records 1 failed criterion: clear of the pump speed.');
    // The print's title block reads what the revision was checked for.
    const print = await checker.get(`/api/revisions/${revId}/print`);
    expect(print.status).toBe(200);
    expect(print.body.revision.purpose).toBe('For construction');
  });

  it('signs off without a note or a purpose, leaving the purpose as issued', async () => {
    const revId = await issued(author, await newSheet());
    const res = await checker.post(`/api/revisions/${revId}/sign-off`, {});
    expect(res.status).toBe(200);
    expect(res.body.revision).toMatchObject({ checkedPurpose: null, checkNote: null });
  });

  it('refuses a note that is not text, one too long, and an unknown field, naming it', async () => {
    const revId = await issued(author, await newSheet());
    const notText = await checker.post(`/api/revisions/${revId}/return`, { note: 12 });
    expect(notText.status).toBe(422);
    expect(notText.body.error.field).toBe('note');
    const long = await checker.post(`/api/revisions/${revId}/sign-off`, {
      purpose: 'x'.repeat(501),
    });
    expect(long.status).toBe(422);
    expect(long.body.error.field).toBe('purpose');
    const unknown = await checker.post(`/api/revisions/${revId}/return`, { reason: 'x' });
    expect(unknown.status).toBe(422);
    expect(unknown.body.error.message).toContain('Unknown field: reason.');
    expect((await t.db('revisions').where({ id: revId }).first()).status).toBe('in_check');
    // A viewer with a note is refused as without one.
    expect((await viewer.post(`/api/revisions/${revId}/return`, { note: 'x' })).status).toBe(403);
  });
});
