/**
 * Eigenvalues and eigenvectors of a dense symmetric matrix: blocked Householder
 * tridiagonalization (`./tridiagonalize`), the eigenvectors of the tridiagonal matrix by inverse
 * iteration (`./tridiagonal-vectors`), and their back-transformation by the reflectors. When
 * inverse iteration does not converge for some vector, the implicit QL iteration with
 * accumulated rotations (`./tridiagonal-ql`) computes them instead.
 */
import type { DenseMatrix } from '../../linalg/types';
import { type DenseTeam, SERIAL_TEAM } from './team';
import { tridiagonalQL } from './tridiagonal-ql';
import { backTransform, tridiagonalize } from './tridiagonalize';
import { tridiagonalEigenvectors } from './tridiagonal-vectors';

/**
 * Eigenvalues (ascending) and orthonormal eigenvectors of a dense symmetric matrix.
 * `vectors[k]` is the eigenvector of `values[k]`.
 * @throws NoConvergenceError when the QL fallback exceeds 60 sweeps for one eigenvalue.
 * @example const { values, vectors } = symmetricEigen(denseFromRows([[2, 1], [1, 2]]));
 */
export function symmetricEigen(A: DenseMatrix): { values: Float64Array; vectors: Float64Array[] } {
  const n = A.rows;
  const { values, Z, order } = symmetricEigenColumns(A);
  const vectors: Float64Array[] = [];
  order.forEach((k) => {
    const v = new Float64Array(n);
    for (let i = 0; i < n; i++) v[i] = Z[i * n + k] as number;
    vectors.push(v);
  });
  return { values, vectors };
}

/**
 * `symmetricEigen` without the copying out: `values` ascending, Z (n × n, row-major) with the
 * eigenvector of `values[r]` in column `order[r]`. Only A's upper triangle is read.
 * `tridiagonalVectors: 'ql'` takes the fallback route from the start (for tests and comparisons);
 * `overwrite: true` lets it work in A's own storage instead of a copy; `team` shares the
 * reduction and the back-transformation with other threads (`./team`; the same result bit for
 * bit), which reach A's storage only when it came from `team.shared`.
 * @throws NoConvergenceError as `symmetricEigen`.
 * @example const { values, Z, order } = symmetricEigenColumns(A);
 */
export function symmetricEigenColumns(
  A: DenseMatrix,
  options: {
    tridiagonalVectors?: 'inverse-iteration' | 'ql';
    overwrite?: boolean;
    team?: DenseTeam;
  } = {},
): {
  values: Float64Array;
  Z: Float64Array;
  order: number[];
} {
  const n = A.rows;
  if (n === 0) return { values: new Float64Array(0), Z: new Float64Array(0), order: [] };
  const R = options.overwrite === true ? A.data : Float64Array.from(A.data);
  const team = options.team ?? SERIAL_TEAM;
  const { d, e, tau } = tridiagonalize(n, R, team);
  const sys = options.tridiagonalVectors === 'ql' ? null : tridiagonalEigenvectors(d, e, team);
  let values: Float64Array;
  let Z: Float64Array;
  let order: number[];
  if (sys) {
    ({ values, Z } = sys);
    order = Array.from({ length: n }, (_, k) => k);
  } else {
    ({ values, Z, order } = qlEigensystem(d, e));
  }
  backTransform(n, R, tau, Z, n, team);
  return { values, Z, order };
}

/** The tridiagonal eigensystem by QL with accumulated rotations, from the identity. */
function qlEigensystem(
  d0: Float64Array,
  e0: Float64Array,
): { values: Float64Array; Z: Float64Array; order: number[] } {
  const n = d0.length;
  const d = d0.slice();
  const e = new Float64Array(n);
  e.set(e0);
  const Z = new Float64Array(n * n);
  for (let i = 0; i < n; i++) Z[i * n + i] = 1;
  // The eigenvalues alone cost O(n²); used as shifts they let most eigenvalues converge in one
  // sweep (the "perfect shift" strategy, Parlett, *The Symmetric Eigenvalue Problem*, §8.9 —
  // from memory).
  const shifts = d.slice();
  tridiagonalQL(shifts, e.slice(), null, 0);
  shifts.sort();
  tridiagonalQL(d, e, Z, n, shifts);
  const order = Array.from({ length: n }, (_, k) => k).sort(
    (a, b) => (d[a] as number) - (d[b] as number),
  );
  const values = new Float64Array(n);
  order.forEach((k, r) => (values[r] = d[k] as number));
  return { values, Z, order };
}
