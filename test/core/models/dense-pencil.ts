// Test helper: all eigenvalues of K φ = λ M φ through ml-matrix (an independent library,
// REFERENCES.md item 5): Cholesky M = L Lᵀ, then the symmetric eigenproblem of L⁻¹ K L⁻ᵀ.
import { CholeskyDecomposition, EigenvalueDecomposition, Matrix } from 'ml-matrix';
import type { SparseSymmetricMatrix } from '../../../core/linalg/types';

export function toDense(A: SparseSymmetricMatrix): Matrix {
  const m = new Matrix(A.n, A.n);
  for (let j = 0; j < A.n; j++) {
    for (let p = A.colPtr[j]!; p < A.colPtr[j + 1]!; p++) {
      const i = A.rowIdx[p]!;
      m.set(i, j, m.get(i, j) + A.values[p]!);
      if (i !== j) m.set(j, i, m.get(j, i) + A.values[p]!);
    }
  }
  return m;
}

export function denseEigenvalues(K: SparseSymmetricMatrix, M: SparseSymmetricMatrix): number[] {
  const chol = new CholeskyDecomposition(toDense(M));
  if (!chol.isPositiveDefinite()) throw new Error('dense reference: M is not positive definite');
  const inv = solveLower(chol.lowerTriangularMatrix); // L⁻¹ by solving L X = I
  const C = inv.mmul(toDense(K)).mmul(inv.transpose());
  const sym = C.add(C.transpose()).mul(0.5);
  return new EigenvalueDecomposition(sym, { assumeSymmetric: true }).realEigenvalues.sort(
    (a, b) => a - b,
  );
}

function solveLower(L: Matrix): Matrix {
  const n = L.rows;
  const X = new Matrix(n, n);
  for (let c = 0; c < n; c++) {
    for (let i = 0; i < n; i++) {
      let s = i === c ? 1 : 0;
      for (let k = 0; k < i; k++) s -= L.get(i, k) * X.get(k, c);
      X.set(i, c, s / L.get(i, i));
    }
  }
  return X;
}
