// Rows for tests, each with unique values so test files never trip over each other's data or
// over the demo scenario. Tests make their own rows; they never rely on the seeds.
import { randomBytes } from 'node:crypto';
import type { Knex } from 'knex';
import argon2 from 'argon2';
import { hashPassword } from '../../api/modules/auth/passwords';

export const TEST_PASSWORD = 'factory-password-91';

let counter = 0;
/** A short token unique within and across test runs. */
export function unique(): string {
  counter += 1;
  return `${Date.now().toString(36)}${counter.toString(36)}${randomBytes(3).toString('hex')}`;
}

// argon2id at the server's cost takes most of a second here, and a check costs what the hash was
// made with. Factory people share one argon2id hash made at a low cost so that tests sign in
// quickly; the server's own hashing (POST /api/users, the seeds) keeps the library defaults.
let sharedHash: Promise<string> | undefined;
function testPasswordHash(): Promise<string> {
  sharedHash ??= argon2.hash(TEST_PASSWORD, {
    type: argon2.argon2id,
    memoryCost: 4096,
    timeCost: 1,
    parallelism: 1,
  });
  return sharedHash;
}

export interface TestUser {
  id: number;
  email: string;
  name: string;
  isAdmin: boolean;
  password: string;
}

export async function createUser(
  db: Knex,
  overrides: Partial<{
    email: string;
    name: string;
    isAdmin: boolean;
    password: string;
    licenceNumber: string | null;
    jurisdiction: string | null;
  }> = {},
): Promise<TestUser> {
  const tag = unique();
  const email = overrides.email ?? `person-${tag}@factory.example`;
  const name = overrides.name ?? `Test Person ${tag}`;
  const password = overrides.password ?? TEST_PASSWORD;
  const passwordHash =
    password === TEST_PASSWORD ? await testPasswordHash() : await hashPassword(password);
  const [id] = await db('users').insert({
    email,
    name,
    password_hash: passwordHash,
    is_admin: overrides.isAdmin ?? false,
    licence_number: overrides.licenceNumber ?? null,
    jurisdiction: overrides.jurisdiction ?? null,
  });
  if (id === undefined) throw new Error('factory: users insert returned no id');
  return { id, email, name, isAdmin: overrides.isAdmin ?? false, password };
}

export interface TestProject {
  id: number;
  jobNumber: string;
  name: string;
  client: string;
  site: string;
}

export async function createProject(
  db: Knex,
  overrides: Partial<Omit<TestProject, 'id'>> = {},
): Promise<TestProject> {
  const tag = unique();
  const fields = {
    jobNumber: overrides.jobNumber ?? `T-${tag}`,
    name: overrides.name ?? `Test project ${tag}`,
    client: overrides.client ?? `Test client ${tag}`,
    site: overrides.site ?? `Test site ${tag}`,
  };
  const [id] = await db('projects').insert({
    job_number: fields.jobNumber,
    name: fields.name,
    client: fields.client,
    site: fields.site,
  });
  if (id === undefined) throw new Error('factory: projects insert returned no id');
  return { id, ...fields };
}

export type TestRole = 'author' | 'checker' | 'principal' | 'viewer';

export async function addMember(
  db: Knex,
  projectId: number,
  userId: number,
  roles: TestRole[],
): Promise<void> {
  await db('project_members').insert(
    roles.map((role) => ({ project_id: projectId, user_id: userId, role })),
  );
}

/** A project with one person in each role and an admin outside it. */
export async function createProjectTeam(db: Knex) {
  const project = await createProject(db);
  const [admin, author, checker, principal, viewer, outsider] = await Promise.all([
    createUser(db, { isAdmin: true }),
    createUser(db),
    createUser(db),
    createUser(db, { licenceNumber: `SE-${unique()}`, jurisdiction: 'Test Authority' }),
    createUser(db),
    createUser(db),
  ]);
  await addMember(db, project.id, author.id, ['author']);
  await addMember(db, project.id, checker.id, ['checker']);
  await addMember(db, project.id, principal.id, ['principal']);
  await addMember(db, project.id, viewer.id, ['viewer']);
  return { project, admin, author, checker, principal, viewer, outsider };
}

/** A JSON column as stored: MariaDB keeps JSON as LONGTEXT, the driver may or may not parse it. */
export function jsonColumn(value: unknown): unknown {
  return typeof value === 'string' ? JSON.parse(value) : value;
}
