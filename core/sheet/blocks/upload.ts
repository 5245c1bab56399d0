/**
 * Uploaded matrix files for `matrix` blocks (`from: <name>`): Matrix Market (coordinate or
 * array; real or integer; general, symmetric or skew-symmetric) and CSV (numbers separated by
 * commas, semicolons or whitespace; `#` comment lines). Every refusal names the file and its line.
 *
 * Matrix Market: the NIST exchange format (Boisvert, Pozo & Remington, "The Matrix Market
 * Exchange Formats: Initial Design", NISTIR 5935, 1996): header `%%MatrixMarket matrix
 * <coordinate|array> <field> <symmetry>`, `%` comment lines, a size line, then entries
 * (1-based `i j value` for coordinate; column-major values for array, lower triangle only when
 * symmetric).
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

const NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

function invalid(file: string, line: number, message: string): EngineError {
  return new EngineError('MATRIX_FILE_INVALID', `${file}, line ${line}: ${message}.`, {
    file,
    line,
  });
}

function num(file: string, line: number, token: string): number {
  if (!NUMBER.test(token)) throw invalid(file, line, `"${token}" is not a number`);
  return Number(token);
}

function checkEntries(file: string, line: number, rows: number, cols: number, limit: number): void {
  if (rows * cols > limit) {
    throw new EngineError(
      'SHEET_LIMIT',
      `${file}, line ${line}: a ${rows}×${cols} matrix exceeds the ${limit} entries a sheet value may hold.`,
    );
  }
}

/** Reads a Matrix Market file into dense rows. */
export function readMatrixMarket(file: string, text: string, limit: number): number[][] {
  const lines = text.replace(/\r\n?/g, '\n').split('\n');
  const header = (lines[0] ?? '').trim().toLowerCase().split(/\s+/);
  if (header[0] !== '%%matrixmarket' || header[1] !== 'matrix') {
    throw invalid(
      file,
      1,
      'a Matrix Market file starts with "%%MatrixMarket matrix coordinate real symmetric" or similar',
    );
  }
  const [, , layout, field, symmetry] = header;
  if (layout !== 'coordinate' && layout !== 'array') {
    throw invalid(file, 1, `the layout must be coordinate or array, not "${layout ?? ''}"`);
  }
  if (field !== 'real' && field !== 'integer' && field !== 'double') {
    throw invalid(file, 1, `the field must be real or integer, not "${field ?? ''}"`);
  }
  if (symmetry !== 'general' && symmetry !== 'symmetric' && symmetry !== 'skew-symmetric') {
    throw invalid(
      file,
      1,
      `the symmetry must be general, symmetric or skew-symmetric, not "${symmetry ?? ''}"`,
    );
  }
  const data: { tokens: string[]; line: number }[] = [];
  for (let i = 1; i < lines.length; i++) {
    const t = lines[i]!.trim();
    if (t === '' || t.startsWith('%')) continue;
    data.push({ tokens: t.split(/\s+/), line: i + 1 });
  }
  const size = data.shift();
  if (!size) throw invalid(file, lines.length, 'the size line is missing');
  const dims = size.tokens.map((x) => num(file, size.line, x));
  const [rows, cols] = dims as [number, number];
  if (
    dims.length !== (layout === 'coordinate' ? 3 : 2) ||
    !dims.every((d) => Number.isInteger(d) && d >= 0) ||
    rows < 1 ||
    cols < 1
  ) {
    throw invalid(
      file,
      size.line,
      layout === 'coordinate'
        ? 'the size line is "rows columns entries"'
        : 'the size line is "rows columns"',
    );
  }
  checkEntries(file, size.line, rows, cols, limit);
  const mirrored = symmetry !== 'general';
  if (mirrored && rows !== cols)
    throw invalid(file, size.line, `a ${symmetry} matrix must be square (got ${rows}×${cols})`);
  const sign = symmetry === 'skew-symmetric' ? -1 : 1;
  const out = Array.from({ length: rows }, () => new Array<number>(cols).fill(0));
  if (layout === 'coordinate') {
    const count = dims[2]!;
    if (data.length !== count) {
      throw invalid(
        file,
        data[data.length - 1]?.line ?? size.line,
        `the size line announces ${count} entries but the file has ${data.length}`,
      );
    }
    for (const { tokens, line } of data) {
      if (tokens.length !== 3) throw invalid(file, line, 'an entry is "row column value"');
      const i = num(file, line, tokens[0]!);
      const j = num(file, line, tokens[1]!);
      const v = num(file, line, tokens[2]!);
      if (!Number.isInteger(i) || !Number.isInteger(j) || i < 1 || j < 1 || i > rows || j > cols) {
        throw invalid(
          file,
          line,
          `the position (${tokens[0]}, ${tokens[1]}) is outside the ${rows}×${cols} matrix`,
        );
      }
      if (mirrored && j > i)
        throw invalid(
          file,
          line,
          `a ${symmetry} file lists the lower triangle only; (${i}, ${j}) is above the diagonal`,
        );
      out[i - 1]![j - 1] = v;
      if (mirrored && i !== j) out[j - 1]![i - 1] = sign * v;
    }
  } else {
    const values = data.flatMap(({ tokens, line }) =>
      tokens.map((t) => ({ v: num(file, line, t), line })),
    );
    const expected = mirrored
      ? (rows * (rows + (symmetry === 'skew-symmetric' ? -1 : 1))) / 2
      : rows * cols;
    if (values.length !== expected) {
      throw invalid(
        file,
        data[data.length - 1]?.line ?? size.line,
        `an array of this size and symmetry has ${expected} values but the file has ${values.length}`,
      );
    }
    let k = 0;
    for (let j = 0; j < cols; j++) {
      for (let i = mirrored ? j + (symmetry === 'skew-symmetric' ? 1 : 0) : 0; i < rows; i++) {
        const v = values[k++]!.v;
        out[i]![j] = v;
        if (mirrored && i !== j) out[j]![i] = sign * v;
      }
    }
  }
  return out;
}

/** Reads a CSV file of numbers into rows. */
export function readCsv(file: string, text: string, limit: number): number[][] {
  const rows: number[][] = [];
  let firstLine = 0;
  const lines = text.replace(/\r\n?/g, '\n').split('\n');
  for (let i = 0; i < lines.length; i++) {
    const t = lines[i]!.trim();
    if (t === '' || t.startsWith('#')) continue;
    const line = i + 1;
    const tokens = t.split(/\s*[,;]\s*|\s+/).filter((x) => x !== '');
    const row = tokens.map((x) => num(file, line, x));
    if (rows.length > 0 && row.length !== rows[0]!.length) {
      throw invalid(
        file,
        line,
        `this row has ${row.length} values; the first row (line ${firstLine}) has ${rows[0]!.length}`,
      );
    }
    if (rows.length === 0) firstLine = line;
    rows.push(row);
    checkEntries(file, line, rows.length, row.length, limit);
  }
  if (rows.length === 0) throw invalid(file, 1, 'the file has no rows of numbers');
  return rows;
}

/** Reads an uploaded matrix file (Matrix Market when it starts with %%MatrixMarket, else CSV). */
export function readUploadedMatrix(ctx: EvalContext, name: string): number[][] {
  const u = findUpload(ctx, name);
  if (/^\s*%%MatrixMarket/i.test(u.text))
    return readMatrixMarket(u.name, u.text, ctx.maxMatrixEntries);
  return readCsv(u.name, u.text, ctx.maxMatrixEntries);
}
