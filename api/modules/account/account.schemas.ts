import { z } from 'zod';

export const changePasswordBody = z.strictObject(
  {
    currentPassword: z
      .string({ error: 'Enter your current password.' })
      .min(1, { error: 'Enter your current password.' }),
    newPassword: z
      .string({ error: 'Enter a new password.' })
      .min(12, { error: 'A password needs at least 12 characters.' })
      .max(256, { error: 'A password can be at most 256 characters.' }),
  },
  { error: () => 'Send a JSON object with currentPassword and newPassword.' },
);
