import { EngineError } from '../../errors';
import { multiplyAdd } from '../dense-kernels';
import type { SparseSymmetricMatrix } from '../types';
import type { SparseLdltSymbolic } from './symbolic';

/**
 * Supernodal structure for the multifrontal LDLᵀ (Duff & Reid 1983; Liu, "The multifrontal
 * method for sparse matrix solution", SIAM Review 34, 1992): fundamental supernodes of the
 * elimination tree, the row structure of each front, and each supernode's parent.
 */
export interface SupernodalStructure {
  /** Supernode s holds pivot columns first[s] .. first[s+1]-1. */
  readonly first: Int32Array;
  /** Rows of front s: rows[rowPtr[s] .. rowPtr[s+1]-1] (its own columns first, then the rest, ascending). */
  readonly rowPtr: Int32Array;
  readonly rows: Int32Array;
  /** Parent supernode, −1 at a root. */
  readonly parent: Int32Array;
  /** Offsets of each supernode's factor block (front rows × pivots) in the value array. */
  readonly blockPtr: Float64Array;
  /** Lower triangle of P A Pᵀ by columns, as indices into A.values. */
  readonly lPtr: Int32Array;
  readonly lRow: Int32Array;
  readonly lSrc: Int32Array;
  /** Largest front order. */
  readonly maxFront: number;
}

const cache = new WeakMap<SparseLdltSymbolic, SupernodalStructure>();

/** Builds (once per symbolic analysis) the supernodal structure. */
export function supernodalStructure(sym: SparseLdltSymbolic): SupernodalStructure {
  const hit = cache.get(sym);
  if (hit) return hit;
  const { n, parent, colCounts, cPtr, cRow, cSrc } = sym;
  // Lower triangle by columns = the upper triangle C by rows.
  const lPtr = new Int32Array(n + 1);
  const nnz = cPtr[n]!;
  for (let p = 0; p < nnz; p++) lPtr[cRow[p]! + 1]!++;
  for (let j = 0; j < n; j++) lPtr[j + 1] = lPtr[j]! + lPtr[j + 1]!;
  const lRow = new Int32Array(nnz);
  const lSrc = new Int32Array(nnz);
  const next = lPtr.slice(0, n);
  for (let k = 0; k < n; k++) {
    for (let p = cPtr[k]!; p < cPtr[k + 1]!; p++) {
      const q = next[cRow[p]!]!++;
      lRow[q] = k;
      lSrc[q] = cSrc[p]!;
    }
  }
  // Fundamental supernodes: j+1 continues j's supernode when it is j's parent, j is its only
  // child, and their columns nest (count(j) = count(j+1) + 1).
  const children = new Int32Array(n);
  for (let j = 0; j < n; j++) if (parent[j]! >= 0) children[parent[j]!]!++;
  const firstList: number[] = [0];
  for (let j = 1; j < n; j++) {
    const cont =
      parent[j - 1] === j &&
      children[j] === 1 &&
      colCounts[j - 1] === colCounts[j]! + 1 &&
      j - firstList[firstList.length - 1]! < 256;
    if (!cont) firstList.push(j);
  }
  firstList.push(n);
  const ns = firstList.length - 1;
  const first = Int32Array.from(firstList);
  const superOf = new Int32Array(n);
  for (let s = 0; s < ns; s++) for (let j = first[s]!; j < first[s + 1]!; j++) superOf[j] = s;
  const sParent = new Int32Array(ns);
  for (let s = 0; s < ns; s++) {
    const last = first[s + 1]! - 1;
    sParent[s] = parent[last]! >= 0 ? superOf[parent[last]!]! : -1;
  }
  // Row structures: front s = its columns ∪ A's rows below them ∪ children's rows beyond their
  // own columns. Its size is count(first[s]) + 1 (checked).
  const rowPtr = new Int32Array(ns + 1);
  for (let s = 0; s < ns; s++) rowPtr[s + 1] = rowPtr[s]! + colCounts[first[s]!]! + 1;
  const rows = new Int32Array(rowPtr[ns]!);
  const mark = new Int32Array(n).fill(-1);
  const childHead = new Int32Array(ns).fill(-1);
  const childNext = new Int32Array(ns).fill(-1);
  for (let s = ns - 1; s >= 0; s--) {
    const ps = sParent[s]!;
    if (ps >= 0) {
      childNext[s] = childHead[ps]!;
      childHead[ps] = s;
    }
  }
  let maxFront = 0;
  const blockPtr = new Float64Array(ns + 1);
  const tmp = new Int32Array(n);
  for (let s = 0; s < ns; s++) {
    const f = first[s]!;
    const l = first[s + 1]! - 1;
    let cnt = 0;
    for (let j = f; j <= l; j++) {
      mark[j] = s;
      tmp[cnt++] = j;
    }
    const own = cnt;
    for (let j = f; j <= l; j++) {
      for (let p = lPtr[j]!; p < lPtr[j + 1]!; p++) {
        const i = lRow[p]!;
        if (mark[i] !== s) {
          mark[i] = s;
          tmp[cnt++] = i;
        }
      }
    }
    for (let c = childHead[s]!; c >= 0; c = childNext[c]!) {
      const cOwn = first[c + 1]! - first[c]!;
      for (let p = rowPtr[c]! + cOwn; p < rowPtr[c + 1]!; p++) {
        const i = rows[p]!;
        if (mark[i] !== s) {
          mark[i] = s;
          tmp[cnt++] = i;
        }
      }
    }
    const expected = rowPtr[s + 1]! - rowPtr[s]!;
    if (cnt !== expected) {
      throw new EngineError(
        'INVALID_MODEL',
        `Internal error in the supernodal analysis: front ${s} has ${cnt} rows, expected ${expected}.`,
      );
    }
    const seg = tmp.subarray(own, cnt);
    seg.sort();
    rows.set(tmp.subarray(0, cnt), rowPtr[s]!);
    if (cnt > maxFront) maxFront = cnt;
    blockPtr[s + 1] = blockPtr[s]! + cnt * (l - f + 1);
  }
  const out: SupernodalStructure = {
    first,
    rowPtr,
    rows,
    parent: sParent,
    blockPtr,
    lPtr,
    lRow,
    lSrc,
    maxFront,
  };
  cache.set(sym, out);
  return out;
}

/** The numeric result of the multifrontal factorization. */
export interface MultifrontalFactor {
  /** Factor blocks: for supernode s, a (front rows × pivots) row-major block of L (unit diagonal). */
  readonly values: Float64Array;
  readonly pivots: Float64Array;
  readonly negative: number;
}

/**
 * Multifrontal numeric LDLᵀ: each front is assembled from A and its children's update matrices
 * (extend-add), its pivot columns are factored by dense left-looking LDLᵀ, and its Schur
 * complement U = F₂₂ − L₂₁ D L₂₁ᵀ is formed with contiguous dot products for the parent.
 * `zeroPivot(k, d)` decides (and throws) on a vanishing pivot at pivot position k.
 */
export function multifrontalNumeric(
  A: SparseSymmetricMatrix,
  sym: SparseLdltSymbolic,
  st: SupernodalStructure,
  isZero: (k: number, d: number) => boolean,
  onZero: (k: number, d: number) => never,
): MultifrontalFactor {
  const { first, rowPtr, rows, parent, blockPtr, lPtr, lRow, lSrc } = st;
  const ns = first.length - 1;
  const n = sym.n;
  const values = new Float64Array(blockPtr[ns]!);
  const pivots = new Float64Array(n);
  const Av = A.values;
  const rel = new Int32Array(n);
  const updates: (Float64Array | null)[] = new Array<Float64Array | null>(ns).fill(null);
  const childHead = new Int32Array(ns).fill(-1);
  const childNext = new Int32Array(ns).fill(-1);
  for (let s = ns - 1; s >= 0; s--) {
    const ps = parent[s]!;
    if (ps >= 0) {
      childNext[s] = childHead[ps]!;
      childHead[ps] = s;
    }
  }
  let negative = 0;
  let F = new Float64Array(0);
  let W = new Float64Array(0);
  for (let s = 0; s < ns; s++) {
    const f = first[s]!;
    const np = first[s + 1]! - f; // pivots
    const r0 = rowPtr[s]!;
    const nf = rowPtr[s + 1]! - r0; // front order
    if (F.length < nf * nf) F = new Float64Array(Math.max(nf * nf, F.length * 2));
    F.fill(0, 0, nf * nf);
    for (let a = 0; a < nf; a++) rel[rows[r0 + a]!] = a;
    // Assemble A's lower entries of the pivot columns.
    for (let j = f; j < f + np; j++) {
      const cj = rel[j]!;
      for (let p = lPtr[j]!; p < lPtr[j + 1]!; p++) {
        F[rel[lRow[p]!]! * nf + cj]! += Av[lSrc[p]!]!;
      }
    }
    // Extend-add the children's update matrices (lower triangles).
    for (let c = childHead[s]!; c >= 0; c = childNext[c]!) {
      const U = updates[c]!;
      const cOwn = first[c + 1]! - first[c]!;
      const cr = rowPtr[c]! + cOwn;
      const nu = rowPtr[c + 1]! - cr;
      for (let a = 0; a < nu; a++) {
        const ra = rel[rows[cr + a]!]! * nf;
        const ua = a * nu;
        for (let b = 0; b <= a; b++) F[ra + rel[rows[cr + b]!]!]! += U[ua + b]!;
      }
      updates[c] = null;
    }
    // Dense left-looking LDLᵀ of the np pivot columns (rows of F are contiguous in the column
    // index, so every update is a dot product over t < k).
    if (W.length < nf * np) W = new Float64Array(Math.max(nf * np, W.length * 2));
    for (let k = 0; k < np; k++) {
      // W[i, t] = L[i, t] · d_t for t < k (kept for rows ≥ k).
      const rk = k * nf;
      let d = F[rk + k]!;
      for (let t = 0; t < k; t++) d -= F[rk + t]! * W[k * np + t]!;
      if (isZero(f + k, d)) onZero(f + k, d);
      pivots[f + k] = d;
      if (d < 0) negative++;
      const inv = 1 / d;
      for (let i = k + 1; i < nf; i++) {
        const ri = i * nf;
        const wi = i * np;
        let v = F[ri + k]!;
        for (let t = 0; t < k; t++) v -= F[ri + t]! * W[k * np + t]!;
        // v is now L[i,k]·d; store W[i,k] = L[i,k]·d and L[i,k] = v / d.
        W[wi + k] = v;
        F[ri + k] = v * inv;
      }
      W[k * np + k] = d;
      F[rk + k] = 1;
    }
    // Store the factor block (nf × np, row-major).
    const base = blockPtr[s]!;
    for (let i = 0; i < nf; i++) {
      const ri = i * nf;
      const bi = base + i * np;
      for (let t = 0; t < np; t++) values[bi + t] = F[ri + t]!;
    }
    // Update matrix for the parent: U = F₂₂ − L₂₁ D L₂₁ᵀ (lower triangle).
    const nu = nf - np;
    if (nu > 0 && parent[s]! >= 0 && np >= BLOCKED_SCHUR_PIVOTS) {
      updates[s] = blockedSchur(F, W, nf, np, nu);
    } else if (nu > 0 && parent[s]! >= 0) {
      const U = new Float64Array(nu * nu);
      for (let a = 0; a < nu; a++) {
        const ia = (np + a) * nf;
        const wa = (np + a) * np;
        const ua = a * nu;
        for (let b = 0; b <= a; b++) {
          const ib = (np + b) * nf;
          let v = F[ia + np + b]!;
          for (let t = 0; t < np; t++) v -= W[wa + t]! * F[ib + t]!;
          U[ua + b] = v;
        }
      }
      updates[s] = U;
    }
  }
  return { values, pivots, negative };
}

/**
 * From this many pivots on, a front's Schur complement goes through the dense solver's blocked
 * product kernel (measured on the bench's 50k plate: most of its Schur flops are in fronts of 16
 * pivots or more, where the kernel runs several times faster than dot products of length np).
 */
const BLOCKED_SCHUR_PIVOTS = 16;
/** Rows of U per call of the kernel: only the columns up to the block's last row are formed. */
const SCHUR_ROWS = 64;

/**
 * U = F₂₂ − (L₂₁ D) L₂₁ᵀ for a front of order nf with np pivots (nu = nf − np): the lower
 * triangle, by row blocks of the kernel C += s·P U with P = W₂₁ (L₂₁ D, rows contiguous) and U =
 * L₂₁ᵀ (transposed once here). Entries above the diagonal of U are left as the kernel makes them
 * and never read.
 */
function blockedSchur(
  F: Float64Array,
  W: Float64Array,
  nf: number,
  np: number,
  nu: number,
): Float64Array {
  const U = new Float64Array(nu * nu);
  for (let a = 0; a < nu; a++) {
    const ia = (np + a) * nf + np;
    const ua = a * nu;
    for (let b = 0; b <= a; b++) U[ua + b] = F[ia + b]!;
  }
  const T = new Float64Array(np * nu);
  for (let b = 0; b < nu; b++) {
    const ib = (np + b) * nf;
    for (let t = 0; t < np; t++) T[t * nu + b] = F[ib + t]!;
  }
  for (let i0 = 0; i0 < nu; i0 += SCHUR_ROWS) {
    const rows = Math.min(SCHUR_ROWS, nu - i0);
    multiplyAdd(
      { data: U, offset: i0 * nu, stride: nu },
      { data: W, offset: (np + i0) * np, stride: np },
      { data: T, offset: 0, stride: nu },
      rows,
      np,
      0,
      i0 + rows,
      -1,
    );
  }
  return U;
}

/**
 * Solves L D Lᵀ y = c in place on the permuted vector y. Both sweeps run along the rows of the
 * row-major factor blocks (contiguous), the backward one accumulating each supernode's products
 * with the rows below its pivots before its own triangle.
 */
export function multifrontalSolve(
  st: SupernodalStructure,
  fac: MultifrontalFactor,
  y: Float64Array,
): void {
  const { first, rowPtr, rows, blockPtr } = st;
  const { values, pivots } = fac;
  const ns = first.length - 1;
  for (let s = 0; s < ns; s++) {
    const f = first[s]!;
    const np = first[s + 1]! - f;
    const r0 = rowPtr[s]!;
    const nf = rowPtr[s + 1]! - r0;
    const base = blockPtr[s]!;
    for (let i = 1; i < np; i++) {
      const bi = base + i * np;
      let v = y[f + i]!;
      for (let k = 0; k < i; k++) v -= values[bi + k]! * y[f + k]!;
      y[f + i] = v;
    }
    for (let i = np; i < nf; i++) {
      const bi = base + i * np;
      let v = 0;
      for (let k = 0; k < np; k++) v += values[bi + k]! * y[f + k]!;
      y[rows[r0 + i]!]! -= v;
    }
  }
  for (let j = 0; j < y.length; j++) y[j]! /= pivots[j]!;
  const acc = new Float64Array(256);
  for (let s = ns - 1; s >= 0; s--) {
    const f = first[s]!;
    const np = first[s + 1]! - f;
    const r0 = rowPtr[s]!;
    const nf = rowPtr[s + 1]! - r0;
    const base = blockPtr[s]!;
    const a = np <= acc.length ? acc : new Float64Array(np);
    a.fill(0, 0, np);
    for (let i = np; i < nf; i++) {
      const bi = base + i * np;
      const yi = y[rows[r0 + i]!]!;
      if (yi === 0) continue;
      for (let k = 0; k < np; k++) a[k]! += values[bi + k]! * yi;
    }
    for (let i = np - 1; i >= 0; i--) {
      const xi = y[f + i]! - a[i]!;
      y[f + i] = xi;
      const bi = base + i * np;
      for (let k = 0; k < i; k++) a[k]! += values[bi + k]! * xi;
    }
  }
}
