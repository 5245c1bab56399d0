import type { Knex } from 'knex';
import { hashPassword } from '../api/modules/auth/passwords';
import { withDemoClock, type SetDemoClock } from './support/demo-clock';

// The demo scenario (DESIGN §11): an invented firm, Brackwater Structural Ltd, its people and two
// projects. Safe to re-run: people are matched by e-mail, projects by job number, memberships by
// (project, person, role); nothing already there is duplicated and passwords already set stay.
export const DEMO_PASSWORD = 'modewright-demo';

interface DemoPerson {
  email: string;
  name: string;
  isAdmin: boolean;
  licenceNumber: string | null;
  jurisdiction: string | null;
}

const people: DemoPerson[] = [
  {
    email: 'ada.brennan@brackwater.example',
    name: 'Ada Brennan',
    isAdmin: true,
    licenceNumber: null,
    jurisdiction: null,
  },
  {
    email: 'ines.marlow@brackwater.example',
    name: 'Ines Marlow',
    isAdmin: false,
    licenceNumber: null,
    jurisdiction: null,
  },
  {
    email: 'tomasz.reyes@brackwater.example',
    name: 'Tomasz Reyes',
    isAdmin: false,
    licenceNumber: null,
    jurisdiction: null,
  },
  {
    email: 'priya.anand@brackwater.example',
    name: 'Priya Anand',
    isAdmin: false,
    licenceNumber: 'SE-20417',
    jurisdiction: 'Harbour County Building Authority',
  },
  {
    email: 'lena.ostrowski@kestrelquay.example',
    name: 'Lena Ostrowski',
    isAdmin: false,
    licenceNumber: null,
    jurisdiction: null,
  },
];

const projects = [
  {
    jobNumber: 'BW-2611',
    name: 'Kestrel Quay Footbridge and Pump House',
    client: 'Kestrel Quay Harbour Trust',
    site: 'East Basin, Kestrel Quay',
    members: [
      ['ines.marlow@brackwater.example', 'author'],
      ['tomasz.reyes@brackwater.example', 'checker'],
      ['priya.anand@brackwater.example', 'principal'],
      ['lena.ostrowski@kestrelquay.example', 'viewer'],
    ],
  },
  {
    jobNumber: 'BW-2598',
    name: 'Linden Row Offices — Floor Vibration',
    client: 'Linden Row Estates',
    site: '14 Linden Row',
    members: [
      ['ines.marlow@brackwater.example', 'author'],
      ['priya.anand@brackwater.example', 'principal'],
    ],
  },
] as const;

export async function seed(knex: Knex): Promise<void> {
  await withDemoClock(knex, (db, at) => scenario(db, at));
}

// The people join four weeks before today, the projects start a week later (seeds/support).
async function scenario(knex: Knex, at: SetDemoClock): Promise<void> {
  await at(28, '08:30');
  const ids = new Map<string, number>();
  for (const person of people) {
    const existing: { id: number } | undefined = await knex('users')
      .select('id')
      .where({ email: person.email })
      .first();
    const fields = {
      name: person.name,
      is_admin: person.isAdmin,
      licence_number: person.licenceNumber,
      jurisdiction: person.jurisdiction,
    };
    if (existing) {
      await knex('users').where({ id: existing.id }).update(fields);
      ids.set(person.email, existing.id);
    } else {
      const [id] = await knex('users').insert({
        ...fields,
        email: person.email,
        password_hash: await hashPassword(DEMO_PASSWORD),
      });
      if (id === undefined) throw new Error(`could not insert ${person.email}`);
      ids.set(person.email, id);
    }
  }
  const adminId = ids.get('ada.brennan@brackwater.example') ?? null;

  await at(21, '09:10');
  for (const project of projects) {
    await knex.transaction(async (trx) => {
      const fields = { name: project.name, client: project.client, site: project.site };
      const existing: { id: number } | undefined = await trx('projects')
        .select('id')
        .where({ job_number: project.jobNumber })
        .first();
      let projectId: number;
      if (existing) {
        projectId = existing.id;
        await trx('projects').where({ id: projectId }).update(fields);
      } else {
        const [id] = await trx('projects').insert({ ...fields, job_number: project.jobNumber });
        if (id === undefined) throw new Error(`could not insert project ${project.jobNumber}`);
        projectId = id;
        await trx('activity').insert({
          actor_id: adminId,
          project_id: projectId,
          action: 'project.created',
          object_type: 'project',
          object_id: projectId,
          details: JSON.stringify({ jobNumber: project.jobNumber, ...fields, seeded: true }),
        });
      }
      for (const [email, role] of project.members) {
        const userId = ids.get(email);
        if (userId === undefined) throw new Error(`demo member ${email} is not among the people`);
        const inserted = await trx('project_members')
          .insert({ project_id: projectId, user_id: userId, role })
          .onConflict(['project_id', 'user_id', 'role'])
          .ignore();
        // MariaDB reports 0 affected rows for an ignored duplicate; knex hands back insertId 0.
        if (inserted[0]) {
          await trx('activity').insert({
            actor_id: adminId,
            project_id: projectId,
            action: 'member.added',
            object_type: 'user',
            object_id: userId,
            details: JSON.stringify({ email, roles: [role], seeded: true }),
          });
        }
      }
    });
  }
}
