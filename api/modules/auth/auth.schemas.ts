import { z } from 'zod';

export const signInBody = z.object({
  email: z
    .string({ error: 'Enter your e-mail address.' })
    .trim()
    .toLowerCase()
    .min(1, { error: 'Enter your e-mail address.' })
    .max(191, { error: 'An e-mail address can be at most 191 characters.' }),
  password: z
    .string({ error: 'Enter your password.' })
    .min(1, { error: 'Enter your password.' })
    .max(256, { error: 'A password can be at most 256 characters.' }),
});

export type SignInInput = z.output<typeof signInBody>;
