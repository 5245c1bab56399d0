/**
 * Uploaded matrix files for `matrix` blocks (`from: <name>`), read with the engine's readers
 * (core/linalg/matrix-io.ts, the same ones the API uses to describe an upload): Matrix Market
 * (coordinate or array; real, integer or pattern; general or symmetric) and CSV (dense rows
 * separated by commas, or `i,j,value` triplets; `#` comment lines). Every refusal names the file
 * and its line; the sheet names the block and its `from:` line.
 */
import { EngineError } from '../../errors';
import { parseCsvMatrix, parseMatrixMarket, type ParsedMatrix } from '../../linalg/matrix-io';
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

/** Parses with the engine's reader, adding the upload's name to the error's details. */
function parseUpload(file: string, text: string): ParsedMatrix {
  try {
    return /^\s*%%MatrixMarket/i.test(text)
      ? parseMatrixMarket(text, file)
      : parseCsvMatrix(text, file);
  } catch (err) {
    if (err instanceof EngineError) {
      throw new EngineError(err.code, err.message, { ...err.details, file });
    }
    throw err;
  }
}

/**
 * Dense rows of a parsed file: a symmetric file's lower triangle is mirrored and duplicate
 * coordinate entries are summed (as the engine's triplet assembly and the API's description of
 * the upload do).
 * @throws EngineError SHEET_LIMIT when the matrix has more entries than a sheet value may hold.
 */
function toRows(file: string, p: ParsedMatrix, limit: number): number[][] {
  if (p.rows < 1 || p.cols < 1) {
    throw new EngineError(
      'MATRIX_FILE_INVALID',
      `${file}: a ${p.rows}×${p.cols} matrix has no entries.`,
      { file },
    );
  }
  if (p.rows * p.cols > limit) {
    throw new EngineError(
      'SHEET_LIMIT',
      `${file}: a ${p.rows}×${p.cols} matrix exceeds the ${limit} entries a sheet value may hold.`,
      { file },
    );
  }
  const out = Array.from({ length: p.rows }, () => new Array<number>(p.cols).fill(0));
  const dense = p.format === 'array' || p.format === 'csv-dense';
  for (let k = 0; k < p.values.length; k++) {
    const i = p.rowIdx[k]!;
    const j = p.colIdx[k]!;
    const v = p.values[k]!;
    out[i]![j] = dense ? v : out[i]![j]! + v;
    if (p.symmetricStorage && i !== j) out[j]![i] = out[i]![j]!;
  }
  return out;
}

/** Reads and parses an uploaded matrix file (Matrix Market when it starts with %%MatrixMarket). */
export function readUpload(ctx: EvalContext, name: string): { file: string; parsed: ParsedMatrix } {
  const u = findUpload(ctx, name);
  return { file: u.name, parsed: parseUpload(u.name, u.text) };
}

/** Dense rows of a parsed upload, within the sheet's value limit. */
export function uploadRows(ctx: EvalContext, file: string, parsed: ParsedMatrix): number[][] {
  return toRows(file, parsed, ctx.maxMatrixEntries);
}
