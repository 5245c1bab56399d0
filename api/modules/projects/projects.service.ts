import type { Db } from '../../db/index';
import { ConflictError, NotFoundError } from '../../http/errors';
import { activityService } from '../activity/activity.service';
import type { User } from '../users/users.repository';
import { projectsRepository, type Project, type ProjectFields } from './projects.repository';
import type { CreateProjectInput, UpdateProjectInput } from './projects.schemas';

function duplicateJobNumber(jobNumber: string): ConflictError {
  return new ConflictError(`A project with job number ${jobNumber} already exists.`, {
    code: 'DUPLICATE',
    field: 'jobNumber',
  });
}

export const projectsService = {
  /** The person's projects; an admin sees every project. */
  list(db: Db, user: User): Promise<Project[]> {
    return user.isAdmin
      ? projectsRepository.listAll(db, user.id)
      : projectsRepository.listForMember(db, user.id);
  },

  async get(db: Db, user: User, projectId: number): Promise<Project> {
    const project = await projectsRepository.findById(db, projectId, user.id);
    if (!project) throw new NotFoundError(`There is no project with id ${projectId}.`);
    return project;
  },

  exists(db: Db, projectId: number): Promise<boolean> {
    return projectsRepository.exists(db, projectId);
  },

  async create(db: Db, actor: User, input: CreateProjectInput): Promise<Project> {
    const id = await db.transaction(async (trx) => {
      if (await projectsRepository.findIdByJobNumber(trx, input.jobNumber)) {
        throw duplicateJobNumber(input.jobNumber);
      }
      const projectId = await projectsRepository.insert(trx, input);
      await activityService.record(trx, {
        actorId: actor.id,
        projectId,
        action: 'project.created',
        objectType: 'project',
        objectId: projectId,
        details: { ...input },
      });
      return projectId;
    });
    return this.get(db, actor, id);
  },

  async update(
    db: Db,
    actor: User,
    projectId: number,
    input: UpdateProjectInput,
  ): Promise<Project> {
    await db.transaction(async (trx) => {
      const before = await projectsRepository.fields(trx, projectId);
      if (!before) throw new NotFoundError(`There is no project with id ${projectId}.`);
      if (input.jobNumber !== undefined && input.jobNumber !== before.jobNumber) {
        const other = await projectsRepository.findIdByJobNumber(trx, input.jobNumber);
        if (other !== undefined && other !== projectId) throw duplicateJobNumber(input.jobNumber);
      }
      const changes: Record<string, { from: string; to: string }> = {};
      for (const key of ['jobNumber', 'name', 'client', 'site'] as (keyof ProjectFields)[]) {
        const to = input[key];
        if (to !== undefined && to !== before[key]) changes[key] = { from: before[key], to };
      }
      if (Object.keys(changes).length === 0) return;
      await projectsRepository.update(trx, projectId, input);
      await activityService.record(trx, {
        actorId: actor.id,
        projectId,
        action: 'project.updated',
        objectType: 'project',
        objectId: projectId,
        details: { changes },
      });
    });
    return this.get(db, actor, projectId);
  },
};
