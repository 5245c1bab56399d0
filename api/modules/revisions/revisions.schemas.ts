import { z } from 'zod';

const id = (what: string) =>
  z.coerce
    .number({ error: `The ${what} id must be a whole number.` })
    .int({ error: `The ${what} id must be a whole number.` })
    .positive({ error: `The ${what} id must be a whole number.` });

export const sheetParams = z.object({ sheetId: id('sheet') });
export const revisionParams = z.object({ revisionId: id('revision') });
export const remarkParams = z.object({ remarkId: id('remark') });

const unknownKeys = (issue: { code: string; keys?: string[] }) =>
  issue.code === 'unrecognized_keys'
    ? `Unknown field: ${(issue.keys ?? []).join(', ')}.`
    : 'Send a JSON object.';

export const issueBody = z.strictObject(
  {
    purpose: z
      .string({
        error: 'Say what the revision is issued for, e.g. "For check" or "For construction".',
      })
      .trim()
      .min(1, {
        error: 'Say what the revision is issued for, e.g. "For check" or "For construction".',
      })
      .max(500, { error: 'The purpose can be at most 500 characters.' }),
  },
  { error: unknownKeys },
);

export const compareQuery = z.object({
  from: id('revision'),
  to: z.union([z.literal('draft'), id('revision')], {
    error: 'to must be a revision id or "draft".',
  }),
});
