import { z } from 'zod';

export const emailSchema = z
  .string({ error: 'Enter an e-mail address.' })
  .trim()
  .toLowerCase()
  .max(191, { error: 'An e-mail address can be at most 191 characters.' })
  .pipe(z.email({ error: 'Enter a valid e-mail address, like name@example.com.' }));

const optionalText = (label: string, max: number) =>
  z
    .string({ error: `${label} must be text.` })
    .trim()
    .max(max, { error: `${label} can be at most ${max} characters.` })
    .nullish()
    .transform((v) => (v ? v : null));

export const createUserBody = z.strictObject(
  {
    email: emailSchema,
    name: z
      .string({ error: 'Enter a name.' })
      .trim()
      .min(1, { error: 'Enter a name.' })
      .max(191, { error: 'A name can be at most 191 characters.' }),
    password: z
      .string({ error: 'Enter a password.' })
      .min(12, { error: 'A password needs at least 12 characters.' })
      .max(256, { error: 'A password can be at most 256 characters.' }),
    isAdmin: z.boolean({ error: 'isAdmin must be true or false.' }).optional().default(false),
    licenceNumber: optionalText('The licence number', 64),
    jurisdiction: optionalText('The jurisdiction', 191),
  },
  {
    error: (issue) =>
      issue.code === 'unrecognized_keys'
        ? `Unknown field: ${issue.keys.join(', ')}.`
        : 'Send a JSON object.',
  },
);

export type CreateUserInput = z.output<typeof createUserBody>;
