import { z } from 'zod';

export const searchQuery = z.object({
  q: z
    .string({ error: 'Type something to search for.' })
    .trim()
    .min(1, { error: 'Type something to search for.' })
    .max(200, { error: 'A search can be at most 200 characters.' }),
});
