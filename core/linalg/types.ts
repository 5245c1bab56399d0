/**
 * Plain-data matrix types shared by every part of the engine.
 *
 * - `DenseMatrix`: row-major, `data[i * cols + j]`.
 * - `SparseSymmetricMatrix`: the lower triangle (row >= col, diagonal included) in compressed
 *   sparse column form; row indices sorted within each column, no duplicates. Entry (i, j) with
 *   i >= j sits in `values[p]` for `p` in `colPtr[j] .. colPtr[j+1]-1` where `rowIdx[p] === i`.
 */
export interface DenseMatrix {
  readonly kind: 'dense';
  readonly rows: number;
  readonly cols: number;
  readonly data: Float64Array;
}

export interface SparseSymmetricMatrix {
  readonly kind: 'sparse-symmetric';
  readonly n: number;
  readonly colPtr: Int32Array;
  readonly rowIdx: Int32Array;
  readonly values: Float64Array;
}

/** A square symmetric matrix in either storage. Dense ones are checked for symmetry on entry. */
export type SymmetricMatrix = DenseMatrix | SparseSymmetricMatrix;

/**
 * A factorization A = L D Lᵀ (or Cholesky) of a symmetric matrix, with its inertia.
 * `negativePivots` is the number of d_i < 0, which by Sylvester's law of inertia equals the number
 * of negative eigenvalues of A (for A = K − σM with M positive definite: the eigenvalues below σ).
 */
export interface SymmetricFactorization {
  readonly n: number;
  readonly method: 'dense-cholesky' | 'dense-ldlt' | 'skyline-ldlt' | 'sparse-ldlt';
  readonly negativePivots: number;
  /** Stored nonzeros of the factor (a measure of fill). */
  readonly factorNonzeros: number;
  /** Solves A x = b. Writes into `out` when given; returns x. */
  solve(b: Float64Array, out?: Float64Array): Float64Array;
}
