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
import { denseCholesky } from '../../linalg/dense';
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
export interface ProfileFactor {
  readonly n: number;
  readonly L: Float64Array;
  readonly first: Int32Array;
}

/**
 * Cholesky of the permuted matrix B (row-major n × n). A zero or negative pivot is rethrown with
 * the DOF in the caller's numbering.
 * @throws EngineError ZERO_PIVOT (`details.dof` 1-based original DOF, `details.negative`).
 * @example const F = profileCholesky(Mp, ord);
 */
export function profileCholesky(B: Float64Array, ord: BandOrdering): ProfileFactor {
  const n = ord.n;
  let L: Float64Array;
  try {
    L = denseCholesky({ kind: 'dense', rows: n, cols: n, data: B }).L;
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
  const first = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    let f = i;
    for (let j = 0; j < i; j++) {
      if ((L[i * n + j] as number) !== 0) {
        f = j;
        break;
      }
    }
    first[i] = f;
  }
  return { n, L, first };
}

/** Solves L X = X in place for all n columns of X (row-major), using the profile of L. */
function forwardProfile(F: ProfileFactor, X: Float64Array): void {
  const { n, L, first } = F;
  for (let i = 0; i < n; i++) {
    const xi = i * n;
    const li = i * n;
    for (let k = first[i] as number; k < i; k++) {
      const lik = L[li + k] as number;
      if (lik === 0) continue;
      const xk = k * n;
      for (let j = 0; j < n; j++) X[xi + j] = (X[xi + j] as number) - lik * (X[xk + j] as number);
    }
    const r = 1 / (L[li + i] as number);
    for (let j = 0; j < n; j++) X[xi + j] = (X[xi + j] as number) * r;
  }
}

/**
 * C = L⁻¹ A L⁻ᵀ (row-major, symmetrized) for the permuted symmetric A.
 * @example const C = congruence(F, Kp);
 */
export function congruence(F: ProfileFactor, A: Float64Array): Float64Array {
  const n = F.n;
  const X = Float64Array.from(A);
  forwardProfile(F, X); // X = L⁻¹ A
  const Y = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) Y[j * n + i] = X[i * n + j] as number;
  forwardProfile(F, Y); // Y = L⁻¹ Xᵀ = L⁻¹ A L⁻ᵀ
  for (let i = 0; i < n; i++)
    for (let j = 0; j < i; j++) {
      const v = 0.5 * ((Y[i * n + j] as number) + (Y[j * n + i] as number));
      Y[i * n + j] = v;
      Y[j * n + i] = v;
    }
  return Y;
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
