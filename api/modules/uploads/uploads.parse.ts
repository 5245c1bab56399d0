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

/**
 * Largest dense matrix (array or CSV rows) a file may describe, in entries: the sheet engine's
 * limit for one value. Coordinate files are sparse and limited by the upload size only.
 */
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

const WHITESPACE = /\s+/;

/** A finite number, or the reason it is not one (Fortran's 1.5D+03 exponents accepted). */
function number(token: string): number | string {
  const c = token.charCodeAt(0);
  // Fast path: a plain decimal (Number() alone would also take "0x1f", "Infinity" and "").
  const plausible = (c >= 48 && c <= 57) || c === 45 || c === 43 || c === 46;
  if (plausible && token.charCodeAt(1) !== 120 && token.charCodeAt(1) !== 88) {
    const v = Number(token);
    if (Number.isFinite(v)) return v;
  }
  if (/^[+-]?(\d+\.?\d*|\.\d+)[dD][+-]?\d+$/.test(token)) {
    const v = Number(token.replace(/[dD]/, 'e'));
    if (Number.isFinite(v)) return v;
  }
  if (/^[+-]?(nan|inf|infinity)$/i.test(token)) return `"${token}" is not a finite number`;
  if (/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(token)) {
    return `"${token}" is too large to be a number`;
  }
  return `"${token}" is not a number`;
}

/**
 * Entries of a matrix as triplets (0-based), gathered in file order. Duplicates are summed when
 * the shape is worked out (as the engine's triplet assembly does).
 */
class Entries {
  private is: number[] = [];
  private js: number[] = [];
  private vs: number[] = [];
  constructor(
    readonly rows: number,
    readonly cols: number,
  ) {}
  add(i: number, j: number, v: number): void {
    this.is.push(i);
    this.js.push(j);
    this.vs.push(v);
  }

  /** Compressed rows: columns sorted within each row, duplicates summed. */
  compress(): { ptr: Int32Array; col: Int32Array; val: Float64Array } {
    const count = new Int32Array(this.rows + 1);
    for (const i of this.is) count[i + 1]! += 1;
    for (let r = 0; r < this.rows; r++) count[r + 1]! += count[r]!;
    const next = count.slice(0, this.rows);
    const col = new Int32Array(this.is.length);
    const val = new Float64Array(this.is.length);
    for (let k = 0; k < this.is.length; k++) {
      const at = next[this.is[k]!]!++;
      col[at] = this.js[k]!;
      val[at] = this.vs[k]!;
    }
    // Sort each row by column (insertion sort: rows of a stiffness matrix are short) and sum
    // duplicates, writing the result compactly.
    const ptr = new Int32Array(this.rows + 1);
    let out = 0;
    for (let r = 0; r < this.rows; r++) {
      const start = count[r]!;
      const end = count[r + 1]!;
      for (let k = start + 1; k < end; k++) {
        const c = col[k]!;
        const v = val[k]!;
        let m = k - 1;
        while (m >= start && col[m]! > c) {
          col[m + 1] = col[m]!;
          val[m + 1] = val[m]!;
          m -= 1;
        }
        col[m + 1] = c;
        val[m + 1] = v;
      }
      ptr[r] = out;
      for (let k = start; k < end; k++) {
        if (out > ptr[r]! && col[out - 1] === col[k]) {
          val[out - 1]! += val[k]!;
        } else {
          col[out] = col[k]!;
          val[out] = val[k]!;
          out += 1;
        }
      }
    }
    ptr[this.rows] = out;
    return { ptr, col: col.subarray(0, out), val: val.subarray(0, out) };
  }
}

function shapeOf(entries: Entries): MatrixFileShape {
  const { ptr, col, val } = entries.compress();
  let nonzeros = 0;
  let maxAbs = 0;
  for (const v of val) {
    if (v !== 0) nonzeros += 1;
    maxAbs = Math.max(maxAbs, Math.abs(v));
  }
  // a_ij with i, j 0-based, by binary search in row i.
  const get = (i: number, j: number): number => {
    let lo = ptr[i]!;
    let hi = ptr[i + 1]! - 1;
    while (lo <= hi) {
      const mid = (lo + hi) >> 1;
      const c = col[mid]!;
      if (c === j) return val[mid]!;
      if (c < j) lo = mid + 1;
      else hi = mid - 1;
    }
    return 0;
  };
  let worst: UploadAsymmetry | null = null;
  if (entries.rows === entries.cols) {
    let worstGap = 0;
    for (let i = 0; i < entries.rows; i++) {
      for (let k = ptr[i]!; k < ptr[i + 1]!; k++) {
        const j = col[k]!;
        if (j === i) continue;
        // Each pair once: from its upper entry, or from a lower entry whose upper partner is 0.
        const upper = j > i ? val[k]! : get(j, i);
        const lower = j > i ? get(j, i) : val[k]!;
        if (j < i && upper !== 0) continue;
        const gap = Math.abs(upper - lower);
        if (gap > worstGap) {
          worstGap = gap;
          worst = {
            row: Math.min(i, j) + 1,
            col: Math.max(i, j) + 1,
            upper,
            lower,
            relative: maxAbs > 0 ? gap / maxAbs : 0,
          };
        }
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
      if (raw === '' || raw.charCodeAt(0) === 37) continue; // '%' starts a comment line
      return { tokens: raw.split(WHITESPACE), line: n };
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
  // Coordinate files are sparse: their size is bounded by the upload limit, not by rows × cols.
  if (layout === 'array') checkSize(name, sizeLine.line, rows, cols);
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
    let rows = 0;
    let cols = 0;
    for (const p of parsed) {
      rows = Math.max(rows, p.i);
      cols = Math.max(cols, p.j);
    }
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
