import type { DbOrTx } from '../../db/index';
import type { ProjectRole } from './roles';
import { PROJECT_ROLES } from './roles';
import type { Member } from '../../../core/contract/projects';

export type { Member } from '../../../core/contract/projects';

interface MemberRow {
  user_id: number;
  email: string;
  name: string;
  role: ProjectRole;
}

function group(rows: MemberRow[]): Member[] {
  const byUser = new Map<number, Member>();
  for (const row of rows) {
    let member = byUser.get(row.user_id);
    if (!member) {
      member = { userId: row.user_id, email: row.email, name: row.name, roles: [] };
      byUser.set(row.user_id, member);
    }
    member.roles.push(row.role);
  }
  for (const member of byUser.values()) {
    member.roles.sort((a, b) => PROJECT_ROLES.indexOf(a) - PROJECT_ROLES.indexOf(b));
  }
  return [...byUser.values()];
}

export const membersRepository = {
  async listByProject(db: DbOrTx, projectId: number): Promise<Member[]> {
    const rows: MemberRow[] = await db('project_members as pm')
      .join('users as u', 'u.id', 'pm.user_id')
      .select('pm.user_id', 'u.email', 'u.name', 'pm.role')
      .where('pm.project_id', projectId)
      .orderBy('u.name')
      .orderBy('u.id');
    return group(rows);
  },

  async find(db: DbOrTx, projectId: number, userId: number): Promise<Member | undefined> {
    const rows: MemberRow[] = await db('project_members as pm')
      .join('users as u', 'u.id', 'pm.user_id')
      .select('pm.user_id', 'u.email', 'u.name', 'pm.role')
      .where({ 'pm.project_id': projectId, 'pm.user_id': userId });
    return group(rows)[0];
  },

  /** Whether the person holds any of `roles` in any project. */
  async holdsRoleAnywhere(db: DbOrTx, userId: number, roles: ProjectRole[]): Promise<boolean> {
    const row = (await db('project_members')
      .where({ user_id: userId })
      .whereIn('role', roles)
      .first('user_id')) as { user_id: number } | undefined;
    return row !== undefined;
  },

  async rolesOf(db: DbOrTx, projectId: number, userId: number): Promise<ProjectRole[]> {
    const rows: { role: ProjectRole }[] = await db('project_members')
      .select('role')
      .where({ project_id: projectId, user_id: userId });
    return rows
      .map((r) => r.role)
      .sort((a, b) => PROJECT_ROLES.indexOf(a) - PROJECT_ROLES.indexOf(b));
  },

  async insertRoles(
    db: DbOrTx,
    projectId: number,
    userId: number,
    roles: ProjectRole[],
  ): Promise<void> {
    if (roles.length === 0) return;
    await db('project_members').insert(
      roles.map((role) => ({ project_id: projectId, user_id: userId, role })),
    );
  },

  async deleteRoles(
    db: DbOrTx,
    projectId: number,
    userId: number,
    roles?: ProjectRole[],
  ): Promise<number> {
    const q = db('project_members').where({ project_id: projectId, user_id: userId });
    if (roles) q.whereIn('role', roles);
    return q.delete();
  },

  /** Locks the person's rows in the project so concurrent role changes serialise. */
  async lock(db: DbOrTx, projectId: number, userId: number): Promise<void> {
    await db('project_members')
      .select('id')
      .where({ project_id: projectId, user_id: userId })
      .forUpdate();
  },
};
