/**
 * The reduction of K φ = λ M φ to standard form, C = L⁻¹ A L⁻ᵀ with B = L Lᵀ (Golub & Van Loan,
 * *Matrix Computations*, 4th ed., §8.7.2), done in a band ordering so that it costs O(n² b)
 * instead of O(n³).
 *
 * Both matrices are first permuted with the reverse Cuthill–McKee ordering of their joint pattern
 * (`../../linalg/ordering`). The Cholesky factor keeps the profile of B (G&VL §4.3.5), so each
 * row of L has at most b nonzeros left of the diagonal; the two triangular solves of the
 * congruence and the back-substitution φ = L⁻ᵀ z then touch only those.
 */
import { EngineError } from '../../errors';
import {
  type CholeskyFactor,
  denseCholesky,
  solveLowerInPlace,
  solveLowerTransposeInPlace,
} from '../../linalg/dense';
import { combine, toSparse } from '../../linalg/factorize';
import { reverseCuthillMcKee } from '../../linalg/ordering';
import type { SymmetricMatrix } from '../../linalg/types';

/** A matrix pencil permuted into a band ordering: `perm[k]` is the original index of row k. */
export interface BandOrdering {
  readonly n: number;
  readonly perm: Int32Array;
}

/**
 * The reverse Cuthill–McKee ordering of the joint pattern of K and M.
 * @example const ord = bandOrdering(K, M);
 */
export function bandOrdering(K: SymmetricMatrix, M: SymmetricMatrix): BandOrdering {
  const pattern = combine(toSparse(K), 1, toSparse(M), 1);
  const perm = reverseCuthillMcKee(toSparse(pattern));
  return { n: perm.length, perm };
}

/**
 * The permuted dense copy P A Pᵀ (row-major, both triangles): entry (i, j) is A[perm[i], perm[j]].
 * @example const Kp = permutedDense(K, ord);
 */
export function permutedDense(A: SymmetricMatrix, ord: BandOrdering): Float64Array {
  const { n, perm } = ord;
  const inv = new Int32Array(n);
  for (let k = 0; k < n; k++) inv[perm[k] as number] = k;
  const out = new Float64Array(n * n);
  if (A.kind === 'dense') {
    const a = A.data;
    for (let i = 0; i < n; i++) {
      const src = (perm[i] as number) * n;
      const o = i * n;
      for (let j = 0; j < n; j++) out[o + j] = a[src + (perm[j] as number)] as number;
    }
    return out;
  }
  for (let j = 0; j < n; j++) {
    for (let p = A.colPtr[j] as number; p < (A.colPtr[j + 1] as number); p++) {
      const r = inv[A.rowIdx[p] as number] as number;
      const c = inv[j] as number;
      const v = A.values[p] as number;
      out[r * n + c] = v;
      out[c * n + r] = v;
    }
  }
  return out;
}

/** The Cholesky factor of a permuted matrix with the column of its first nonzero in each row. */
export type ProfileFactor = CholeskyFactor;

/**
 * Cholesky of the permuted matrix B (row-major n × n). A zero or negative pivot is rethrown with
 * the DOF in the caller's numbering.
 * @throws EngineError ZERO_PIVOT (`details.dof` 1-based original DOF, `details.negative`).
 * @example const F = profileCholesky(Mp, ord);
 */
export function profileCholesky(B: Float64Array, ord: BandOrdering): ProfileFactor {
  const n = ord.n;
  try {
    return denseCholesky({ kind: 'dense', rows: n, cols: n, data: B });
  } catch (e) {
    if (!(e instanceof EngineError) || e.code !== 'ZERO_PIVOT') throw e;
    const det = e.details ?? {};
    const dof = (ord.perm[(det.dof as number) - 1] as number) + 1;
    const pivot = det.pivot as number;
    throw new EngineError(
      'ZERO_PIVOT',
      `The Cholesky factorization met a zero pivot at DOF ${dof} (pivot ${pivot.toPrecision(3)}): the matrix is singular there — check supports and connectivity at that DOF.`,
      { dof, pivot, negative: det.negative === true },
    );
  }
}

/**
 * C = L⁻¹ A L⁻ᵀ for the permuted symmetric A (row-major; A is overwritten). Only the upper triangle of C (columns ≥
 * row) is computed; the lower one is left zero, and `symmetricEigenColumns` reads only the upper.
 *
 * Two triangular solves with L's profile, each limited to where its result can be nonzero:
 * X = L⁻¹ A has X(i, j) = 0 for j beyond the last column A reaches in rows 0 … i, and of
 * C = L⁻¹ Xᵀ only the upper triangle is wanted (row i needs rows k < i of C from column i on,
 * which they have). Each costs about n² b for a band width b, half of the full solves.
 * @example const C = congruence(F, Kp);
 */
export function congruence(F: ProfileFactor, A: Float64Array): Float64Array {
  const { n, L, first } = F;
  const X = A;
  // reach[i]: one past the last column any of rows 0 … i of A has a nonzero in
  const reach = new Int32Array(n);
  let r = 0;
  for (let i = 0; i < n; i++) {
    const o = i * n;
    let last = n - 1;
    while (last >= r && (X[o + last] as number) === 0) last--;
    r = Math.max(r, last + 1, i + 1);
    reach[i] = r;
  }
  for (let i = 0; i < n; i++) {
    const xi = i * n;
    const end = reach[i] as number;
    for (let k = first[i] as number; k < i; k++) {
      const lik = L[xi + k] as number;
      if (lik === 0) continue;
      const xk = k * n;
      // row k is zero from reach[k] ≤ end on
      const stop = reach[k] as number;
      for (let j = 0; j < stop; j++)
        X[xi + j] = (X[xi + j] as number) - lik * (X[xk + j] as number);
    }
    const inv = 1 / (L[xi + i] as number);
    for (let j = 0; j < end; j++) X[xi + j] = (X[xi + j] as number) * inv;
  }
  // C(i, j ≥ i) starts as Xᵀ(i, j) = X(j, i), copied in tiles (a plain column walk misses the
  // cache on every entry)
  const C = new Float64Array(n * n);
  const TILE = 32;
  for (let i0 = 0; i0 < n; i0 += TILE) {
    const i1 = Math.min(n, i0 + TILE);
    for (let j0 = i0; j0 < n; j0 += TILE) {
      const j1 = Math.min(n, j0 + TILE);
      for (let j = j0; j < j1; j++) {
        const xj = j * n;
        for (let i = i0; i < i1 && i <= j; i++) C[i * n + j] = X[xj + i] as number;
      }
    }
  }
  for (let i = 0; i < n; i++) {
    const ci = i * n;
    for (let k = first[i] as number; k < i; k++) {
      const lik = L[ci + k] as number;
      if (lik === 0) continue;
      const ck = k * n;
      for (let j = i; j < n; j++) C[ci + j] = (C[ci + j] as number) - lik * (C[ck + j] as number);
    }
    const inv = 1 / (L[ci + i] as number);
    for (let j = i; j < n; j++) C[ci + j] = (C[ci + j] as number) * inv;
  }
  return C;
}

/**
 * X = L⁻ᵀ Z in place for every column of Z (row-major n × n): the back-substitution of all
 * eigenvectors at once, as row operations over contiguous memory.
 * @example backSubstituteColumns(F, Z);
 */
export function backSubstituteColumns(F: ProfileFactor, Z: Float64Array): void {
  const { n, L, first } = F;
  for (let i = n - 1; i >= 0; i--) {
    const li = i * n;
    const zi = i * n;
    const r = 1 / (L[li + i] as number);
    for (let j = 0; j < n; j++) Z[zi + j] = (Z[zi + j] as number) * r;
    for (let k = first[i] as number; k < i; k++) {
      const lik = L[li + k] as number;
      if (lik === 0) continue;
      const zk = k * n;
      for (let j = 0; j < n; j++) Z[zk + j] = (Z[zk + j] as number) - lik * (Z[zi + j] as number);
    }
  }
}

/**
 * A solver for the original (unpermuted) A from the profile Cholesky factor of its permuted copy:
 * x = A⁻¹ b by L y = P b, Lᵀ z = y, x = Pᵀ z, each in O(n b).
 * @example const K = profileSolver(profileCholesky(permutedDense(K, ord), ord), ord); K.solve(b)
 */
export function profileSolver(
  F: ProfileFactor,
  ord: BandOrdering,
): { n: number; solve(b: Float64Array): Float64Array } {
  const { n, L, first } = F;
  const { perm } = ord;
  return {
    n,
    solve(b: Float64Array): Float64Array {
      const z = new Float64Array(n);
      for (let i = 0; i < n; i++) z[i] = b[perm[i] as number] as number;
      solveLowerInPlace(L, n, z, first);
      solveLowerTransposeInPlace(L, n, z, first);
      const x = new Float64Array(n);
      for (let i = 0; i < n; i++) x[perm[i] as number] = z[i] as number;
      return x;
    },
  };
}

/**
 * Column `col` of X scaled by `scale`, in the original numbering (undoes the band ordering).
 * @example const phi = columnInOriginalOrder(ord, X, order[0], 1);
 */
export function columnInOriginalOrder(
  ord: BandOrdering,
  X: Float64Array,
  col: number,
  scale: number,
): Float64Array {
  const n = ord.n;
  const phi = new Float64Array(n);
  for (let k = 0; k < n; k++) phi[ord.perm[k] as number] = (X[k * n + col] as number) * scale;
  return phi;
}
