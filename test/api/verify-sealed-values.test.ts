import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sealDigest } from '../../api/modules/seals/seal-digest';
import { sealsRepository } from '../../api/modules/seals/seals.repository';
import { signDigest, unlockSigningKey } from '../../api/modules/seals/signing-keys';
import {
  anonymous,
  createSheetWithDraft,
  createTeamApp,
  type ApiClient,
  type TestApp,
} from '../support/api-app';
import { unique } from '../support/factories';
import { withoutTriggers } from '../support/without-triggers';

// The seal covers everything verify shows: project name and job number, sheet number and title,
// revision, principal's name, licence and jurisdiction, time. Verify shows the sealed values; a
// rename after sealing appears only as "now …", not part of the seal; changing any sealed value
// in the database makes verify say it does not match; a seal of the earlier format still verifies
// with its own payload.

let t: TestApp;
let team: Awaited<ReturnType<typeof createTeamApp>>['team'];
let author: ApiClient;
let checker: ApiClient;
let principal: ApiClient;

async function seal(title: string): Promise<{ sheetId: number; number: string; code: string }> {
  const sheet = await createSheetWithDraft(
    author,
    team.project.id,
    { number: `VS-${unique()}`, title },
    [{ id: 'calc', kind: 'calc', source: 'k = 24 kN/mm\nm = 18 t\nf = sqrt(k/m)/(2 pi)' }],
  );
  const rev = await author.post(`/api/sheets/${sheet.id}/revisions`, { purpose: 'For use' });
  expect(rev.status).toBe(201);
  expect((await checker.post(`/api/revisions/${rev.body.revision.id}/sign-off`)).status).toBe(200);
  const sealed = await principal.post(`/api/revisions/${rev.body.revision.id}/seal`, {
    password: team.principal.password,
  });
  expect(sealed.status, JSON.stringify(sealed.body)).toBe(200);
  return { sheetId: sheet.id, number: sheet.number, code: sealed.body.seal.code };
}

async function verdict(code: string) {
  return (await (await anonymous(t.app)).get(`/api/verify/${code}`)).body;
}

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

describe('GET /api/verify/:code shows what was sealed', () => {
  it('records the names in the seal, and shows a later rename only as now titled, not sealed', async () => {
    const { sheetId, number, code } = await seal('Footbridge deck');
    const row = await t.db('seals').where({ code }).first();
    expect(row).toMatchObject({
      payload_version: 2,
      sheet_number: number,
      sheet_title: 'Footbridge deck',
      project_name: team.project.name,
      project_job_number: team.project.jobNumber,
    });
    await t.db('sheets').where({ id: sheetId }).update({ title: 'Renamed deck' });
    await t.db('projects').where({ id: team.project.id }).update({ name: 'Renamed project' });
    try {
      const v = await verdict(code);
      expect(v.verdict).toBe('genuine');
      expect(v.payloadVersion).toBe(2);
      expect(v.sheet).toEqual({ number, title: 'Footbridge deck' });
      expect(v.project).toEqual({ jobNumber: team.project.jobNumber, name: team.project.name });
      expect(v.now).toEqual({ sheetTitle: 'Renamed deck', projectName: 'Renamed project' });
    } finally {
      await t.db('projects').where({ id: team.project.id }).update({ name: team.project.name });
    }
  });

  const sealedColumns: [string, string | Date][] = [
    ['sheet_title', 'A title never sealed'],
    ['sheet_number', 'XX-99'],
    ['project_name', 'Another project'],
    ['project_job_number', 'J-0000'],
    ['principal_name', 'Someone Else'],
    ['licence_number', 'PE-000000'],
    ['jurisdiction', 'Nowhere'],
    ['sealed_at', new Date('2020-01-01T00:00:00.000Z')],
  ];

  it.each(sealedColumns)(
    'says does-not-match when %s is changed in the database',
    async (column, value) => {
      const { code } = await seal(`Tamper ${column}`);
      expect((await verdict(code)).verdict).toBe('genuine');
      const row = await t.db('seals').where({ code }).first();
      await withoutTriggers(t.db, async () => {
        await t
          .db('seals')
          .where({ id: row.id })
          .update({ [column]: value });
        try {
          const v = await verdict(code);
          expect(v.verdict).toBe('does-not-match');
          expect(v.reasons.join(' ')).toMatch(/seal digest recomputed/);
        } finally {
          await t
            .db('seals')
            .where({ id: row.id })
            .update({ [column]: row[column] });
        }
      });
      expect((await verdict(code)).verdict).toBe('genuine');
    },
  );

  it('still verifies a seal made with the earlier payload, and says its names were not sealed', async () => {
    const { code } = await seal('Made before names were sealed');
    const seal1 = (await sealsRepository.findByCode(t.db, code))!;
    const rev = await t.db('revisions').where({ id: seal1.revisionId }).first();
    // The payload of a version-1 seal, signed with the principal's own key as the server did then.
    const digest = sealDigest({
      canonicalTextDigest: seal1.canonicalTextDigest,
      resultsDigest: seal1.resultsDigest,
      engineVersion: seal1.engineVersion,
      revisionId: seal1.revisionId,
      revisionNumber: rev.number,
      sheetId: rev.sheet_id,
      principalId: seal1.principalId,
      licenceNumber: seal1.licenceNumber,
      sealedAt: seal1.sealedAt,
    });
    const key = (await sealsRepository.findSigningKey(t.db, seal1.principalId))!;
    const signature = signDigest(await unlockSigningKey(key, team.principal.password), digest);
    const asBefore = {
      payload_version: 1,
      digest,
      signature,
      project_name: null,
      project_job_number: null,
      sheet_number: null,
      sheet_title: null,
    };
    await withoutTriggers(t.db, async () => {
      await t.db('seals').where({ id: seal1.id }).update(asBefore);
    });
    const v = await verdict(code);
    expect(v.verdict, JSON.stringify(v.reasons)).toBe('genuine');
    expect(v.payloadVersion).toBe(1);
    expect(v.now).toBeNull();
    expect(v.notes.join(' ')).toMatch(/made before names were sealed/);
    // Its licence is covered as it always was.
    await withoutTriggers(t.db, async () => {
      await t.db('seals').where({ id: seal1.id }).update({ licence_number: 'PE-1' });
      expect((await verdict(code)).verdict).toBe('does-not-match');
      await t.db('seals').where({ id: seal1.id }).update({ licence_number: seal1.licenceNumber });
    });
  });
});
