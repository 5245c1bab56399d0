import type { Db } from '../../db/index';
import { ConflictError, NotFoundError, ValidationError } from '../../http/errors';
import { activityService } from '../activity/activity.service';
import { projectsRepository } from '../projects/projects.repository';
import { usersRepository, type User } from '../users/users.repository';
import { membersRepository, type Member } from './members.repository';
import type { ProjectRole } from './roles';

function notAMember(projectId: number, userId: number): NotFoundError {
  return new NotFoundError(`Person ${userId} is not a member of project ${projectId}.`);
}

async function requireProject(db: Db, projectId: number): Promise<void> {
  if (!(await projectsRepository.exists(db, projectId))) {
    throw new NotFoundError(`There is no project with id ${projectId}.`);
  }
}

export const membersService = {
  async list(db: Db, projectId: number): Promise<Member[]> {
    await requireProject(db, projectId);
    return membersRepository.listByProject(db, projectId);
  },

  /**
   * Whether the person works for the firm on some project: author, checker or principal there
   * (a viewer, the client's representative, is not).
   */
  isFirmEngineer(db: Db, userId: number): Promise<boolean> {
    return membersRepository.holdsRoleAnywhere(db, userId, ['author', 'checker', 'principal']);
  },

  rolesOf(db: Db, projectId: number, userId: number): Promise<ProjectRole[]> {
    return membersRepository.rolesOf(db, projectId, userId);
  },

  async add(
    db: Db,
    actor: User,
    projectId: number,
    input: { email: string; roles: ProjectRole[] },
  ): Promise<Member> {
    await requireProject(db, projectId);
    return db.transaction(async (trx) => {
      const person = await usersRepository.findByEmail(trx, input.email);
      if (!person) {
        throw new ValidationError(`email: nobody has the e-mail address ${input.email}.`, {
          field: 'email',
        });
      }
      await membersRepository.lock(trx, projectId, person.id);
      if ((await membersRepository.rolesOf(trx, projectId, person.id)).length > 0) {
        throw new ConflictError(`${person.name} is already a member of this project.`, {
          field: 'email',
        });
      }
      await membersRepository.insertRoles(trx, projectId, person.id, input.roles);
      const member = await membersRepository.find(trx, projectId, person.id);
      if (!member) throw new Error('member vanished inside its own transaction');
      await activityService.record(trx, {
        actorId: actor.id,
        projectId,
        action: 'member.added',
        objectType: 'user',
        objectId: person.id,
        details: { email: person.email, name: person.name, roles: member.roles },
      });
      return member;
    });
  },

  async changeRoles(
    db: Db,
    actor: User,
    projectId: number,
    userId: number,
    roles: ProjectRole[],
  ): Promise<Member> {
    await requireProject(db, projectId);
    return db.transaction(async (trx) => {
      await membersRepository.lock(trx, projectId, userId);
      const before = await membersRepository.rolesOf(trx, projectId, userId);
      if (before.length === 0) throw notAMember(projectId, userId);
      const removed = before.filter((r) => !roles.includes(r));
      const added = roles.filter((r) => !before.includes(r));
      if (removed.length > 0) await membersRepository.deleteRoles(trx, projectId, userId, removed);
      await membersRepository.insertRoles(trx, projectId, userId, added);
      const member = await membersRepository.find(trx, projectId, userId);
      if (!member) throw new Error('member vanished inside its own transaction');
      if (removed.length > 0 || added.length > 0) {
        await activityService.record(trx, {
          actorId: actor.id,
          projectId,
          action: 'member.roles_changed',
          objectType: 'user',
          objectId: userId,
          details: { email: member.email, name: member.name, from: before, to: member.roles },
        });
      }
      return member;
    });
  },

  async remove(db: Db, actor: User, projectId: number, userId: number): Promise<void> {
    await requireProject(db, projectId);
    await db.transaction(async (trx) => {
      const member = await membersRepository.find(trx, projectId, userId);
      if (!member) throw notAMember(projectId, userId);
      await membersRepository.deleteRoles(trx, projectId, userId);
      await activityService.record(trx, {
        actorId: actor.id,
        projectId,
        action: 'member.removed',
        objectType: 'user',
        objectId: userId,
        details: { email: member.email, name: member.name, roles: member.roles },
      });
    });
  },
};
