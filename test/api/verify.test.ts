import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  saveDraft,
  anonymous,
  createTeamApp,
  createTestApp,
  type ApiClient,
  type TestApp,
} from '../support/api-app';
import { createProjectTeam, unique } from '../support/factories';

// The public verify route: no sign-in, the verdict with sheet, project,
// revision, principal, licence and date; codes typed loosely; unknown codes; supersession; the
// rate limit. Tampering is tested in triggers.test.ts.

let t: TestApp;
let team: Awaited<ReturnType<typeof createProjectTeam>>;
let author: ApiClient;
let checker: ApiClient;
let principal: ApiClient;
let sheet: { id: number; number: string };

async function sealNext(source: string): Promise<string> {
  await saveDraft(author, sheet.id, [{ id: 'calc', kind: 'calc', source }]);
  const rev = await author.post(`/api/sheets/${sheet.id}/revisions`, {
    purpose: 'For construction',
  });
  expect(rev.status).toBe(201);
  expect((await checker.post(`/api/revisions/${rev.body.revision.id}/sign-off`)).status).toBe(200);
  const sealed = await principal.post(`/api/revisions/${rev.body.revision.id}/seal`, {
    password: team.principal.password,
  });
  expect(sealed.status).toBe(200);
  return sealed.body.seal.code;
}

beforeAll(async () => {
  ({
    t,
    team,
    clients: { author, checker, principal },
  } = await createTeamApp(['author', 'checker', 'principal']));
  const res = await author.post(`/api/projects/${team.project.id}/sheets`, {
    number: `VF-${unique()}`,
    title: 'Deck frequency',
  });
  sheet = { id: res.body.sheet.id, number: res.body.sheet.number };
});

afterAll(async () => {
  await t?.close();
});

describe('GET /api/verify/:code', () => {
  it('says genuine to someone not signed in, with what was sealed and by whom', async () => {
    const code = await sealNext('k = 24 kN/mm\nm = 18 t\nf = sqrt(k/m)/(2 pi)');
    const client = await anonymous(t.app);
    const res = await client.get(`/api/verify/${code}`);
    expect(res.status).toBe(200);
    const principalRow = await t.db('users').where({ id: team.principal.id }).first();
    const seal = await t.db('seals').where({ code }).first();
    expect(res.body).toMatchObject({
      verdict: 'genuine',
      code,
      sheet: { number: sheet.number, title: 'Deck frequency' },
      project: { jobNumber: team.project.jobNumber, name: team.project.name },
      revision: { number: 1, status: 'sealed' },
      principal: {
        name: team.principal.name,
        licenceNumber: principalRow.licence_number,
        jurisdiction: principalRow.jurisdiction,
      },
      sealedAt: new Date(seal.sealed_at).toISOString(),
      digest: seal.digest,
      reasons: [],
    });
    // Typed loosely: lower case, no hyphen, O for 0 and L for 1 (Crockford's reading rules).
    const loose = code.replace('-', '').toLowerCase().replace(/0/g, 'o').replace(/1/g, 'l');
    expect((await client.get(`/api/verify/${loose}`)).body).toMatchObject({
      verdict: 'genuine',
      code,
    });
  });

  it('still says genuine for a superseded revision, and says it was superseded', async () => {
    const first = await sealNext('k = 24 kN/mm\nm = 19 t\nf = sqrt(k/m)/(2 pi)');
    await sealNext('k = 24 kN/mm\nm = 20 t\nf = sqrt(k/m)/(2 pi)');
    const res = await (await anonymous(t.app)).get(`/api/verify/${first}`);
    expect(res.body.verdict).toBe('genuine');
    expect(res.body.revision.status).toBe('superseded');
    expect(res.body.notes.join(' ')).toMatch(/superseded by a later sealed revision/);
  });

  it('answers unknown-code for a code no seal has, and for text that cannot be a code', async () => {
    const client = await anonymous(t.app);
    const none = await client.get('/api/verify/ZZZZZ-ZZZZZ');
    expect(none.status).toBe(200);
    expect(none.body).toMatchObject({ verdict: 'unknown-code', sheet: null, principal: null });
    expect(none.body.reasons[0]).toMatch(/No seal has the code ZZZZZ-ZZZZZ/);
    const bad = await client.get('/api/verify/not-a-code');
    expect(bad.body.verdict).toBe('unknown-code');
    expect(bad.body.reasons[0]).toMatch(/10 letters and digits/);
  });
});

describe('GET /api/verify/:code rate limit', () => {
  it('answers 429 with Retry-After past the limit per address', async () => {
    process.env.MW_VERIFY_LIMIT = '3';
    const limited = await createTestApp();
    delete process.env.MW_VERIFY_LIMIT;
    try {
      const client = await anonymous(limited.app);
      for (let i = 0; i < 3; i++) {
        expect((await client.get('/api/verify/ZZZZZ-ZZZZZ')).status).toBe(200);
      }
      const res = await client.get('/api/verify/ZZZZZ-ZZZZZ');
      expect(res.status).toBe(429);
      expect(res.body.error.code).toBe('RATE_LIMITED');
      expect(Number(res.headers['retry-after'])).toBeGreaterThan(0);
    } finally {
      await limited.close();
    }
  });
});
