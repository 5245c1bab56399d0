import { createHash, createPublicKey, verify as verifySignature } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  createSheetWithDraft,
  saveDraft,
  createTeamApp,
  signedIn,
  type ApiClient,
  type TestApp,
} from '../support/api-app';
import { chainMatrixMarket, chainOmega } from '../support/chain-files';
import { addMember, createProjectTeam, createUser, unique } from '../support/factories';
import {
  up as contentTriggerUp,
  down as contentTriggerDown,
} from '../../migrations/20261203000700_revisions_content_immutable';

// Sealing: the refusals each with its reason, the seal record's digest and
// Ed25519 signature checked here with node:crypto, supersession, and the password change that
// re-encrypts the signing key.

let t: TestApp;
let team: Awaited<ReturnType<typeof createProjectTeam>>;
let author: ApiClient;
let checker: ApiClient;
let principal: ApiClient;

const blocks = [
  { id: 'calc', kind: 'calc', source: 'k = 24 kN/mm\nm = 18 t\nf = sqrt(k/m)/(2 pi)' },
  { id: 'crit', kind: 'criteria', source: 'f >= 3 Hz  # walking comfort (common practice)' },
];

async function newSheet(): Promise<number> {
  const sheet = await createSheetWithDraft(
    author,
    team.project.id,
    { number: `SL-${unique()}`, title: 'Storey frequency' },
    blocks,
  );
  return sheet.id;
}

/** Issues the draft and has the checker sign it off; returns the revision id. */
async function signedOff(sheetId: number): Promise<number> {
  const rev = await author.post(`/api/sheets/${sheetId}/revisions`, {
    purpose: 'For construction',
  });
  expect(rev.status, JSON.stringify(rev.body)).toBe(201);
  const off = await checker.post(`/api/revisions/${rev.body.revision.id}/sign-off`);
  expect(off.status, JSON.stringify(off.body)).toBe(200);
  return rev.body.revision.id;
}

/** Canonical JSON written out here (sorted keys, no spaces) to recompute the seal digest. */
function sortedJson(v: unknown): string {
  if (v === null || typeof v !== 'object') return JSON.stringify(v);
  if (Array.isArray(v)) return `[${v.map(sortedJson).join(',')}]`;
  const o = v as Record<string, unknown>;
  return `{${Object.keys(o)
    .sort()
    .map((k) => `${JSON.stringify(k)}:${sortedJson(o[k])}`)
    .join(',')}}`;
}
const sha = (s: string) => createHash('sha256').update(s, 'utf8').digest('hex');

beforeAll(async () => {
  ({
    t,
    team,
    clients: { author, checker, principal },
  } = await createTeamApp(['author', 'checker', 'principal']));
});

afterAll(async () => {
  await t?.close();
});

describe('POST /api/revisions/:revisionId/seal', () => {
  it('seals a signed-off revision with a digest and an Ed25519 signature anyone can check', async () => {
    const sheetId = await newSheet();
    const revId = await signedOff(sheetId);
    const res = await principal.post(`/api/revisions/${revId}/seal`, {
      password: team.principal.password,
    });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.revision).toMatchObject({
      id: revId,
      status: 'sealed',
      sealedBy: { id: team.principal.id },
    });
    const seal = res.body.seal;
    // Crockford base32 (no I, L, O, U), 10 characters grouped 5-5.
    expect(seal.code).toMatch(/^[0-9A-HJKMNP-TV-Z]{5}-[0-9A-HJKMNP-TV-Z]{5}$/);

    const rev = await t.db('revisions').where({ id: revId }).first();
    const row = await t.db('seals').where({ revision_id: revId }).first();
    const principalRow = await t.db('users').where({ id: team.principal.id }).first();
    expect(row.canonical_text_digest).toBe(sha(rev.canonical_text));
    expect(row.results_digest).toBe(sha(rev.results));
    const sheetRow = await t.db('sheets').where({ id: sheetId }).first();
    const projectRow = await t.db('projects').where({ id: sheetRow.project_id }).first();
    // Version 2 of the payload: the names verify shows are signed too.
    expect(row.payload_version).toBe(2);
    const payload = {
      format: 'modewright-seal-v2',
      projectName: projectRow.name,
      projectJobNumber: projectRow.job_number,
      sheetNumber: sheetRow.number,
      sheetTitle: sheetRow.title,
      principalName: principalRow.name,
      jurisdiction: principalRow.jurisdiction,
      canonicalTextDigest: sha(rev.canonical_text),
      resultsDigest: sha(rev.results),
      engineVersion: rev.engine_version,
      revisionId: revId,
      revisionNumber: 1,
      sheetId,
      principalId: team.principal.id,
      licenceNumber: principalRow.licence_number,
      sealedAt: new Date(row.sealed_at).toISOString(),
    };
    expect(row.digest).toBe(sha(sortedJson(payload)));
    // Ed25519 (RFC 8032) over the 32 digest bytes, with the public key stored beside it.
    const ok = verifySignature(
      null,
      Buffer.from(row.digest, 'hex'),
      createPublicKey(row.public_key),
      Buffer.from(row.signature, 'base64'),
    );
    expect(ok).toBe(true);
    const key = await t.db('signing_keys').where({ user_id: team.principal.id }).first();
    expect(key.public_key).toBe(row.public_key);
    expect(key.encrypted_private_key).not.toContain('PRIVATE KEY');

    expect((await t.db('sheets').where({ id: sheetId }).first()).status).toBe('sealed');
    const detail = await author.get(`/api/revisions/${revId}`);
    expect(detail.body.revision.seal).toMatchObject({
      code: seal.code,
      digest: row.digest,
      principal: { name: team.principal.name, licenceNumber: principalRow.licence_number },
    });
    expect(
      await t.db('activity').where({ action: 'revision.sealed', object_id: revId }),
    ).toHaveLength(1);
  });

  it('stores the purpose stated at the seal on the revision and in the activity; none keeps the sign-off purpose', async () => {
    const revId = await signedOff(await newSheet());
    const tooLong = await principal.post(`/api/revisions/${revId}/seal`, {
      password: team.principal.password,
      purpose: 'x'.repeat(501),
    });
    expect(tooLong.status).toBe(422);
    expect(tooLong.body.error).toMatchObject({ code: 'VALIDATION', field: 'purpose' });
    const res = await principal.post(`/api/revisions/${revId}/seal`, {
      password: team.principal.password,
      purpose: '  For construction, phase 2  ',
    });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.revision).toMatchObject({
      status: 'sealed',
      purpose: 'For construction',
      checkedPurpose: null,
      sealedPurpose: 'For construction, phase 2',
    });
    const row = await t.db('revisions').where({ id: revId }).first();
    expect(row.sealed_purpose).toBe('For construction, phase 2');
    const entry = await t
      .db('activity')
      .where({ action: 'revision.sealed', object_id: revId })
      .first();
    expect(entry.details).toMatchObject({ purpose: 'For construction, phase 2' });
    // The print's title block states the purpose the revision was sealed for.
    const print = await author.get(`/api/revisions/${revId}/print`);
    expect(print.body.revision.purpose).toBe('For construction, phase 2');

    // Without a purpose the seal leaves it as signed off, and the activity has none.
    const other = await signedOff(await newSheet());
    const plain = await principal.post(`/api/revisions/${other}/seal`, {
      password: team.principal.password,
      purpose: '',
    });
    expect(plain.status, JSON.stringify(plain.body)).toBe(200);
    expect(plain.body.revision.sealedPurpose).toBeNull();
    const plainEntry = await t
      .db('activity')
      .where({ action: 'revision.sealed', object_id: other })
      .first();
    expect(plainEntry.details).not.toHaveProperty('purpose');
  });

  it('refuses the author and the checker', async () => {
    const revId = await signedOff(await newSheet());
    for (const client of [author, checker]) {
      const res = await client.post(`/api/revisions/${revId}/seal`, { password: 'whatever-it-is' });
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe('FORBIDDEN');
    }
  });

  it('refuses a revision that is not signed off', async () => {
    const sheetId = await newSheet();
    const rev = await author.post(`/api/sheets/${sheetId}/revisions`, { purpose: 'For check' });
    const res = await principal.post(`/api/revisions/${rev.body.revision.id}/seal`, {
      password: team.principal.password,
    });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('NOT_SIGNED_OFF');
    expect(await t.db('seals').where({ revision_id: rev.body.revision.id })).toHaveLength(0);
  });

  it('refuses a wrong password', async () => {
    const revId = await signedOff(await newSheet());
    const res = await principal.post(`/api/revisions/${revId}/seal`, {
      password: 'not-the-password',
    });
    expect(res.status).toBe(403);
    expect(res.body.error).toMatchObject({ code: 'WRONG_PASSWORD', field: 'password' });
    expect(await t.db('seals').where({ revision_id: revId })).toHaveLength(0);
    expect((await t.db('revisions').where({ id: revId }).first()).status).toBe('checked');
  });

  it('refuses a principal without a licence number', async () => {
    const unlicensed = await createUser(t.db, { jurisdiction: 'Test Authority' });
    await addMember(t.db, team.project.id, unlicensed.id, ['principal']);
    const client = await signedIn(t.app, unlicensed);
    const revId = await signedOff(await newSheet());
    const res = await client.post(`/api/revisions/${revId}/seal`, {
      password: unlicensed.password,
    });
    expect(res.status).toBe(422);
    expect(res.body.error).toMatchObject({ code: 'NO_LICENCE', field: 'licenceNumber' });
  });

  it('refuses a revision evaluated by an earlier engine, and says the upgrade is the cause and what to do', async () => {
    const revId = await signedOff(await newSheet());
    const row = await t.db('revisions').where({ id: revId }).first();
    const results = JSON.parse(row.results);
    const current = results.engineVersion as string;
    results.engineVersion = 'modewright-sheet 0.0.1 (mathjs 15.2.0)';
    await contentTriggerDown(t.db);
    try {
      await t
        .db('revisions')
        .where({ id: revId })
        .update({ results: JSON.stringify(results), engine_version: results.engineVersion });
    } finally {
      await contentTriggerUp(t.db);
    }
    const res = await principal.post(`/api/revisions/${revId}/seal`, {
      password: team.principal.password,
    });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('RESULTS_DO_NOT_REPRODUCE');
    expect(res.body.error.details).toMatchObject({
      storedEngineVersion: 'modewright-sheet 0.0.1 (mathjs 15.2.0)',
      freshEngineVersion: current,
    });
    expect(res.body.error.message).toMatch(
      new RegExp(
        `^Rev \\d+ was evaluated with modewright-sheet 0\\.0\\.1 \\(mathjs 15\\.2\\.0\\); this server runs `,
      ),
    );
    expect(res.body.error.message).toContain(
      'issue a new revision (it is evaluated with the current engine)',
    );
    expect(await t.db('seals').where({ revision_id: revId })).toHaveLength(0);
  });

  it('refuses when the stored results no longer reproduce, naming the value that moved', async () => {
    const revId = await signedOff(await newSheet());
    const row = await t.db('revisions').where({ id: revId }).first();
    const results = JSON.parse(row.results);
    const calc = results.blocks.find((b: { blockId: string }) => b.blockId === 'calc');
    const f = calc.lines.find((l: { name: string }) => l.name === 'f');
    const storedSi = f.value.si as number;
    f.value.si = storedSi * (1 + 1e-6); // far outside relative 1e-9
    // The content trigger forbids this, as it should; drop it for the tampering and put it back.
    await contentTriggerDown(t.db);
    try {
      await t
        .db('revisions')
        .where({ id: revId })
        .update({ results: JSON.stringify(results) });
    } finally {
      await contentTriggerUp(t.db);
    }
    const res = await principal.post(`/api/revisions/${revId}/seal`, {
      password: team.principal.password,
    });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('RESULTS_DO_NOT_REPRODUCE');
    expect(res.body.error.details.tolerance).toBe(1e-9);
    const moved = res.body.error.details.moved as {
      blockId: string;
      line: number;
      path: string;
      fresh: number;
    }[];
    expect(moved).toHaveLength(1);
    expect(moved[0]).toMatchObject({ blockId: 'calc', line: 3 });
    expect(moved[0]!.path).toMatch(/value\.si$/);
    expect(moved[0]!.fresh).toBe(storedSi);
    expect(res.body.error.message).toMatch(/block calc, line 3/);
    expect(await t.db('seals').where({ revision_id: revId })).toHaveLength(0);
  });

  it('supersedes the earlier sealed revision when a later one is sealed', async () => {
    const sheetId = await newSheet();
    const rev1 = await signedOff(sheetId);
    const s1 = await principal.post(`/api/revisions/${rev1}/seal`, {
      password: team.principal.password,
    });
    expect(s1.status).toBe(200);
    await saveDraft(author, sheetId, [
      blocks[0]!,
      { ...blocks[1]!, source: 'f >= 5 Hz  # EN 1990 A2 vertical (from memory)' },
    ]);
    const rev2 = await signedOff(sheetId);
    const s2 = await principal.post(`/api/revisions/${rev2}/seal`, {
      password: team.principal.password,
    });
    expect(s2.status, JSON.stringify(s2.body)).toBe(200);
    const rows = await t.db('revisions').where({ sheet_id: sheetId }).orderBy('number');
    expect(rows.map((r: { status: string }) => r.status)).toEqual(['superseded', 'sealed']);
    expect(rows[0].superseded_at).not.toBeNull();
    expect(await t.db('seals').whereIn('revision_id', [rev1, rev2])).toHaveLength(2);
  });
});

describe('sealing a sheet built on a large uploaded model', () => {
  it('reproduces the sparse solve on the server and seals it', async () => {
    // A 1 000-DOF fixed–free chain as Matrix Market (k = 1e6 N/m, m = 1e3 kg): kept sparse.
    const n = 1000;
    const files = chainMatrixMarket(n, 1e6, 1e3);
    const sheet = await createSheetWithDraft(
      author,
      team.project.id,
      { number: `SL-${unique()}`, title: 'Exported chain' },
      [
        { id: 'k', kind: 'matrix', source: 'name: K\nunit: N/m\nfrom: chain-k.mtx' },
        { id: 'm', kind: 'matrix', source: 'name: M\nunit: kg\nfrom: chain-m.mtx' },
        { id: 's', kind: 'modes', source: 'name: chain\nstiffness: K\nmass: M\ncount: 3' },
      ],
    );
    for (const [name, text] of [
      ['chain-k.mtx', files.K],
      ['chain-m.mtx', files.M],
    ] as const) {
      const res = await author.agent
        .post(`/api/sheets/${sheet.id}/uploads`)
        .set('X-CSRF-Token', author.csrfToken)
        .attach('file', Buffer.from(text), name);
      expect(res.status, JSON.stringify(res.body)).toBe(201);
    }
    const revId = await signedOff(sheet.id);
    const rev = await principal.get(`/api/revisions/${revId}`);
    const results = rev.body.revision.results;
    expect(results.errors).toEqual([]);
    expect(results.blocks[0]).toMatchObject({ storage: 'sparse', rows: n, nonzeros: 3 * n - 2 });
    // ω₁ = 2 √(k/m) sin(π / (2 (2n + 1))) (REFERENCES.md item 2, the chain's closed form).
    const w1 = chainOmega(n, 1e6, 1e3, 1);
    expect(Math.abs(results.blocks[2].modes[0].omega - w1) / w1).toBeLessThan(1e-8);
    const sealed = await principal.post(`/api/revisions/${revId}/seal`, {
      password: team.principal.password,
    });
    expect(sealed.status, JSON.stringify(sealed.body)).toBe(200);
  });
});

describe('POST /api/auth/password', () => {
  it('re-encrypts the signing key so the same key seals under the new password', async () => {
    const p = await createUser(t.db, {
      licenceNumber: `SE-${unique()}`,
      jurisdiction: 'Test Authority',
    });
    await addMember(t.db, team.project.id, p.id, ['principal']);
    const client = await signedIn(t.app, p);
    const rev1 = await signedOff(await newSheet());
    expect(
      (await client.post(`/api/revisions/${rev1}/seal`, { password: p.password })).status,
    ).toBe(200);
    const before = await t.db('signing_keys').where({ user_id: p.id }).first();

    const wrong = await client.post('/api/auth/password', {
      currentPassword: 'not-my-password',
      newPassword: 'a-new-password-of-mine',
    });
    expect(wrong.status).toBe(403);
    expect(wrong.body.error.field).toBe('currentPassword');
    const short = await client.post('/api/auth/password', {
      currentPassword: p.password,
      newPassword: 'short',
    });
    expect(short.status).toBe(422);
    expect(short.body.error.field).toBe('newPassword');

    const res = await client.post('/api/auth/password', {
      currentPassword: p.password,
      newPassword: 'a-new-password-of-mine',
    });
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ signingKeyReencrypted: true, otherSessionsEnded: 0 });
    const after = await t.db('signing_keys').where({ user_id: p.id }).first();
    expect(after.public_key).toBe(before.public_key);
    expect(after.encrypted_private_key).not.toBe(before.encrypted_private_key);
    expect(after.salt).not.toBe(before.salt);

    const rev2 = await signedOff(await newSheet());
    const old = await client.post(`/api/revisions/${rev2}/seal`, { password: p.password });
    expect(old.body.error.code).toBe('WRONG_PASSWORD');
    const sealed = await client.post(`/api/revisions/${rev2}/seal`, {
      password: 'a-new-password-of-mine',
    });
    expect(sealed.status, JSON.stringify(sealed.body)).toBe(200);
    const seals = await t.db('seals').whereIn('revision_id', [rev1, rev2]);
    expect(new Set(seals.map((s: { public_key: string }) => s.public_key)).size).toBe(1);
    const activity = await t
      .db('activity')
      .where({ action: 'account.password_changed', actor_id: p.id });
    expect(activity).toHaveLength(1);
  });
});

describe('a password set from a reset link', () => {
  it('retires the signing key it cannot unlock: the earlier seal still verifies and the next seal makes a new key', async () => {
    const first = await signedOff(await newSheet());
    const sealed = await principal.post(`/api/revisions/${first}/seal`, {
      password: team.principal.password,
    });
    expect(sealed.status, JSON.stringify(sealed.body)).toBe(200);
    const oldKey = await t.db('signing_keys').where({ user_id: team.principal.id }).first();

    // An admin sends the principal a reset link; the principal sets a new password from it.
    const admin = await signedIn(t.app, await createUser(t.db, { isAdmin: true }));
    await admin.post(`/api/users/${team.principal.id}/password-reset`).expect(202);
    const mail = await t
      .db('outbox')
      .where({ kind: 'user.password_reset_sent' })
      .andWhere('to_addresses', 'like', `%${team.principal.email}%`)
      .orderBy('id', 'desc')
      .first();
    const token = /\/reset-password#([A-Za-z0-9_-]{43})/.exec(mail?.text ?? '')?.[1];
    expect(token).toBeDefined();
    const newPassword = 'a-new-password-after-reset-31';
    const anyone = await signedIn(t.app, await createUser(t.db));
    await anyone.post('/api/auth/password-reset', { token, newPassword }).expect(200);

    // The old key is retired, not lost: its public half is kept with the time it stopped.
    expect(await t.db('signing_keys').where({ user_id: team.principal.id })).toHaveLength(0);
    const retired = await t.db('retired_signing_keys').where({ user_id: team.principal.id });
    expect(retired.map((r: { public_key: string }) => r.public_key)).toEqual([oldKey.public_key]);
    const actions = await t
      .db('activity')
      .where({ object_type: 'user', object_id: team.principal.id, action: 'signing_key.retired' });
    expect(actions).toHaveLength(1);

    // The seal made with the old key still verifies.
    const code = sealed.body.seal.code as string;
    expect((await anyone.get(`/api/verify/${code}`)).body.verdict).toBe('genuine');

    // The next seal makes a new key under the new password, and verifies too.
    const again = await signedIn(t.app, { email: team.principal.email, password: newPassword });
    const second = await signedOff(await newSheet());
    const resealed = await again.post(`/api/revisions/${second}/seal`, { password: newPassword });
    expect(resealed.status, JSON.stringify(resealed.body)).toBe(200);
    const newKey = await t.db('signing_keys').where({ user_id: team.principal.id }).first();
    expect(newKey.public_key).not.toBe(oldKey.public_key);
    const code2 = resealed.body.seal.code as string;
    expect((await anyone.get(`/api/verify/${code2}`)).body.verdict).toBe('genuine');
    expect((await anyone.get(`/api/verify/${code}`)).body.verdict).toBe('genuine');
  });
});
