import { z } from 'zod';
import { createSheetBody } from '../sheets/sheets.schemas';

const id = (what: string) =>
  z.coerce
    .number({ message: `must be a ${what} id` })
    .int(`must be a ${what} id`)
    .positive(`must be a ${what} id`);

export const templateParams = z.object({ templateId: id('template') });

const name = z
  .string({ message: 'is required' })
  .trim()
  .min(1, 'is required')
  .max(191, 'must be at most 191 characters');
const description = z.string().trim().max(2000, 'must be at most 2000 characters');

/** Save a sheet's draft, or one of its revisions, as a firm template. */
export const saveTemplateBody = z.object({
  sheetId: id('sheet'),
  revisionId: id('revision').nullish(),
  name,
  description: description.default(''),
});
export type SaveTemplateBody = z.output<typeof saveTemplateBody>;

export const updateTemplateBody = z
  .object({ name: name.optional(), description: description.optional() })
  .refine((b) => b.name !== undefined || b.description !== undefined, {
    message: 'name at least one of name or description to change',
  });
export type UpdateTemplateBody = z.output<typeof updateTemplateBody>;

/** Start a sheet in a project from a firm template: the new sheet's number, title and subject. */
export const startSheetBody = createSheetBody
  .omit({ template: true })
  .extend({ projectId: id('project') });
export type StartSheetBody = z.output<typeof startSheetBody>;
