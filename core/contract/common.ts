// Pieces every response shape uses. The contract imports zod and core/vocabulary.ts only, so the
// client may import its types and the API its schemas without pulling server or engine code.
import { z } from 'zod';
import { PROJECT_ROLES } from '../vocabulary';

/**
 * A moment as the API sends it: ISO 8601 in UTC with milliseconds (`Date.prototype.toISOString`,
 * ECMA-262 §21.4.4.36).
 */
export const isoTime = z.iso.datetime();

/** A person named beside what they did: id and display name. */
export const personRef = z.strictObject({ id: z.number().int(), name: z.string() });
export type PersonRef = z.infer<typeof personRef>;

/** A database id: a positive integer. */
export const id = z.number().int().positive();

/** A person's role in a project (core/vocabulary.ts). */
export const projectRole = z.enum(PROJECT_ROLES);
