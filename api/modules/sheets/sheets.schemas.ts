import { z } from 'zod';
import { BLOCK_KINDS } from '../../../core/vocabulary';
import { UNIT_SYSTEMS } from '../../../core/display-units';

/** Template keys a new sheet can start from (see sheets.templates.ts). */
export const TEMPLATE_KEYS = [
  'empty',
  'footbridge',
  'four-storey-frame',
  'pump-foundation',
] as const;
export type TemplateKey = (typeof TEMPLATE_KEYS)[number];

const id = z.coerce
  .number({ message: 'must be a whole number' })
  .int('must be a whole number')
  .positive('must be a positive whole number');

export const projectParams = z.object({ projectId: id });
export const sheetParams = z.object({ sheetId: id });

// Sheet numbers are what engineers print on the sheet (e.g. DYN-03): letters, digits and a few
// separators, no leading or trailing spaces.
const sheetNumber = z
  .string({ message: 'is required' })
  .trim()
  .min(1, 'is required')
  .max(64, 'must be at most 64 characters')
  .regex(
    /^[A-Za-z0-9][A-Za-z0-9 ._/-]*$/,
    'may hold letters, digits, spaces and . _ / - only, starting with a letter or digit',
  );
const title = z
  .string({ message: 'is required' })
  .trim()
  .min(1, 'is required')
  .max(255, 'must be at most 255 characters');
const subject = z.string().trim().max(1000, 'must be at most 1000 characters');

export const createSheetBody = z.object({
  number: sheetNumber,
  title,
  subject: subject.optional(),
  template: z
    .enum(TEMPLATE_KEYS, { message: `must be one of ${TEMPLATE_KEYS.join(', ')}` })
    .optional(),
});
export type CreateSheetBody = z.output<typeof createSheetBody>;

export const updateSheetBody = z
  .object({ number: sheetNumber.optional(), title: title.optional(), subject: subject.optional() })
  .refine((b) => b.number !== undefined || b.title !== undefined || b.subject !== undefined, {
    message: 'name at least one of number, title or subject to change',
  });
export type UpdateSheetBody = z.output<typeof updateSheetBody>;

/** Limits that keep one draft within the JSON body limit and the editor's reach. */
export const MAX_BLOCKS = 500;
export const MAX_BLOCK_SOURCE = 400_000;

export const blockSchema = z.object({
  // The sheet engine's id rule (core/sheet/source.ts validateSheet).
  id: z
    .string({ message: 'is required' })
    .regex(/^[A-Za-z0-9_.:-]{1,64}$/, 'must be 1–64 letters, digits or _ . : - without spaces'),
  kind: z.enum(BLOCK_KINDS, { message: `must be one of ${BLOCK_KINDS.join(', ')}` }),
  source: z
    .string({ message: 'is required' })
    .max(MAX_BLOCK_SOURCE, `must be at most ${MAX_BLOCK_SOURCE} characters`),
});

export const settingsSchema = z.object({
  significantFigures: z
    .number({ message: 'must be a whole number from 1 to 15' })
    .int('must be a whole number from 1 to 15')
    .min(1, 'must be a whole number from 1 to 15')
    .max(15, 'must be a whole number from 1 to 15')
    .default(4),
  units: z.enum(UNIT_SYSTEMS, { message: `must be one of ${UNIT_SYSTEMS.join(', ')}` }).optional(),
});

export const draftBody = z
  .object({
    blocks: z.array(blockSchema).max(MAX_BLOCKS, `may hold at most ${MAX_BLOCKS} blocks`),
    settings: settingsSchema.default({ significantFigures: 4 }),
  })
  .superRefine((d, ctx) => {
    const seen = new Map<string, number>();
    d.blocks.forEach((b, i) => {
      const first = seen.get(b.id);
      if (first !== undefined) {
        ctx.addIssue({
          code: 'custom',
          path: ['blocks', i, 'id'],
          message: `repeats the id "${b.id}" of block ${first + 1}; every block needs its own id`,
        });
      } else {
        seen.set(b.id, i);
      }
    });
  });
export type DraftBody = z.output<typeof draftBody>;

/**
 * `If-Match: "<draftVersion>"` (a strong entity tag holding the version number; W/ and bare
 * numbers are accepted too). Returns the version, or null when the header is not of that form.
 */
export function parseIfMatch(header: string | undefined): number | null {
  if (header === undefined) return null;
  const m = /^\s*(?:W\/)?"?(\d{1,9})"?\s*$/.exec(header);
  if (!m?.[1]) return null;
  return Number(m[1]);
}
