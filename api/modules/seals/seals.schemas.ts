import { z } from 'zod';

export const sealBody = z.strictObject(
  {
    password: z
      .string({ error: 'Type your password again to seal.' })
      .min(1, { error: 'Type your password again to seal.' })
      .max(256),
  },
  {
    error: (issue) =>
      issue.code === 'unrecognized_keys'
        ? `Unknown field: ${(issue.keys ?? []).join(', ')}.`
        : 'Send a JSON object with the password.',
  },
);
