/**
 * Eigenvalues and eigenvectors of a dense symmetric matrix: Householder tridiagonalization with
 * the transformation accumulated (the `tred2` procedure of Wilkinson & Reinsch, *Handbook for
 * Automatic Computation* vol. II, 1971, II/2), then the implicit QL iteration (`./tridiagonal-ql`).
 */
import type { DenseMatrix } from '../../linalg/types';
import { tridiagonalQL } from './tridiagonal-ql';

/**
 * Eigenvalues (ascending) and orthonormal eigenvectors of a dense symmetric matrix.
 * `vectors[k]` is the eigenvector of `values[k]`.
 * @throws NoConvergenceError when the QL iteration exceeds 60 sweeps for one eigenvalue.
 * @example const { values, vectors } = symmetricEigen(denseFromRows([[2, 1], [1, 2]]));
 */
export function symmetricEigen(A: DenseMatrix): { values: Float64Array; vectors: Float64Array[] } {
  const n = A.rows;
  const V = Float64Array.from(A.data); // A is symmetric: its transpose is itself
  const d = new Float64Array(n);
  const e = new Float64Array(n);
  if (n === 0) return { values: d, vectors: [] };
  tred2(n, V, d, e);
  // tred2 works on the transpose (contiguous inner loops) and leaves Qᵀ in V; the QL sweeps want
  // Q row-major with one column per eigenvector.
  const Z = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) Z[j * n + i] = V[i * n + j] as number;
  for (let i = 1; i < n; i++) e[i - 1] = e[i] as number;
  tridiagonalQL(d, e, Z, n);
  const order = Array.from({ length: n }, (_, k) => k).sort(
    (a, b) => (d[a] as number) - (d[b] as number),
  );
  const values = new Float64Array(n);
  const vectors: Float64Array[] = [];
  order.forEach((k, r) => {
    values[r] = d[k] as number;
    const v = new Float64Array(n);
    for (let i = 0; i < n; i++) v[i] = Z[i * n + k] as number;
    vectors.push(v);
  });
  return { values, vectors };
}

export function tred2(n: number, V: Float64Array, d: Float64Array, e: Float64Array): void {
  for (let j = 0; j < n; j++) d[j] = V[j * n + (n - 1)] as number;
  for (let i = n - 1; i > 0; i--) {
    let scale = 0;
    let h = 0;
    for (let k = 0; k < i; k++) scale += Math.abs(d[k] as number);
    if (scale === 0) {
      e[i] = d[i - 1] as number;
      for (let j = 0; j < i; j++) {
        d[j] = V[j * n + (i - 1)] as number;
        V[j * n + i] = 0;
        V[i * n + j] = 0;
      }
    } else {
      for (let k = 0; k < i; k++) {
        d[k] = (d[k] as number) / scale;
        h += (d[k] as number) ** 2;
      }
      let f = d[i - 1] as number;
      let g = Math.sqrt(h);
      if (f > 0) g = -g;
      e[i] = scale * g;
      h -= f * g;
      d[i - 1] = f - g;
      for (let j = 0; j < i; j++) e[j] = 0;
      for (let j = 0; j < i; j++) {
        f = d[j] as number;
        V[i * n + j] = f;
        g = (e[j] as number) + (V[j * n + j] as number) * f;
        for (let k = j + 1; k <= i - 1; k++) {
          const vkj = V[j * n + k] as number;
          g += vkj * (d[k] as number);
          e[k] = (e[k] as number) + vkj * f;
        }
        e[j] = g;
      }
      f = 0;
      for (let j = 0; j < i; j++) {
        e[j] = (e[j] as number) / h;
        f += (e[j] as number) * (d[j] as number);
      }
      const hh = f / (h + h);
      for (let j = 0; j < i; j++) e[j] = (e[j] as number) - hh * (d[j] as number);
      for (let j = 0; j < i; j++) {
        f = d[j] as number;
        g = e[j] as number;
        for (let k = j; k <= i - 1; k++) {
          V[j * n + k] = (V[j * n + k] as number) - (f * (e[k] as number) + g * (d[k] as number));
        }
        d[j] = V[j * n + (i - 1)] as number;
        V[j * n + i] = 0;
      }
    }
    d[i] = h;
  }
  for (let i = 0; i < n - 1; i++) {
    V[i * n + (n - 1)] = V[i * n + i] as number;
    V[i * n + i] = 1;
    const h = d[i + 1] as number;
    if (h !== 0) {
      for (let k = 0; k <= i; k++) d[k] = (V[(i + 1) * n + k] as number) / h;
      for (let j = 0; j <= i; j++) {
        let g = 0;
        for (let k = 0; k <= i; k++) g += (V[(i + 1) * n + k] as number) * (V[j * n + k] as number);
        for (let k = 0; k <= i; k++) V[j * n + k] = (V[j * n + k] as number) - g * (d[k] as number);
      }
    }
    for (let k = 0; k <= i; k++) V[(i + 1) * n + k] = 0;
  }
  for (let j = 0; j < n; j++) {
    d[j] = V[j * n + (n - 1)] as number;
    V[j * n + (n - 1)] = 0;
  }
  V[(n - 1) * n + (n - 1)] = 1;
  e[0] = 0;
}
