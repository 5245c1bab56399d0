import { AppError, ValidationError } from '../../http/errors';
import type { UploadAsymmetry, UploadFormat } from './uploads.repository';

/**
 * What an upload response says about a matrix file: its shape, the nonzeros of the full matrix
 * (a symmetric Matrix Market file storing one triangle counts both), whether it is symmetric
 * and, when it is not, where the worst asymmetry sits.
 */
export interface MatrixFileShape {
  rows: number;
  cols: number;
  nonzeros: number;
  symmetric: boolean;
  worstAsymmetry: UploadAsymmetry | null;
}

/** Largest matrix a file may describe (entries of the full matrix), as the sheet engine's limit. */
export const MAX_MATRIX_ENTRIES = 4_000_000;

/**
 * Relative asymmetry |a_ij − a_ji| / max |a| still called symmetric: the sheet engine's matrix
 * block tolerance (core/sheet/blocks/matrix.ts), so an upload called symmetric here is accepted
 * by a modes block. The worst pair is reported either way.
 */
export const SYMMETRY_TOLERANCE = 1e-9;

/** Matrix Market by the .mtx extension or its header line; CSV by the .csv extension. */
export function detectFormat(name: string, text: string): UploadFormat {
  const lower = name.toLowerCase();
  if (lower.endsWith('.mtx') || lower.endsWith('.mm')) return 'matrix-market';
  if (lower.endsWith('.csv')) return 'csv';
  if (/^%%MatrixMarket/i.test(text)) return 'matrix-market';
  throw new ValidationError(
    `${name} is neither a Matrix Market file (.mtx) nor a CSV file (.csv); upload one of those.`,
    { field: 'file' },
  );
}

function invalid(name: string, line: number, reason: string): AppError {
  return new AppError(
    422,
    'MATRIX_FILE_INVALID',
    line > 0 ? `${name}, line ${line}: ${reason}` : `${name}: ${reason}`,
    { field: 'file', details: { line, file: name } },
  );
}

/** A finite number, or the reason it is not one. */
function number(token: string): number | string {
  if (!/^[+-]?(\d+\.?\d*|\.\d+)([eEdD][+-]?\d+)?$/.test(token)) {
    if (/^[+-]?(nan|inf|infinity)$/i.test(token)) return `"${token}" is not a finite number`;
    return `"${token}" is not a number`;
  }
  const value = Number(token.replace(/[dD]/, 'e'));
  return Number.isFinite(value) ? value : `"${token}" is too large to be a number`;
}

/** Entries of a matrix, keyed by row * cols + col (0-based). */
class Entries {
  readonly values = new Map<number, number>();
  constructor(
    readonly rows: number,
    readonly cols: number,
  ) {}
  add(i: number, j: number, v: number): void {
    const key = i * this.cols + j;
    this.values.set(key, (this.values.get(key) ?? 0) + v);
  }
  get(i: number, j: number): number {
    return this.values.get(i * this.cols + j) ?? 0;
  }
}

function shapeOf(entries: Entries): MatrixFileShape {
  let nonzeros = 0;
  let maxAbs = 0;
  for (const v of entries.values.values()) {
    if (v !== 0) nonzeros += 1;
    maxAbs = Math.max(maxAbs, Math.abs(v));
  }
  let worst: UploadAsymmetry | null = null;
  if (entries.rows === entries.cols) {
    let worstGap = 0;
    for (const [key, v] of entries.values) {
      const i = Math.floor(key / entries.cols);
      const j = key % entries.cols;
      if (j <= i) {
        // Lower-triangle entries are seen again through their upper partner below.
        if (j === i || entries.values.has(j * entries.cols + i)) continue;
      }
      const lower = j < i ? v : entries.get(j, i);
      const upper = j < i ? entries.get(j, i) : v;
      const gap = Math.abs(upper - lower);
      if (gap > worstGap) {
        worstGap = gap;
        const row = Math.min(i, j) + 1;
        const col = Math.max(i, j) + 1;
        worst = { row, col, upper, lower, relative: maxAbs > 0 ? gap / maxAbs : 0 };
      }
    }
  }
  return {
    rows: entries.rows,
    cols: entries.cols,
    nonzeros,
    symmetric:
      entries.rows === entries.cols && (worst === null || worst.relative <= SYMMETRY_TOLERANCE),
    worstAsymmetry: worst,
  };
}

function checkSize(name: string, line: number, rows: number, cols: number): void {
  if (rows * cols > MAX_MATRIX_ENTRIES) {
    throw invalid(
      name,
      line,
      `a ${rows} × ${cols} matrix is larger than the ${MAX_MATRIX_ENTRIES.toLocaleString('en')} entries a sheet may hold`,
    );
  }
}

function readMatrixMarket(text: string, name: string): MatrixFileShape {
  const lines = text.split(/\r?\n/);
  const header = (lines[0] ?? '').trim().split(/\s+/);
  if (header[0]?.toLowerCase() !== '%%matrixmarket') {
    throw invalid(name, 1, 'a Matrix Market file starts with "%%MatrixMarket matrix …"');
  }
  const [object, layout, field, symmetry] = header.slice(1).map((h) => h.toLowerCase());
  if (object !== 'matrix') throw invalid(name, 1, `the object must be "matrix", not "${object}"`);
  if (layout !== 'coordinate' && layout !== 'array') {
    throw invalid(name, 1, `the format must be "coordinate" or "array", not "${layout ?? ''}"`);
  }
  if (field !== 'real' && field !== 'integer' && field !== 'pattern') {
    throw invalid(
      name,
      1,
      `the field must be real, integer or pattern; "${field ?? ''}" entries cannot form a stiffness or mass matrix`,
    );
  }
  if (layout === 'array' && field === 'pattern') {
    throw invalid(name, 1, 'an array file cannot have the pattern field');
  }
  if (symmetry !== 'general' && symmetry !== 'symmetric' && symmetry !== 'skew-symmetric') {
    throw invalid(
      name,
      1,
      `the symmetry must be general, symmetric or skew-symmetric, not "${symmetry ?? ''}"`,
    );
  }
  const mirrored = symmetry !== 'general';
  const sign = symmetry === 'skew-symmetric' ? -1 : 1;

  let n = 1;
  const nextDataLine = (): { tokens: string[]; line: number } | undefined => {
    while (n < lines.length) {
      const raw = (lines[n] ?? '').trim();
      n += 1;
      if (raw === '' || raw.startsWith('%')) continue;
      return { tokens: raw.split(/\s+/), line: n };
    }
    return undefined;
  };

  const sizeLine = nextDataLine();
  if (!sizeLine) throw invalid(name, lines.length, 'the size line is missing');
  const wantSize = layout === 'coordinate' ? 3 : 2;
  const sizes = sizeLine.tokens.map(Number);
  if (
    sizeLine.tokens.length !== wantSize ||
    sizes.some((s) => !Number.isInteger(s) || s < 0) ||
    (sizes[0] ?? 0) < 1 ||
    (sizes[1] ?? 0) < 1
  ) {
    throw invalid(
      name,
      sizeLine.line,
      layout === 'coordinate'
        ? 'the size line must hold three whole numbers: rows, columns, stored entries'
        : 'the size line must hold two whole numbers: rows, columns',
    );
  }
  const rows = sizes[0] ?? 0;
  const cols = sizes[1] ?? 0;
  if (mirrored && rows !== cols) {
    throw invalid(
      name,
      sizeLine.line,
      `a ${symmetry} matrix must be square, not ${rows} × ${cols}`,
    );
  }
  checkSize(name, sizeLine.line, rows, cols);
  const entries = new Entries(rows, cols);

  if (layout === 'coordinate') {
    const stored = sizes[2] ?? 0;
    const perLine = field === 'pattern' ? 2 : 3;
    for (let k = 0; k < stored; k++) {
      const entry = nextDataLine();
      if (!entry) {
        throw invalid(
          name,
          lines.length,
          `the size line promises ${stored} entries but the file holds ${k}`,
        );
      }
      if (entry.tokens.length !== perLine) {
        throw invalid(
          name,
          entry.line,
          field === 'pattern'
            ? 'an entry must hold a row and a column'
            : 'an entry must hold a row, a column and a value',
        );
      }
      const [ti, tj, tv] = entry.tokens as [string, string, string | undefined];
      const i = Number(ti);
      const j = Number(tj);
      if (!Number.isInteger(i) || i < 1 || i > rows) {
        throw invalid(name, entry.line, `row index ${ti} is outside 1…${rows}`);
      }
      if (!Number.isInteger(j) || j < 1 || j > cols) {
        throw invalid(name, entry.line, `column index ${tj} is outside 1…${cols}`);
      }
      let v = 1;
      if (tv !== undefined) {
        const parsed = number(tv);
        if (typeof parsed === 'string') throw invalid(name, entry.line, parsed);
        v = parsed;
      }
      if (mirrored && j > i) {
        throw invalid(
          name,
          entry.line,
          `entry (${i}, ${j}) is above the diagonal; a ${symmetry} file stores the lower triangle only`,
        );
      }
      entries.add(i - 1, j - 1, v);
      if (mirrored && i !== j) entries.add(j - 1, i - 1, sign * v);
    }
    const extra = nextDataLine();
    if (extra) {
      throw invalid(
        name,
        extra.line,
        `the size line promises ${stored} entries but there are more`,
      );
    }
  } else {
    // Array: column by column; symmetric files hold the lower triangle of each column.
    for (let j = 0; j < cols; j++) {
      for (let i = mirrored ? j + (sign < 0 ? 1 : 0) : 0; i < rows; i++) {
        const entry = nextDataLine();
        if (!entry) {
          throw invalid(name, lines.length, `the entries stop at row ${i + 1}, column ${j + 1}`);
        }
        if (entry.tokens.length !== 1) {
          throw invalid(name, entry.line, 'an array file holds one value per line');
        }
        const parsed = number(entry.tokens[0] ?? '');
        if (typeof parsed === 'string') throw invalid(name, entry.line, parsed);
        if (parsed !== 0) {
          entries.add(i, j, parsed);
          if (mirrored && i !== j) entries.add(j, i, sign * parsed);
        }
      }
    }
    const extra = nextDataLine();
    if (extra) throw invalid(name, extra.line, `there are more values than ${rows} × ${cols}`);
  }
  return shapeOf(entries);
}

const TRIPLET_HEADER = /^\s*(i|row)\s*,\s*(j|col|column)\s*,\s*(value|v)\s*$/i;

/**
 * CSV: rows of numbers separated by commas, or triplets `i,j,value` (1-based) when the first line
 * is the header `i,j,value` (also `row,col,value`). Blank lines and lines starting with # are
 * skipped.
 */
function readCsv(text: string, name: string): MatrixFileShape {
  const lines = text.split(/\r?\n/);
  const data: { cells: string[]; line: number }[] = [];
  let triplets = false;
  lines.forEach((raw, index) => {
    const t = raw.trim();
    if (t === '' || t.startsWith('#')) return;
    if (data.length === 0 && !triplets && TRIPLET_HEADER.test(t)) {
      triplets = true;
      return;
    }
    data.push({ cells: t.split(',').map((c) => c.trim()), line: index + 1 });
  });
  if (data.length === 0) throw invalid(name, 0, 'the file holds no numbers');

  if (triplets) {
    const parsed = data.map(({ cells, line }) => {
      if (cells.length !== 3) throw invalid(name, line, 'a triplet line holds i, j and a value');
      const [ti, tj, tv] = cells as [string, string, string];
      const i = Number(ti);
      const j = Number(tj);
      if (!Number.isInteger(i) || i < 1)
        throw invalid(name, line, `row index "${ti}" is not a whole number from 1`);
      if (!Number.isInteger(j) || j < 1)
        throw invalid(name, line, `column index "${tj}" is not a whole number from 1`);
      const v = number(tv);
      if (typeof v === 'string') throw invalid(name, line, v);
      return { i, j, v };
    });
    const rows = Math.max(...parsed.map((p) => p.i));
    const cols = Math.max(...parsed.map((p) => p.j));
    checkSize(name, 0, rows, cols);
    const entries = new Entries(rows, cols);
    for (const p of parsed) entries.add(p.i - 1, p.j - 1, p.v);
    return shapeOf(entries);
  }

  const cols = data[0]?.cells.length ?? 0;
  const rows = data.length;
  checkSize(name, 0, rows, cols);
  const entries = new Entries(rows, cols);
  data.forEach(({ cells, line }, i) => {
    if (cells.length !== cols) {
      throw invalid(name, line, `this row has ${cells.length} values; the first row has ${cols}`);
    }
    cells.forEach((cell, j) => {
      if (cell === '') throw invalid(name, line, `value ${j + 1} is empty`);
      const v = number(cell);
      if (typeof v === 'string') throw invalid(name, line, v);
      if (v !== 0) entries.add(i, j, v);
    });
  });
  return shapeOf(entries);
}

/**
 * Reads an uploaded matrix file far enough to describe it, refusing anything that is not a matrix
 * with 422 MATRIX_FILE_INVALID naming the line (`details.line`, 1-based; 0 for the whole file).
 */
export function describeMatrixFile(
  text: string,
  format: UploadFormat,
  name: string,
): MatrixFileShape {
  return format === 'matrix-market' ? readMatrixMarket(text, name) : readCsv(text, name);
}
