import { describe, expect, it } from 'vitest';
import { lanczos } from '../../../core/eigen/lanczos';
import { multiplyLower } from '../../../core/linalg/sparse-ldlt';
import { EngineError } from '../../../core/errors';
import { denseEigenvalues } from '../models/dense-pencil';
import { chain, chainLambda, checkModes, doubled, input, randomPencil } from './pencils';

describe('lanczos (shift-invert, M-inner products, thick restarts)', () => {
  it('matches the dense reference (ml-matrix) on seeded sparse pencils', () => {
    for (const [n, seed, p] of [
      [120, 1, 6],
      [300, 2, 10],
      [500, 3, 12],
    ] as const) {
      const { K, M } = randomPencil(n, seed);
      const ref = denseEigenvalues(K, M);
      const raw = lanczos(input(K, M, p));
      expect(raw.lambdas).toHaveLength(p);
      for (let i = 0; i < p; i++) {
        // 1e-9 relative: both sides are converged to ~1e-12; the dense QR loses ~n·eps.
        expect(Math.abs(raw.lambdas[i]! - ref[i]!) / ref[i]!).toBeLessThan(1e-9);
      }
      const chk = checkModes(K, M, raw.lambdas, raw.vectors, multiplyLower);
      expect(chk.residual).toBeLessThan(1e-9);
      expect(chk.orthogonality).toBeLessThan(1e-9);
    }
  });

  it('gives the fixed–free chain closed form at 20 000 DOF (REFERENCES.md item 2)', () => {
    const N = 20_000;
    const { K, M } = chain(N);
    const raw = lanczos(input(K, M, 10));
    for (let j = 1; j <= 10; j++) {
      const exact = chainLambda(N, j);
      // λ₁ ≈ 6e-9 against λ_max ≈ 4: conditioning allows ~1e-8 relative (κ·eps ≈ 6e8·1e-16).
      expect(Math.abs(raw.lambdas[j - 1]! - exact) / exact).toBeLessThan(1e-7);
    }
  });

  it('finds both copies of repeated eigenvalues (two uncoupled identical pencils)', () => {
    const { K, M } = randomPencil(150, 9);
    const K2 = doubled(K);
    const M2 = doubled(M);
    const ref = denseEigenvalues(K, M);
    const raw = lanczos(input(K2, M2, 8));
    for (let i = 0; i < 8; i++) {
      const exact = ref[Math.floor(i / 2)]!;
      expect(Math.abs(raw.lambdas[i]! - exact) / exact).toBeLessThan(1e-9);
    }
    // The two vectors of one eigenvalue span its eigenspace: M-orthonormal and with residual.
    const chk = checkModes(K2, M2, raw.lambdas, raw.vectors, multiplyLower);
    expect(chk.residual).toBeLessThan(1e-9);
    expect(chk.orthogonality).toBeLessThan(1e-8);
  });

  it('resolves closely spaced eigenvalues (relative gap 1e-6)', () => {
    // Diagonal pencil with λ = 1, 1 + 1e-6, 2, 3, …: exact values known by construction.
    const n = 200;
    const { K, M } = chain(n); // pattern donor
    const Kd = { ...K, values: new Float64Array(K.values.length) };
    for (let j = 0; j < n; j++) Kd.values[K.colPtr[j]!] = j === 0 ? 1 : j === 1 ? 1 + 1e-6 : j;
    const raw = lanczos(input(Kd, M, 4));
    const exact = [1, 1 + 1e-6, 2, 3];
    exact.forEach((v, i) => expect(Math.abs(raw.lambdas[i]! - v) / v).toBeLessThan(1e-12));
  });

  it('handles rigid-body modes (free–free chain, λ₁ = 0) by shifting below zero', () => {
    // Free–free chain of N masses: λ_n = 4 sin²((n−1)π/(2N)) (REFERENCES.md item 2).
    const N = 400;
    const { K, M } = chain(N);
    const Kf = { ...K, values: Float64Array.from(K.values) };
    Kf.values[0] = 1; // first DOF loses its ground spring: free–free
    const raw = lanczos(input(Kf, M, 5));
    expect(Math.abs(raw.lambdas[0]!)).toBeLessThan(1e-10); // rigid body
    for (let j = 2; j <= 5; j++) {
      const exact = 4 * Math.sin(((j - 1) * Math.PI) / (2 * N)) ** 2;
      expect(Math.abs(raw.lambdas[j - 1]! - exact) / exact).toBeLessThan(1e-8);
    }
    // Either σ = 0 factors with a rounding-sized pivot or the method moves σ below zero; in both
    // cases the Sturm check must agree with the five modes found.
    expect(raw.notes.join(' ')).toMatch(/5 found/);
  });

  it('finds every mode in a band [lo, hi] (count from Sturm sequences)', () => {
    const N = 3000;
    const { K, M } = chain(N);
    const lo = chainLambda(N, 20) * 1.0001;
    const hi = chainLambda(N, 31) * 0.9999; // modes 21..30 lie inside
    const raw = lanczos(input(K, M, 1), { band: { lo, hi } });
    expect(raw.lambdas).toHaveLength(10);
    raw.lambdas.forEach((l, i) => {
      const exact = chainLambda(N, 21 + i);
      expect(Math.abs(l - exact) / exact).toBeLessThan(1e-9);
    });
  });

  it('stops within one restart when cancelled, with EngineError CANCELLED', () => {
    const { K, M } = chain(5000);
    const signal = { aborted: false };
    let restarts = 0;
    let err: unknown;
    try {
      lanczos(
        input(K, M, 10, {
          signal,
          tolerance: 1e-300, // never converges: only the signal can stop it
          onProgress: (pr) => {
            restarts = pr.iteration;
            if (pr.iteration === 2) signal.aborted = true;
          },
        }),
      );
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(EngineError);
    expect((err as EngineError).code).toBe('CANCELLED');
    expect(restarts).toBe(2);
  });
});
