import { EngineError } from '../../errors';
import type { SparseSymmetricMatrix } from '../types';
import { factorizeSparseLdlt, type SparseLdltFactorization } from './numeric';
import { analyzeSparseLdlt, type SparseLdltSymbolic } from './symbolic';

/**
 * The pencil K − σM on the union of the patterns of K and M, analysed once: every shift reuses the
 * same pattern, ordering and elimination tree, only the numeric step is repeated.
 */
export interface ShiftedPencil {
  readonly n: number;
  /** K − σM with the union pattern (fresh values array each call). */
  assemble(sigma: number): SparseSymmetricMatrix;
  /** The symbolic analysis of the union pattern (computed on first use). */
  symbolic(): SparseLdltSymbolic;
  /** LDLᵀ of K − σM (`pivotTolerance` as in `factorizeSparseLdlt`). */
  factorize(sigma: number, pivotTolerance?: number): SparseLdltFactorization;
}

/**
 * Builds the union pattern of K and M (both lower-triangle CSC, same size) and returns a
 * `ShiftedPencil` whose factorizations share one symbolic analysis.
 *
 * @throws EngineError MATRIX_SIZE_MISMATCH when K and M differ in size; MODEL_TOO_LARGE from the
 *   analysis when `memoryLimitBytes` is exceeded.
 * @example
 * const pencil = createShiftedPencil(K, M);
 * const below = pencil.factorize(sigma).negativePivots; // eigenvalues below σ
 */
export function createShiftedPencil(
  K: SparseSymmetricMatrix,
  M: SparseSymmetricMatrix,
  options: { memoryLimitBytes?: number } = {},
): ShiftedPencil {
  if (K.n !== M.n) {
    throw new EngineError(
      'MATRIX_SIZE_MISMATCH',
      `K is ${K.n}×${K.n} but M is ${M.n}×${M.n}; they must describe the same unknowns.`,
    );
  }
  const n = K.n;
  const colPtr = new Int32Array(n + 1);
  // First pass counts the merged column lengths, second fills rows and the maps.
  for (let j = 0; j < n; j++) {
    let a = K.colPtr[j]!;
    let b = M.colPtr[j]!;
    const ae = K.colPtr[j + 1]!;
    const be = M.colPtr[j + 1]!;
    let c = 0;
    while (a < ae || b < be) {
      const ra = a < ae ? K.rowIdx[a]! : n;
      const rb = b < be ? M.rowIdx[b]! : n;
      if (ra <= rb) a++;
      if (rb <= ra) b++;
      c++;
    }
    colPtr[j + 1] = colPtr[j]! + c;
  }
  const nnz = colPtr[n]!;
  const rowIdx = new Int32Array(nnz);
  const kMap = new Int32Array(K.colPtr[n]!);
  const mMap = new Int32Array(M.colPtr[n]!);
  for (let j = 0; j < n; j++) {
    let a = K.colPtr[j]!;
    let b = M.colPtr[j]!;
    const ae = K.colPtr[j + 1]!;
    const be = M.colPtr[j + 1]!;
    let q = colPtr[j]!;
    while (a < ae || b < be) {
      const ra = a < ae ? K.rowIdx[a]! : n;
      const rb = b < be ? M.rowIdx[b]! : n;
      const r = ra < rb ? ra : rb;
      rowIdx[q] = r;
      if (ra === r) kMap[a++] = q;
      if (rb === r) mMap[b++] = q;
      q++;
    }
  }
  let sym: SparseLdltSymbolic | undefined;
  const assemble = (sigma: number): SparseSymmetricMatrix => {
    const values = new Float64Array(nnz);
    const kv = K.values;
    const mv = M.values;
    for (let p = 0; p < kv.length; p++) values[kMap[p]!]! += kv[p]!;
    if (sigma !== 0) for (let p = 0; p < mv.length; p++) values[mMap[p]!]! -= sigma * mv[p]!;
    return { kind: 'sparse-symmetric', n, colPtr, rowIdx, values };
  };
  const symbolic = (): SparseLdltSymbolic => {
    if (!sym) {
      sym = analyzeSparseLdlt(
        { kind: 'sparse-symmetric', n, colPtr, rowIdx, values: new Float64Array(nnz) },
        options.memoryLimitBytes === undefined
          ? {}
          : { memoryLimitBytes: options.memoryLimitBytes },
      );
    }
    return sym;
  };
  return {
    n,
    assemble,
    symbolic,
    factorize(sigma: number, pivotTolerance?: number): SparseLdltFactorization {
      return factorizeSparseLdlt(
        assemble(sigma),
        pivotTolerance === undefined
          ? { symbolic: symbolic() }
          : { symbolic: symbolic(), pivotTolerance },
      );
    },
  };
}

/** y = A x for a symmetric matrix stored as its lower triangle (CSC). */
export function multiplyLower(
  A: SparseSymmetricMatrix,
  x: Float64Array,
  y: Float64Array = new Float64Array(A.n),
): Float64Array {
  const { n, colPtr, rowIdx, values } = A;
  y.fill(0);
  for (let j = 0; j < n; j++) {
    const xj = x[j]!;
    let s = 0;
    const pe = colPtr[j + 1]!;
    for (let p = colPtr[j]!; p < pe; p++) {
      const i = rowIdx[p]!;
      const a = values[p]!;
      if (i === j) s += a * xj;
      else {
        y[i]! += a * xj;
        s += a * x[i]!;
      }
    }
    y[j]! += s;
  }
  return y;
}
