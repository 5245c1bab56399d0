/**
 * The nonzero entries of a matrix too large to list in full (a model-scale sparse matrix, or a
 * matrix of entries beyond RESULT_MATRIX_LIMIT), as the results carry them for the editor's paged
 * table: row, column (1-based) and value in the matrix's display unit, column by column, at most
 * ENTRY_LIST_LIMIT of them. A symmetric sparse matrix lists its stored lower triangle.
 */
import type { SparseSymmetricMatrix } from '../linalg/types';
import type { MatrixEntries } from './types';

/**
 * Entries a result lists at most (200 pages of 50). About 35 bytes of JSON each, so a matrix adds
 * at most about 350 kB to the results however large the model.
 */
export const ENTRY_LIST_LIMIT = 10_000;

function noEntries(lowerTriangle: boolean): MatrixEntries {
  return { rows: [], cols: [], values: [], total: 0, nonzeros: 0, lowerTriangle };
}

/**
 * The nonzeros of a dense matrix of numbers, column by column (compressed-column order, the order
 * of a Matrix Market coordinate file), the first `limit` listed.
 * @example denseEntries([[2, 0], [-1, 3]]) // rows [1, 2, 2], cols [1, 1, 2], values [2, -1, 3]
 */
export function denseEntries(
  values: readonly (readonly number[])[],
  limit = ENTRY_LIST_LIMIT,
): MatrixEntries {
  const out = noEntries(false);
  const nr = values.length;
  const nc = values[0]?.length ?? 0;
  for (let j = 0; j < nc; j++) {
    for (let i = 0; i < nr; i++) {
      const x = values[i]![j]!;
      if (x === 0) continue;
      if (out.total < limit) {
        out.rows.push(i + 1);
        out.cols.push(j + 1);
        out.values.push(x);
      }
      out.total++;
    }
  }
  out.nonzeros = out.total;
  return out;
}

/**
 * The stored lower triangle of a sparse symmetric matrix (SI values divided by `unitInSi`, the SI
 * value of one display unit), column by column, the first `limit` listed; explicit zeros skipped.
 * @example sparseEntries(K, 1000) // K in kN/m from its N/m entries
 */
export function sparseEntries(
  A: SparseSymmetricMatrix,
  unitInSi = 1,
  limit = ENTRY_LIST_LIMIT,
): MatrixEntries {
  const out = noEntries(true);
  let diagonal = 0;
  for (let j = 0; j < A.n; j++) {
    for (let p = A.colPtr[j]!; p < A.colPtr[j + 1]!; p++) {
      const x = A.values[p]!;
      if (x === 0) continue;
      if (out.total < limit) {
        out.rows.push(A.rowIdx[p]! + 1);
        out.cols.push(j + 1);
        out.values.push(x / unitInSi);
      }
      out.total++;
      if (A.rowIdx[p] === j) diagonal++;
    }
  }
  out.nonzeros = 2 * out.total - diagonal;
  return out;
}
