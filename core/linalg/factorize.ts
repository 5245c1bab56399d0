/**
 * One place that picks the factorization for a symmetric matrix, and the helpers around it
 * (K − σM, norms, diagonals, checks) that every eigen method uses.
 */
import { EngineError } from '../errors';
import { assertDenseSymmetric, denseLDLT } from './dense';
import { skylineLDLT } from './skyline';
import { factorizeSparseLdlt } from './sparse-ldlt/index';
import { matrixSize, symmetricMultiply } from './sparse';
import type {
  DenseMatrix,
  SparseSymmetricMatrix,
  SymmetricFactorization,
  SymmetricMatrix,
} from './types';

/** Options of `factorizeSymmetric`. */
export interface FactorizeOptions {
  ordering?: 'auto' | 'rcm' | 'natural';
}

/**
 * Factorizes a symmetric matrix as L D Lᵀ: dense storage → dense LDLᵀ; sparse storage → the
 * fill-reducing sparse LDLᵀ (nested dissection, multifrontal; `sparse-ldlt/README.md`), or with
 * `ordering: 'rcm' | 'natural'` the skyline LDLᵀ with that band ordering.
 * The factorization's `negativePivots` is the Sturm count (Sylvester's law of inertia).
 * @throws EngineError ZERO_PIVOT with `details.dof` (1-based) on a singular matrix.
 * @example const F = factorizeSymmetric(combine(K, 1, M, -sigma)); F.negativePivots
 */
export function factorizeSymmetric(
  A: SymmetricMatrix,
  options: FactorizeOptions = {},
): SymmetricFactorization {
  if (A.kind === 'dense') return denseLDLT(A);
  // The fill-reducing sparse LDLᵀ is the default; an explicit band ordering asks for the skyline.
  if (options.ordering === 'rcm' || options.ordering === 'natural') {
    return skylineLDLT(A, { ordering: options.ordering });
  }
  return factorizeSparseLdlt(A);
}

/**
 * αK + βM for two symmetric matrices of the same size. Both dense → dense; both sparse → sparse
 * on the union pattern; mixed → dense.
 * @throws EngineError MATRIX_SIZE_MISMATCH when the sizes differ.
 * @example const A = combine(K, 1, M, -sigma); // K − σM
 */
export function combine(
  K: SymmetricMatrix,
  alpha: number,
  M: SymmetricMatrix,
  beta: number,
): SymmetricMatrix {
  const n = matrixSize(K);
  if (matrixSize(M) !== n) {
    throw new EngineError(
      'MATRIX_SIZE_MISMATCH',
      `K is ${n} × ${n} but M is ${matrixSize(M)} × ${matrixSize(M)}; they must be the same size.`,
    );
  }
  if (K.kind === 'sparse-symmetric' && M.kind === 'sparse-symmetric') {
    const colPtr = new Int32Array(n + 1);
    const rows: number[] = [];
    const vals: number[] = [];
    for (let j = 0; j < n; j++) {
      let p = K.colPtr[j] as number;
      let q = M.colPtr[j] as number;
      const pe = K.colPtr[j + 1] as number;
      const qe = M.colPtr[j + 1] as number;
      while (p < pe || q < qe) {
        const ip = p < pe ? (K.rowIdx[p] as number) : Infinity;
        const iq = q < qe ? (M.rowIdx[q] as number) : Infinity;
        if (ip === iq) {
          rows.push(ip);
          vals.push(alpha * (K.values[p++] as number) + beta * (M.values[q++] as number));
        } else if (ip < iq) {
          rows.push(ip);
          vals.push(alpha * (K.values[p++] as number));
        } else {
          rows.push(iq);
          vals.push(beta * (M.values[q++] as number));
        }
      }
      colPtr[j + 1] = rows.length;
    }
    return {
      kind: 'sparse-symmetric',
      n,
      colPtr,
      rowIdx: Int32Array.from(rows),
      values: Float64Array.from(vals),
    };
  }
  const a = toDense(K).data;
  const b = toDense(M).data;
  const data = new Float64Array(n * n);
  for (let p = 0; p < n * n; p++) data[p] = alpha * (a[p] as number) + beta * (b[p] as number);
  return { kind: 'dense', rows: n, cols: n, data };
}

/**
 * Full dense copy of a symmetric matrix (sparse → both triangles filled).
 * @example toDense(K).data
 */
export function toDense(A: SymmetricMatrix): DenseMatrix {
  if (A.kind === 'dense') return A;
  const n = A.n;
  const data = new Float64Array(n * n);
  for (let j = 0; j < n; j++) {
    for (let p = A.colPtr[j] as number; p < (A.colPtr[j + 1] as number); p++) {
      const i = A.rowIdx[p] as number;
      const v = A.values[p] as number;
      data[i * n + j] = v;
      data[j * n + i] = v;
    }
  }
  return { kind: 'dense', rows: n, cols: n, data };
}

/**
 * Sparse symmetric copy of a dense symmetric matrix (lower triangle, exact zeros dropped).
 * @example toSparse(denseFromRows([[2, -1], [-1, 2]]))
 */
export function toSparse(A: SymmetricMatrix): SparseSymmetricMatrix {
  if (A.kind === 'sparse-symmetric') return A;
  const n = A.rows;
  const colPtr = new Int32Array(n + 1);
  const rows: number[] = [];
  const vals: number[] = [];
  for (let j = 0; j < n; j++) {
    for (let i = j; i < n; i++) {
      const v = A.data[i * n + j] as number;
      if (v !== 0 || i === j) {
        rows.push(i);
        vals.push(v);
      }
    }
    colPtr[j + 1] = rows.length;
  }
  return {
    kind: 'sparse-symmetric',
    n,
    colPtr,
    rowIdx: Int32Array.from(rows),
    values: Float64Array.from(vals),
  };
}

/**
 * The diagonal of a symmetric matrix.
 * @example diagonalOf(M)
 */
export function diagonalOf(A: SymmetricMatrix): Float64Array {
  const n = matrixSize(A);
  const d = new Float64Array(n);
  if (A.kind === 'dense') {
    for (let i = 0; i < n; i++) d[i] = A.data[i * n + i] as number;
    return d;
  }
  for (let j = 0; j < n; j++) {
    const p = A.colPtr[j] as number;
    if (p < (A.colPtr[j + 1] as number) && A.rowIdx[p] === j) d[j] = A.values[p] as number;
  }
  return d;
}

/**
 * True when every off-diagonal entry is zero (a lumped mass matrix).
 * @example isDiagonal(M)
 */
export function isDiagonal(A: SymmetricMatrix): boolean {
  const n = matrixSize(A);
  if (A.kind === 'dense') {
    for (let i = 0; i < n; i++)
      for (let j = 0; j < n; j++) if (i !== j && A.data[i * n + j] !== 0) return false;
    return true;
  }
  for (let j = 0; j < n; j++)
    for (let p = A.colPtr[j] as number; p < (A.colPtr[j + 1] as number); p++)
      if (A.rowIdx[p] !== j && A.values[p] !== 0) return false;
  return true;
}

/**
 * The 1-norm (= ∞-norm for a symmetric matrix), max column sum of |a_ij|; an upper bound of the
 * 2-norm.
 * @example normOne(K)
 */
export function normOne(A: SymmetricMatrix): number {
  const n = matrixSize(A);
  const s = new Float64Array(n);
  if (A.kind === 'dense') {
    for (let i = 0; i < n; i++)
      for (let j = 0; j < n; j++) s[j] = (s[j] as number) + Math.abs(A.data[i * n + j] as number);
  } else {
    for (let j = 0; j < n; j++)
      for (let p = A.colPtr[j] as number; p < (A.colPtr[j + 1] as number); p++) {
        const i = A.rowIdx[p] as number;
        const v = Math.abs(A.values[p] as number);
        s[j] = (s[j] as number) + v;
        if (i !== j) s[i] = (s[i] as number) + v;
      }
  }
  let m = 0;
  for (let j = 0; j < n; j++) if ((s[j] as number) > m) m = s[j] as number;
  return m;
}

/**
 * Products A X for a block of vectors (one `Float64Array` per column).
 * @example symmetricMultiplyBlock(M, [phi1, phi2])
 */
export function symmetricMultiplyBlock(A: SymmetricMatrix, X: Float64Array[]): Float64Array[] {
  return X.map((x) => symmetricMultiply(A, x));
}

/**
 * Checks a matrix for use as K or M: square, finite and (dense) symmetric.
 * @param name 'K' or 'M' as the user knows it.
 * @throws EngineError MATRIX_NOT_SQUARE, MATRIX_NOT_FINITE, MATRIX_NOT_SYMMETRIC naming the entry.
 * @example assertSymmetricMatrix(K, 'K');
 */
export function assertSymmetricMatrix(A: SymmetricMatrix, name: string): void {
  if (A.kind === 'dense') {
    assertDenseSymmetric(A, name);
    return;
  }
  for (let j = 0; j < A.n; j++)
    for (let p = A.colPtr[j] as number; p < (A.colPtr[j + 1] as number); p++) {
      const v = A.values[p] as number;
      if (!Number.isFinite(v)) {
        throw new EngineError(
          'MATRIX_NOT_FINITE',
          `${name}[${(A.rowIdx[p] as number) + 1},${j + 1}] is ${v}; every entry must be a finite number.`,
          { row: (A.rowIdx[p] as number) + 1, col: j + 1 },
        );
      }
    }
}

/**
 * xᵀ y.
 * @example dot(x, y)
 */
export function dot(x: Float64Array, y: Float64Array): number {
  let s = 0;
  for (let i = 0; i < x.length; i++) s += (x[i] as number) * (y[i] as number);
  return s;
}

/**
 * Euclidean norm ‖x‖₂ (scaled to avoid overflow).
 * @example norm2(x)
 */
export function norm2(x: Float64Array): number {
  let m = 0;
  for (let i = 0; i < x.length; i++) m = Math.max(m, Math.abs(x[i] as number));
  if (m === 0) return 0;
  let s = 0;
  for (let i = 0; i < x.length; i++) s += ((x[i] as number) / m) ** 2;
  return m * Math.sqrt(s);
}
