import { describe, expect, it } from 'vitest';
import { solveModes } from '../../../core/eigen/solve-modes';
import type { RawEigenResult } from '../../../core/eigen/types';
import { EngineError, NoConvergenceError } from '../../../core/errors';
import { toSparse } from '../../../core/linalg/factorize';
import { denseFromRows, sparseSymmetricFromTriplets } from '../../../core/linalg/sparse';
import { storeyChain } from '../../../core/models/storey-chain';

function codeOf(f: () => unknown): { code: string; message: string } {
  try {
    f();
  } catch (e) {
    if (e instanceof EngineError) return { code: e.code, message: e.message };
    throw e;
  }
  throw new Error('expected a refusal');
}

const chain = (N: number) =>
  storeyChain({ masses: new Array(N).fill(1), stiffnesses: new Array(N).fill(1) });

describe('solveModes refusals (DESIGN.md §5)', () => {
  it('refuses mismatched sizes', () => {
    const r = codeOf(() => solveModes(chain(3).K, chain(4).M));
    expect(r.code).toBe('MATRIX_SIZE_MISMATCH');
    expect(r.message).toMatch(/K is 3 × 3 but M is 4 × 4/);
  });

  it('refuses a non-square dense matrix', () => {
    const K = { kind: 'dense' as const, rows: 2, cols: 3, data: new Float64Array(6) };
    const M = denseFromRows([
      [1, 0],
      [0, 1],
    ]);
    expect(codeOf(() => solveModes(K, M)).code).toBe('MATRIX_NOT_SQUARE');
  });

  it('refuses asymmetry, saying where and by how much', () => {
    const K = denseFromRows([
      [2, -1, 0],
      [-1, 2, -1],
      [0, -1.5, 2],
    ]);
    const M = denseFromRows([
      [1, 0, 0],
      [0, 1, 0],
      [0, 0, 1],
    ]);
    const r = codeOf(() => solveModes(K, M));
    expect(r.code).toBe('MATRIX_NOT_SYMMETRIC');
    expect(r.message).toContain('K[3,2] = -1.5 but K[2,3] = -1');
    expect(r.message).toContain('difference 0.500');
  });

  it('refuses NaN and Inf entries, naming the entry', () => {
    const K = chain(3).K;
    const M = sparseSymmetricFromTriplets(3, [0, 1, 2], [0, 1, 2], [1, 1, 1]);
    (M.values as Float64Array)[1] = Infinity;
    const r = codeOf(() => solveModes(K, M));
    expect(r.code).toBe('MATRIX_NOT_FINITE');
    expect(r.message).toContain('M[2,2] is Infinity');
  });

  it('refuses a negative mass and an indefinite M', () => {
    const K = chain(2).K;
    expect(
      codeOf(() =>
        solveModes(
          K,
          denseFromRows([
            [1, 0],
            [0, -2],
          ]),
        ),
      ).message,
    ).toMatch(/DOF 2/);
    const r = codeOf(() =>
      solveModes(
        K,
        denseFromRows([
          [1, 2],
          [2, 1],
        ]),
        { method: 'dense' },
      ),
    );
    expect(r.code).toBe('MASS_NOT_PSD');
  });

  it('refuses a stiffness matrix with a negative eigenvalue', () => {
    const r = codeOf(() =>
      solveModes(
        denseFromRows([
          [1, 2],
          [2, 1],
        ]),
        denseFromRows([
          [1, 0],
          [0, 1],
        ]),
        { method: 'inverse' },
      ),
    );
    expect(r.code).toBe('STIFFNESS_NOT_PSD');
    expect(r.message).toMatch(/1 negative eigenvalue/);
  });

  it('refuses bad options with the field named', () => {
    const { K, M } = chain(3);
    expect(codeOf(() => solveModes(K, M, { count: 0 })).message).toMatch(/number of modes/);
    expect(codeOf(() => solveModes(K, M, { tolerance: 2 })).message).toMatch(/tolerance/);
    expect(codeOf(() => solveModes(K, M, { method: 'shifted' })).message).toMatch(/needs a target/);
    expect(codeOf(() => solveModes(K, M, { method: 'magic' as 'dense' })).code).toBe(
      'INVALID_OPTION',
    );
    expect(codeOf(() => solveModes(K, M, { normalize: { dof: 9 } })).message).toMatch(
      /between 1 and 3/,
    );
    expect(
      codeOf(() => solveModes(K, M, { influence: [{ name: 'x', vector: new Float64Array(2) }] }))
        .message,
    ).toMatch(/'x' has 2 entries/);
  });

  it('refuses massless DOFs in forward iteration with MASS_SINGULAR, solves them with inverse', () => {
    const K = denseFromRows([
      [2, -1, 0],
      [-1, 2, -1],
      [0, -1, 1],
    ]);
    const M = denseFromRows([
      [1, 0, 0],
      [0, 0, 0],
      [0, 0, 1],
    ]);
    const r = codeOf(() => solveModes(K, M, { method: 'forward', count: 1 }));
    expect(r.code).toBe('MASS_SINGULAR');
    expect(r.message).toMatch(/DOF 2/);
    // static condensation by hand: eliminating DOF 2 gives K* = [[1.5, −0.5], [−0.5, 0.5]], M* = I
    // with eigenvalues 1 ± √2/2 (hand computation).
    const inv = solveModes(K, M, { method: 'inverse', count: 2 });
    const den = solveModes(K, M, { method: 'dense' });
    expect(den.modes).toHaveLength(2);
    for (const res of [inv, den]) {
      // relative 1e-10: the default tolerance on λ
      expect(Math.abs((res.modes[0]?.lambda as number) / (1 - Math.SQRT1_2) - 1)).toBeLessThan(
        1e-10,
      );
      expect(Math.abs((res.modes[1]?.lambda as number) / (1 + Math.SQRT1_2) - 1)).toBeLessThan(
        1e-10,
      );
    }
  });

  it('throws NoConvergenceError with the converged modes as partial results', () => {
    const { K, M } = chain(600);
    try {
      solveModes(K, M, { method: 'inverse', count: 5, maxIterations: 15 });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(NoConvergenceError);
      const err = e as NoConvergenceError<RawEigenResult>;
      expect(err.code).toBe('NO_CONVERGENCE');
      expect(err.message).toMatch(/within 15 iterations/);
      const done = err.details?.modesConverged as number;
      expect(err.partial.lambdas).toHaveLength(done);
      // the partial modes are right: λ_1 of the fixed–free chain (closed form)
      if (done > 0) {
        const exact = 4 * Math.sin(Math.PI / (2 * 1201)) ** 2;
        expect(Math.abs((err.partial.lambdas[0] as number) / exact - 1)).toBeLessThan(1e-9);
      }
    }
  });

  it('stops with CANCELLED when the signal is set', () => {
    const { K, M } = chain(500);
    const signal = { aborted: false };
    let calls = 0;
    const r = codeOf(() =>
      solveModes(K, M, {
        method: 'inverse',
        signal,
        onProgress: () => {
          calls++;
          if (calls === 3) signal.aborted = true;
        },
      }),
    );
    expect(r.code).toBe('CANCELLED');
    expect(r.message).toMatch(/mode 1, iteration 4/);
  });
});

describe('solveModes results', () => {
  it('auto picks dense for small models and Lanczos for large sparse ones, and says so', () => {
    const small = chain(10);
    expect(solveModes(small.K, small.M, { count: 3 }).methodNote).toMatch(/auto: 10 DOFs ≤ 400/);
    const big = chain(800);
    const r = solveModes(big.K, big.M, { count: 2 });
    expect(r.method).toBe('lanczos');
    expect(r.methodNote).toMatch(/auto: 800 DOFs > 400 in sparse storage/);
    const s = solveModes(big.K, big.M, { count: 1, shift: 1e-3 });
    expect(s.method).toBe('shifted');
  });

  it('reports Sturm counts, orthogonality, residuals, sign and normalization', () => {
    const { K, M } = chain(50);
    const r = solveModes(K, M, { method: 'inverse', count: 4, normalize: 'max' });
    expect(r.sturm).toMatchObject({ countBelow: 4, found: 4, ok: true });
    expect(r.orthogonality).toBeLessThan(1e-12);
    for (const m of r.modes) {
      // inverse iteration stops when the vector residual ‖ρx̄ − x‖_M ≤ tol^¾ ≈ 3e-8, which gives
      // backward errors of order 1e-10 here
      expect(m.residual).toBeLessThan(1e-9);
      expect(Math.max(...Array.from(m.shape))).toBeCloseTo(1, 14);
      expect(m.history.length).toBe(m.iterations);
      expect(m.frequencyHz).toBeCloseTo(m.omega / (2 * Math.PI), 14);
      expect(m.periodS).toBeCloseTo(1 / m.frequencyHz, 10);
    }
    // the fixed–free chain's fundamental is largest at the top: u50 = 1
    expect(r.modes[0]?.shape[49]).toBeCloseTo(1, 12);
  });

  it('warns loudly when the Sturm count shows a mode was skipped', () => {
    // repeated eigenvalue split across the requested count: λ = 1, 1 and count 1 → 2 below σ
    const K = denseFromRows([
      [1, 0, 0],
      [0, 1, 0],
      [0, 0, 3],
    ]);
    const M = denseFromRows([
      [1, 0, 0],
      [0, 1, 0],
      [0, 0, 1],
    ]);
    const r = solveModes(K, M, { method: 'inverse', count: 1 });
    expect(r.sturm?.ok).toBe(false);
    expect(r.warnings.find((w) => w.code === 'STURM_MISMATCH')?.message).toMatch(
      /1 mode is missing/,
    );
  });

  it('lists closely spaced modes (T_j/T_i > 0.9) and gives the critical time step for dense solves', () => {
    const K = denseFromRows([
      [1, 0, 0],
      [0, 1.1, 0],
      [0, 0, 4],
    ]);
    const M = denseFromRows([
      [1, 0, 0],
      [0, 1, 0],
      [0, 0, 1],
    ]);
    const r = solveModes(K, M, { method: 'dense' });
    expect(r.closelySpaced).toEqual([[1, 2]]);
    expect(r.criticalTimeStep?.dtCr).toBeCloseTo(2 / 2, 14); // 2/ω_max, ω_max = √4
  });

  it('Rayleigh quotient of any vector lies between λ_min and λ_max (REFERENCES.md)', () => {
    const { K, M } = chain(20);
    const r = solveModes(K, M, { method: 'dense' });
    const lo = r.modes[0]?.lambda as number;
    const hi = r.modes[19]?.lambda as number;
    const x = new Float64Array(20).map((_, i) => Math.sin(i * 1.7) + 0.3);
    let kx = 0;
    let mx = 0;
    const Kd = toSparse(K);
    for (let j = 0; j < 20; j++)
      for (let p = Kd.colPtr[j] as number; p < (Kd.colPtr[j + 1] as number); p++) {
        const i = Kd.rowIdx[p] as number;
        const v = Kd.values[p] as number;
        kx += (i === j ? 1 : 2) * v * (x[i] as number) * (x[j] as number);
      }
    for (let i = 0; i < 20; i++) mx += (x[i] as number) ** 2;
    expect(kx / mx).toBeGreaterThanOrEqual(lo);
    expect(kx / mx).toBeLessThanOrEqual(hi);
  });

  it('20 000-DOF fixed–free chain: the lowest 10 within 1e-9 of the closed form (issue "done when")', () => {
    const N = 20000;
    const { K, M } = chain(N);
    const r = solveModes(K, M, { count: 10 });
    expect(r.method).toBe('lanczos');
    r.modes.forEach((m, i) => {
      const exact = 4 * Math.sin(((2 * i + 1) * Math.PI) / (2 * (2 * N + 1))) ** 2;
      expect(Math.abs(m.lambda - exact) / exact).toBeLessThan(1e-9);
    });
    expect(r.sturm?.ok).toBe(true);
    expect(r.warnings.map((w) => w.code)).toContain('ILL_CONDITIONED');
  });
});
