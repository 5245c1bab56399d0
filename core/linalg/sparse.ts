/**
 * Sparse symmetric matrices (lower triangle, compressed sparse column) and the products every
 * method needs. Construction from triplets follows the usual assembly rule of the finite element
 * method: entries from either triangle are accepted and mirrored into the lower one, duplicates
 * are summed (common practice).
 */
import { EngineError } from '../errors';
import type { DenseMatrix, SparseSymmetricMatrix, SymmetricMatrix } from './types';

/**
 * Builds a sparse symmetric matrix from triplets (0-based indices). An entry (i, j) with i < j is
 * stored as (j, i); duplicates are summed; row indices are sorted within each column; explicit
 * zeros are kept (they belong to the pattern).
 *
 * @throws EngineError MATRIX_SIZE_MISMATCH when the three arrays differ in length,
 *   MATRIX_FILE_INVALID when an index lies outside 0..n-1, MATRIX_NOT_FINITE for NaN/Inf values.
 * @example
 * const K = sparseSymmetricFromTriplets(2, [0, 1, 1], [0, 0, 1], [2, -1, 2]);
 */
export function sparseSymmetricFromTriplets(
  n: number,
  rows: ArrayLike<number>,
  cols: ArrayLike<number>,
  values: ArrayLike<number>,
): SparseSymmetricMatrix {
  if (!Number.isInteger(n) || n < 0) {
    throw new EngineError(
      'INVALID_OPTION',
      `The matrix size must be a whole number ≥ 0, got ${n}.`,
    );
  }
  const nnzIn = rows.length;
  if (cols.length !== nnzIn || values.length !== nnzIn) {
    throw new EngineError(
      'MATRIX_SIZE_MISMATCH',
      `Triplet arrays differ in length: ${rows.length} rows, ${cols.length} columns, ${values.length} values.`,
    );
  }
  const r = new Int32Array(nnzIn);
  const c = new Int32Array(nnzIn);
  const counts = new Int32Array(n + 1);
  for (let k = 0; k < nnzIn; k++) {
    const i = rows[k] as number;
    const j = cols[k] as number;
    const v = values[k] as number;
    if (!Number.isInteger(i) || !Number.isInteger(j) || i < 0 || j < 0 || i >= n || j >= n) {
      throw new EngineError(
        'MATRIX_FILE_INVALID',
        `Entry ${k + 1} has index (${i + 1}, ${j + 1}) outside a ${n} × ${n} matrix (indices are 1-based here).`,
        { entry: k + 1, row: i + 1, col: j + 1 },
      );
    }
    if (!Number.isFinite(v)) {
      throw new EngineError(
        'MATRIX_NOT_FINITE',
        `Entry ${k + 1} at (${i + 1}, ${j + 1}) is ${v}; every entry must be a finite number.`,
        { entry: k + 1, row: i + 1, col: j + 1 },
      );
    }
    const lo = i >= j ? i : j; // row in lower triangle
    const hi = i >= j ? j : i; // column
    r[k] = lo;
    c[k] = hi;
    counts[hi + 1] = (counts[hi + 1] as number) + 1;
  }
  for (let j = 0; j < n; j++) counts[j + 1] = (counts[j + 1] as number) + (counts[j] as number);
  // bucket by column
  const next = counts.slice(0, n);
  const rb = new Int32Array(nnzIn);
  const vb = new Float64Array(nnzIn);
  for (let k = 0; k < nnzIn; k++) {
    const j = c[k] as number;
    const p = next[j] as number;
    next[j] = p + 1;
    rb[p] = r[k] as number;
    vb[p] = values[k] as number;
  }
  // sort each column by row (files and generators almost always list them in order: checked
  // first, sorted only when not) and sum duplicates
  const colPtr = new Int32Array(n + 1);
  const outRows = new Int32Array(nnzIn);
  const outVals = new Float64Array(nnzIn);
  let q = 0;
  for (let j = 0; j < n; j++) {
    const start = counts[j] as number;
    const end = counts[j + 1] as number;
    let sorted = true;
    for (let p = start + 1; p < end && sorted; p++)
      sorted = (rb[p - 1] as number) <= (rb[p] as number);
    if (!sorted) sortColumn(rb, vb, start, end);
    let last = -1;
    for (let p = start; p < end; p++) {
      const i = rb[p] as number;
      if (i === last) {
        outVals[q - 1] = (outVals[q - 1] as number) + (vb[p] as number);
      } else {
        outRows[q] = i;
        outVals[q] = vb[p] as number;
        q++;
        last = i;
      }
    }
    colPtr[j + 1] = q;
  }
  return {
    kind: 'sparse-symmetric',
    n,
    colPtr,
    rowIdx: q === nnzIn ? outRows : outRows.slice(0, q),
    values: q === nnzIn ? outVals : outVals.slice(0, q),
  };
}

/**
 * Sorts rows[start, end) ascending, carrying values along; stable, so duplicates are summed in
 * the order they were given.
 */
function sortColumn(rows: Int32Array, values: Float64Array, start: number, end: number): void {
  const idx: number[] = [];
  for (let p = start; p < end; p++) idx.push(p);
  idx.sort((a, b) => (rows[a] as number) - (rows[b] as number) || a - b);
  const r = idx.map((p) => rows[p] as number);
  const v = idx.map((p) => values[p] as number);
  for (let k = 0; k < r.length; k++) {
    rows[start + k] = r[k] as number;
    values[start + k] = v[k] as number;
  }
}

/**
 * Size n of a square symmetric matrix in either storage.
 * @example matrixSize(denseFromRows([[1, 0], [0, 1]])) // 2
 */
export function matrixSize(A: SymmetricMatrix | DenseMatrix): number {
  return A.kind === 'dense' ? A.rows : A.n;
}

/**
 * Dense row-major matrix from an array of rows.
 * @throws EngineError MATRIX_SIZE_MISMATCH when rows differ in length, MATRIX_NOT_FINITE for NaN/Inf.
 * @example denseFromRows([[2, -1], [-1, 2]])
 */
export function denseFromRows(rows: number[][]): DenseMatrix {
  const m = rows.length;
  const n = m === 0 ? 0 : (rows[0] as number[]).length;
  const data = new Float64Array(m * n);
  for (let i = 0; i < m; i++) {
    const row = rows[i] as number[];
    if (row.length !== n) {
      throw new EngineError(
        'MATRIX_SIZE_MISMATCH',
        `Row ${i + 1} has ${row.length} entries but row 1 has ${n}.`,
        { row: i + 1 },
      );
    }
    for (let j = 0; j < n; j++) {
      const v = row[j] as number;
      if (!Number.isFinite(v)) {
        throw new EngineError(
          'MATRIX_NOT_FINITE',
          `Entry (${i + 1}, ${j + 1}) is ${v}; every entry must be a finite number.`,
          { row: i + 1, col: j + 1 },
        );
      }
      data[i * n + j] = v;
    }
  }
  return { kind: 'dense', rows: m, cols: n, data };
}

/**
 * y = A x for a symmetric matrix in either storage (dense: all entries used as stored).
 * @example symmetricMultiply(K, phi) // K φ
 */
export function symmetricMultiply(
  A: SymmetricMatrix,
  x: Float64Array,
  out?: Float64Array,
): Float64Array {
  const n = matrixSize(A);
  if (x.length !== n) {
    throw new EngineError(
      'MATRIX_SIZE_MISMATCH',
      `Vector has ${x.length} entries but the matrix is ${n} × ${n}.`,
    );
  }
  const y = out ?? new Float64Array(n);
  if (A.kind === 'dense') {
    const d = A.data;
    for (let i = 0; i < n; i++) {
      let s = 0;
      const o = i * n;
      for (let j = 0; j < n; j++) s += (d[o + j] as number) * (x[j] as number);
      y[i] = s;
    }
    return y;
  }
  y.fill(0);
  const { colPtr, rowIdx, values } = A;
  for (let j = 0; j < n; j++) {
    const xj = x[j] as number;
    let s = 0;
    const end = colPtr[j + 1] as number;
    for (let p = colPtr[j] as number; p < end; p++) {
      const i = rowIdx[p] as number;
      const v = values[p] as number;
      if (i === j) {
        s += v * xj;
      } else {
        y[i] = (y[i] as number) + v * xj;
        s += v * (x[i] as number);
      }
    }
    y[j] = (y[j] as number) + s;
  }
  return y;
}
