import { z } from 'zod';
import { idOf, revisionParams } from '../revisions/revisions.schemas';

export { revisionParams };
export const remarkParams = z.object({ remarkId: idOf('remark') });
export const replyParams = z.object({ remarkId: idOf('remark'), replyId: idOf('reply') });

const unknownKeys = (issue: { code: string; keys?: string[] }) =>
  issue.code === 'unrecognized_keys'
    ? `Unknown field: ${(issue.keys ?? []).join(', ')}.`
    : 'Send a JSON object.';

const text = (what: string) =>
  z
    .string({ error: `Write the ${what}.` })
    .trim()
    .min(1, { error: `Write the ${what}.` })
    .max(4000, { error: `The ${what} can be at most 4000 characters.` });

export const createRemarkBody = z.strictObject(
  {
    blockId: z
      .string({ error: 'Say which block the remark is on (blockId).' })
      .min(1, { error: 'Say which block the remark is on (blockId).' })
      .max(64),
    line: z
      .number({ error: 'Say which line of the block the remark is on (1 for the first line).' })
      .int({ error: 'The line must be a whole number.' })
      .min(0, { error: 'The line must be 0 (the block as a whole) or more.' }),
    type: z.enum(['error', 'query', 'editorial'], {
      error: 'The type of a remark is error, query or editorial.',
    }),
    text: text('remark'),
  },
  { error: unknownKeys },
);

export const replyBody = z.strictObject({ text: text('reply') }, { error: unknownKeys });

export const remarkStateBody = z.strictObject(
  {
    state: z.enum(['closed', 'open'], {
      error: 'A checker sets a remark to closed or open (an author answers by replying).',
    }),
  },
  { error: unknownKeys },
);
