/**
 * Implicit QL iteration with Wilkinson's shift on a symmetric tridiagonal matrix, the `tql2`
 * procedure of Wilkinson & Reinsch, *Handbook for Automatic Computation* vol. II (1971), II/3.
 *
 * The transformations are applied to Z, stored row-major with one column per eigenvector (the
 * layout LAPACK uses for its `dsteqr`, column-major there). Each QL sweep first computes its
 * plane rotations from (d, e) alone, then applies the whole sweep to one row of Z at a time: the
 * sweep walks the row backwards carrying one value in a register, so every entry is loaded and
 * stored once per sweep and the inner loop runs over contiguous memory.
 */
import { NoConvergenceError } from '../../errors';

/** Sweeps allowed for one eigenvalue before the iteration gives up (Wilkinson–Reinsch use 30). */
const MAX_SWEEPS = 60;
/** Sweeps applied to Z together (measured: 16 cuts memory traffic without spilling the cache). */
const BATCH = 16;

/**
 * Eigenvalues and (optionally) eigenvectors of the symmetric tridiagonal matrix with diagonal `d`
 * and off-diagonal `e` (`e[i]` couples i and i + 1; `e[n − 1]` is ignored). On return `d` holds
 * the eigenvalues, unsorted, and column k of Z (rows × n, row-major) has been multiplied by the
 * accumulated rotations: start from the identity for the eigenvectors of T, or from Q with
 * A = Q T Qᵀ for those of A. `e` is overwritten.
 * @throws NoConvergenceError when one eigenvalue needs more than 60 sweeps (names which one).
 * @example tridiagonalQL(d, e, Z, n); // column k of Z is the eigenvector of d[k]
 */
export function tridiagonalQL(
  d: Float64Array,
  e: Float64Array,
  Z: Float64Array | null,
  rows: number,
  shifts?: Float64Array,
): void {
  const n = d.length;
  if (n === 0) return;
  e[n - 1] = 0;
  // Rotations of up to BATCH sweeps wait here and are applied to Z together, row by row, so
  // each row of Z is brought into cache once per batch instead of once per sweep.
  const cs = new Float64Array(BATCH * n);
  const sn = new Float64Array(BATCH * n);
  const lo = new Int32Array(BATCH);
  const hi = new Int32Array(BATCH);
  let queued = 0;
  const flush = (): void => {
    if (Z && queued > 0) applySweeps(Z, rows, n, queued, lo, hi, cs, sn);
    queued = 0;
  };
  let f = 0;
  let tst1 = 0;
  const eps = 2 ** -52;
  for (let l = 0; l < n; l++) {
    tst1 = Math.max(tst1, Math.abs(d[l] as number) + Math.abs(e[l] as number));
    let m = l;
    while (m < n) {
      if (Math.abs(e[m] as number) <= eps * tst1) break;
      m++;
    }
    if (m > l) {
      let iter = 0;
      do {
        iter++;
        if (iter > MAX_SWEEPS) {
          throw new NoConvergenceError(
            `The tridiagonal QL iteration did not converge for eigenvalue ${l + 1} of ${n} within ${MAX_SWEEPS} sweeps.`,
            { eigenvalue: l + 1 },
          );
        }
        let g = d[l] as number;
        let p = ((d[l + 1] as number) - g) / (2 * (e[l] as number));
        let r = hypot(p, 1);
        if (p < 0) r = -r;
        // Wilkinson's shift: the eigenvalue of the leading 2 × 2 nearest d[l], less the shifts so far
        let h = g - (e[l] as number) / (p + r);
        const perfect = shifts !== undefined && iter === 1;
        if (perfect) {
          h = nearest(shifts, f + h) - f;
          d[l] = g - h;
          d[l + 1] = (d[l + 1] as number) - h;
        } else {
          d[l] = (e[l] as number) / (p + r);
          d[l + 1] = (e[l] as number) * (p + r);
        }
        for (let i = l + 2; i < n; i++) d[i] = (d[i] as number) - h;
        const dl1 = d[l + 1] as number;
        f += h;
        p = d[m] as number;
        let c = 1;
        let c2 = c;
        let c3 = c;
        const el1 = e[l + 1] as number;
        let s = 0;
        let s2 = 0;
        for (let i = m - 1; i >= l; i--) {
          c3 = c2;
          c2 = c;
          s2 = s;
          g = c * (e[i] as number);
          h = c * p;
          r = hypot(p, e[i] as number);
          e[i + 1] = s * r;
          s = (e[i] as number) / r;
          c = p / r;
          p = c * (d[i] as number) - s * g;
          d[i + 1] = h + s * (c * g + s * (d[i] as number));
          cs[queued * n + i] = c;
          sn[queued * n + i] = s;
        }
        lo[queued] = l;
        hi[queued] = m;
        queued++;
        if (queued === BATCH) flush();
        // With Wilkinson's shift the leading 2 × 2 is singular after shifting, which gives the
        // more accurate form of EISPACK's tql2; any other shift takes the Handbook's form.
        if (!perfect) p = (-s * s2 * c3 * el1 * (e[l] as number)) / dl1;
        e[l] = s * p;
        d[l] = c * p;
      } while (Math.abs(e[l] as number) > eps * tst1);
    }
    d[l] = (d[l] as number) + f;
    e[l] = 0;
  }
  flush();
}

/**
 * √(a² + b²) without overflow or underflow: the plain formula where the squares are safe (V8's
 * Math.hypot is several times slower), Math.hypot outside that range.
 */
function hypot(a: number, b: number): number {
  const s = Math.abs(a) + Math.abs(b);
  if (s < 1e150 && s > 1e-150) return Math.sqrt(a * a + b * b);
  return Math.hypot(a, b);
}

/** The entry of the ascending list `xs` nearest to x. */
function nearest(xs: Float64Array, x: number): number {
  let lo = 0;
  let hi = xs.length - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if ((xs[mid] as number) < x) lo = mid;
    else hi = mid;
  }
  const a = xs[lo] as number;
  const b = xs[hi] as number;
  return Math.abs(a - x) <= Math.abs(b - x) ? a : b;
}

/**
 * Columns l..m of Z times the rotations G_{m−1} … G_l of each queued sweep, in queue order
 * (rotation i acts on columns i and i + 1): new z_{i+1} = s z_i + c z_{i+1},
 * new z_i = c z_i − s z_{i+1}.
 */
function applySweeps(
  Z: Float64Array,
  rows: number,
  n: number,
  count: number,
  lo: Int32Array,
  hi: Int32Array,
  cs: Float64Array,
  sn: Float64Array,
): void {
  // Four rows at a time: each row's sweep is one serial chain through `carry`, so interleaving
  // independent rows keeps the multiply units busy.
  let k = 0;
  for (; k + 3 < rows; k += 4) {
    const o0 = k * n;
    const o1 = o0 + n;
    const o2 = o1 + n;
    const o3 = o2 + n;
    for (let q = 0; q < count; q++) {
      const l = lo[q] as number;
      const m = hi[q] as number;
      const b = q * n;
      let c0 = Z[o0 + m] as number;
      let c1 = Z[o1 + m] as number;
      let c2 = Z[o2 + m] as number;
      let c3 = Z[o3 + m] as number;
      for (let i = m - 1; i >= l; i--) {
        const c = cs[b + i] as number;
        const s = sn[b + i] as number;
        const a0 = Z[o0 + i] as number;
        const a1 = Z[o1 + i] as number;
        const a2 = Z[o2 + i] as number;
        const a3 = Z[o3 + i] as number;
        Z[o0 + i + 1] = s * a0 + c * c0;
        Z[o1 + i + 1] = s * a1 + c * c1;
        Z[o2 + i + 1] = s * a2 + c * c2;
        Z[o3 + i + 1] = s * a3 + c * c3;
        c0 = c * a0 - s * c0;
        c1 = c * a1 - s * c1;
        c2 = c * a2 - s * c2;
        c3 = c * a3 - s * c3;
      }
      Z[o0 + l] = c0;
      Z[o1 + l] = c1;
      Z[o2 + l] = c2;
      Z[o3 + l] = c3;
    }
  }
  for (; k < rows; k++) {
    const o = k * n;
    for (let q = 0; q < count; q++) {
      const l = lo[q] as number;
      const m = hi[q] as number;
      const b = q * n;
      let carry = Z[o + m] as number;
      for (let i = m - 1; i >= l; i--) {
        const a = Z[o + i] as number;
        const c = cs[b + i] as number;
        const s = sn[b + i] as number;
        Z[o + i + 1] = s * a + c * carry;
        carry = c * a - s * carry;
      }
      Z[o + l] = carry;
    }
  }
}
