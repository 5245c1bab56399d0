import { EngineError } from '../../errors';
import type { SparseSymmetricMatrix, SymmetricFactorization } from '../types';
import { multifrontalNumeric, multifrontalSolve, supernodalStructure } from './multifrontal';
import { analyzeSparseLdlt, type SparseLdltSymbolic } from './symbolic';

export interface SparseLdltOptions {
  /** A symbolic analysis of the same pattern, reused instead of a new one. */
  readonly symbolic?: SparseLdltSymbolic;
  /** Refuse (MODEL_TOO_LARGE) when the memory estimate exceeds this many bytes. */
  readonly memoryLimitBytes?: number;
  /**
   * A pivot whose magnitude is at most this fraction of the largest entry of its row of A counts
   * as zero (all digits lost to cancellation). Default 1e-15: a long slender model legitimately
   * has pivots near (h/L)³ ≈ 1e-13 of its element stiffness, so the default is set below that.
   */
  readonly pivotTolerance?: number;
  /**
   * `'multifrontal'` (default): supernodal fronts with dense kernels; `'up-looking'`: the
   * simplicial row algorithm (kept as an independent check of the other).
   */
  readonly kernel?: 'multifrontal' | 'up-looking';
}

/** The sparse LDLᵀ factorization: a `SymmetricFactorization` with its factor and analysis. */
export interface SparseLdltFactorization extends SymmetricFactorization {
  readonly method: 'sparse-ldlt';
  readonly symbolic: SparseLdltSymbolic;
  /** Pivots d_k in the permuted order. */
  readonly pivots: Float64Array;
  /** Solves A X = B for `count` right-hand sides stored one after another in `b`. */
  solveMany(b: Float64Array, count: number, out?: Float64Array): Float64Array;
}

/**
 * Sparse LDLᵀ factorization P A Pᵀ = L D Lᵀ of a symmetric matrix (definite or indefinite, no
 * pivoting beyond the fill-reducing order) by the up-looking row algorithm: row k of L is a
 * sparse triangular solve whose pattern is the reach of row k of A in the elimination tree
 * (Davis, *Direct Methods for Sparse Linear Systems*, SIAM 2006, §4.7; Davis's LDL package).
 * `negativePivots` is the inertia used for Sturm counts (Sylvester's law of inertia).
 *
 * @throws EngineError ZERO_PIVOT with `{ dof }` (1-based, original numbering) when a pivot
 *   vanishes; MODEL_TOO_LARGE when the analysis' memory estimate exceeds `memoryLimitBytes`;
 *   MATRIX_SIZE_MISMATCH when `symbolic` was made for another pattern.
 * @example
 * const sym = analyzeSparseLdlt(Kminus);
 * const f = factorizeSparseLdlt(Kminus, { symbolic: sym });
 * const x = f.solve(b);
 * const below = f.negativePivots; // eigenvalues of K − σM below zero
 */
export function factorizeSparseLdlt(
  A: SparseSymmetricMatrix,
  options: SparseLdltOptions = {},
): SparseLdltFactorization {
  const symbolic =
    options.symbolic ??
    analyzeSparseLdlt(
      A,
      options.memoryLimitBytes === undefined ? {} : { memoryLimitBytes: options.memoryLimitBytes },
    );
  checkPattern(A, symbolic);
  const limit = options.memoryLimitBytes;
  if (limit !== undefined && symbolic.memoryEstimateBytes > limit) {
    throw new EngineError(
      'MODEL_TOO_LARGE',
      `The factorization of this ${A.n}-unknown model needs about ` +
        `${(symbolic.memoryEstimateBytes / 1e6).toFixed(0)} MB, more than the configured limit ` +
        `of ${(limit / 1e6).toFixed(0)} MB.`,
      { n: A.n, estimateBytes: symbolic.memoryEstimateBytes, limitBytes: limit },
    );
  }
  const tol = options.pivotTolerance ?? 1e-15;
  if ((options.kernel ?? 'multifrontal') === 'multifrontal') {
    return multifrontalFactorization(A, symbolic, tol);
  }
  const { n, perm, parent, colStart, cPtr, cRow, cSrc } = symbolic;
  const values = A.values;
  const nnzL = colStart[n]!;
  const Li = new Int32Array(nnzL);
  const Lx = new Float64Array(nnzL);
  const D = new Float64Array(n);
  const Y = new Float64Array(n);
  const pattern = new Int32Array(n);
  const flag = new Int32Array(n);
  const fill = new Int32Array(n); // entries of each column written so far
  const rowMax = rowMagnitudes(A, symbolic);
  let negative = 0;
  for (let k = 0; k < n; k++) {
    let top = n;
    flag[k] = k;
    const pEnd = cPtr[k + 1]!;
    for (let p = cPtr[k]!; p < pEnd; p++) {
      let i = cRow[p]!;
      Y[i]! += values[cSrc[p]!]!;
      let len = 0;
      while (flag[i] !== k) {
        pattern[len++] = i;
        flag[i] = k;
        i = parent[i]!;
      }
      while (len > 0) pattern[--top] = pattern[--len]!;
    }
    let dk = Y[k]!;
    Y[k] = 0;
    for (; top < n; top++) {
      const i = pattern[top]!;
      const yi = Y[i]!;
      Y[i] = 0;
      const p0 = colStart[i]!;
      const p2 = p0 + fill[i]!;
      for (let p = p0; p < p2; p++) Y[Li[p]!]! -= Lx[p]! * yi;
      const lki = yi / D[i]!;
      dk -= lki * yi;
      Li[p2] = k;
      Lx[p2] = lki;
      fill[i]!++;
    }
    if (!(Math.abs(dk) > tol * rowMax[k]!) || !Number.isFinite(dk)) {
      const dof = perm[k]! + 1;
      throw new EngineError(
        'ZERO_PIVOT',
        `The matrix is singular at DOF ${dof}: its pivot vanished (${dk.toExponential(3)} against ` +
          `entries of size ${rowMax[k]!.toExponential(3)} in that row). Check the supports ` +
          `and massless unknowns, or factor at another shift.`,
        { dof, pivot: dk },
      );
    }
    D[k] = dk;
    if (dk < 0) negative++;
  }
  const work = new Float64Array(n);
  const solveInto = (b: Float64Array, bOff: number, out: Float64Array, oOff: number): void => {
    for (let k = 0; k < n; k++) work[k] = b[bOff + perm[k]!]!;
    for (let j = 0; j < n; j++) {
      const xj = work[j]!;
      if (xj !== 0) {
        const pe = colStart[j + 1]!;
        for (let p = colStart[j]!; p < pe; p++) work[Li[p]!]! -= Lx[p]! * xj;
      }
    }
    for (let j = 0; j < n; j++) work[j]! /= D[j]!;
    for (let j = n - 1; j >= 0; j--) {
      let s = work[j]!;
      const pe = colStart[j + 1]!;
      for (let p = colStart[j]!; p < pe; p++) s -= Lx[p]! * work[Li[p]!]!;
      work[j] = s;
    }
    for (let k = 0; k < n; k++) out[oOff + perm[k]!] = work[k]!;
  };
  return {
    n,
    method: 'sparse-ldlt',
    negativePivots: negative,
    factorNonzeros: nnzL + n,
    symbolic,
    pivots: D,
    ...solvers(n, solveInto),
  };
}

/**
 * `solve` and `solveMany` of a factorization from its one-vector solve (b at bOff → out at oOff),
 * with the size checks both need.
 */
function solvers(
  n: number,
  solveInto: (b: Float64Array, bOff: number, out: Float64Array, oOff: number) => void,
): Pick<SparseLdltFactorization, 'solve' | 'solveMany'> {
  return {
    solve(b: Float64Array, out?: Float64Array): Float64Array {
      if (b.length !== n) {
        throw new EngineError(
          'MATRIX_SIZE_MISMATCH',
          `The right-hand side has ${b.length} entries but the matrix has ${n} rows.`,
        );
      }
      const x = out ?? new Float64Array(n);
      solveInto(b, 0, x, 0);
      return x;
    },
    solveMany(b: Float64Array, count: number, out?: Float64Array): Float64Array {
      if (b.length !== n * count) {
        throw new EngineError(
          'MATRIX_SIZE_MISMATCH',
          `${count} right-hand sides of ${n} entries need ${n * count} values, got ${b.length}.`,
        );
      }
      const x = out ?? new Float64Array(n * count);
      for (let c = 0; c < count; c++) solveInto(b, c * n, x, c * n);
      return x;
    },
  };
}

function zeroPivotError(dof: number, dk: number, size: number): EngineError {
  return new EngineError(
    'ZERO_PIVOT',
    `The matrix is singular at DOF ${dof}: its pivot vanished (${dk.toExponential(3)} against ` +
      `entries of size ${size.toExponential(3)} in that row). Check the supports ` +
      `and massless unknowns, or factor at another shift.`,
    { dof, pivot: dk },
  );
}

function multifrontalFactorization(
  A: SparseSymmetricMatrix,
  symbolic: SparseLdltSymbolic,
  tol: number,
): SparseLdltFactorization {
  const { n, perm } = symbolic;
  const st = supernodalStructure(symbolic);
  const rowMax = rowMagnitudes(A, symbolic);
  const fac = multifrontalNumeric(
    A,
    symbolic,
    st,
    (k, d) => !(Math.abs(d) > tol * rowMax[k]!) || !Number.isFinite(d),
    (k, d) => {
      throw zeroPivotError(perm[k]! + 1, d, rowMax[k]!);
    },
  );
  const work = new Float64Array(n);
  const solveInto = (b: Float64Array, bOff: number, out: Float64Array, oOff: number): void => {
    for (let k = 0; k < n; k++) work[k] = b[bOff + perm[k]!]!;
    multifrontalSolve(st, fac, work);
    for (let k = 0; k < n; k++) out[oOff + perm[k]!] = work[k]!;
  };
  return {
    n,
    method: 'sparse-ldlt',
    negativePivots: fac.negative,
    factorNonzeros: symbolic.factorNonzeros,
    symbolic,
    pivots: fac.pivots,
    ...solvers(n, solveInto),
  };
}

function checkPattern(A: SparseSymmetricMatrix, s: SparseLdltSymbolic): void {
  const same =
    A.n === s.n &&
    (A.colPtr === s.patternColPtr ||
      (A.colPtr.length === s.patternColPtr.length &&
        A.colPtr.every((v, i) => v === s.patternColPtr[i]))) &&
    (A.rowIdx === s.patternRowIdx ||
      (A.rowIdx.length === s.patternRowIdx.length &&
        A.rowIdx.every((v, i) => v === s.patternRowIdx[i])));
  if (!same) {
    throw new EngineError(
      'MATRIX_SIZE_MISMATCH',
      'The symbolic analysis was made for a different sparsity pattern; analyse this matrix again.',
    );
  }
}

/** Largest |a_ij| in each row of A, indexed by pivot position (the reference for a zero pivot). */
function rowMagnitudes(A: SparseSymmetricMatrix, s: SparseLdltSymbolic): Float64Array {
  const out = new Float64Array(A.n);
  const { colPtr, rowIdx, values } = A;
  for (let j = 0; j < A.n; j++) {
    for (let p = colPtr[j]!; p < colPtr[j + 1]!; p++) {
      const a = Math.abs(values[p]!);
      const i = rowIdx[p]!;
      const pi = s.invPerm[i]!;
      const pj = s.invPerm[j]!;
      if (a > out[pi]!) out[pi] = a;
      if (a > out[pj]!) out[pj] = a;
    }
  }
  for (let k = 0; k < A.n; k++) if (out[k] === 0) out[k] = Number.MIN_VALUE;
  return out;
}
