import type { Db } from '../../db/index';
import { ForbiddenError, NotFoundError } from '../../http/errors';
import { membersService } from '../members/members.service';
import type { ProjectRole } from '../members/roles';
import type { User } from '../users/users.repository';
import { findSheetProjectId } from './sheets.repository';

/** Who may do what to a sheet: every member (and an admin) reads; only authors write. */
export interface SheetAccess {
  projectId: number;
  myRoles: ProjectRole[];
}

const roleList = (roles: readonly ProjectRole[]) =>
  roles.length === 1 ? `an ${roles[0]}` : `a ${roles.slice(0, -1).join(', ')} or ${roles.at(-1)}`;

/**
 * The roles the person holds in the project, refusing non-members (403) unless they are an admin.
 * When `need` is given, one of those roles is required; admins are not exempt from it, because
 * only the project's own authors write its sheets.
 */
export async function checkProjectAccess(
  db: Db,
  user: User,
  projectId: number,
  need?: readonly ProjectRole[],
  action = 'do this',
): Promise<SheetAccess> {
  const myRoles = await membersService.rolesOf(db, projectId, user.id);
  if (myRoles.length === 0 && !user.isAdmin) {
    throw new ForbiddenError('You are not a member of this project.');
  }
  if (need && !need.some((r) => myRoles.includes(r))) {
    throw new ForbiddenError(`Only ${roleList(need)} of this project can ${action}.`);
  }
  return { projectId, myRoles };
}

/** As checkProjectAccess, for a sheet addressed by id (404 when there is no such sheet). */
export async function checkSheetAccess(
  db: Db,
  user: User,
  sheetId: number,
  need?: readonly ProjectRole[],
  action?: string,
): Promise<SheetAccess> {
  const projectId = await findSheetProjectId(db, sheetId);
  if (projectId === undefined) throw new NotFoundError(`There is no sheet with id ${sheetId}.`);
  return checkProjectAccess(db, user, projectId, need, action);
}
