/**
 * Skyline (profile) LDLᵀ of a sparse symmetric matrix, rows stored from their first nonzero to the
 * diagonal. The active-column reduction of Bathe, *Finite Element Procedures* (1996), §8.2.3, in
 * row form: each entry is a dot product of two contiguous stretches.
 */
import { EngineError } from '../errors';
import { ZERO_PIVOT_TOLERANCE } from './dense';
import { envelopeFirst, profileSize, reverseCuthillMcKee } from './ordering';
import type { SparseSymmetricMatrix, SymmetricFactorization } from './types';

/** Options of the skyline factorization. */
export interface SkylineOptions {
  /** 'auto' keeps the natural order unless reverse Cuthill–McKee gives a smaller profile. */
  ordering?: 'auto' | 'rcm' | 'natural';
}

/**
 * Factorizes A = P L D Lᵀ Pᵀ in skyline storage. `negativePivots` is the inertia (Sturm count).
 * @throws EngineError ZERO_PIVOT naming the 1-based DOF in the caller's numbering.
 * @example skylineLDLT(K, { ordering: 'rcm' }).solve(f)
 */
export function skylineLDLT(
  A: SparseSymmetricMatrix,
  options: SkylineOptions = {},
): SymmetricFactorization & { readonly perm: Int32Array | null } {
  const n = A.n;
  const ordering = options.ordering ?? 'auto';
  let perm: Int32Array | null = null;
  if (ordering !== 'natural') {
    const rcm = reverseCuthillMcKee(A);
    if (ordering === 'rcm' || profileSize(A, rcm) < profileSize(A)) perm = rcm;
  }
  const inv = new Int32Array(n);
  for (let k = 0; k < n; k++) inv[perm ? (perm[k] as number) : k] = k;

  // first column of each (permuted) row
  const first = envelopeFirst(A, perm);
  // rowStart[i] points at the entry (i, first[i]); the diagonal sits at rowStart[i] + i - first[i]
  const rowStart = new Float64Array(n + 1);
  for (let i = 0; i < n; i++)
    rowStart[i + 1] = (rowStart[i] as number) + i - (first[i] as number) + 1;
  const size = rowStart[n] as number;
  const S = new Float64Array(size);
  for (let j = 0; j < n; j++) {
    for (let p = A.colPtr[j] as number; p < (A.colPtr[j + 1] as number); p++) {
      const a = inv[A.rowIdx[p] as number] as number;
      const b = inv[j] as number;
      const r = a > b ? a : b;
      const c = a > b ? b : a;
      const q = (rowStart[r] as number) + c - (first[r] as number);
      S[q] = (S[q] as number) + (A.values[p] as number);
    }
  }
  const D = new Float64Array(n);
  let neg = 0;
  for (let i = 0; i < n; i++) {
    const fi = first[i] as number;
    const oi = (rowStart[i] as number) - fi; // S[oi + k] is entry (i, k)
    // w_j = l_ij d_j, computed in place
    for (let j = fi; j < i; j++) {
      const fj = first[j] as number;
      const oj = (rowStart[j] as number) - fj;
      const k0 = fi > fj ? fi : fj;
      let s = S[oi + j] as number;
      for (let k = k0; k < j; k++) s -= (S[oi + k] as number) * (S[oj + k] as number);
      S[oi + j] = s;
    }
    const aii = S[oi + i] as number;
    let d = aii;
    for (let j = fi; j < i; j++) {
      const w = S[oi + j] as number;
      const l = w / (D[j] as number);
      d -= w * l;
      S[oi + j] = l;
    }
    if (!(Math.abs(d) > ZERO_PIVOT_TOLERANCE * Math.max(Math.abs(aii), 1e-300))) {
      const dof = (perm ? (perm[i] as number) : i) + 1;
      throw new EngineError(
        'ZERO_PIVOT',
        `The skyline LDLᵀ factorization met a zero pivot at DOF ${dof} (pivot ${d.toPrecision(3)}): the matrix is singular there — check supports and connectivity at that DOF.`,
        { dof, pivot: d },
      );
    }
    D[i] = d;
    S[oi + i] = 1;
    if (d < 0) neg++;
  }
  const work = new Float64Array(n);
  return {
    n,
    method: 'skyline-ldlt',
    negativePivots: neg,
    factorNonzeros: size,
    perm,
    solve(b: Float64Array, out?: Float64Array): Float64Array {
      const x = work;
      for (let k = 0; k < n; k++) x[k] = b[perm ? (perm[k] as number) : k] as number;
      for (let i = 0; i < n; i++) {
        const fi = first[i] as number;
        const oi = (rowStart[i] as number) - fi;
        let s = x[i] as number;
        for (let k = fi; k < i; k++) s -= (S[oi + k] as number) * (x[k] as number);
        x[i] = s;
      }
      for (let i = 0; i < n; i++) x[i] = (x[i] as number) / (D[i] as number);
      for (let i = n - 1; i >= 0; i--) {
        const fi = first[i] as number;
        const oi = (rowStart[i] as number) - fi;
        const xi = x[i] as number;
        for (let k = fi; k < i; k++) x[k] = (x[k] as number) - (S[oi + k] as number) * xi;
      }
      const y = out ?? new Float64Array(n);
      for (let k = 0; k < n; k++) y[perm ? (perm[k] as number) : k] = x[k] as number;
      return y;
    },
  };
}
