import { z } from 'zod';
import { emailSchema } from '../users/users.schemas';
import { idParam } from '../projects/projects.schemas';
import { PROJECT_ROLES } from './roles';

const rolesSchema = z
  .array(
    z.enum(PROJECT_ROLES, {
      error: `A role is one of ${PROJECT_ROLES.join(', ')}.`,
    }),
    { error: 'roles must be a list, like ["checker"].' },
  )
  .min(1, { error: 'Give at least one role.' })
  .transform((roles) => [...new Set(roles)]);

export const addMemberBody = z.object({ email: emailSchema, roles: rolesSchema });
export const changeRolesBody = z.object({ roles: rolesSchema });
export const memberParams = z.object({
  projectId: idParam('project id'),
  userId: idParam('person id'),
});
