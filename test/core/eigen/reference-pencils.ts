// Seeded random pencils for the solver tests. The references are built with ml-matrix (an
// independent library, REFERENCES.md item 5), never with our own code.
import {
  CholeskyDecomposition,
  EigenvalueDecomposition,
  Matrix,
  QrDecomposition,
  inverse,
} from 'ml-matrix';
import type { DenseMatrix } from '../../../core/linalg/types';
import { seededRandom } from '../../../core/eigen/random';

export function toDenseMatrix(A: Matrix): DenseMatrix {
  const n = A.rows;
  const data = new Float64Array(n * A.columns);
  for (let i = 0; i < n; i++)
    for (let j = 0; j < A.columns; j++) data[i * A.columns + j] = A.get(i, j);
  return { kind: 'dense', rows: n, cols: A.columns, data };
}

export function randomSpd(n: number, rand: () => number): Matrix {
  const B = Matrix.zeros(n, n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) B.set(i, j, 2 * rand() - 1);
  const A = B.mmul(B.transpose()).add(Matrix.eye(n, n).mul(n));
  return A.add(A.transpose()).mul(0.5);
}

/** A generic random pencil (K, M both random SPD). */
export function randomPencil(n: number, seed: number): { K: Matrix; M: Matrix } {
  const rand = seededRandom(seed);
  return { K: randomSpd(n, rand), M: randomSpd(n, rand) };
}

/**
 * A random pencil with a prescribed spectrum: M random SPD = LLᵀ, Q random orthogonal,
 * K = L Q Λ Qᵀ Lᵀ, so that K φ = λ M φ has exactly the eigenvalues in `spectrum`.
 */
export function pencilWithSpectrum(spectrum: number[], seed: number): { K: Matrix; M: Matrix } {
  const n = spectrum.length;
  const rand = seededRandom(seed);
  const M = randomSpd(n, rand);
  const G = Matrix.zeros(n, n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) G.set(i, j, 2 * rand() - 1);
  const Q = new QrDecomposition(G).orthogonalMatrix;
  const L = new CholeskyDecomposition(M).lowerTriangularMatrix;
  const LQ = L.mmul(Q);
  const K = LQ.mmul(Matrix.diag(spectrum)).mmul(LQ.transpose());
  return { K: K.add(K.transpose()).mul(0.5), M };
}

/** Eigenvalues of K φ = λ M φ by ml-matrix: EigenvalueDecomposition of L⁻¹ K L⁻ᵀ, ascending. */
export function mlMatrixEigenvalues(K: Matrix, M: Matrix): number[] {
  const L = new CholeskyDecomposition(M).lowerTriangularMatrix;
  const Li = inverse(L);
  let C = Li.mmul(K).mmul(Li.transpose());
  C = C.add(C.transpose()).mul(0.5);
  return new EigenvalueDecomposition(C, { assumeSymmetric: true }).realEigenvalues
    .slice()
    .sort((a, b) => a - b);
}

/** max |ΦᵀMΦ − I| and the largest ‖Kφ − λMφ‖ / (‖K‖_F + |λ|‖M‖_F) with ml-matrix products. */
export function checkPairs(
  K: Matrix,
  M: Matrix,
  lambdas: number[],
  vectors: Float64Array[],
): { orth: number; resid: number } {
  const Phi = new Matrix(vectors.map((v) => Array.from(v))).transpose();
  const G = Phi.transpose().mmul(M).mmul(Phi);
  let orth = 0;
  for (let i = 0; i < G.rows; i++)
    for (let j = 0; j < G.columns; j++)
      orth = Math.max(orth, Math.abs(G.get(i, j) - (i === j ? 1 : 0)));
  let resid = 0;
  const nk = K.norm('frobenius');
  const nm = M.norm('frobenius');
  lambdas.forEach((l, k) => {
    const phi = Matrix.columnVector(Array.from(vectors[k] as Float64Array));
    const r = K.mmul(phi).sub(M.mmul(phi).mul(l));
    resid = Math.max(
      resid,
      r.norm('frobenius') / ((nk + Math.abs(l) * nm) * phi.norm('frobenius')),
    );
  });
  return { orth, resid };
}
