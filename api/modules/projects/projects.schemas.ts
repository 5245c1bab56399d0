import { z } from 'zod';
import { idParam } from '../../http/validate';

export { idParam };

const text = (label: string, max: number) =>
  z
    .string({ error: `Enter the ${label}.` })
    .trim()
    .min(1, { error: `Enter the ${label}.` })
    .max(max, { error: `The ${label} can be at most ${max} characters.` });

const unknownKeys = (issue: { code: string; keys?: string[] }) =>
  issue.code === 'unrecognized_keys'
    ? `Unknown field: ${(issue.keys ?? []).join(', ')}.`
    : 'Send a JSON object.';

export const projectFields = {
  jobNumber: text('job number', 64).regex(/^[A-Za-z0-9][A-Za-z0-9._/-]*$/, {
    error: 'A job number uses letters, digits and . _ / - only, like BW-2611.',
  }),
  name: text('project name', 191),
  client: text('client', 191),
  site: text('site', 191),
};

export const createProjectBody = z.strictObject(projectFields, { error: unknownKeys });

export const updateProjectBody = z
  .strictObject(
    {
      jobNumber: projectFields.jobNumber.optional(),
      name: projectFields.name.optional(),
      client: projectFields.client.optional(),
      site: projectFields.site.optional(),
    },
    { error: unknownKeys },
  )
  .refine((v) => Object.values(v).some((x) => x !== undefined), {
    error: 'Send at least one of jobNumber, name, client, site.',
  });

export const projectParams = z.object({ projectId: idParam('project id') });

export type CreateProjectInput = z.output<typeof createProjectBody>;
export type UpdateProjectInput = z.output<typeof updateProjectBody>;
