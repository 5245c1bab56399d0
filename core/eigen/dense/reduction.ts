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
import {
  DENSE_PARTS,
  type DenseTask,
  type DenseTeam,
  evenSplit,
  SERIAL_TEAM,
  SPLIT_MIN,
  transposePart,
  triangleSplit,
} from './team';

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
 * The permuted dense copy P A Pᵀ (row-major, both triangles): entry (i, j) is A[perm[i], perm[j]],
 * in an array of `team`'s.
 * @example const Kp = permutedDense(K, ord);
 */
export function permutedDense(
  A: SymmetricMatrix,
  ord: BandOrdering,
  team: DenseTeam = SERIAL_TEAM,
): Float64Array {
  const { n, perm } = ord;
  const inv = new Int32Array(n);
  for (let k = 0; k < n; k++) inv[perm[k] as number] = k;
  const out = team.shared(n * n);
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
 * Cholesky of the permuted matrix B (row-major n × n), L in an array of `team`'s. A zero or
 * negative pivot is rethrown with the DOF in the caller's numbering.
 * @throws EngineError ZERO_PIVOT (`details.dof` 1-based original DOF, `details.negative`).
 * @example const F = profileCholesky(Mp, ord);
 */
export function profileCholesky(
  B: Float64Array,
  ord: BandOrdering,
  team: DenseTeam = SERIAL_TEAM,
): ProfileFactor {
  const n = ord.n;
  try {
    return denseCholesky({ kind: 'dense', rows: n, cols: n, data: B }, team.shared(n * n));
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
 * C is made by `team.shared`, so that the steps after can share it with the team's threads.
 * @example const C = congruence(F, Kp);
 */
export function congruence(
  F: ProfileFactor,
  A: Float64Array,
  team: DenseTeam = SERIAL_TEAM,
): Float64Array {
  const { n, L, first } = F;
  const X = A;
  // reach[i]: one past the last column any of rows 0 … i of A has a nonzero in
  const reach = team.shared(n);
  let r = 0;
  for (let i = 0; i < n; i++) {
    const o = i * n;
    let last = n - 1;
    while (last >= r && (X[o + last] as number) === 0) last--;
    r = Math.max(r, last + 1, i + 1);
    reach[i] = r;
  }
  const firsts = team.shared(n);
  for (let i = 0; i < n; i++) firsts[i] = first[i] as number;
  // Both solves run down the rows and are independent column by column: the parts are runs of
  // columns, cut where the work halves (column j of X = L⁻¹ A takes about n − j row operations,
  // column j of C about j).
  const parts = n >= 2 * SPLIT_MIN ? DENSE_PARTS : 1;
  team.run(
    'congruenceLeft',
    congruenceLeftPart,
    parts,
    [L, firsts, reach, X],
    [n, ...triangleSplit(0, n, n, parts, 4)],
  );
  // C(i, j ≥ i) starts as Xᵀ(i, j) = X(j, i)
  const C = team.shared(n * n);
  team.run('transpose', transposePart, parts, [X, C], [n, 1, ...triangleSplit(0, n, n, parts, 32)]);
  const right = [0];
  for (let p = 1; p < parts; p++) right.push(Math.round((n * Math.sqrt(p / parts)) / 4) * 4);
  right.push(n);
  team.run('congruenceRight', congruenceRightPart, parts, [L, firsts, C], [n, ...right]);
  return C;
}

/** Columns [bounds[part], bounds[part + 1]) of X = L⁻¹ X, row by row (see `congruence`). */
export const congruenceLeftPart: DenseTask = (part, [L, first, reach, X], [n, ...bounds]) => {
  const l = L as Float64Array;
  const f = first as Float64Array;
  const rc = reach as Float64Array;
  const x = X as Float64Array;
  const size = n as number;
  const c0 = bounds[part] as number;
  const c1 = bounds[part + 1] as number;
  for (let i = 0; i < size; i++) {
    const xi = i * size;
    for (let k = f[i] as number; k < i; k++) {
      const lik = l[xi + k] as number;
      if (lik === 0) continue;
      const xk = k * size;
      // row k is zero from reach[k] on
      rowAxpy(x, xi, -lik, xk, c0, Math.min(c1, rc[k] as number));
    }
    rowScale(x, xi, 1 / (l[xi + i] as number), c0, Math.min(c1, rc[i] as number));
  }
};

// The row operations of the solves below, as small functions: the JIT optimizes them after a few
// calls, where a loop inside a task that runs once per solve would wait for on-stack replacement.

/** a[o + j] += s · a[src + j] for j0 ≤ j < j1. */
function rowAxpy(a: Float64Array, o: number, s: number, src: number, j0: number, j1: number): void {
  for (let j = j0; j < j1; j++) a[o + j] = (a[o + j] as number) + s * (a[src + j] as number);
}

/** a[o + j] *= s for j0 ≤ j < j1. */
function rowScale(a: Float64Array, o: number, s: number, j0: number, j1: number): void {
  for (let j = j0; j < j1; j++) a[o + j] = (a[o + j] as number) * s;
}

/** Columns [bounds[part], bounds[part + 1]) of the upper triangle of C = L⁻¹ C, row by row. */
export const congruenceRightPart: DenseTask = (part, [L, first, C], [n, ...bounds]) => {
  const l = L as Float64Array;
  const f = first as Float64Array;
  const c = C as Float64Array;
  const size = n as number;
  const c0 = bounds[part] as number;
  const c1 = bounds[part + 1] as number;
  for (let i = 0; i < c1; i++) {
    const ci = i * size;
    const j0 = Math.max(i, c0);
    for (let k = f[i] as number; k < i; k++) {
      const lik = l[ci + k] as number;
      if (lik === 0) continue;
      rowAxpy(c, ci, -lik, k * size, j0, c1);
    }
    rowScale(c, ci, 1 / (l[ci + i] as number), j0, c1);
  }
};

/**
 * X = L⁻ᵀ Z in place for every column of Z (row-major n × n): the back-substitution of all
 * eigenvectors at once, as row operations over contiguous memory.
 * @example backSubstituteColumns(F, Z);
 */
export function backSubstituteColumns(
  F: ProfileFactor,
  Z: Float64Array,
  team: DenseTeam = SERIAL_TEAM,
): void {
  const { n, L, first } = F;
  // each column is its own solve: the parts are runs of columns
  const parts = n >= 2 * SPLIT_MIN ? DENSE_PARTS : 1;
  const firsts = team.shared(n);
  for (let i = 0; i < n; i++) firsts[i] = first[i] as number;
  team.run(
    'backSubstitute',
    backSubstitutePart,
    parts,
    [L, firsts, Z],
    [n, ...evenSplit(0, n, parts, 4)],
  );
}

/** Columns [bounds[part], bounds[part + 1]) of `backSubstituteColumns`. */
export const backSubstitutePart: DenseTask = (part, [L, first, Z], [n, ...bounds]) => {
  const l = L as Float64Array;
  const f = first as Float64Array;
  const z = Z as Float64Array;
  const size = n as number;
  const c0 = bounds[part] as number;
  const c1 = bounds[part + 1] as number;
  for (let i = size - 1; i >= 0; i--) {
    const li = i * size;
    rowScale(z, li, 1 / (l[li + i] as number), c0, c1);
    for (let k = f[i] as number; k < i; k++) {
      const lik = l[li + k] as number;
      if (lik !== 0) rowAxpy(z, k * size, -lik, li, c0, c1);
    }
  }
};

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

/**
 * Columns `cols` of X, each scaled by `scale`, in the original numbering: `columnInOriginalOrder`
 * for many columns at once, read row by row in blocks of columns (a column walk of a row-major
 * matrix misses the cache on every entry).
 * @example const phis = columnsInOriginalOrder(ord, X, order.slice(0, 10), 1);
 */
export function columnsInOriginalOrder(
  ord: BandOrdering,
  X: Float64Array,
  cols: readonly number[],
  scale: number,
): Float64Array[] {
  const { n, perm } = ord;
  const out = cols.map(() => new Float64Array(n));
  const BLOCK = 32;
  for (let c0 = 0; c0 < cols.length; c0 += BLOCK) {
    const c1 = Math.min(cols.length, c0 + BLOCK);
    for (let k = 0; k < n; k++) {
      const row = k * n;
      const at = perm[k] as number;
      for (let c = c0; c < c1; c++) {
        (out[c] as Float64Array)[at] = (X[row + (cols[c] as number)] as number) * scale;
      }
    }
  }
  return out;
}
