import {
  isEngineError,
  parseCsvMatrix,
  parseMatrixMarket,
  type ParsedMatrix,
} from '../../../core/index';
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

/**
 * Reads an uploaded matrix file with the engine's readers (the same ones a matrix block's
 * `from:` uses) far enough to describe it, refusing anything that is not a matrix with 422
 * MATRIX_FILE_INVALID naming the line (`details.line`, 1-based).
 */
export function describeMatrixFile(
  text: string,
  format: UploadFormat,
  name: string,
): MatrixFileShape {
  let parsed: ParsedMatrix;
  try {
    parsed =
      format === 'matrix-market' ? parseMatrixMarket(text, name) : parseCsvMatrix(text, name);
  } catch (e) {
    if (isEngineError(e)) {
      const line = typeof e.details?.line === 'number' ? e.details.line : 0;
      throw new AppError(422, 'MATRIX_FILE_INVALID', e.message, {
        field: 'file',
        details: { ...e.details, line, file: name, reason: e.code },
      });
    }
    throw e;
  }
  // Dense layouts hold every entry: keep them within what one sheet value may hold. Sparse
  // coordinate files and triplets are bounded by the upload size only.
  if (parsed.format === 'array' || parsed.format === 'csv-dense') {
    checkSize(name, 0, parsed.rows, parsed.cols);
  }
  const entries = new Entries(parsed.rows, parsed.cols);
  const { rowIdx, colIdx, values } = parsed;
  for (let k = 0; k < values.length; k++) {
    const i = rowIdx[k]!;
    const j = colIdx[k]!;
    const v = values[k]!;
    if (v === 0) continue;
    entries.add(i, j, v);
    if (parsed.symmetricStorage && i !== j) entries.add(j, i, v);
  }
  return shapeOf(entries);
}
