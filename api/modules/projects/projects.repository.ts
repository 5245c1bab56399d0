import type { DbOrTx } from '../../db/index';
import type { Project } from '../../../core/contract/projects';
import type { ProjectRole } from '../../../core/vocabulary';

export type { Project };

export interface ProjectFields {
  jobNumber: string;
  name: string;
  client: string;
  site: string;
}

interface ProjectRow {
  id: number;
  job_number: string;
  name: string;
  client: string;
  site: string;
  created_at: Date;
  updated_at: Date;
  member_count: number | string;
  my_roles: string | null;
}

const roleOrder: ProjectRole[] = ['author', 'checker', 'principal', 'viewer'];

function toProject(row: ProjectRow): Project {
  const roles = (row.my_roles ? row.my_roles.split(',') : []) as ProjectRole[];
  return {
    id: row.id,
    jobNumber: row.job_number,
    name: row.name,
    client: row.client,
    site: row.site,
    myRoles: roleOrder.filter((r) => roles.includes(r)),
    memberCount: Number(row.member_count),
    createdAt: new Date(row.created_at).toISOString(),
    updatedAt: new Date(row.updated_at).toISOString(),
  };
}

/** Projects with the viewer's roles and the number of distinct members. */
function selectProjects(db: DbOrTx, viewerId: number) {
  return db('projects as p')
    .select(
      'p.id',
      'p.job_number',
      'p.name',
      'p.client',
      'p.site',
      'p.created_at',
      'p.updated_at',
      db('project_members as pm')
        .countDistinct('pm.user_id')
        .where('pm.project_id', db.ref('p.id'))
        .as('member_count'),
      db('project_members as mine')
        .select(db.raw('group_concat(mine.role)'))
        .where('mine.project_id', db.ref('p.id'))
        .andWhere('mine.user_id', viewerId)
        .as('my_roles'),
    )
    .orderBy('p.job_number', 'desc');
}

function toRow(fields: Partial<ProjectFields>): Record<string, string> {
  const row: Record<string, string> = {};
  if (fields.jobNumber !== undefined) row.job_number = fields.jobNumber;
  if (fields.name !== undefined) row.name = fields.name;
  if (fields.client !== undefined) row.client = fields.client;
  if (fields.site !== undefined) row.site = fields.site;
  return row;
}

export const projectsRepository = {
  async listAll(db: DbOrTx, viewerId: number): Promise<Project[]> {
    const rows: ProjectRow[] = await selectProjects(db, viewerId);
    return rows.map(toProject);
  },

  async listForMember(db: DbOrTx, userId: number): Promise<Project[]> {
    const rows: ProjectRow[] = await selectProjects(db, userId).whereExists(
      db('project_members as m')
        .where('m.project_id', db.ref('p.id'))
        .andWhere('m.user_id', userId),
    );
    return rows.map(toProject);
  },

  async findById(db: DbOrTx, id: number, viewerId: number): Promise<Project | undefined> {
    const row: ProjectRow | undefined = await selectProjects(db, viewerId)
      .where('p.id', id)
      .first();
    return row ? toProject(row) : undefined;
  },

  async exists(db: DbOrTx, id: number): Promise<boolean> {
    return Boolean(await db('projects').select('id').where({ id }).first());
  },

  async findIdByJobNumber(db: DbOrTx, jobNumber: string): Promise<number | undefined> {
    const row: { id: number } | undefined = await db('projects')
      .select('id')
      .where({ job_number: jobNumber })
      .first();
    return row?.id;
  },

  async insert(db: DbOrTx, fields: ProjectFields): Promise<number> {
    const [id] = await db('projects').insert(toRow(fields));
    if (id === undefined) throw new Error('projects insert returned no id');
    return id;
  },

  async update(db: DbOrTx, id: number, fields: Partial<ProjectFields>): Promise<void> {
    await db('projects')
      .where({ id })
      .update({ ...toRow(fields), updated_at: db.fn.now(3) });
  },

  /** The stored fields alone, for recording what an update changed. */
  async fields(db: DbOrTx, id: number): Promise<ProjectFields | undefined> {
    const row: Omit<ProjectRow, 'member_count' | 'my_roles'> | undefined = await db('projects')
      .where({ id })
      .forUpdate()
      .first();
    return row
      ? { jobNumber: row.job_number, name: row.name, client: row.client, site: row.site }
      : undefined;
  },
};
