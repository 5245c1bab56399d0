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
 * eigenvector of `values[r]` in column `order[r]`.
 * @throws NoConvergenceError as `symmetricEigen`.
 * @example const { values, Z, order } = symmetricEigenColumns(A);
 */
export function symmetricEigenColumns(A: DenseMatrix): {
  values: Float64Array;
  Z: Float64Array;
  order: number[];
} {
  const n = A.rows;
  const V = Float64Array.from(A.data); // A is symmetric: its transpose is itself
  const d = new Float64Array(n);
  const e = new Float64Array(n);
  if (n === 0) return { values: d, Z: new Float64Array(0), order: [] };
  tred2(n, V, d, e);
  // tred2 works on the transpose (contiguous inner loops) and leaves Qᵀ in V; the QL sweeps want
  // Q row-major with one column per eigenvector.
  const Z = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) Z[j * n + i] = V[i * n + j] as number;
  for (let i = 1; i < n; i++) e[i - 1] = e[i] as number;
  // The eigenvalues alone cost O(n²); used as shifts they let most eigenvalues converge in one
  // sweep, which halves the work on Z (the "perfect shift" strategy, Parlett, *The Symmetric
  // Eigenvalue Problem*, §8.9 — from memory).
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

export function tred2(n: number, V: Float64Array, d: Float64Array, e: Float64Array): void {
  if (n > 1) reduce(n, V, d, e);
  else d[0] = V[0] as number;
  accumulate(n, V, d);
  for (let j = 0; j < n; j++) {
    d[j] = V[j * n + (n - 1)] as number;
    V[j * n + (n - 1)] = 0;
  }
  V[(n - 1) * n + (n - 1)] = 1;
  e[0] = 0;
}

/**
 * The first half of tred2 (Householder reduction, steps i = n − 1 … 1 on the transposed storage),
 * with the same arithmetic as the Handbook's loops but one pass over the trailing matrix per step
 * instead of two: row j's share of step i's rank-two update is followed at once by its share of
 * step i − 1's product A u while the row is in cache. Column i − 1, which step i − 1's reflector
 * is made from, is updated first.
 * Leaves, as the Handbook does: e[i] the off-diagonal, d[i] = h of reflector i (stored in row i of
 * V, entries 0..i − 1), the reduced diagonal in V's diagonal.
 */
function reduce(n: number, V: Float64Array, d: Float64Array, e: Float64Array): void {
  const x = new Float64Array(n); // row i of the reduced matrix, left of the diagonal
  let u = new Float64Array(n); // reflector of step i, scaled
  let p = new Float64Array(n); // A u / h, then q = p − K u
  let u2 = new Float64Array(n);
  let p2 = new Float64Array(n);
  for (let j = 0; j < n; j++) x[j] = V[j * n + (n - 1)] as number;
  let i = n - 1;
  let h = prologue(n, V, i, x, u, p, e);
  let active = h > 0;
  if (active) for (let j = 0; j < i; j++) productRow(n, V, j, i, u, p);
  for (;;) {
    if (active) {
      let f = 0;
      for (let j = 0; j < i; j++) {
        p[j] = (p[j] as number) / h;
        f += (p[j] as number) * (u[j] as number);
      }
      const hh = f / (h + h);
      for (let j = 0; j < i; j++) p[j] = (p[j] as number) - hh * (u[j] as number);
    }
    const c = i - 1;
    const uc = u[c] as number;
    const pc = p[c] as number;
    for (let j = 0; j < i; j++) {
      if (active) {
        V[j * n + c] = (V[j * n + c] as number) - ((u[j] as number) * pc + (p[j] as number) * uc);
      }
      x[j] = V[j * n + c] as number;
    }
    d[i] = h;
    if (c === 0) {
      V[i] = 0;
      d[0] = x[0] as number;
      return;
    }
    const hNext = prologue(n, V, c, x, u2, p2, e);
    const activeNext = hNext > 0;
    for (let j = 0; j < c; j++) {
      const o = j * n;
      if (active && activeNext) {
        updateAndProductRow(n, V, j, c, u, p, u2, p2);
      } else if (active) {
        const f = u[j] as number;
        const g = p[j] as number;
        for (let k = j; k < c; k++) {
          V[o + k] = (V[o + k] as number) - (f * (p[k] as number) + g * (u[k] as number));
        }
      } else if (activeNext) {
        productRow(n, V, j, c, u2, p2);
      }
      V[o + i] = 0;
    }
    V[c * n + i] = 0;
    [u, u2] = [u2, u];
    [p, p2] = [p2, p];
    i = c;
    h = hNext;
    active = activeNext;
  }
}

/**
 * The start of step i: the reflector from x (row i), e[i], row i of V := the reflector; returns
 * h (0 when the row is already zero and the step is skipped).
 */
function prologue(
  n: number,
  V: Float64Array,
  i: number,
  x: Float64Array,
  u: Float64Array,
  p: Float64Array,
  e: Float64Array,
): number {
  let scale = 0;
  for (let k = 0; k < i; k++) scale += Math.abs(x[k] as number);
  if (scale === 0) {
    e[i] = x[i - 1] as number;
    for (let j = 0; j < i; j++) V[i * n + j] = 0;
    return 0;
  }
  let h = 0;
  for (let k = 0; k < i; k++) {
    u[k] = (x[k] as number) / scale;
    h += (u[k] as number) ** 2;
  }
  const f = u[i - 1] as number;
  let g = Math.sqrt(h);
  if (f > 0) g = -g;
  e[i] = scale * g;
  h -= f * g;
  u[i - 1] = f - g;
  for (let j = 0; j < i; j++) {
    p[j] = 0;
    V[i * n + j] = u[j] as number;
  }
  return h;
}

/**
 * Row j's share of step i's rank-two update A −= u qᵀ + q uᵀ (u, q = p) and, in the same loop
 * over the row, its share of the next step's product p2 = A u2 over the leading c × c block.
 */
function updateAndProductRow(
  n: number,
  V: Float64Array,
  j: number,
  c: number,
  u: Float64Array,
  p: Float64Array,
  u2: Float64Array,
  p2: Float64Array,
): void {
  const o = j * n;
  const f = u[j] as number;
  const g = p[j] as number;
  const f2 = u2[j] as number;
  const vjj = (V[o + j] as number) - (f * (p[j] as number) + g * (u[j] as number));
  V[o + j] = vjj;
  let g0 = (p2[j] as number) + vjj * f2;
  let g1 = 0;
  let k = j + 1;
  for (; k + 1 < c; k += 2) {
    const v0 = (V[o + k] as number) - (f * (p[k] as number) + g * (u[k] as number));
    const v1 = (V[o + k + 1] as number) - (f * (p[k + 1] as number) + g * (u[k + 1] as number));
    V[o + k] = v0;
    V[o + k + 1] = v1;
    g0 += v0 * (u2[k] as number);
    g1 += v1 * (u2[k + 1] as number);
    p2[k] = (p2[k] as number) + v0 * f2;
    p2[k + 1] = (p2[k + 1] as number) + v1 * f2;
  }
  if (k < c) {
    const v0 = (V[o + k] as number) - (f * (p[k] as number) + g * (u[k] as number));
    V[o + k] = v0;
    g0 += v0 * (u2[k] as number);
    p2[k] = (p2[k] as number) + v0 * f2;
  }
  p2[j] = g0 + g1;
}

/** Row j's share of p = A u over the leading i × i block (upper triangle of the storage). */
function productRow(
  n: number,
  V: Float64Array,
  j: number,
  i: number,
  u: Float64Array,
  p: Float64Array,
): void {
  const o = j * n;
  const f = u[j] as number;
  // two partial sums: one running sum would wait on the adder's latency every step
  let g0 = (p[j] as number) + (V[o + j] as number) * f;
  let g1 = 0;
  let k = j + 1;
  for (; k + 1 < i; k += 2) {
    const v0 = V[o + k] as number;
    const v1 = V[o + k + 1] as number;
    g0 += v0 * (u[k] as number);
    g1 += v1 * (u[k + 1] as number);
    p[k] = (p[k] as number) + v0 * f;
    p[k + 1] = (p[k + 1] as number) + v1 * f;
  }
  if (k < i) {
    const v0 = V[o + k] as number;
    g0 += v0 * (u[k] as number);
    p[k] = (p[k] as number) + v0 * f;
  }
  p[j] = g0 + g1;
}

/** Reflectors accumulated together in `accumulate`. */
const ACCUMULATE_BATCH = 32;

/**
 * The second half of tred2: V ← V H_i for i = 0 … n − 2, where reflector i is stored in row
 * i + 1 of V (entries 0..i) with H_i = I − u uᵀ / h, h = d[i + 1]. The Handbook applies one
 * reflector at a time (rank-one updates, bound by memory); here ACCUMULATE_BATCH of them are
 * gathered into the compact WY form H_{i0} ⋯ H_{i1} = I − Y T Yᵀ (Schreiber & Van Loan, SIAM J.
 * Sci. Stat. Comput. 10 (1989); Golub & Van Loan, 4th ed., §5.1.7) and applied to the leading
 * block as R ← R − ((R Y) T) Yᵀ, two matrix products.
 */
function accumulate(n: number, V: Float64Array, d: Float64Array): void {
  const Bmax = ACCUMULATE_BATCH;
  const Yt = new Float64Array(Bmax * n); // row b: reflector i0 + b, zero past its support
  const T = new Float64Array(Bmax * Bmax);
  const P = new Float64Array(n * Bmax);
  const w = new Float64Array(Bmax);
  for (let i0 = 0; i0 < n - 1; i0 += Bmax) {
    const i1 = Math.min(i0 + Bmax, n - 1) - 1;
    const B = i1 - i0 + 1;
    const m = i1 + 1; // the block R = V[0..i1, 0..i1]
    Yt.fill(0, 0, B * m);
    T.fill(0);
    for (let b = 0; b < B; b++) {
      const i = i0 + b;
      const h = d[i + 1] as number;
      const vo = (i + 1) * n;
      const yo = b * m;
      if (h !== 0) for (let k = 0; k <= i; k++) Yt[yo + k] = V[vo + k] as number;
      const tau = h !== 0 ? 1 / h : 0;
      // T[0:b, b] = −τ T[0:b, 0:b] (Yᵀ u_b), T[b, b] = τ (the forward recurrence of LAPACK's dlarft)
      for (let c = 0; c < b; c++) {
        let s = 0;
        const co = c * m;
        for (let k = 0; k <= i; k++) s += (Yt[co + k] as number) * (Yt[yo + k] as number);
        w[c] = s;
      }
      for (let r = 0; r < b; r++) {
        let s = 0;
        for (let c = r; c < b; c++) s += (T[r * Bmax + c] as number) * (w[c] as number);
        T[r * Bmax + b] = -tau * s;
      }
      T[b * Bmax + b] = tau;
    }
    // rows i0 … i1 join the block as unit rows (their diagonal saved in column n − 1); the vector
    // rows are cleared, as the Handbook's loop does once it has used them. A reflector with
    // index below a row's own touches only that row's cleared entries, so applying the whole
    // batch to every row of the block is exact.
    for (let i = i0; i <= i1; i++) {
      const vo = (i + 1) * n;
      for (let k = 0; k <= i; k++) V[vo + k] = 0;
    }
    for (let i = i0; i <= i1; i++) {
      V[i * n + (n - 1)] = V[i * n + i] as number;
      V[i * n + i] = 1;
    }
    multiplyRowsByTransposed(V, n, m, Yt, B, P);
    // P ← P T
    for (let j = 0; j < m; j++) {
      const po = j * Bmax;
      for (let c = B - 1; c >= 0; c--) {
        let s = 0;
        for (let r = 0; r <= c; r++) s += (P[po + r] as number) * (T[r * Bmax + c] as number);
        P[po + c] = s;
      }
    }
    subtractProduct(V, n, m, P, Yt, B);
  }
}

/** P[j, b] = Σ_k R[j, k] Yt[b, k] for j < m, b < B (R = V with row stride n; P row stride 32). */
function multiplyRowsByTransposed(
  V: Float64Array,
  n: number,
  m: number,
  Yt: Float64Array,
  B: number,
  P: Float64Array,
): void {
  const ps = ACCUMULATE_BATCH;
  // four rows × two reflectors per pass: eight running sums from six loads per step
  let j = 0;
  for (; j + 3 < m; j += 4) {
    const r0 = j * n;
    const r1 = r0 + n;
    const r2 = r1 + n;
    const r3 = r2 + n;
    let b = 0;
    for (; b + 1 < B; b += 2) {
      const y0 = b * m;
      const y1 = y0 + m;
      let s00 = 0;
      let s01 = 0;
      let s10 = 0;
      let s11 = 0;
      let s20 = 0;
      let s21 = 0;
      let s30 = 0;
      let s31 = 0;
      for (let k = 0; k < m; k++) {
        const c0 = Yt[y0 + k] as number;
        const c1 = Yt[y1 + k] as number;
        const a0 = V[r0 + k] as number;
        const a1 = V[r1 + k] as number;
        const a2 = V[r2 + k] as number;
        const a3 = V[r3 + k] as number;
        s00 += a0 * c0;
        s01 += a0 * c1;
        s10 += a1 * c0;
        s11 += a1 * c1;
        s20 += a2 * c0;
        s21 += a2 * c1;
        s30 += a3 * c0;
        s31 += a3 * c1;
      }
      const o = j * ps + b;
      P[o] = s00;
      P[o + 1] = s01;
      P[o + ps] = s10;
      P[o + ps + 1] = s11;
      P[o + 2 * ps] = s20;
      P[o + 2 * ps + 1] = s21;
      P[o + 3 * ps] = s30;
      P[o + 3 * ps + 1] = s31;
    }
    for (; b < B; b++) {
      const y0 = b * m;
      for (let r = 0; r < 4; r++) {
        const ro = (j + r) * n;
        let s = 0;
        for (let k = 0; k < m; k++) s += (V[ro + k] as number) * (Yt[y0 + k] as number);
        P[(j + r) * ps + b] = s;
      }
    }
  }
  for (; j < m; j++) {
    const r0 = j * n;
    for (let b = 0; b < B; b++) {
      const y0 = b * m;
      let s = 0;
      for (let k = 0; k < m; k++) s += (V[r0 + k] as number) * (Yt[y0 + k] as number);
      P[j * ps + b] = s;
    }
  }
}

/** R[j, k] −= Σ_b P[j, b] Yt[b, k] for j, k < m. */
function subtractProduct(
  V: Float64Array,
  n: number,
  m: number,
  P: Float64Array,
  Yt: Float64Array,
  B: number,
): void {
  const ps = ACCUMULATE_BATCH;
  let j = 0;
  // four rows × four reflectors per pass: sixteen products from eight loads and four stores
  for (; j + 3 < m; j += 4) {
    const r0 = j * n;
    const p0 = j * ps;
    let b = 0;
    for (; b + 3 < B; b += 4) {
      const y0 = b * m;
      const y1 = y0 + m;
      const y2 = y1 + m;
      const y3 = y2 + m;
      const a00 = P[p0 + b] as number;
      const a01 = P[p0 + b + 1] as number;
      const a02 = P[p0 + b + 2] as number;
      const a03 = P[p0 + b + 3] as number;
      const a10 = P[p0 + ps + b] as number;
      const a11 = P[p0 + ps + b + 1] as number;
      const a12 = P[p0 + ps + b + 2] as number;
      const a13 = P[p0 + ps + b + 3] as number;
      const a20 = P[p0 + 2 * ps + b] as number;
      const a21 = P[p0 + 2 * ps + b + 1] as number;
      const a22 = P[p0 + 2 * ps + b + 2] as number;
      const a23 = P[p0 + 2 * ps + b + 3] as number;
      const a30 = P[p0 + 3 * ps + b] as number;
      const a31 = P[p0 + 3 * ps + b + 1] as number;
      const a32 = P[p0 + 3 * ps + b + 2] as number;
      const a33 = P[p0 + 3 * ps + b + 3] as number;
      for (let k = 0; k < m; k++) {
        const u0 = Yt[y0 + k] as number;
        const u1 = Yt[y1 + k] as number;
        const u2 = Yt[y2 + k] as number;
        const u3 = Yt[y3 + k] as number;
        V[r0 + k] = (V[r0 + k] as number) - (a00 * u0 + a01 * u1 + (a02 * u2 + a03 * u3));
        V[r0 + n + k] = (V[r0 + n + k] as number) - (a10 * u0 + a11 * u1 + (a12 * u2 + a13 * u3));
        V[r0 + 2 * n + k] =
          (V[r0 + 2 * n + k] as number) - (a20 * u0 + a21 * u1 + (a22 * u2 + a23 * u3));
        V[r0 + 3 * n + k] =
          (V[r0 + 3 * n + k] as number) - (a30 * u0 + a31 * u1 + (a32 * u2 + a33 * u3));
      }
    }
    for (; b < B; b++) {
      const y0 = b * m;
      for (let r = 0; r < 4; r++) {
        const ro = r0 + r * n;
        const a = P[p0 + r * ps + b] as number;
        for (let k = 0; k < m; k++) V[ro + k] = (V[ro + k] as number) - a * (Yt[y0 + k] as number);
      }
    }
  }
  for (; j + 1 < m; j += 2) {
    const r0 = j * n;
    const r1 = r0 + n;
    const p0 = j * ps;
    const p1 = p0 + ps;
    let b = 0;
    for (; b + 3 < B; b += 4) {
      const a0 = P[p0 + b] as number;
      const a1 = P[p0 + b + 1] as number;
      const a2 = P[p0 + b + 2] as number;
      const a3 = P[p0 + b + 3] as number;
      const c0 = P[p1 + b] as number;
      const c1 = P[p1 + b + 1] as number;
      const c2 = P[p1 + b + 2] as number;
      const c3 = P[p1 + b + 3] as number;
      const y0 = b * m;
      const y1 = y0 + m;
      const y2 = y1 + m;
      const y3 = y2 + m;
      for (let k = 0; k < m; k++) {
        const u0 = Yt[y0 + k] as number;
        const u1 = Yt[y1 + k] as number;
        const u2 = Yt[y2 + k] as number;
        const u3 = Yt[y3 + k] as number;
        V[r0 + k] = (V[r0 + k] as number) - (a0 * u0 + a1 * u1 + (a2 * u2 + a3 * u3));
        V[r1 + k] = (V[r1 + k] as number) - (c0 * u0 + c1 * u1 + (c2 * u2 + c3 * u3));
      }
    }
    for (; b < B; b++) {
      const a0 = P[p0 + b] as number;
      const c0 = P[p1 + b] as number;
      const y0 = b * m;
      for (let k = 0; k < m; k++) {
        const u = Yt[y0 + k] as number;
        V[r0 + k] = (V[r0 + k] as number) - a0 * u;
        V[r1 + k] = (V[r1 + k] as number) - c0 * u;
      }
    }
  }
  for (; j < m; j++) {
    const r0 = j * n;
    const p0 = j * ps;
    for (let b = 0; b < B; b++) {
      const a0 = P[p0 + b] as number;
      const y0 = b * m;
      for (let k = 0; k < m; k++) V[r0 + k] = (V[r0 + k] as number) - a0 * (Yt[y0 + k] as number);
    }
  }
}
