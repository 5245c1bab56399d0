/**
 * Dense symmetric matrices: checks, products and the dense factorizations (Cholesky, LDLᵀ).
 * Algorithms: Golub & Van Loan, *Matrix Computations*, 4th ed., §4.1–4.2 (LDLᵀ and Cholesky
 * without pivoting, inertia by Sylvester's law).
 */
import { EngineError } from '../errors';
import type { DenseMatrix, SymmetricFactorization } from './types';

/** Relative size below which a pivot counts as zero (pivot / original diagonal). Common practice. */
export const ZERO_PIVOT_TOLERANCE = 1e-13;

/**
 * A new n × n dense matrix of zeros.
 * @example const A = denseZeros(3);
 */
export function denseZeros(rows: number, cols: number = rows): DenseMatrix {
  return { kind: 'dense', rows, cols, data: new Float64Array(rows * cols) };
}

/**
 * Checks that a dense matrix is square, finite and symmetric. Entries that differ from their mirror
 * by no more than `relTol` × max(|a_ij|, |a_ji|) (default 1e-9, enough for files written with ~10
 * significant digits) are accepted.
 * @param name how the matrix is called in messages, e.g. 'K'.
 * @throws EngineError MATRIX_NOT_SQUARE, MATRIX_NOT_FINITE or MATRIX_NOT_SYMMETRIC naming the
 *   1-based row and column.
 * @example assertDenseSymmetric(K, 'K');
 */
export function assertDenseSymmetric(A: DenseMatrix, name: string, relTol = 1e-9): void {
  if (A.rows !== A.cols) {
    throw new EngineError(
      'MATRIX_NOT_SQUARE',
      `${name} is ${A.rows} × ${A.cols}; a stiffness or mass matrix must be square.`,
      { rows: A.rows, cols: A.cols },
    );
  }
  const n = A.rows;
  const d = A.data;
  let maxAbs = 0;
  for (let p = 0; p < d.length; p++) {
    const v = d[p] as number;
    if (!Number.isFinite(v)) {
      const i = Math.floor(p / n);
      const j = p % n;
      throw new EngineError(
        'MATRIX_NOT_FINITE',
        `${name}[${i + 1},${j + 1}] is ${v}; every entry must be a finite number.`,
        { row: i + 1, col: j + 1 },
      );
    }
    if (Math.abs(v) > maxAbs) maxAbs = Math.abs(v);
  }
  const floor = maxAbs * 1e-14;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < i; j++) {
      const a = d[i * n + j] as number;
      const b = d[j * n + i] as number;
      const diff = Math.abs(a - b);
      if (diff > floor && diff > relTol * Math.max(Math.abs(a), Math.abs(b))) {
        throw new EngineError(
          'MATRIX_NOT_SYMMETRIC',
          `${name} is not symmetric: ${name}[${i + 1},${j + 1}] = ${a} but ${name}[${j + 1},${i + 1}] = ${b} (difference ${diff.toPrecision(3)}).`,
          { row: i + 1, col: j + 1, difference: diff },
        );
      }
    }
  }
}

function zeroPivot(dof: number, pivot: number, method: string): EngineError {
  return new EngineError(
    'ZERO_PIVOT',
    `The ${method} factorization met a zero pivot at DOF ${dof} (pivot ${pivot.toPrecision(3)}): the matrix is singular there — check supports and connectivity at that DOF.`,
    { dof, pivot },
  );
}

/**
 * Dense LDLᵀ without pivoting of a symmetric matrix (lower triangle read). Reports the inertia
 * (`negativePivots`), which for K − σM is the Sturm count of eigenvalues below σ.
 * Golub & Van Loan, §4.1.2.
 * @throws EngineError ZERO_PIVOT with `details.dof` (1-based) when |d_j| ≤ 1e-13 |a_jj|.
 * @example denseLDLT(K).solve(f)
 */
export function denseLDLT(A: DenseMatrix): SymmetricFactorization {
  const n = A.rows;
  const L = new Float64Array(n * n);
  const D = new Float64Array(n);
  const a = A.data;
  const w = new Float64Array(n);
  let neg = 0;
  for (let j = 0; j < n; j++) {
    // w_k = L_jk d_k for k < j
    let djj = a[j * n + j] as number;
    const lj = j * n;
    for (let k = 0; k < j; k++) {
      const l = L[lj + k] as number;
      w[k] = l * (D[k] as number);
      djj -= l * (w[k] as number);
    }
    const scale = Math.max(Math.abs(a[j * n + j] as number), 1e-300);
    if (!(Math.abs(djj) > ZERO_PIVOT_TOLERANCE * scale)) throw zeroPivot(j + 1, djj, 'LDLᵀ');
    D[j] = djj;
    if (djj < 0) neg++;
    for (let i = j + 1; i < n; i++) {
      let s = a[i * n + j] as number;
      const li = i * n;
      for (let k = 0; k < j; k++) s -= (L[li + k] as number) * (w[k] as number);
      L[li + j] = s / djj;
    }
    L[lj + j] = 1;
  }
  return {
    n,
    method: 'dense-ldlt',
    negativePivots: neg,
    factorNonzeros: (n * (n + 1)) / 2,
    solve(b: Float64Array, out?: Float64Array): Float64Array {
      const x = out ?? new Float64Array(n);
      if (x !== b) x.set(b);
      for (let i = 0; i < n; i++) {
        let s = x[i] as number;
        const li = i * n;
        for (let k = 0; k < i; k++) s -= (L[li + k] as number) * (x[k] as number);
        x[i] = s;
      }
      for (let i = 0; i < n; i++) x[i] = (x[i] as number) / (D[i] as number);
      for (let i = n - 1; i >= 0; i--) {
        const xi = x[i] as number;
        const li = i * n;
        for (let k = 0; k < i; k++) x[k] = (x[k] as number) - (L[li + k] as number) * xi;
      }
      return x;
    },
  };
}

/**
 * A dense Cholesky factor A = L Lᵀ, L lower triangular row-major, with its profile: row i of L is
 * zero left of column `first[i]`.
 */
export interface CholeskyFactor {
  readonly n: number;
  readonly L: Float64Array;
  readonly first: Int32Array;
}

/**
 * Dense Cholesky A = L Lᵀ (Golub & Van Loan, Algorithm 4.2.1 in outer-product form).
 * @throws EngineError ZERO_PIVOT (`details.dof`, `details.pivot`) when a pivot is ≤ 1e-13 a_jj;
 *   a negative pivot carries `details.negative = true`.
 * `out`, when given, is a zeroed n × n array L is written to.
 * @example const { L } = denseCholesky(M);
 */
export function denseCholesky(A: DenseMatrix, out?: Float64Array): CholeskyFactor {
  const n = A.rows;
  const L = out ?? new Float64Array(n * n);
  const a = A.data;
  // The factor keeps the profile of A (Golub & Van Loan §4.3.5): row i of L is zero left of the
  // first nonzero of row i of A, so the sums below start there. Only exact zeros are skipped: the
  // result is the same as without the profile, and a banded A costs O(n b²) instead of O(n³).
  const first = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    let f = i;
    for (let j = 0; j < i; j++) {
      if ((a[i * n + j] as number) !== 0) {
        f = j;
        break;
      }
    }
    first[i] = f;
    for (let j = f; j <= i; j++) L[i * n + j] = a[i * n + j] as number;
  }
  for (let j = 0; j < n; j++) {
    const lj = j * n;
    const fj = first[j] as number;
    let s = L[lj + j] as number;
    for (let k = fj; k < j; k++) s -= (L[lj + k] as number) ** 2;
    const scale = Math.max(Math.abs(a[lj + j] as number), 1e-300);
    if (!(s > ZERO_PIVOT_TOLERANCE * scale)) {
      const e = zeroPivot(j + 1, s, 'Cholesky');
      (e.details as Record<string, unknown>).negative = s < 0;
      throw e;
    }
    const d = Math.sqrt(s);
    L[lj + j] = d;
    for (let i = j + 1; i < n; i++) {
      const fi = first[i] as number;
      if (fi > j) continue;
      const li = i * n;
      let t = L[li + j] as number;
      for (let k = fi > fj ? fi : fj; k < j; k++)
        t -= (L[li + k] as number) * (L[lj + k] as number);
      L[li + j] = t / d;
    }
  }
  return { n, L, first };
}

/**
 * Dense Cholesky as a `SymmetricFactorization` (negativePivots is always 0).
 * @throws EngineError ZERO_PIVOT as `denseCholesky`.
 * @example denseCholeskyFactorization(M).solve(b)
 */
export function denseCholeskyFactorization(A: DenseMatrix): SymmetricFactorization {
  const { n, L, first } = denseCholesky(A);
  return {
    n,
    method: 'dense-cholesky',
    negativePivots: 0,
    factorNonzeros: (n * (n + 1)) / 2,
    solve(b: Float64Array, out?: Float64Array): Float64Array {
      const x = out ?? new Float64Array(n);
      if (x !== b) x.set(b);
      solveLowerInPlace(L, n, x, first);
      solveLowerTransposeInPlace(L, n, x, first);
      return x;
    },
  };
}

/**
 * Solves L x = b in place (L lower triangular, row-major n × n); with `first`, row i's sum starts
 * at its profile, so a band width b costs O(n b).
 */
export function solveLowerInPlace(
  L: Float64Array,
  n: number,
  x: Float64Array,
  first?: Int32Array,
): void {
  for (let i = 0; i < n; i++) {
    let s = x[i] as number;
    const li = i * n;
    for (let k = first ? (first[i] as number) : 0; k < i; k++) {
      s -= (L[li + k] as number) * (x[k] as number);
    }
    x[i] = s / (L[li + i] as number);
  }
}

/** Solves Lᵀ x = b in place (L lower triangular, row-major n × n; `first` as above). */
export function solveLowerTransposeInPlace(
  L: Float64Array,
  n: number,
  x: Float64Array,
  first?: Int32Array,
): void {
  for (let i = n - 1; i >= 0; i--) {
    const li = i * n;
    const xi = (x[i] as number) / (L[li + i] as number);
    x[i] = xi;
    for (let k = first ? (first[i] as number) : 0; k < i; k++) {
      x[k] = (x[k] as number) - (L[li + k] as number) * xi;
    }
  }
}
