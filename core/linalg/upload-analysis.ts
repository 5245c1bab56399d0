import { EngineError } from '../errors';
import { parseCsvMatrix, parseMatrixMarket, type ParsedMatrix } from './matrix-io';

/** The worst asymmetric pair of a square matrix: 1-based row < col, both values, gap / max |a|. */
export interface MatrixAsymmetry {
  row: number;
  col: number;
  upper: number;
  lower: number;
  relative: number;
}

/**
 * What an uploaded matrix holds: its shape, the nonzeros of the full matrix (a symmetric file
 * storing one triangle counts both), whether it is symmetric and, when it is not, where the
 * worst asymmetry sits.
 */
export interface MatrixAnalysis {
  rows: number;
  cols: number;
  nonzeros: number;
  symmetric: boolean;
  worstAsymmetry: MatrixAsymmetry | null;
}

/**
 * Relative asymmetry |a_ij − a_ji| / max |a| still called symmetric: the matrix block's
 * tolerance (core/sheet/blocks/matrix.ts), so a file called symmetric here is accepted by a
 * modes block. The worst pair is reported either way.
 */
export const UPLOAD_SYMMETRY_TOLERANCE = 1e-9;

/** Compressed sparse rows: columns sorted within each row, duplicates summed. */
interface CompressedRows {
  ptr: Int32Array;
  col: Int32Array;
  val: Float64Array;
}

/**
 * Triplets (0-based, file order) to compressed sparse rows by a counting sort on the row, an
 * insertion sort on the column within each row (rows of a stiffness matrix are short) and a
 * sum of duplicates, as in the triplet-to-CSR conversion of Saad, "Iterative Methods for Sparse
 * Linear Systems", 2nd ed., SIAM 2003, §3.4 (from memory).
 */
function compressRows(rows: number, is: number[], js: number[], vs: number[]): CompressedRows {
  const count = new Int32Array(rows + 1);
  for (const i of is) count[i + 1]! += 1;
  for (let r = 0; r < rows; r++) count[r + 1]! += count[r]!;
  const next = count.slice(0, rows);
  const col = new Int32Array(is.length);
  const val = new Float64Array(is.length);
  for (let k = 0; k < is.length; k++) {
    const at = next[is[k]!]!++;
    col[at] = js[k]!;
    val[at] = vs[k]!;
  }
  const ptr = new Int32Array(rows + 1);
  let out = 0;
  for (let r = 0; r < rows; r++) {
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
  ptr[rows] = out;
  return { ptr, col: col.subarray(0, out), val: val.subarray(0, out) };
}

/** a_ij (0-based) by binary search in row i; 0 when not stored. */
function entryAt(m: CompressedRows, i: number, j: number): number {
  let lo = m.ptr[i]!;
  let hi = m.ptr[i + 1]! - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    const c = m.col[mid]!;
    if (c === j) return m.val[mid]!;
    if (c < j) lo = mid + 1;
    else hi = mid - 1;
  }
  return 0;
}

/** The pair (i, j) with the largest |a_ij − a_ji|, each pair visited once. */
function worstPair(m: CompressedRows, n: number, maxAbs: number): MatrixAsymmetry | null {
  let worst: MatrixAsymmetry | null = null;
  let worstGap = 0;
  for (let i = 0; i < n; i++) {
    for (let k = m.ptr[i]!; k < m.ptr[i + 1]!; k++) {
      const j = m.col[k]!;
      if (j === i) continue;
      // From its upper entry, or from a lower entry whose upper partner is 0.
      const upper = j > i ? m.val[k]! : entryAt(m, j, i);
      const lower = j > i ? entryAt(m, j, i) : m.val[k]!;
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
  return worst;
}

/**
 * Describes a matrix read by `parseMatrixMarket` or `parseCsvMatrix`: the entries are expanded
 * (a symmetric-storage file gives both triangles), compressed by row with duplicates summed,
 * counted, and searched for the worst asymmetric pair. Symmetric means square with every
 * relative gap within `UPLOAD_SYMMETRY_TOLERANCE` (common practice: a relative test against the
 * largest entry, as for the matrix block).
 *
 * Throws nothing; the readers have refused what is not a matrix.
 *
 * @example
 * analyseParsedMatrix(parseMatrixMarket(text, 'K.mtx'))
 * // → { rows: 3, cols: 3, nonzeros: 7, symmetric: true, worstAsymmetry: null }
 */
export function analyseParsedMatrix(parsed: ParsedMatrix): MatrixAnalysis {
  const is: number[] = [];
  const js: number[] = [];
  const vs: number[] = [];
  const add = (i: number, j: number, v: number) => {
    is.push(i);
    js.push(j);
    vs.push(v);
  };
  const { rowIdx, colIdx, values } = parsed;
  for (let k = 0; k < values.length; k++) {
    const v = values[k]!;
    if (v === 0) continue;
    const i = rowIdx[k]!;
    const j = colIdx[k]!;
    add(i, j, v);
    if (parsed.symmetricStorage && i !== j) add(j, i, v);
  }
  const m = compressRows(parsed.rows, is, js, vs);
  let nonzeros = 0;
  let maxAbs = 0;
  for (const v of m.val) {
    if (v !== 0) nonzeros += 1;
    maxAbs = Math.max(maxAbs, Math.abs(v));
  }
  const square = parsed.rows === parsed.cols;
  const worst = square ? worstPair(m, parsed.rows, maxAbs) : null;
  return {
    rows: parsed.rows,
    cols: parsed.cols,
    nonzeros,
    symmetric: square && (worst === null || worst.relative <= UPLOAD_SYMMETRY_TOLERANCE),
    worstAsymmetry: worst,
  };
}

/**
 * Largest dense matrix (array or CSV rows) a file may describe, in entries: the sheet engine's
 * limit for one value (core/sheet/context.ts). Coordinate files and triplets are sparse and
 * bounded by the upload size only.
 */
export const UPLOAD_MAX_DENSE_ENTRIES = 4_000_000;

/**
 * Reads a matrix file with the engine's readers (the ones a matrix block's `from:` uses) and
 * describes it with `analyseParsedMatrix`.
 *
 * Throws `EngineError` MATRIX_FILE_INVALID (or the reader's code, e.g. MATRIX_NOT_FINITE) with
 * `details.line` (1-based; 0 for the file as a whole) when the text is not a matrix or a dense
 * layout holds more than `maxDenseEntries`.
 *
 * @example
 * describeMatrixText('1,2\n2,5\n', 'csv', 'K.csv').symmetric // → true
 */
export function describeMatrixText(
  text: string,
  format: 'matrix-market' | 'csv',
  name: string,
  options: { maxDenseEntries?: number } = {},
): MatrixAnalysis {
  const parsed =
    format === 'matrix-market' ? parseMatrixMarket(text, name) : parseCsvMatrix(text, name);
  const limit = options.maxDenseEntries ?? UPLOAD_MAX_DENSE_ENTRIES;
  const dense = parsed.format === 'array' || parsed.format === 'csv-dense';
  if (dense && parsed.rows * parsed.cols > limit) {
    throw new EngineError(
      'MATRIX_FILE_INVALID',
      `${name}: a ${parsed.rows} × ${parsed.cols} matrix is larger than the ${limit.toLocaleString('en')} entries a sheet may hold`,
      { line: 0 },
    );
  }
  return analyseParsedMatrix(parsed);
}
