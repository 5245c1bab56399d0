/**
 * Uploaded matrix files for `matrix` blocks (`from: <name>`).
 */
import { EngineError } from '../../errors';
import type { EvalContext } from '../context';

/** Finds an upload by name; the message lists the uploads there are. */
export function findUpload(ctx: EvalContext, name: string): { name: string; text: string } {
  const u = ctx.uploads.find((x) => x.name === name);
  if (!u) {
    const names = ctx.uploads.map((x) => `"${x.name}"`).join(', ');
    throw new EngineError(
      'SHEET_PARSE',
      `No uploaded file is named "${name}"; ${names ? `the uploads are ${names}` : 'this sheet has no uploads'}.`,
    );
  }
  return u;
}

/** Reads an uploaded matrix file into rows. */
export function readUploadedMatrix(ctx: EvalContext, name: string): number[][] {
  findUpload(ctx, name);
  throw new EngineError(
    'MATRIX_FILE_INVALID',
    'Reading uploaded matrix files is not available yet.',
  );
}
