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

const nameSchema = z
  .string({ error: 'Enter a name.' })
  .trim()
  .min(1, { error: 'Enter a name.' })
  .max(191, { error: 'A name can be at most 191 characters.' });

export const newPasswordSchema = z
  .string({ error: 'Enter a password.' })
  .min(12, { error: 'A password needs at least 12 characters.' })
  .max(256, { error: 'A password can be at most 256 characters.' });

const unknownKeys = {
  error: (issue: { code: string; keys?: string[] }) =>
    issue.code === 'unrecognized_keys'
      ? `Unknown field: ${(issue.keys ?? []).join(', ')}.`
      : 'Send a JSON object.',
};

export const createUserBody = z.strictObject(
  {
    email: emailSchema,
    name: nameSchema,
    password: newPasswordSchema,
    isAdmin: z.boolean({ error: 'isAdmin must be true or false.' }).optional().default(false),
    licenceNumber: optionalText('The licence number', 64),
    jurisdiction: optionalText('The jurisdiction', 191),
  },
  unknownKeys,
);

export type CreateUserInput = z.output<typeof createUserBody>;

/** Every field optional: only what is sent changes. An empty licence clears it. */
export const updateUserBody = z.strictObject(
  {
    email: emailSchema.optional(),
    name: nameSchema.optional(),
    licenceNumber: optionalText('The licence number', 64).optional(),
    jurisdiction: optionalText('The jurisdiction', 191).optional(),
  },
  unknownKeys,
);

export type UpdateUserInput = z.output<typeof updateUserBody>;

export const resetPasswordBody = z.strictObject(
  {
    token: z
      .string({ error: 'The link has no token; open the link from the e-mail again.' })
      .regex(/^[A-Za-z0-9_-]{43}$/, {
        error: 'This reset link is not complete; open the link from the e-mail again.',
      }),
    newPassword: newPasswordSchema,
  },
  unknownKeys,
);

export type ResetPasswordInput = z.output<typeof resetPasswordBody>;
