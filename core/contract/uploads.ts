// Matrix files uploaded to a sheet (/api/sheets/:id/uploads).
import { z } from 'zod';
import { id, isoTime, personRef } from './common';

/** The formats a matrix file is read in: Matrix Market (NIST) coordinate or array, or CSV. */
export const uploadFormat = z.enum(['matrix-market', 'csv']);
export type UploadFormat = z.infer<typeof uploadFormat>;

/**
 * The worst asymmetry found in an uploaded square matrix: 1-based row and column, the upper and
 * lower entries and their gap relative to the matrix's largest entry (core/linalg/upload-analysis).
 */
export const uploadAsymmetry = z.strictObject({
  row: z.number().int(),
  col: z.number().int(),
  upper: z.number(),
  lower: z.number(),
  relative: z.number(),
});
export type UploadAsymmetry = z.infer<typeof uploadAsymmetry>;

/** One uploaded file as its sheet lists it: its size, SHA-256 and the matrix's shape. */
export const upload = z.strictObject({
  id,
  sheetId: id,
  name: z.string(),
  format: uploadFormat,
  size: z.number().int().nonnegative(),
  sha256: z.string().regex(/^[0-9a-f]{64}$/),
  rows: z.number().int().nonnegative(),
  cols: z.number().int().nonnegative(),
  nonzeros: z.number().int().nonnegative(),
  symmetric: z.boolean(),
  worstAsymmetry: uploadAsymmetry.nullable(),
  createdAt: isoTime,
  createdBy: personRef,
});
export type Upload = z.infer<typeof upload>;

/** GET /api/sheets/:sheetId/uploads. */
export const uploadsResponse = z.strictObject({ uploads: z.array(upload) });
export type UploadsResponse = z.infer<typeof uploadsResponse>;

/** POST /api/sheets/:sheetId/uploads: 201 for a new file, 200 for the very same file again. */
export const uploadResponse = z.strictObject({ upload });
export type UploadResponse = z.infer<typeof uploadResponse>;
