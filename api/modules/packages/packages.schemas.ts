import { z } from 'zod';

/** `?revisions=12,15,19`: the revisions to bind (one per sheet); absent: the default choice. */
export const packageQuery = z.object({
  revisions: z
    .string({ error: 'revisions must be a list of revision ids, like 12,15,19.' })
    .trim()
    .regex(/^\d{1,10}(,\d{1,10}){0,199}$/, {
      error: 'revisions must be a list of revision ids separated by commas, like 12,15,19.',
    })
    .transform((s) => s.split(',').map(Number))
    .optional(),
});

export type PackageQuery = z.output<typeof packageQuery>;
