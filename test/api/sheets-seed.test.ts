import { execFileSync } from 'node:child_process';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, signedIn, type ApiClient, type TestApp } from '../support/api-app';

// The demo sheets of DESIGN §11 (seeds/02_demo_sheets.ts): three drafts in project BW-2611 by
// Ines Marlow, each evaluating without errors, safe to seed twice.

const root = path.resolve(import.meta.dirname, '..', '..');
const DEMO_PASSWORD = 'modewright-demo';

function runSeed(file: string): void {
  execFileSync(
    process.execPath,
    [
      '--import',
      'tsx',
      'node_modules/knex/bin/cli.js',
      '--knexfile',
      'knexfile.ts',
      'seed:run',
      `--specific=${file}`,
    ],
    { cwd: root, env: { ...process.env, MW_DB_NAME: 'modewright_test' }, stdio: 'pipe' },
  );
}

let t: TestApp;
let ines: ApiClient;
let lena: ApiClient;

async function demoSheets() {
  return t
    .db('sheets as s')
    .join('projects as p', 'p.id', 's.project_id')
    .join('users as u', 'u.id', 's.created_by')
    .where('p.job_number', 'BW-2611')
    .whereIn('s.number', ['DYN-01', 'DYN-02', 'DYN-03'])
    .orderBy('s.number')
    .select('s.id', 's.number', 's.title', 's.draft_version', 'u.email');
}

beforeAll(async () => {
  runSeed('01_demo_scenario.ts');
  runSeed('02_demo_sheets.ts');
  t = await createTestApp();
  ines = await signedIn(t.app, {
    email: 'ines.marlow@brackwater.example',
    password: DEMO_PASSWORD,
  });
  lena = await signedIn(t.app, {
    email: 'lena.ostrowski@kestrelquay.example',
    password: DEMO_PASSWORD,
  });
}, 120_000);

afterAll(async () => {
  await t?.close();
});

describe('seeds/02_demo_sheets', () => {
  it('makes the footbridge, four-storey frame and pump foundation sheets by Ines Marlow', async () => {
    const sheets = await demoSheets();
    expect(sheets.map((s) => s.number)).toEqual(['DYN-01', 'DYN-02', 'DYN-03']);
    expect(sheets.every((s) => s.email === 'ines.marlow@brackwater.example')).toBe(true);
    expect(sheets[0]!.title).toContain('footbridge');
    expect(sheets[1]!.title).toContain('four-storey frame');
    expect(sheets[2]!.title).toContain('pump foundation');
  });

  it('gives drafts that evaluate without errors, each criterion passed or failed', async () => {
    for (const s of await demoSheets()) {
      const read = await lena.get(`/api/sheets/${s.id}`);
      expect(read.status).toBe(200);
      const draft = read.body.sheet.draft;
      const res = await ines.post(`/api/sheets/${s.id}/evaluate`, draft);
      expect(res.status, s.number).toBe(200);
      expect(res.body.results.errors, s.number).toEqual([]);
      const criteria = (draft.blocks as { kind: string; source: string }[])
        .filter((b) => b.kind === 'criteria')
        .flatMap((b) => b.source.split('\n'))
        .filter((l) => l.trim() !== '');
      const { passed, failed } = res.body.results.summary;
      expect(passed + failed, s.number).toBe(criteria.length);
    }
  });

  it('leaves the sheets as they are when seeded again', async () => {
    const before = await demoSheets();
    runSeed('02_demo_sheets.ts');
    expect(await demoSheets()).toEqual(before);
  });
});
