/**
 * Every eigenvector of a symmetric tridiagonal matrix by inverse iteration, after its eigenvalues
 * (LAPACK's `dstein`: Jessup & Ipsen, "Improving the accuracy of inverse iteration", SIAM J. Sci.
 * Stat. Comput. 13, 1992; Wilkinson, *The Algebraic Eigenvalue Problem*, 1965, ch. 9 §47–54).
 *
 * T first splits where an off-diagonal is negligible (|e_k| ≤ ε‖T‖, the test of the QL
 * iteration). In each unreduced block the eigenvalues come from the QL iteration without vectors,
 * O(m²), and each eigenvector from a few solves with the pivoted LU factorization of T − λI, O(m)
 * each. A vector is orthogonalized (modified Gram–Schmidt, in every iteration) against the
 * vectors already found whose eigenvalues lie within 10⁻³‖T‖ of its own: farther ones are already
 * orthogonal to it to about ε‖T‖ / 10⁻³‖T‖ ≈ 2·10⁻¹³, the bound `dstein` works to. `dstein`
 * chains such neighbourhoods into one cluster; the window used here keeps the cost O(n²) when the
 * spectrum is evenly dense, as a finite-element model's is.
 *
 * The whole costs O(n²) against the 6n³ of accumulating the QL rotations. When a vector does not
 * converge within five solves the function returns null and the caller takes the QL route.
 */
import { seededRandom } from '../random';
import type { Block } from '../../linalg/dense-kernels';
import {
  DENSE_PARTS,
  type DenseTask,
  type DenseTeam,
  evenSplit,
  SERIAL_TEAM,
  SPLIT_MIN,
  transposePart,
} from './team';
import { tridiagonalQL } from './tridiagonal-ql';

const EPS = 2 ** -52;
/** Solves allowed for one vector (dstein's MAXITS). */
const MAX_SOLVES = 5;
/** Solves made after the growth test first passes (dstein's EXTRA). */
const EXTRA = 2;
/** Neighbours closer than this fraction of ‖T‖ are orthogonalized against (dstein's ODM3). */
const ORTHOGONALIZE_WITHIN = 1e-3;

/** Eigenvalues ascending and Z (n × n, row-major) with the eigenvector of `values[k]` in column k. */
export interface TridiagonalEigensystem {
  readonly values: Float64Array;
  readonly Z: Float64Array;
}

/**
 * Eigenvalues and orthonormal eigenvectors of the tridiagonal matrix with diagonal d and
 * off-diagonal e (`e[k]` couples k and k + 1), or null when inverse iteration fails to converge
 * for some vector. d and e are not changed. `team` may run parts of a large block at once
 * (the same result); Z is one of its arrays.
 * @example const sys = tridiagonalEigenvectors(d, e); // sys.Z[i * n + k]: component i of vector k
 */
export function tridiagonalEigenvectors(
  d: Float64Array,
  e: Float64Array,
  team: DenseTeam = SERIAL_TEAM,
): TridiagonalEigensystem | null {
  const n = d.length;
  const tnorm = oneNorm(d, e);
  // Zt row r: the r-th vector found, block by block, zero outside its block
  const Zt = team.shared(n * n);
  const found: { value: number; row: number }[] = [];
  let start = 0;
  for (let i = 0; i < n; i++) {
    const last = i === n - 1 || Math.abs(e[i] as number) <= EPS * tnorm;
    if (!last) continue;
    const size = i - start + 1;
    const db = d.slice(start, i + 1);
    const eb = new Float64Array(size);
    for (let k = 0; k < size - 1; k++) eb[k] = e[start + k] as number;
    const vals = db.slice();
    tridiagonalQL(vals, eb.slice(), null, 0);
    vals.sort();
    const row0 = found.length;
    const block: Block = { data: Zt, offset: row0 * n + start, stride: n };
    if (!blockVectors(db, eb, vals, block, team)) return null;
    vals.forEach((value, k) => found.push({ value, row: row0 + k }));
    start = i + 1;
  }
  found.sort((a, b) => a.value - b.value);
  const values = new Float64Array(n);
  const rowOf = team.shared(n);
  found.forEach((f, k) => {
    values[k] = f.value;
    rowOf[k] = f.row;
  });
  // Z(i, k) = Zt(rowOf[k], i)
  const Z = team.shared(n * n);
  const parts = n >= 2 * SPLIT_MIN ? DENSE_PARTS : 1;
  team.run(
    'transpose',
    transposePart,
    parts,
    [Zt, Z, rowOf],
    [n, 0, ...evenSplit(0, n, parts, 32)],
  );
  return { values, Z };
}

/** ‖T‖₁ of the tridiagonal (d, e), `e[k]` coupling k and k + 1. */
function oneNorm(d: Float64Array, e: Float64Array): number {
  const n = d.length;
  let norm = 0;
  for (let i = 0; i < n; i++) {
    const left = i > 0 ? Math.abs(e[i - 1] as number) : 0;
    const right = i < n - 1 ? Math.abs(e[i] as number) : 0;
    norm = Math.max(norm, Math.abs(d[i] as number) + left + right);
  }
  return norm;
}

/**
 * The eigenvectors of one unreduced block, unit length, written to row k of `out` for `vals[k]`;
 * false when one does not converge.
 *
 * The shifts are fixed first (equal or nearly equal eigenvalues get shifts apart, as dstein
 * does). Where two neighbouring shifts lie more than the orthogonalization window apart, the
 * vectors on either side never meet, so a large block is cut there, near its middle, into parts
 * that `team` may run at once; vector j draws its start vector from the generator advanced by
 * j·m draws, so the result is the same however the parts run.
 */
function blockVectors(
  d: Float64Array,
  e: Float64Array,
  vals: Float64Array,
  out: Block,
  team: DenseTeam,
): boolean {
  const m = d.length;
  if (m === 1) {
    out.data[out.offset] = 1;
    return true;
  }
  const ortol = ORTHOGONALIZE_WITHIN * oneNorm(d, e);
  const shifts = new Float64Array(m);
  for (let j = 0; j < m; j++) {
    let xj = vals[j] as number;
    if (j > 0) {
      const pertol = 10 * Math.abs(EPS * xj);
      const prev = shifts[j - 1] as number;
      if (xj - prev < pertol) xj = prev + pertol;
    }
    shifts[j] = xj;
  }
  const bounds = [0, m];
  if (m >= 2 * SPLIT_MIN) {
    // the gap wider than the window nearest the middle
    let cut = -1;
    for (let j = 1; j < m; j++) {
      const wide = (shifts[j] as number) - (shifts[j - 1] as number) > ortol;
      if (wide && (cut < 0 || Math.abs(j - m / 2) < Math.abs(cut - m / 2))) cut = j;
    }
    if (cut > 0) bounds.splice(1, 0, cut);
  }
  const parts = bounds.length - 1;
  if (parts === 1) {
    const status = new Float64Array(1);
    blockVectorsPart(0, [d, e, shifts, out.data, status], [m, out.offset, out.stride, ...bounds]);
    return status[0] === 0;
  }
  const arrays = [d, e, shifts, team.shared(parts)].map((a) => {
    const copy = team.shared(a.length);
    copy.set(a);
    return copy;
  });
  const status = arrays[3] as Float64Array;
  team.run(
    'tridiagonalVectors',
    blockVectorsPart,
    parts,
    [
      arrays[0] as Float64Array,
      arrays[1] as Float64Array,
      arrays[2] as Float64Array,
      out.data,
      status,
    ],
    [m, out.offset, out.stride, ...bounds],
  );
  return status.every((x) => x === 0);
}

/**
 * Vectors j ∈ [bounds[part], bounds[part + 1]) of a block (d, e) with the given shifts, into row j
 * of the block `out` (offset, stride); status[part] = 1 when one does not converge.
 */
export const blockVectorsPart: DenseTask = (
  part,
  [d, e, shifts, outData, status],
  [m, offset, stride, ...bounds],
) => {
  const size = m as number;
  const dd = d as Float64Array;
  const ee = e as Float64Array;
  const sh = shifts as Float64Array;
  const out: Block = {
    data: outData as Float64Array,
    offset: offset as number,
    stride: stride as number,
  };
  const j0 = bounds[part] as number;
  const j1 = bounds[part + 1] as number;
  const onenrm = oneNorm(dd, ee);
  const ortol = ORTHOGONALIZE_WITHIN * onenrm;
  const growth = Math.sqrt(0.1 / size); // dstein's DTPCRT
  const tiny = EPS * onenrm;
  const lu = new LU(size);
  const x = new Float64Array(size);
  // the same start vectors every run: vector j takes draws j·m … j·m + m − 1
  const rand = seededRandom(7, j0 * size);
  let window = j0;
  for (let j = j0; j < j1; j++) {
    const xj = sh[j] as number;
    while (window < j && xj - (sh[window] as number) > ortol) window++;
    lu.factor(dd, ee, xj, tiny);
    for (let i = 0; i < size; i++) x[i] = 2 * rand() - 1;
    const target = size * onenrm * Math.max(EPS, Math.abs(lu.lastPivot()));
    if (!iterate(lu, x, out, window, j, target, growth)) {
      (status as Float64Array)[part] = 1;
      return;
    }
    store(x, out.data, out.offset + j * out.stride);
  }
};

/**
 * Inverse iteration from x for vector j, orthogonalized against vectors window … j − 1 of `out`;
 * false when it does not converge.
 */
function iterate(
  lu: LU,
  x: Float64Array,
  out: Block,
  window: number,
  j: number,
  target: number,
  growth: number,
): boolean {
  let checks = 0;
  let big = maxAbs(x);
  for (let its = 0; its < MAX_SOLVES && big > 0; its++) {
    big = lu.solve(x, target / big);
    if (window < j) {
      for (let q = window; q < j; q++) orthogonalize(x, out.data, out.offset + q * out.stride);
      big = maxAbs(x);
    }
    if (!(big < Infinity)) return false;
    if (big < growth) continue;
    checks++;
    if (checks === EXTRA + 1) return true;
  }
  return false;
}

/** x −= (xᵀy) y for the unit vector y = out[o …]. */
function orthogonalize(x: Float64Array, out: Float64Array, o: number): void {
  const m = x.length;
  let s = 0;
  for (let i = 0; i < m; i++) s += (x[i] as number) * (out[o + i] as number);
  for (let i = 0; i < m; i++) x[i] = (x[i] as number) - s * (out[o + i] as number);
}

function maxAbs(x: Float64Array): number {
  let big = 0;
  for (let i = 0; i < x.length; i++) {
    const a = Math.abs(x[i] as number);
    if (a > big) big = a;
  }
  return big;
}

/** out[o …] = x / ‖x‖, signed so that its largest entry is positive (as dstein does). */
function store(x: Float64Array, out: Float64Array, o: number): void {
  const m = x.length;
  let nrm = 0;
  let jmax = 0;
  let big = 0;
  for (let i = 0; i < m; i++) {
    const v = x[i] as number;
    nrm += v * v;
    if (Math.abs(v) > big) {
      big = Math.abs(v);
      jmax = i;
    }
  }
  let scl = 1 / Math.sqrt(nrm);
  if ((x[jmax] as number) < 0) scl = -scl;
  for (let i = 0; i < m; i++) out[o + i] = (x[i] as number) * scl;
}

/**
 * LU factorization with partial pivoting of a tridiagonal T − σI (LAPACK's `dgttrf`), pivots
 * smaller than `tiny` raised to it so that the solve amplifies the eigenvector instead of failing.
 */
class LU {
  private readonly dl: Float64Array;
  private readonly dd: Float64Array; // U's diagonal, then its reciprocals
  private readonly du: Float64Array;
  private readonly du2: Float64Array;
  private readonly swap: Uint8Array;

  constructor(private readonly m: number) {
    this.dl = new Float64Array(m);
    this.dd = new Float64Array(m);
    this.du = new Float64Array(m);
    this.du2 = new Float64Array(m);
    this.swap = new Uint8Array(m);
  }

  factor(d: Float64Array, e: Float64Array, sigma: number, tiny: number): void {
    const { m, dl, dd, du, du2, swap } = this;
    for (let i = 0; i < m; i++) {
      dd[i] = (d[i] as number) - sigma;
      dl[i] = i < m - 1 ? (e[i] as number) : 0;
      du[i] = dl[i] as number;
      du2[i] = 0;
      swap[i] = 0;
    }
    for (let i = 0; i < m - 1; i++) {
      const a = dd[i] as number;
      const b = dl[i] as number;
      if (Math.abs(a) >= Math.abs(b)) {
        const f = a !== 0 ? b / a : 0;
        dl[i] = f;
        dd[i + 1] = (dd[i + 1] as number) - f * (du[i] as number);
      } else {
        const f = a / b;
        dd[i] = b;
        dl[i] = f;
        const t = du[i] as number;
        du[i] = dd[i + 1] as number;
        dd[i + 1] = t - f * (dd[i + 1] as number);
        if (i < m - 2) {
          du2[i] = du[i + 1] as number;
          du[i + 1] = -f * (du[i + 1] as number);
        }
        swap[i] = 1;
      }
    }
    // the back-substitution multiplies by the reciprocals (a division costs several multiplies)
    for (let i = 0; i < m; i++) {
      let p = dd[i] as number;
      if (Math.abs(p) < tiny) p = p < 0 ? -tiny : tiny;
      dd[i] = 1 / p;
    }
  }

  /** U's last pivot, which is small when σ is close to an eigenvalue. */
  lastPivot(): number {
    return 1 / (this.dd[this.m - 1] as number);
  }

  /** x ← (T − σI)⁻¹ (scale · x); returns max |x|. */
  solve(x: Float64Array, scale: number): number {
    const { m, dl, dd, du, du2, swap } = this;
    let xi = (x[0] as number) * scale;
    for (let i = 0; i < m - 1; i++) {
      const next = (x[i + 1] as number) * scale;
      if (swap[i] === 0) {
        x[i] = xi;
        xi = next - (dl[i] as number) * xi;
      } else {
        x[i] = next;
        xi = xi - (dl[i] as number) * next;
      }
    }
    let x2 = xi * (dd[m - 1] as number);
    x[m - 1] = x2;
    let big = Math.abs(x2);
    if (m === 1) return big;
    let x1 = ((x[m - 2] as number) - (du[m - 2] as number) * x2) * (dd[m - 2] as number);
    x[m - 2] = x1;
    big = Math.max(big, Math.abs(x1));
    for (let i = m - 3; i >= 0; i--) {
      const x0 =
        ((x[i] as number) - (du[i] as number) * x1 - (du2[i] as number) * x2) * (dd[i] as number);
      x[i] = x0;
      if (Math.abs(x0) > big) big = Math.abs(x0);
      x2 = x1;
      x1 = x0;
    }
    return big;
  }
}
