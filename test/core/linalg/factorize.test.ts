import { CholeskyDecomposition, EigenvalueDecomposition, Matrix, solve } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { seededRandom } from '../../../core/eigen/random';
import { EngineError } from '../../../core/errors';
import { denseCholeskyFactorization, denseLDLT } from '../../../core/linalg/dense';
import { combine, factorizeSymmetric, toDense, toSparse } from '../../../core/linalg/factorize';
import { profileSize, reverseCuthillMcKee } from '../../../core/linalg/ordering';
import { skylineLDLT } from '../../../core/linalg/skyline';
import { sparseSymmetricFromTriplets, symmetricMultiply } from '../../../core/linalg/sparse';
import type { DenseMatrix } from '../../../core/linalg/types';

function randomSymmetric(n: number, seed: number, shift: number): Matrix {
  const rand = seededRandom(seed);
  const A = Matrix.zeros(n, n);
  for (let i = 0; i < n; i++)
    for (let j = 0; j <= i; j++) {
      const v = rand() < 0.2 || i === j ? 2 * rand() - 1 : 0; // sparse-ish
      A.set(i, j, v);
      A.set(j, i, v);
    }
  return A.add(Matrix.eye(n, n).mul(shift));
}

function dense(A: Matrix): DenseMatrix {
  return { kind: 'dense', rows: A.rows, cols: A.columns, data: Float64Array.from(A.to1DArray()) };
}

describe('dense and skyline factorizations', () => {
  const n = 60;
  const A = randomSymmetric(n, 5, 0.5); // indefinite
  const b = Float64Array.from({ length: n }, (_, i) => Math.cos(i));
  // reference solution and inertia from ml-matrix (LU solve, symmetric eigen decomposition)
  const xRef = solve(A, Matrix.columnVector(Array.from(b))).to1DArray();
  const negRef = new EigenvalueDecomposition(A, { assumeSymmetric: true }).realEigenvalues.filter(
    (l) => l < 0,
  ).length;

  it('dense LDLᵀ and skyline LDLᵀ (RCM and natural) solve like ml-matrix to 1e-9 and count the negative eigenvalues', () => {
    const Ad = dense(A);
    for (const F of [
      denseLDLT(Ad),
      skylineLDLT(toSparse(Ad), { ordering: 'rcm' }),
      skylineLDLT(toSparse(Ad), { ordering: 'natural' }),
      factorizeSymmetric(toSparse(Ad)),
    ]) {
      const x = F.solve(b);
      x.forEach((v, i) =>
        expect(Math.abs(v - (xRef[i] as number))).toBeLessThan(
          1e-9 * Math.max(1, Math.abs(xRef[i] as number)),
        ),
      );
      expect(F.negativePivots).toBe(negRef); // Sylvester's law of inertia
    }
    expect(negRef).toBeGreaterThan(0);
  });

  it('dense Cholesky agrees with ml-matrix on an SPD matrix', () => {
    const S = A.mmul(A).add(Matrix.eye(n, n));
    const F = denseCholeskyFactorization(dense(S));
    const x = F.solve(b);
    const ref = new CholeskyDecomposition(S).solve(Matrix.columnVector(Array.from(b))).to1DArray();
    x.forEach((v, i) =>
      expect(Math.abs(v - (ref[i] as number))).toBeLessThan(
        1e-10 * Math.max(1, Math.abs(ref[i] as number)),
      ),
    );
  });

  it('stops on a zero pivot naming the 1-based DOF in the caller’s numbering', () => {
    // free–free chain of 4: singular; with natural ordering the last pivot is zero
    const K = sparseSymmetricFromTriplets(
      4,
      [0, 1, 1, 2, 2, 3, 3],
      [0, 0, 1, 1, 2, 2, 3],
      [1, -1, 2, -1, 2, -1, 1],
    );
    for (const f of [() => skylineLDLT(K, { ordering: 'natural' }), () => denseLDLT(toDense(K))]) {
      try {
        f();
        expect.unreachable();
      } catch (e) {
        expect((e as EngineError).code).toBe('ZERO_PIVOT');
        expect((e as EngineError).details?.dof).toBe(4);
        expect((e as EngineError).message).toMatch(/DOF 4/);
      }
    }
    const r = (() => {
      try {
        skylineLDLT(K, { ordering: 'rcm' });
      } catch (e) {
        return e as EngineError;
      }
      return null;
    })();
    expect(r?.code).toBe('ZERO_PIVOT');
    expect([1, 2, 3, 4]).toContain(r?.details?.dof);
  });

  it('reverse Cuthill–McKee restores the band of a shuffled chain', () => {
    const N = 200;
    const rand = seededRandom(9);
    const perm = Array.from({ length: N }, (_, i) => i);
    for (let i = N - 1; i > 0; i--) {
      const j = Math.floor(rand() * (i + 1));
      [perm[i], perm[j]] = [perm[j] as number, perm[i] as number];
    }
    const r: number[] = [];
    const c: number[] = [];
    const v: number[] = [];
    for (let i = 0; i < N; i++) {
      r.push(perm[i] as number);
      c.push(perm[i] as number);
      v.push(2);
      if (i + 1 < N) {
        r.push(perm[i + 1] as number);
        c.push(perm[i] as number);
        v.push(-1);
      }
    }
    const K = sparseSymmetricFromTriplets(N, r, c, v);
    // a chain in the best order has profile 2N − 1 (one off-diagonal per row)
    expect(profileSize(K, reverseCuthillMcKee(K))).toBe(2 * N - 1);
    expect(profileSize(K)).toBeGreaterThan(10 * N);
    const F = factorizeSymmetric(K, { ordering: 'rcm' });
    expect(F.method).toBe('skyline-ldlt');
    expect(F.factorNonzeros).toBe(2 * N - 1);
    const x = Float64Array.from({ length: N }, (_, i) => i % 7);
    const y = F.solve(symmetricMultiply(K, x));
    y.forEach((yi, i) => expect(Math.abs(yi - (x[i] as number))).toBeLessThan(1e-9));
  });

  it('combine forms αK + βM on the union pattern (sparse) and densely', () => {
    const K = sparseSymmetricFromTriplets(3, [0, 1, 2, 1], [0, 1, 2, 0], [2, 2, 2, -1]);
    const M = sparseSymmetricFromTriplets(3, [0, 1, 2, 2], [0, 1, 2, 1], [1, 1, 1, 0.5]);
    const C = combine(K, 1, M, -2);
    expect(C.kind).toBe('sparse-symmetric');
    expect(Array.from(toDense(C).data)).toEqual([0, -1, 0, -1, 0, -1, 0, -1, 0]);
    const Cd = combine(toDense(K), 2, toDense(M), 1);
    expect(Array.from((Cd as DenseMatrix).data)).toEqual([5, -2, 0, -2, 5, 0.5, 0, 0.5, 5]);
  });
});
