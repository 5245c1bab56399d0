import { z } from 'zod';
import { statedPurpose } from '../revisions/revisions.schemas';

export const sealBody = z.strictObject(
  {
    password: z
      .string({ error: 'Type your password again to seal.' })
      .min(1, { error: 'Type your password again to seal.' })
      .max(256),
    purpose: statedPurpose,
  },
  {
    error: (issue) =>
      issue.code === 'unrecognized_keys'
        ? `Unknown field: ${(issue.keys ?? []).join(', ')}.`
        : 'Send a JSON object with the password.',
  },
);
