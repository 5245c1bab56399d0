import { z } from 'zod';

/** An id in the address whose refusal names what it is: "The revision id must be …". */
export const idOf = (what: string) =>
  z.coerce
    .number({ error: `The ${what} id must be a whole number.` })
    .int({ error: `The ${what} id must be a whole number.` })
    .positive({ error: `The ${what} id must be a whole number.` });

export const sheetParams = z.object({ sheetId: idOf('sheet') });
export const revisionParams = z.object({ revisionId: idOf('revision') });

const unknownKeys = (issue: { code: string; keys?: string[] }) =>
  issue.code === 'unrecognized_keys'
    ? `Unknown field: ${(issue.keys ?? []).join(', ')}.`
    : 'Send a JSON object.';

const note = z
  .string({ error: 'A note is text.' })
  .trim()
  .max(2000, { error: 'The note can be at most 2000 characters.' })
  .optional()
  .transform((v) => (v ? v : null));

/** Return: an optional covering note to the author. */
export const returnBody = z.strictObject({ note }, { error: unknownKeys });

/** What a signed-off or sealed revision is for ("For construction"); empty or absent: null. */
export const statedPurpose = z
  .string({ error: 'The purpose is text, e.g. "For construction".' })
  .trim()
  .max(500, { error: 'The purpose can be at most 500 characters.' })
  .optional()
  .transform((v) => (v ? v : null));

/** Sign off: an optional note, and what the checked revision is for ("For construction"). */
export const signOffBody = z.strictObject({ note, purpose: statedPurpose }, { error: unknownKeys });

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
  from: idOf('revision'),
  to: z.union([z.literal('draft'), idOf('revision')], {
    error: 'to must be a revision id or "draft".',
  }),
});
