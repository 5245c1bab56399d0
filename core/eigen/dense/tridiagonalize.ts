/**
 * Blocked Householder tridiagonalization of a dense symmetric matrix, A = Q T Qᵀ, and the
 * back-transformation of eigenvectors, x = Q z.
 *
 * The reduction is LAPACK's `dsytrd`/`dlatrd` scheme (Dongarra, Hammarling & Sorensen, "Block
 * reduction of matrices to condensed forms for eigenvalue computations", J. Comput. Appl. Math.
 * 27, 1989; Golub & Van Loan, *Matrix Computations*, 4th ed., §8.3.1 and §5.1.7): a panel of
 * PANEL reflectors is made one at a time from the matrix as it stood at the panel's start, with
 * the panel's own updates applied as corrections; the trailing matrix then takes them all at once
 * as one rank-2·PANEL update A −= V Wᵀ + W Vᵀ, a matrix product (`./kernels`). The product A v of
 * each step stays a matrix–vector product over the trailing triangle; it is half the arithmetic.
 *
 * Q is never formed: the eigenvectors of T are multiplied by the reflectors in compact WY blocks,
 * Z ← (I − Y S Yᵀ) Z with S upper triangular (Schreiber & Van Loan, SIAM J. Sci. Stat. Comput. 10,
 * 1989), two matrix products per block. That costs 2n³ against the 4n³/3 of forming Q and 6n³ of
 * rotating it through the QL sweeps.
 *
 * Storage: A is row-major n × n and only its upper triangle (columns ≥ row) is read or written.
 * Step k reduces row k (equivalently column k); its reflector H_k = I − τ_k v vᵀ has v_j = 0 for
 * j ≤ k, v_{k+1} = 1, and v_{k+2…n−1} left in row k of A where the reduced entries were.
 */
import { type Block, multiplyAdd } from '../../linalg/dense-kernels';
import {
  DENSE_PARTS,
  type DenseTask,
  type DenseTeam,
  evenSplit,
  SERIAL_TEAM,
  SPLIT_MIN,
  triangleSplit,
} from './team';

/** Reflectors per panel and per back-transformation block. */
const PANEL = 32;

/** T's diagonal and off-diagonal (`e[k]` couples k and k + 1), and the reflectors' τ. */
export interface Tridiagonal {
  readonly d: Float64Array;
  readonly e: Float64Array;
  readonly tau: Float64Array;
}

/**
 * Reduces A (row-major, upper triangle used, overwritten by the reflectors) to tridiagonal form.
 * @example const { d, e, tau } = tridiagonalize(n, A); // later: backTransform(n, A, tau, Z)
 */
export function tridiagonalize(
  n: number,
  A: Float64Array,
  team: DenseTeam = SERIAL_TEAM,
): Tridiagonal {
  const d = new Float64Array(n);
  const e = new Float64Array(Math.max(n - 1, 0));
  const tau = team.shared(Math.max(n - 1, 0));
  // The panel, interleaved: row 2b is reflector v of step k0 + b, row 2b + 1 its w, so that the
  // matrix the panel has made so far is A − Σ_b (v_b w_bᵀ + w_b v_bᵀ) and its first 2b rows are
  // the U of every product below.
  const VW = team.shared(2 * PANEL * n);
  const U: Block = { data: VW, offset: 0, stride: n };
  const coef = team.shared(n * 2 * PANEL); // row r: (w_b(r), v_b(r)) for each b
  // p = A v; the product's parts write their sums at p[part · n …], added into the first n after
  const p = team.shared(DENSE_PARTS * n);
  const s = team.shared(2 * PANEL);
  const sRow: Block = { data: s, offset: 0, stride: 2 * PANEL };
  for (let k0 = 0; k0 < n - 1; k0 += PANEL) {
    const nb = Math.min(PANEL, n - 1 - k0);
    VW.fill(0, 0, 2 * nb * n);
    for (let b = 0; b < nb; b++) {
      const j = k0 + b;
      const row = j * n;
      // row j (columns ≥ j) takes the panel's earlier reflectors:
      // A(j, c) −= Σ_q v_q(c) w_q(j) + w_q(c) v_q(j)
      if (b > 0) {
        for (let q = 0; q < b; q++) {
          s[2 * q] = VW[(2 * q + 1) * n + j] as number;
          s[2 * q + 1] = VW[2 * q * n + j] as number;
        }
        multiplyAdd({ data: A, offset: row, stride: n }, sRow, U, 1, 2 * b, j, n, -1);
      }
      d[j] = A[row + j] as number;
      // the reflector that zeroes A[j, j+2 …]
      const alpha = A[row + j + 1] as number;
      let sigma = 0;
      for (let c = j + 2; c < n; c++) sigma += (A[row + c] as number) ** 2;
      const vrow = 2 * b * n;
      const wrow = vrow + n;
      if (sigma === 0) {
        e[j] = alpha;
        tau[j] = 0;
        continue;
      }
      let beta = Math.sqrt(alpha * alpha + sigma);
      if (alpha > 0) beta = -beta;
      const t = (beta - alpha) / beta;
      const scale = 1 / (alpha - beta);
      e[j] = beta;
      tau[j] = t;
      VW[vrow + j + 1] = 1;
      for (let c = j + 2; c < n; c++) {
        const v = (A[row + c] as number) * scale;
        A[row + c] = v;
        VW[vrow + c] = v;
      }
      A[row + j + 1] = beta;
      // p = A(trailing, as at the panel's start) v, then the panel's corrections:
      // p −= Σ_q v_q (w_qᵀ v) + w_q (v_qᵀ v)
      // (the dots first: each part then corrects its own run of p)
      const k = j + 1;
      if (b > 0) {
        rowDots(VW, n, 2 * b, vrow, k, s);
        for (let q = 0; q < b; q++) {
          const wv = s[2 * q + 1] as number;
          s[2 * q + 1] = s[2 * q] as number;
          s[2 * q] = wv;
        }
      }
      const parts = n - k >= SPLIT_MIN ? DENSE_PARTS : 1;
      const bounds = triangleSplit(k, n, n, parts, 4);
      team.run(
        'symmetricProduct',
        symmetricProductPart,
        parts,
        [A, VW, p, s],
        [n, vrow, 2 * b, ...bounds],
      );
      for (let q = 1; q < parts; q++) {
        const o = q * n;
        for (let c = bounds[q] as number; c < n; c++)
          p[c] = (p[c] as number) + (p[o + c] as number);
      }
      // w = τ p − ½ τ² (pᵀv) v
      let pv = 0;
      for (let c = j + 1; c < n; c++) pv += (p[c] as number) * (VW[vrow + c] as number);
      const half = -0.5 * t * t * pv;
      for (let c = j + 1; c < n; c++) {
        VW[wrow + c] = t * (p[c] as number) + half * (VW[vrow + c] as number);
      }
    }
    // the trailing rows take the whole panel: A(r, c) −= Σ_b v_b(r) w_b(c) + w_b(r) v_b(c)
    const r0 = k0 + nb;
    if (r0 >= n) continue;
    const parts = n - r0 >= SPLIT_MIN ? DENSE_PARTS : 1;
    team.run(
      'trailingUpdate',
      trailingUpdatePart,
      parts,
      [A, VW, coef],
      [n, nb, ...triangleSplit(r0, n, n, parts, GROUP)],
    );
  }
  if (n > 0) d[n - 1] = A[(n - 1) * n + (n - 1)] as number;
  return { d, e, tau };
}

/** Rows of the trailing update at a time. */
const GROUP = 16;

/**
 * Rows [bounds[part], bounds[part + 1]) of the trailing update after a panel of nb reflectors:
 * A(r, c ≥ r) −= Σ_b v_b(r) w_b(c) + w_b(r) v_b(c).
 */
export const trailingUpdatePart: DenseTask = (part, [A, VW, coef], [n, nb, ...bounds]) => {
  const a = A as Float64Array;
  const vw = VW as Float64Array;
  const cf = coef as Float64Array;
  const size = n as number;
  const terms = 2 * (nb as number);
  const r0 = bounds[part] as number;
  const r1 = bounds[part + 1] as number;
  for (let r = r0; r < r1; r++) {
    const o = r * terms;
    for (let b = 0; b < terms; b += 2) {
      cf[o + b] = vw[(b + 1) * size + r] as number;
      cf[o + b + 1] = vw[b * size + r] as number;
    }
  }
  const U: Block = { data: vw, offset: 0, stride: size };
  for (let r = r0; r < r1; r += GROUP) {
    multiplyAdd(
      { data: a, offset: r * size, stride: size },
      { data: cf, offset: r * terms, stride: terms },
      U,
      Math.min(GROUP, r1 - r),
      terms,
      r,
      size,
      -1,
    );
  }
};

/**
 * Rows [bounds[part], bounds[part + 1]) of p = A v (v in row `vo` of VW), summed into
 * p[part · n + c] for c from the first of those rows on; then, on the same run of columns, the
 * panel's correction −Σ_q s_q U(q, c) over the first `terms` rows of VW.
 */
export const symmetricProductPart: DenseTask = (part, [A, VW, p, s], [n, vo, terms, ...bounds]) => {
  const size = n as number;
  const r0 = bounds[part] as number;
  const r1 = bounds[part + 1] as number;
  const vw = VW as Float64Array;
  const out = p as Float64Array;
  symmetricProduct(size, A as Float64Array, r0, r1, vw, vo as number, out, part * size);
  if ((terms as number) > 0) {
    multiplyAdd(
      { data: out, offset: part * size, stride: size },
      { data: s as Float64Array, offset: 0, stride: 2 * PANEL },
      { data: vw, offset: 0, stride: size },
      1,
      terms as number,
      r0,
      r1,
      -1,
    );
  }
};

/** s[q] = Σ_{c ≥ c0} U(q, c) U(x, c) for the first `count` rows of U (row x holds the vector). */
function rowDots(
  U: Float64Array,
  n: number,
  count: number,
  xo: number,
  c0: number,
  s: Float64Array,
): void {
  let q = 0;
  for (; q + 3 < count; q += 4) {
    const o0 = q * n;
    const o1 = o0 + n;
    const o2 = o1 + n;
    const o3 = o2 + n;
    let t0 = 0;
    let t1 = 0;
    let t2 = 0;
    let t3 = 0;
    for (let c = c0; c < n; c++) {
      const x = U[xo + c] as number;
      t0 += (U[o0 + c] as number) * x;
      t1 += (U[o1 + c] as number) * x;
      t2 += (U[o2 + c] as number) * x;
      t3 += (U[o3 + c] as number) * x;
    }
    s[q] = t0;
    s[q + 1] = t1;
    s[q + 2] = t2;
    s[q + 3] = t3;
  }
  for (; q < count; q++) {
    const o = q * n;
    let t = 0;
    for (let c = c0; c < n; c++) t += (U[o + c] as number) * (U[xo + c] as number);
    s[q] = t;
  }
}

/**
 * The share of rows [r0, r1) in p = A v, with A symmetric and only its upper triangle stored,
 * v = Vt[vo + …]: out[po + c] for c ≥ r0 receives Σ_{r0 ≤ r < r1} A(r, c) v(r) (both triangles of
 * those rows). Four rows per pass share the loads of v and p: each entry of A is read once and
 * serves both its row's dot product and its column's update.
 */
function symmetricProduct(
  n: number,
  A: Float64Array,
  r0: number,
  r1: number,
  Vt: Float64Array,
  vo: number,
  out: Float64Array,
  po: number,
): void {
  const p = out.subarray(po, po + n);
  p.fill(0, r0, n);
  let r = r0;
  for (; r + 3 < r1; r += 4) {
    const o0 = r * n;
    const o1 = o0 + n;
    const o2 = o1 + n;
    const o3 = o2 + n;
    const x0 = Vt[vo + r] as number;
    const x1 = Vt[vo + r + 1] as number;
    const x2 = Vt[vo + r + 2] as number;
    const x3 = Vt[vo + r + 3] as number;
    // the 4 × 4 diagonal block, upper triangle
    const a00 = A[o0 + r] as number;
    const a01 = A[o0 + r + 1] as number;
    const a02 = A[o0 + r + 2] as number;
    const a03 = A[o0 + r + 3] as number;
    const a11 = A[o1 + r + 1] as number;
    const a12 = A[o1 + r + 2] as number;
    const a13 = A[o1 + r + 3] as number;
    const a22 = A[o2 + r + 2] as number;
    const a23 = A[o2 + r + 3] as number;
    const a33 = A[o3 + r + 3] as number;
    let t0 = (p[r] as number) + (a00 * x0 + a01 * x1 + (a02 * x2 + a03 * x3));
    let t1 = (p[r + 1] as number) + (a01 * x0 + a11 * x1 + (a12 * x2 + a13 * x3));
    let t2 = (p[r + 2] as number) + (a02 * x0 + a12 * x1 + (a22 * x2 + a23 * x3));
    let t3 = (p[r + 3] as number) + (a03 * x0 + a13 * x1 + (a23 * x2 + a33 * x3));
    for (let c = r + 4; c < n; c++) {
      const b0 = A[o0 + c] as number;
      const b1 = A[o1 + c] as number;
      const b2 = A[o2 + c] as number;
      const b3 = A[o3 + c] as number;
      const v = Vt[vo + c] as number;
      t0 += b0 * v;
      t1 += b1 * v;
      t2 += b2 * v;
      t3 += b3 * v;
      p[c] = (p[c] as number) + (b0 * x0 + b1 * x1 + (b2 * x2 + b3 * x3));
    }
    p[r] = t0;
    p[r + 1] = t1;
    p[r + 2] = t2;
    p[r + 3] = t3;
  }
  for (; r < r1; r++) {
    const o = r * n;
    const x = Vt[vo + r] as number;
    let t = (p[r] as number) + (A[o + r] as number) * x;
    for (let c = r + 1; c < n; c++) {
      const a = A[o + c] as number;
      t += a * (Vt[vo + c] as number);
      p[c] = (p[c] as number) + a * x;
    }
    p[r] = t;
  }
}

/**
 * Z ← Q Z for Q = H_0 H_1 ⋯ H_{n−2} from `tridiagonalize` (A holds the reflectors). Z is n × m,
 * row-major: row i is component i of every vector.
 * @example backTransform(n, A, tau, Z, n);
 */
export function backTransform(
  n: number,
  A: Float64Array,
  tau: Float64Array,
  Z: Float64Array,
  m: number,
  team: DenseTeam = SERIAL_TEAM,
): void {
  // every column of Z takes the same reflectors: the parts are runs of columns
  const parts = m >= 2 * SPLIT_MIN ? DENSE_PARTS : 1;
  team.run(
    'backTransform',
    backTransformPart,
    parts,
    [A, tau, Z],
    [n, m, ...evenSplit(0, m, parts, 4)],
  );
}

/** Columns [bounds[part], bounds[part + 1]) of `backTransform`. */
export const backTransformPart: DenseTask = (part, [A, tau, Z], [n, m, ...bounds]) =>
  backTransformColumns(
    n as number,
    A as Float64Array,
    tau as Float64Array,
    Z as Float64Array,
    m as number,
    bounds[part] as number,
    bounds[part + 1] as number,
  );

// The block factors' loops as small functions: the JIT optimizes them after a few calls, where a
// loop inside a part that runs once per solve would wait for on-stack replacement.

/** Σ_{from ≤ c < n} U[xo + c] · U[yo + c]. */
function dotFrom(U: Float64Array, xo: number, yo: number, from: number, n: number): number {
  let s = 0;
  for (let c = from; c < n; c++) s += (U[xo + c] as number) * (U[yo + c] as number);
  return s;
}

/** Row r of Y S into Yp[o …]: Yp(r, c) = Σ_{b ≤ c} Y(r, b) S(b, c), Y(r, b) = Yt[b · n + r]. */
function foldRow(
  Yt: Float64Array,
  n: number,
  nb: number,
  r: number,
  S: Float64Array,
  Yp: Float64Array,
  o: number,
  w: Float64Array,
): void {
  for (let b = 0; b < nb; b++) w[b] = Yt[b * n + r] as number;
  for (let c = 0; c < nb; c++) {
    let acc = 0;
    for (let b = 0; b <= c; b++) acc += (w[b] as number) * (S[b * PANEL + c] as number);
    Yp[o + c] = acc;
  }
}

function backTransformColumns(
  n: number,
  A: Float64Array,
  tau: Float64Array,
  Z: Float64Array,
  m: number,
  c0: number,
  c1: number,
): void {
  if (c1 <= c0) return;
  const B = PANEL;
  const Yt = new Float64Array(B * n); // row b: reflector k0 + b
  const Yp = new Float64Array(n * B); // row r: component r of each reflector of the block
  const S = new Float64Array(B * B);
  const W = new Float64Array(B * m); // columns c0 … c1 − 1 used
  const w = new Float64Array(B);
  const last = n - 2;
  if (last < 0) return;
  // blocks from the last to the first: Q Z = B_0 (B_1 (⋯ (B_last Z)))
  const firstOfLast = Math.floor(last / B) * B;
  for (let k0 = firstOfLast; k0 >= 0; k0 -= B) {
    const nb = Math.min(B, last - k0 + 1);
    const top = k0 + 1; // first row any reflector of the block touches
    Yt.fill(0, 0, nb * n);
    for (let b = 0; b < nb; b++) {
      const k = k0 + b;
      if ((tau[k] as number) === 0) continue;
      const o = b * n;
      Yt[o + k + 1] = 1;
      for (let c = k + 2; c < n; c++) Yt[o + c] = A[k * n + c] as number;
    }
    // S: the forward recurrence of LAPACK's dlarft, S(0:b, b) = −τ_b S(0:b, 0:b) Yᵀ y_b
    S.fill(0);
    for (let b = 0; b < nb; b++) {
      const t = tau[k0 + b] as number;
      const yo = b * n;
      for (let q = 0; q < b; q++) w[q] = dotFrom(Yt, q * n, yo, k0 + b + 1, n);
      for (let r = 0; r < b; r++) {
        let s = 0;
        for (let q = r; q < b; q++) s += (S[r * B + q] as number) * (w[q] as number);
        S[r * B + b] = -t * s;
      }
      S[b * B + b] = t;
    }
    // Yp = Y S, row r − top: the coefficients of row r of Z (S folded in once per block, which
    // costs rows·nb² instead of m·nb² for S W)
    const rows = n - top;
    for (let r = top; r < n; r++) foldRow(Yt, n, nb, r, S, Yp, (r - top) * nb, w);
    // W = Yᵀ Z
    for (let b = 0; b < nb; b++) W.fill(0, b * m + c0, b * m + c1);
    multiplyAdd(
      { data: W, offset: 0, stride: m },
      { data: Yt, offset: top, stride: n },
      { data: Z, offset: top * m, stride: m },
      nb,
      rows,
      c0,
      c1,
      1,
    );
    // Z −= (Y S) W
    multiplyAdd(
      { data: Z, offset: top * m, stride: m },
      { data: Yp, offset: 0, stride: nb },
      { data: W, offset: 0, stride: m },
      rows,
      nb,
      c0,
      c1,
      -1,
    );
  }
}
