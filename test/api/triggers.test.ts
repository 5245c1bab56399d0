import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  createSheetWithDraft,
  createTeamApp,
  type ApiClient,
  type TestApp,
} from '../support/api-app';
import { createProjectTeam, unique } from '../support/factories';
import { withoutTriggers as withoutTriggersIn } from '../support/without-triggers';

// The database refuses to change what was sealed, whatever the API does, and
// verify notices a changed byte when the triggers are gone.

let t: TestApp;
let team: Awaited<ReturnType<typeof createProjectTeam>>;
let author: ApiClient;
let checker: ApiClient;
let principal: ApiClient;

let revId: number;
let code: string;

async function sealedRevision(): Promise<{ sheetId: number; revId: number; code: string }> {
  const { id } = await createSheetWithDraft(
    author,
    team.project.id,
    { number: `TG-${unique()}`, title: 'Trigger check' },
    [{ id: 'calc', kind: 'calc', source: 'k = 24 kN/mm\nm = 18 t\nf = sqrt(k/m)/(2 pi)' }],
  );
  const rev = await author.post(`/api/sheets/${id}/revisions`, { purpose: 'For construction' });
  expect(rev.status).toBe(201);
  expect((await checker.post(`/api/revisions/${rev.body.revision.id}/sign-off`)).status).toBe(200);
  const sealed = await principal.post(`/api/revisions/${rev.body.revision.id}/seal`, {
    password: team.principal.password,
  });
  expect(sealed.status, JSON.stringify(sealed.body)).toBe(200);
  return { sheetId: id, revId: rev.body.revision.id, code: sealed.body.seal.code };
}

/** Runs fn with every protecting trigger dropped, then puts them all back, whatever happens. */
function withoutTriggers(fn: () => Promise<void>): Promise<void> {
  return withoutTriggersIn(t.db, fn);
}

/** The MariaDB refusal raised by SIGNAL SQLSTATE '45000' (ER_SIGNAL_EXCEPTION, errno 1644). */
async function refusal(p: PromiseLike<unknown>): Promise<{ errno: number; message: string }> {
  try {
    await p;
  } catch (e) {
    return e as { errno: number; message: string };
  }
  throw new Error('the statement was not refused');
}

beforeAll(async () => {
  ({
    t,
    team,
    clients: { author, checker, principal },
  } = await createTeamApp(['author', 'checker', 'principal']));
  ({ revId, code } = await sealedRevision());
});

afterAll(async () => {
  await t?.close();
});

describe('triggers on revisions and seals', () => {
  it('refuses an UPDATE of a sealed revision’s content', async () => {
    const e = await refusal(
      t.db('revisions').where({ id: revId }).update({ canonical_text: 'k = 1 kN/mm\n' }),
    );
    expect(e.errno).toBe(1644);
    // Both the content trigger and the sealed-revision trigger refuse this; either may fire first.
    expect(e.message).toMatch(/cannot be changed/);
  });

  it('refuses any change of a sealed revision’s review columns, and a step back from sealed', async () => {
    const e1 = await refusal(
      t
        .db('revisions')
        .where({ id: revId })
        .update({ sealed_at: new Date(0) }),
    );
    expect(e1.message).toMatch(/A sealed revision cannot be changed/);
    const e2 = await refusal(t.db('revisions').where({ id: revId }).update({ status: 'checked' }));
    expect(e2.errno).toBe(1644);
  });

  it('holds the covering note and the purposes set at sign-off and seal, to the byte', async () => {
    // Written by the review's later steps, not at issue: the note, 'For construction' set by the
    // checker, and what the principal sealed it for. A change of case alone is refused too.
    for (const change of [
      { check_note: 'Checked against the frame sheet.' },
      { checked_purpose: 'For tender' },
      { sealed_purpose: 'FOR CONSTRUCTION' },
    ]) {
      const e = await refusal(t.db('revisions').where({ id: revId }).update(change));
      expect(e.message, JSON.stringify(change)).toMatch(/A sealed revision cannot be changed/);
    }
  });

  it('refuses a DELETE of a sealed revision', async () => {
    const e = await refusal(t.db('revisions').where({ id: revId }).delete());
    expect(e.message).toMatch(/A sealed revision cannot be deleted/);
  });

  it('refuses an UPDATE and a DELETE of a seal', async () => {
    const e1 = await refusal(
      t.db('seals').where({ revision_id: revId }).update({ code: 'AAAAA-AAAAA' }),
    );
    expect(e1.message).toMatch(/A seal cannot be changed/);
    const e2 = await refusal(t.db('seals').where({ revision_id: revId }).delete());
    expect(e2.message).toMatch(/A seal cannot be deleted/);
  });

  it('compares bytes: a change of case only is refused too', async () => {
    const row = await t.db('revisions').where({ id: revId }).first();
    // utf8mb4_unicode_ci would call these equal; the trigger compares bytes.
    const e = await refusal(
      t.db('revisions').where({ id: revId }).update({ purpose: row.purpose.toUpperCase() }),
    );
    expect(e.errno).toBe(1644);
  });

  it('refuses a change of content on a revision that is only in check', async () => {
    const sheet = await createSheetWithDraft(
      author,
      team.project.id,
      { number: `TG-${unique()}`, title: 'In check' },
      [{ id: 'calc', kind: 'calc', source: 'k = 2 kN/mm' }],
    );
    const rev = await author.post(`/api/sheets/${sheet.id}/revisions`, {
      purpose: 'For check',
    });
    expect(rev.status).toBe(201);
    const id = rev.body.revision.id as number;
    const e = await refusal(t.db('revisions').where({ id }).update({ results: '{}' }));
    expect(e.message).toMatch(/content .* cannot be changed/);
    // The review columns still move while it is in check.
    await t
      .db('revisions')
      .where({ id })
      .update({ status: 'returned', returned_by: team.checker.id, returned_at: new Date() });
    expect((await t.db('revisions').where({ id }).first()).status).toBe('returned');
  });
});

describe('GET /api/verify/:code after a byte is changed with the triggers dropped', () => {
  it('says genuine, then does-not-match after one byte of the canonical text changes', async () => {
    const anon = (await import('../support/api-app')).anonymous;
    const client = await anon(t.app);
    const before = await client.get(`/api/verify/${code}`);
    expect(before.status).toBe(200);
    expect(before.body.verdict).toBe('genuine');

    const row = await t.db('revisions').where({ id: revId }).first();
    const original: string = row.canonical_text;
    const changed = original.replace('k = 24 kN/mm', 'k = 25 kN/mm');
    expect(changed).not.toBe(original);
    await withoutTriggers(async () => {
      await t.db('revisions').where({ id: revId }).update({ canonical_text: changed });
      try {
        const after = await client.get(`/api/verify/${code}`);
        expect(after.body.verdict).toBe('does-not-match');
        expect(after.body.reasons.join(' ')).toMatch(/canonical text/);
      } finally {
        await t.db('revisions').where({ id: revId }).update({ canonical_text: original });
      }
    });
    const restored = await client.get(`/api/verify/${code}`);
    expect(restored.body.verdict).toBe('genuine');
    // The triggers are back.
    const e = await refusal(
      t.db('revisions').where({ id: revId }).update({ canonical_text: changed }),
    );
    expect(e.errno).toBe(1644);
  });

  it('says does-not-match after one byte of the stored results changes', async () => {
    const anon = (await import('../support/api-app')).anonymous;
    const client = await anon(t.app);
    const row = await t.db('revisions').where({ id: revId }).first();
    const original: string = row.results;
    // One digit of the stored results, whichever comes first.
    const at = original.search(/[1-8]/);
    const changed =
      original.slice(0, at) + String(Number(original[at]) + 1) + original.slice(at + 1);
    await withoutTriggers(async () => {
      await t.db('revisions').where({ id: revId }).update({ results: changed });
      try {
        const after = await client.get(`/api/verify/${code}`);
        expect(after.body.verdict).toBe('does-not-match');
        expect(after.body.reasons.join(' ')).toMatch(/results/);
      } finally {
        await t.db('revisions').where({ id: revId }).update({ results: original });
      }
    });
    expect((await client.get(`/api/verify/${code}`)).body.verdict).toBe('genuine');
  });

  it('says does-not-match when the seal’s signature is altered', async () => {
    const anon = (await import('../support/api-app')).anonymous;
    const client = await anon(t.app);
    const seal = await t.db('seals').where({ revision_id: revId }).first();
    const sig = Buffer.from(seal.signature, 'base64');
    sig[0] = sig[0]! ^ 1;
    await withoutTriggers(async () => {
      await t
        .db('seals')
        .where({ id: seal.id })
        .update({ signature: sig.toString('base64') });
      try {
        const after = await client.get(`/api/verify/${code}`);
        expect(after.body.verdict).toBe('does-not-match');
        expect(after.body.reasons.join(' ')).toMatch(/signature/);
      } finally {
        await t.db('seals').where({ id: seal.id }).update({ signature: seal.signature });
      }
    });
    expect((await client.get(`/api/verify/${code}`)).body.verdict).toBe('genuine');
  });
});
