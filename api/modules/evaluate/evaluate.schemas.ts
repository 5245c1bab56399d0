import { z } from 'zod';

/** One block of a sheet as the client sends it. */
export const blockSchema = z.object({
  id: z
    .string()
    .regex(
      /^[A-Za-z0-9_.:-]{1,64}$/,
      'a block id is 1–64 letters, digits or _ . : - without spaces',
    ),
  kind: z.enum(['text', 'calc', 'matrix', 'modes', 'response', 'criteria']),
  source: z.string().max(2_000_000, 'a block may hold at most 2 000 000 characters'),
});

export const settingsSchema = z
  .object({
    significantFigures: z
      .number()
      .int('significant figures must be a whole number')
      .min(1, 'significant figures must be at least 1')
      .max(15, 'significant figures must be at most 15')
      .optional(),
  })
  .strict();

export const uploadSchema = z.object({
  name: z.string().min(1).max(191),
  text: z.string().max(50_000_000, 'an uploaded matrix file may hold at most 50 MB of text'),
});

/** A sheet with its uploads: the body of POST /api/evaluate and /api/evaluate/stream. */
export const evaluateBodySchema = z
  .object({
    blocks: z.array(blockSchema).max(500, 'a sheet may have at most 500 blocks'),
    settings: settingsSchema.optional(),
    uploads: z.array(uploadSchema).max(50).optional(),
  })
  .strict()
  .superRefine((body, ctx) => {
    const seen = new Map<string, number>();
    body.blocks.forEach((b, i) => {
      const first = seen.get(b.id);
      if (first !== undefined) {
        ctx.addIssue({
          code: 'custom',
          path: ['blocks', i, 'id'],
          message: `block ${i + 1} repeats the id "${b.id}" of block ${first + 1}`,
        });
      }
      seen.set(b.id, i);
    });
  });

export type EvaluateBody = z.output<typeof evaluateBodySchema>;

/** Two sheets to compare: the body of POST /api/evaluate/diff. */
export const diffBodySchema = z
  .object({
    old: evaluateBodySchema,
    new: evaluateBodySchema,
  })
  .strict();

export type DiffBody = z.output<typeof diffBodySchema>;
