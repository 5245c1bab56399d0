import { describe, expect, it } from 'vitest';
import { subspaceIteration } from '../../../core/eigen/subspace-iteration';
import { multiplyLower } from '../../../core/linalg/sparse-ldlt';
import { EngineError, NoConvergenceError } from '../../../core/errors';
import { denseEigenvalues } from '../models/dense-pencil';
import { chain, chainLambda, checkModes, doubled, input, randomPencil } from './pencils';

describe('subspaceIteration (Bathe, q = min(2p, p + 8))', () => {
  it('matches the dense reference (ml-matrix) on seeded sparse pencils', () => {
    for (const [n, seed, p] of [
      [100, 4, 4],
      [250, 5, 8],
      [400, 6, 10],
    ] as const) {
      const { K, M } = randomPencil(n, seed);
      const ref = denseEigenvalues(K, M);
      const raw = subspaceIteration(input(K, M, p));
      expect(raw.notes.join(' ')).toContain(`q = ${Math.min(2 * p, p + 8)} vectors`);
      for (let i = 0; i < p; i++) {
        // Converged to a relative change of 1e-10 per iteration; 1e-8 against the reference
        // allows the last step's error (the change bounds it from above at convergence ratio < 1).
        expect(Math.abs(raw.lambdas[i]! - ref[i]!) / ref[i]!).toBeLessThan(1e-8);
      }
      const chk = checkModes(K, M, raw.lambdas, raw.vectors, multiplyLower);
      expect(chk.orthogonality).toBeLessThan(1e-10);
      expect(chk.residual).toBeLessThan(1e-5); // vectors converge as √ of eigenvalues
    }
  });

  it('gives the fixed–free chain closed form at 20 000 DOF (REFERENCES.md item 2)', () => {
    const N = 20_000;
    const { K, M } = chain(N);
    const raw = subspaceIteration(input(K, M, 6, { tolerance: 1e-12 }));
    for (let j = 1; j <= 6; j++) {
      const exact = chainLambda(N, j);
      // Conditioning κ ≈ 4/λ₁ ≈ 7e8 allows about 1e-8 relative (common practice: κ·eps).
      expect(Math.abs(raw.lambdas[j - 1]! - exact) / exact).toBeLessThan(1e-7);
    }
  });

  it('finds repeated eigenvalues (two uncoupled identical pencils) with an M-orthonormal pair', () => {
    const { K, M } = randomPencil(120, 8);
    const ref = denseEigenvalues(K, M);
    const raw = subspaceIteration(input(doubled(K), doubled(M), 6));
    for (let i = 0; i < 6; i++) {
      const exact = ref[Math.floor(i / 2)]!;
      expect(Math.abs(raw.lambdas[i]! - exact) / exact).toBeLessThan(1e-8);
    }
    const chk = checkModes(doubled(K), doubled(M), raw.lambdas, raw.vectors, multiplyLower);
    expect(chk.orthogonality).toBeLessThan(1e-10);
  });

  it('handles the rigid-body mode of a free–free chain (λ₁ = 0)', () => {
    const N = 300;
    const { K, M } = chain(N);
    const Kf = { ...K, values: Float64Array.from(K.values) };
    Kf.values[0] = 1;
    const raw = subspaceIteration(input(Kf, M, 4));
    expect(Math.abs(raw.lambdas[0]!)).toBeLessThan(1e-10);
    for (let j = 2; j <= 4; j++) {
      // Free–free: λ_n = 4 sin²((n−1)π/(2N)) (REFERENCES.md item 2).
      const exact = 4 * Math.sin(((j - 1) * Math.PI) / (2 * N)) ** 2;
      expect(Math.abs(raw.lambdas[j - 1]! - exact) / exact).toBeLessThan(1e-8);
    }
  });

  it('stops within one iteration when cancelled and reports progress', () => {
    const { K, M } = chain(3000);
    const signal = { aborted: false };
    const seen: number[] = [];
    let err: unknown;
    try {
      subspaceIteration(
        input(K, M, 5, {
          tolerance: 1e-300,
          signal,
          onProgress: (pr) => {
            seen.push(pr.iteration);
            if (pr.iteration === 3) signal.aborted = true;
          },
        }),
      );
    } catch (e) {
      err = e;
    }
    expect((err as EngineError).code).toBe('CANCELLED');
    expect(seen).toEqual([1, 2, 3]);
  });

  it('gives up at the iteration limit with the converged modes as partial results', () => {
    const { K, M } = chain(2000);
    let err: unknown;
    try {
      subspaceIteration(input(K, M, 5, { maxIterations: 3 }));
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(NoConvergenceError);
    expect((err as NoConvergenceError).message).toMatch(/within 3 iterations/);
  });
});
