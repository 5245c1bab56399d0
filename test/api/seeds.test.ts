import { execFileSync } from 'node:child_process';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, signedIn, type TestApp } from '../support/api-app';

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
