import { execFileSync } from 'node:child_process';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { anonymous, createTestApp, signedIn, type TestApp } from '../support/api-app';

// The demo scenario as the foundation contract lists it (DESIGN §11, invented names).
const DEMO_PASSWORD = 'modewright-demo';
const demo = {
  ada: 'ada.brennan@brackwater.example',
  ines: 'ines.marlow@brackwater.example',
  tomasz: 'tomasz.reyes@brackwater.example',
  priya: 'priya.anand@brackwater.example',
  lena: 'lena.ostrowski@kestrelquay.example',
};

const root = path.resolve(import.meta.dirname, '..', '..');

function runSeeds(): void {
  execFileSync(
    process.execPath,
    ['--import', 'tsx', 'node_modules/knex/bin/cli.js', '--knexfile', 'knexfile.ts', 'seed:run'],
    { cwd: root, env: { ...process.env, MW_DB_NAME: 'modewright_test' }, stdio: 'pipe' },
  );
}

let t: TestApp;

async function snapshot() {
  const users = await t.db('users').whereIn('email', Object.values(demo)).orderBy('email');
  const projects = await t.db('projects').whereIn('job_number', ['BW-2611', 'BW-2598']);
  const members = await t
    .db('project_members as pm')
    .join('users as u', 'u.id', 'pm.user_id')
    .join('projects as p', 'p.id', 'pm.project_id')
    .whereIn('p.job_number', ['BW-2611', 'BW-2598'])
    .select('p.job_number', 'u.email', 'pm.role')
    .orderBy(['p.job_number', 'u.email', 'pm.role']);
  const activity = await t
    .db('activity')
    .whereIn(
      'project_id',
      projects.map((p: { id: number }) => p.id),
    )
    .count({ n: '*' })
    .first();
  return { users, projects, members, activityCount: Number(activity?.n) };
}

beforeAll(async () => {
  runSeeds();
  t = await createTestApp();
}, 120_000);

afterAll(async () => {
  await t.close();
});

describe('seeds/01_demo_scenario', () => {
  it('holds the demo people, with Priya’s licence and Ada as the only admin', async () => {
    const { users } = await snapshot();
    expect(users).toHaveLength(5);
    const byEmail = new Map(users.map((u: { email: string }) => [u.email, u]));
    expect(byEmail.get(demo.ada)).toMatchObject({ name: 'Ada Brennan', is_admin: 1 });
    expect(byEmail.get(demo.priya)).toMatchObject({
      name: 'Priya Anand',
      is_admin: 0,
      licence_number: 'SE-20417',
      jurisdiction: 'Harbour County Building Authority',
    });
    for (const email of [demo.ines, demo.tomasz, demo.lena]) {
      expect(byEmail.get(email)).toMatchObject({ is_admin: 0, licence_number: null });
    }
  });

  it('holds both projects with exactly the members of the scenario', async () => {
    const { projects, members } = await snapshot();
    expect(projects.map((p: { job_number: string }) => p.job_number).sort()).toEqual([
      'BW-2598',
      'BW-2611',
    ]);
    expect(projects.find((p: { job_number: string }) => p.job_number === 'BW-2611')).toMatchObject({
      name: 'Kestrel Quay Footbridge and Pump House',
      client: 'Kestrel Quay Harbour Trust',
      site: 'East Basin, Kestrel Quay',
    });
    // Browser tests may give demo people extra roles on the same database; the scenario's own
    // memberships must all be there.
    expect(members).toEqual(
      expect.arrayContaining([
        { job_number: 'BW-2598', email: demo.ines, role: 'author' },
        { job_number: 'BW-2598', email: demo.priya, role: 'principal' },
        { job_number: 'BW-2611', email: demo.ines, role: 'author' },
        { job_number: 'BW-2611', email: demo.lena, role: 'viewer' },
        { job_number: 'BW-2611', email: demo.priya, role: 'principal' },
        { job_number: 'BW-2611', email: demo.tomasz, role: 'checker' },
      ]),
    );
  });

  it('is safe to re-run: nothing is duplicated', async () => {
    const before = await snapshot();
    runSeeds();
    const after = await snapshot();
    expect(after.users.map((u: { id: number }) => u.id)).toEqual(
      before.users.map((u: { id: number }) => u.id),
    );
    expect(after.projects).toHaveLength(2);
    expect(after.members).toEqual(before.members);
    expect(after.activityCount).toBe(before.activityCount);
  }, 120_000);

  it('lets each demo person sign in and see their projects', async () => {
    const expected: Record<string, string[]> = {
      [demo.ada]: ['BW-2598', 'BW-2611'],
      [demo.ines]: ['BW-2598', 'BW-2611'],
      [demo.tomasz]: ['BW-2611'],
      [demo.priya]: ['BW-2598', 'BW-2611'],
      [demo.lena]: ['BW-2611'],
    };
    for (const [email, jobs] of Object.entries(expected)) {
      const client = await signedIn(t.app, { email, password: DEMO_PASSWORD });
      const res = await client.get('/api/projects').expect(200);
      const seen = res.body.projects
        .map((p: { jobNumber: string }) => p.jobNumber)
        .filter((j: string) => j === 'BW-2598' || j === 'BW-2611')
        .sort();
      expect(seen, email).toEqual(jobs);
    }
  }, 60_000);
});

describe('seeds/03_demo_review and the demo clock (seeds/support/demo-clock.ts)', () => {
  const DAY = 86_400_000;
  const footbridge = () =>
    t
      .db('revisions as r')
      .join('sheets as s', 's.id', 'r.sheet_id')
      .where('s.number', 'DYN-01')
      .orderBy('r.number')
      .select('r.id', 'r.number', 'r.issued_at', 'r.returned_at', 'r.checked_at', 'r.sealed_at');

  it('tells the footbridge round over days, step after step, all before today', async () => {
    const [rev1, rev2] = await footbridge();
    const steps = [
      rev1.issued_at,
      rev1.returned_at,
      rev2.issued_at,
      rev2.checked_at,
      rev2.sealed_at,
    ];
    const times = steps.map((d: Date) => new Date(d).getTime());
    for (let i = 1; i < times.length; i += 1) expect(times[i]).toBeGreaterThan(times[i - 1]!);
    expect(times.at(-1)! - times[0]!).toBeGreaterThan(3 * DAY);
    const today = new Date();
    today.setUTCHours(0, 0, 0, 0);
    expect(times.at(-1)!).toBeLessThan(today.getTime());
    // The remark was made after Rev 1 was issued and before it was returned; the activity of
    // the project reads in the same order, with the people joining before the first sheet.
    const remark = await t.db('remarks').where({ revision_id: rev1.id }).first('created_at');
    const made = new Date(remark.created_at).getTime();
    expect(made).toBeGreaterThan(times[0]!);
    expect(made).toBeLessThan(times[1]!);
    const sheet = await t.db('sheets').where({ number: 'DYN-01' }).first('created_at');
    expect(new Date(sheet.created_at).getTime()).toBeLessThan(times[0]!);
  });

  it('seals with the time of the seal, which the public verification still finds genuine', async () => {
    const [, rev2] = await footbridge();
    const seal = await t.db('seals').where({ revision_id: rev2.id }).first('code', 'sealed_at');
    const res = await (await anonymous(t.app)).get(`/api/verify/${seal.code}`).expect(200);
    expect(res.body.verdict).toBe('genuine');
    expect(res.body.sealedAt).toBe(new Date(rev2.sealed_at).toISOString());
    expect(new Date(seal.sealed_at).toISOString()).toBe(res.body.sealedAt);
  });
});
