import { EngineError } from '../../errors';
import type { SparseSymmetricMatrix } from '../types';
import { orderNestedDissection } from './ordering';

/**
 * The symbolic analysis of a sparse symmetric pattern: the fill-reducing ordering, the permuted
 * upper-triangle pattern (with a map back to the entries of A), the elimination tree, the column
 * counts of L and the memory the numeric step will need. It depends on the pattern only, so one
 * analysis serves every K − σM of the same pattern.
 */
export interface SparseLdltSymbolic {
  readonly n: number;
  /** Which ordering produced `perm`. */
  readonly ordering: 'nested-dissection' | 'natural' | 'given';
  /** `perm[k]` = original index of the k-th pivot. */
  readonly perm: Int32Array;
  /** `invPerm[i]` = position of original unknown i in the pivot order. */
  readonly invPerm: Int32Array;
  /** Elimination tree of P A Pᵀ: `parent[k]`, −1 at a root. */
  readonly parent: Int32Array;
  /** Nonzeros of each column of L strictly below the diagonal. */
  readonly colCounts: Int32Array;
  /** Column starts of L (strict lower part), length n + 1. */
  readonly colStart: Int32Array;
  /** nnz(L) including the unit diagonal. */
  readonly factorNonzeros: number;
  /** Floating-point operations of the numeric step (multiply–adds counted as 2). */
  readonly flops: number;
  /** Bytes the numeric factorization will hold (factor, pivots, workspace). */
  readonly memoryEstimateBytes: number;
  /** Upper triangle of P A Pᵀ by columns: rows `cRow[cPtr[k]..cPtr[k+1]-1]` (all ≤ k). */
  readonly cPtr: Int32Array;
  readonly cRow: Int32Array;
  /** Index into `A.values` of each entry of the permuted upper triangle. */
  readonly cSrc: Int32Array;
  /** The pattern analysed, kept to check that a later matrix has the same one. */
  readonly patternColPtr: Int32Array;
  readonly patternRowIdx: Int32Array;
}

export interface SparseLdltAnalyzeOptions {
  /** A pivot order to use instead of nested dissection (`perm[k]` = original index). */
  readonly perm?: Int32Array;
  /** `'natural'` keeps the given numbering (for tests and banded models). */
  readonly ordering?: 'nested-dissection' | 'natural';
  /** Refuse (EngineError MODEL_TOO_LARGE) when the estimate exceeds this many bytes. */
  readonly memoryLimitBytes?: number;
}

const MAX_INDEX = 2 ** 31 - 1;

/**
 * Symbolic analysis for the sparse LDLᵀ factorization: ordering, elimination tree and column
 * counts by the row-subtree traversal of Liu (1986) as used in Davis's LDL package (Davis,
 * *Direct Methods for Sparse Linear Systems*, SIAM 2006, ch. 4), then a memory estimate.
 *
 * @throws EngineError MODEL_TOO_LARGE when the estimate exceeds `memoryLimitBytes` (the message
 *   gives the estimate in MB), or when the factor would not fit 32-bit indices.
 * @example
 * const sym = analyzeSparseLdlt(A, { memoryLimitBytes: 2e9 });
 * const f1 = factorizeSparseLdlt(A1, { symbolic: sym });
 */
export function analyzeSparseLdlt(
  A: SparseSymmetricMatrix,
  options: SparseLdltAnalyzeOptions = {},
): SparseLdltSymbolic {
  const { n, colPtr, rowIdx } = A;
  let perm: Int32Array;
  let ordering: SparseLdltSymbolic['ordering'];
  if (options.perm) {
    perm = options.perm;
    ordering = 'given';
    if (perm.length !== n) {
      throw new EngineError(
        'INVALID_OPTION',
        `The pivot order has ${perm.length} entries but the matrix has ${n} rows.`,
      );
    }
  } else if (options.ordering === 'natural') {
    perm = Int32Array.from({ length: n }, (_, i) => i);
    ordering = 'natural';
  } else if (options.ordering === undefined && envelope(A) <= colPtr[n]! - n + 16) {
    // Pick by measurement: the envelope of the natural order bounds its nnz(L) from above; when
    // it adds nothing to the pattern (a chain, a beam) the model factors without fill as it is.
    perm = Int32Array.from({ length: n }, (_, i) => i);
    ordering = 'natural';
  } else {
    perm = orderNestedDissection(A);
    ordering = 'nested-dissection';
  }
  const invPerm = new Int32Array(n).fill(-1);
  for (let k = 0; k < n; k++) {
    const i = perm[k]!;
    if (i < 0 || i >= n || invPerm[i] !== -1) {
      throw new EngineError('INVALID_OPTION', 'The pivot order is not a permutation of the rows.');
    }
    invPerm[i] = k;
  }
  // Permuted upper triangle C = (P A Pᵀ) upper, by columns.
  const nnzA = colPtr[n]!;
  const cPtr = new Int32Array(n + 1);
  for (let j = 0; j < n; j++) {
    const pj = invPerm[j]!;
    for (let p = colPtr[j]!; p < colPtr[j + 1]!; p++) {
      const pi = invPerm[rowIdx[p]!]!;
      cPtr[(pi > pj ? pi : pj) + 1]!++;
    }
  }
  for (let k = 0; k < n; k++) cPtr[k + 1] = cPtr[k]! + cPtr[k + 1]!;
  const cRow = new Int32Array(nnzA);
  const cSrc = new Int32Array(nnzA);
  const next = cPtr.slice(0, n);
  for (let j = 0; j < n; j++) {
    const pj = invPerm[j]!;
    for (let p = colPtr[j]!; p < colPtr[j + 1]!; p++) {
      const pi = invPerm[rowIdx[p]!]!;
      const col = pi > pj ? pi : pj;
      const q = next[col]!++;
      cRow[q] = pi > pj ? pj : pi;
      cSrc[q] = p;
    }
  }
  // Elimination tree and column counts (LDL symbolic): row k of L is the union of the paths from
  // each i (C[i,k] ≠ 0, i < k) up the tree to k.
  const parent = new Int32Array(n);
  const colCounts = new Int32Array(n);
  const flag = new Int32Array(n);
  for (let k = 0; k < n; k++) {
    parent[k] = -1;
    flag[k] = k;
    for (let p = cPtr[k]!; p < cPtr[k + 1]!; p++) {
      let i = cRow[p]!;
      while (flag[i] !== k) {
        if (parent[i] === -1) parent[i] = k;
        colCounts[i]!++;
        flag[i] = k;
        i = parent[i]!;
      }
    }
  }
  const colStart = new Int32Array(n + 1);
  let total = 0;
  let flops = 0;
  for (let k = 0; k < n; k++) {
    const c = colCounts[k]!;
    total += c;
    flops += c * (c + 3);
    if (total > MAX_INDEX) {
      throw new EngineError(
        'MODEL_TOO_LARGE',
        `The factor of this ${n}-unknown model would hold more than ${MAX_INDEX} nonzeros ` +
          `(${Math.round(estimateBytes(n, total, nnzA) / 1e6)} MB at least); it cannot be factored.`,
        { n, factorNonzeros: total },
      );
    }
    colStart[k + 1] = total;
  }
  const memoryEstimateBytes = estimateBytes(n, total, nnzA);
  const limit = options.memoryLimitBytes;
  if (limit !== undefined && memoryEstimateBytes > limit) {
    throw new EngineError(
      'MODEL_TOO_LARGE',
      `The factorization of this ${n}-unknown model needs about ` +
        `${(memoryEstimateBytes / 1e6).toFixed(0)} MB (${total + n} nonzeros in L), more than ` +
        `the configured limit of ${(limit / 1e6).toFixed(0)} MB.`,
      { n, factorNonzeros: total + n, estimateBytes: memoryEstimateBytes, limitBytes: limit },
    );
  }
  return {
    n,
    ordering,
    perm,
    invPerm,
    parent,
    colCounts,
    colStart,
    factorNonzeros: total + n,
    flops,
    memoryEstimateBytes,
    cPtr,
    cRow,
    cSrc,
    patternColPtr: colPtr,
    patternRowIdx: rowIdx,
  };
}

/** Σ over rows of (row − first column in that row): the envelope of the natural order. */
function envelope(A: SparseSymmetricMatrix): number {
  const first = Int32Array.from({ length: A.n }, (_, i) => i);
  for (let j = 0; j < A.n; j++) {
    for (let p = A.colPtr[j]!; p < A.colPtr[j + 1]!; p++) {
      const i = A.rowIdx[p]!;
      if (j < first[i]!) first[i] = j;
    }
  }
  let s = 0;
  for (let i = 0; i < A.n; i++) s += i - first[i]!;
  return s;
}

/** Factor entries (index 4 + value 8), pivots, permuted values and the numeric workspace. */
function estimateBytes(n: number, nnzL: number, nnzA: number): number {
  return nnzL * 12 + nnzA * 8 + n * (8 + 8 + 4 + 4 + 4 + 4 + 8);
}
