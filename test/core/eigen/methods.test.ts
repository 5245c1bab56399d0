import { Matrix } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { denseEigensolver, symmetricEigen } from '../../../core/eigen/dense-eigensolver';
import { forwardIteration } from '../../../core/eigen/forward-iteration';
import { inverseIteration } from '../../../core/eigen/inverse-iteration';
import { shiftedInverseIteration } from '../../../core/eigen/shifted-inverse-iteration';
import { solveModes } from '../../../core/eigen/solve-modes';
import { seededRandom } from '../../../core/eigen/random';
import { denseFromRows } from '../../../core/linalg/sparse';
import { toSparse } from '../../../core/linalg/factorize';
import {
  checkPairs,
  mlMatrixEigenvalues,
  pencilWithSpectrum,
  randomPencil,
  toDenseMatrix,
} from './reference-pencils';

const base = { tolerance: 1e-10, maxIterations: 5000, shift: 0, seed: 7 };

function relErr(a: number, b: number): number {
  return Math.abs(a - b) / Math.abs(b);
}

describe('symmetricEigen (Householder + implicit QL)', () => {
  it('solves a 2 × 2 matrix exactly', () => {
    // [[2,1],[1,2]] has eigenvalues 1 and 3 (hand computation), vectors (1,−1)/√2, (1,1)/√2.
    const { values, vectors } = symmetricEigen(
      denseFromRows([
        [2, 1],
        [1, 2],
      ]),
    );
    expect(values[0]).toBeCloseTo(1, 14);
    expect(values[1]).toBeCloseTo(3, 14);
    expect(Math.abs((vectors[1] as Float64Array)[0] as number)).toBeCloseTo(Math.SQRT1_2, 14);
  });

  it('matches ml-matrix on a seeded random symmetric 150 × 150 matrix to 1e-12 relative to ‖A‖', () => {
    const rand = seededRandom(11);
    const n = 150;
    const A = Matrix.zeros(n, n);
    for (let i = 0; i < n; i++)
      for (let j = 0; j <= i; j++) {
        const v = 2 * rand() - 1;
        A.set(i, j, v);
        A.set(j, i, v);
      }
    const ours = symmetricEigen(toDenseMatrix(A)).values;
    const ref = mlMatrixEigenvalues(A, Matrix.eye(n, n));
    const scale = Math.max(...ref.map(Math.abs));
    ref.forEach((r, k) => expect(Math.abs((ours[k] as number) - r) / scale).toBeLessThan(1e-12));
  });
});

describe('every method against dense and ml-matrix on seeded random pencils', () => {
  for (const n of [5, 40, 200]) {
    it(`dense matches ml-matrix at n = ${n}: eigenvalues 1e-10 relative, residual 1e-12, orthogonality 1e-10`, () => {
      const { K, M } = randomPencil(n, 100 + n);
      const ref = mlMatrixEigenvalues(K, M);
      const raw = denseEigensolver({ ...base, K: toDenseMatrix(K), M: toDenseMatrix(M), count: n });
      expect(raw.lambdas).toHaveLength(n);
      ref.forEach((r, k) => expect(relErr(raw.lambdas[k] as number, r)).toBeLessThan(1e-10));
      const { orth, resid } = checkPairs(K, M, raw.lambdas, raw.vectors);
      expect(orth).toBeLessThan(1e-10);
      expect(resid).toBeLessThan(1e-12);
    });
  }

  for (const n of [30, 200]) {
    // Spectrum λ_i = i² (separated lowest modes, as inverse iteration needs; Bathe §11.2.1).
    const spectrum = Array.from({ length: n }, (_, i) => (i + 1) ** 2);
    const { K, M } = pencilWithSpectrum(spectrum, 300 + n);
    const Kd = toDenseMatrix(K);
    const Md = toDenseMatrix(M);
    const ref = mlMatrixEigenvalues(K, M);
    const dense = denseEigensolver({ ...base, K: Kd, M: Md, count: n });

    it(`inverse iteration finds the lowest 6 at n = ${n} (dense and sparse storage) to 1e-10`, () => {
      for (const storage of ['dense', 'sparse'] as const) {
        const raw = inverseIteration({
          ...base,
          K: storage === 'dense' ? Kd : toSparse(Kd),
          M: storage === 'dense' ? Md : toSparse(Md),
          count: 6,
        });
        raw.lambdas.forEach((l, k) => {
          expect(relErr(l, dense.lambdas[k] as number)).toBeLessThan(1e-10);
          expect(relErr(l, ref[k] as number)).toBeLessThan(1e-10);
          // the spectrum was prescribed: λ_k = k²
          expect(relErr(l, (k + 1) ** 2)).toBeLessThan(1e-9);
        });
        const { orth, resid } = checkPairs(K, M, raw.lambdas, raw.vectors);
        expect(orth).toBeLessThan(1e-12);
        expect(resid).toBeLessThan(1e-6);
        // ρ history decreases towards λ from above (Rayleigh quotient bound, REFERENCES.md)
        for (const [k, h] of raw.histories.entries()) {
          for (const rho of h)
            expect(rho).toBeGreaterThanOrEqual((raw.lambdas[k] as number) * (1 - 1e-12));
        }
      }
    });

    it(`shifted iteration returns the 3 modes nearest the shift at n = ${n}`, () => {
      const mu = 50.3; // between 7² = 49 and 8² = 64; nearest three: 49, 64, 36
      const raw = shiftedInverseIteration({ ...base, K: Kd, M: Md, count: 3, shift: mu });
      const expected = [...ref]
        .sort((a, b) => Math.abs(a - mu) - Math.abs(b - mu))
        .slice(0, 3)
        .sort((a, b) => a - b);
      raw.lambdas.forEach((l, k) => expect(relErr(l, expected[k] as number)).toBeLessThan(1e-10));
      expect(raw.lambdas.map(Math.round)).toEqual([36, 49, 64]);
    });
  }

  it('forward iteration finds ω_max as the dense solve does (separated top spectrum)', () => {
    // λ_i = i for the bulk, the top three at 400, 800, 1600 (ratios 1/2 per step)
    const n = 120;
    const spectrum = Array.from({ length: n }, (_, i) => i + 1);
    spectrum[n - 3] = 400;
    spectrum[n - 2] = 800;
    spectrum[n - 1] = 1600;
    const { K, M } = pencilWithSpectrum(spectrum, 17);
    const Kd = toDenseMatrix(K);
    const Md = toDenseMatrix(M);
    const dense = denseEigensolver({ ...base, K: Kd, M: Md, count: n });
    const raw = forwardIteration({ ...base, K: Kd, M: Md, count: 3 });
    expect(raw.lambdas).toHaveLength(3);
    raw.lambdas.forEach((l, k) =>
      expect(relErr(l, dense.lambdas[n - 3 + k] as number)).toBeLessThan(1e-10),
    );
    expect(relErr(raw.lambdas[2] as number, 1600)).toBeLessThan(1e-10);
    const r = solveModes(Kd, Md, { method: 'forward', count: 1, dampingRatio: 0.05 });
    // Δt_cr = 2/ω_max (central difference; Belytschko, Liu & Moran, from memory)
    expect(relErr(r.criticalTimeStep?.dtCr as number, 2 / Math.sqrt(1600))).toBeLessThan(1e-10);
    expect(
      relErr(
        r.criticalTimeStep?.dtCrDamped as number,
        (2 / 40) * (Math.sqrt(1 + 0.05 ** 2) - 0.05),
      ),
    ).toBeLessThan(1e-10);
  });

  it('repeated eigenvalues: every method returns an M-orthonormal basis of the repeated eigenspace', () => {
    // λ = 1, 2, 2, 2, 7, 8, … : the 3-fold eigenvalue 2 must come back as a 3-dimensional subspace
    const n = 40;
    const spectrum = Array.from({ length: n }, (_, i) => i + 3);
    spectrum[0] = 1;
    spectrum[1] = 2;
    spectrum[2] = 2;
    spectrum[3] = 2;
    const { K, M } = pencilWithSpectrum(spectrum, 23);
    const Kd = toDenseMatrix(K);
    const Md = toDenseMatrix(M);
    const dense = denseEigensolver({ ...base, K: Kd, M: Md, count: 5 });
    const inv = inverseIteration({ ...base, K: Kd, M: Md, count: 5 });
    for (const raw of [dense, inv]) {
      expect(raw.lambdas.slice(0, 5).map((l) => Number(l.toFixed(8)))).toEqual([1, 2, 2, 2, 7]);
      const { orth, resid } = checkPairs(K, M, raw.lambdas, raw.vectors);
      expect(orth).toBeLessThan(1e-10);
      expect(resid).toBeLessThan(1e-6);
    }
    // subspace comparison: the projector onto span(inverse vectors 2..4) in the M-inner product
    // reproduces the dense vectors 2..4 (‖(I − P)v‖_M ≤ 1e-5, the vector accuracy √tol)
    const Phi = new Matrix(inv.vectors.slice(1, 4).map((v) => Array.from(v))).transpose();
    for (const v of dense.vectors.slice(1, 4)) {
      const x = Matrix.columnVector(Array.from(v));
      const c = Phi.transpose().mmul(M).mmul(x);
      const r = x.sub(Phi.mmul(c));
      expect(Math.sqrt(r.transpose().mmul(M).mmul(r).get(0, 0))).toBeLessThan(1e-5);
    }
  });
});
