import { describe, expect, it } from 'vitest';
import { estimateEigenvalueErrors } from '../../../core/eigen/conditioning';
import { solveModes } from '../../../core/eigen/solve-modes';
import { buildPlaneStressPlate } from '../../../core/models/plate';
import { eulerBernoulliBeam } from '../../../core/models/euler-bernoulli-beam';
import { chain, chainLambda } from './pencils';

// The honest digits estimate (core/eigen/conditioning.ts), calibrated on models whose true error
// is known: clamped–free beams from 100 to 25 000 elements against the exact root of the
// handbook's characteristic equation, fixed–free chains against their closed form, and plates
// against the dense reference. The tolerance asked for is the default 1e-10 throughout.

const TOL = 1e-10;
const EPS = 2 ** -52;

/** β₁L: the first root of cos x cosh x = −1 (clamped–free; REFERENCES.md item 1, 1.87510407). */
function clampedFreeRoot(): number {
  let x = 1.875;
  for (let k = 0; k < 30; k++) {
    const f = Math.cos(x) * Math.cosh(x) + 1;
    const df = -Math.sin(x) * Math.cosh(x) + Math.cos(x) * Math.sinh(x);
    x -= f / df;
  }
  return x;
}

// A steel cantilever (invented): EI = 210 GPa · 8.3e-6 m⁴, 30 kg/m, 4 m.
const E = 210e9;
const I = 8.3e-6;
const MASS = 30;
const L = 4;
const BETA1L = clampedFreeRoot();
/** λ₁ = (β₁L)⁴ EI / (m L⁴) (REFERENCES.md item 1). */
const LAMBDA1 = (BETA1L ** 4 * E * I) / (MASS * L ** 4);
/**
 * The mesh's own error of λ₁ (from above): 6.7e-9 measured at 40 elements, falling as h⁴ for
 * Hermite cubics (Strang & Fix, *An Analysis of the Finite Element Method*, §6.3, from memory);
 * twice that, as an allowance.
 */
const meshError = (elements: number): number => 2 * 6.7e-9 * (40 / elements) ** 4;

describe('the digits estimate after the fact', () => {
  it('finds the handbook root of cos βL cosh βL = −1', () => {
    // REFERENCES.md item 1 gives 1.87510407 (9 digits).
    expect(Math.abs(BETA1L - 1.87510407)).toBeLessThan(5e-9);
  });

  it.each([100, 400, 1000, 3000, 10_000, 25_000])(
    'on a %i-element cantilever: the warning fires, and the estimate covers the true error of λ₁',
    (elements) => {
      const { K, M } = eulerBernoulliBeam({
        E,
        I,
        massPerLength: MASS,
        length: L,
        elements,
        left: 'clamped',
        right: 'free',
      });
      const r = solveModes(K, M, { count: 3 });
      const lambda1 = r.modes[0]!.lambda;
      const trueError = Math.abs(lambda1 - LAMBDA1) / LAMBDA1;
      const est = r.conditioning.relativeError;
      // Never less than the error λ₁ really has (beyond the mesh's own, which is no solver's).
      expect(est).toBeGreaterThanOrEqual(trueError - meshError(elements));
      // From 100 elements on, λ₁ as computed is off by more than the tolerance (true error ≥
      // 3e-9 against the exact root): the warning is right to fire.
      expect(trueError).toBeGreaterThan(TOL);
      expect(r.warnings.map((w) => w.code)).toContain('ILL_CONDITIONED');
      if (elements <= 1000) {
        // Where λ₁ keeps digits, the estimate is close to the truth (within 2×, plus the mesh)
        // and far below the worst case ε·λ_max/λ₁ the old warning used.
        expect(est).toBeLessThanOrEqual(2 * trueError + meshError(elements));
        expect(est).toBeLessThan(r.conditioning.estimate * EPS * 1e-2);
      }
      if (elements >= 10_000) {
        expect(r.conditioning.unresolved).toBe(true);
        expect(r.warnings.find((w) => w.code === 'ILL_CONDITIONED')?.message).toContain(
          'not meaningful',
        );
      }
    },
  );

  it.each([
    [10_000, false],
    [20_000, true],
  ])('on a %i-mass fixed–free chain the estimate equals the true error (fires: %s)', (N, fires) => {
    const { K, M } = chain(N);
    const r = solveModes(K, M, { count: 10 });
    // λ_n = 4 sin²((2n−1)π/(2(2N+1))) with k = m = 1 (REFERENCES.md item 2).
    const trueError = Math.max(
      ...r.modes.map((m, i) => Math.abs(m.lambda - chainLambda(N, i + 1)) / chainLambda(N, i + 1)),
    );
    const est = r.conditioning.relativeError;
    expect(est).toBeGreaterThanOrEqual(0.5 * trueError);
    expect(est).toBeLessThanOrEqual(2 * trueError + 1e-14);
    // 10 000 masses: λ good to 2.2e-11, silent although the worst case ε·λ_max/λ₁ = 1.8e-8 is
    // above the tolerance; 20 000 masses: 2e-10, beyond it.
    expect(r.conditioning.estimate * EPS).toBeGreaterThan(TOL);
    expect(r.warnings.some((w) => w.code === 'ILL_CONDITIONED')).toBe(fires);
  });

  it('on a 1 000-DOF clamped plate: Lanczos and the dense reference differ by no more than their two estimates, and both stay silent', () => {
    // The bench's plate: 2 m × 1 m × 10 mm steel, x = 0 clamped, 25 × 19 elements.
    const { K, M } = buildPlaneStressPlate({
      lengthX: 2,
      lengthY: 1,
      thickness: 0.01,
      E: 210e9,
      nu: 0.3,
      density: 7850,
      nx: 25,
      ny: 19,
    });
    const sparse = solveModes(K, M, { count: 10, method: 'lanczos' });
    const dense = solveModes(K, M, { method: 'dense' });
    const both = sparse.conditioning.relativeError + dense.conditioning.relativeError;
    sparse.modes.forEach((m, i) => {
      const ref = dense.modes[i]!.lambda;
      expect(Math.abs(m.lambda - ref) / ref).toBeLessThanOrEqual(both + 4 * EPS);
    });
    expect(both).toBeLessThan(1e-12);
    expect(sparse.warnings.filter((w) => w.code === 'ILL_CONDITIONED')).toEqual([]);
    expect(dense.warnings.filter((w) => w.code === 'ILL_CONDITIONED')).toEqual([]);
  });

  it('skips rigid-body modes and estimates each flexible mode against its Rayleigh quotient', () => {
    // Two unit masses joined by a unit spring, free: λ = 0 and 2 (closed form).
    const K = {
      kind: 'sparse-symmetric' as const,
      n: 2,
      colPtr: Int32Array.from([0, 2, 3]),
      rowIdx: Int32Array.from([0, 1, 1]),
      values: Float64Array.from([1, -1, 1]),
    };
    const M = {
      kind: 'sparse-symmetric' as const,
      n: 2,
      colPtr: Int32Array.from([0, 1, 2]),
      rowIdx: Int32Array.from([0, 1]),
      values: Float64Array.from([1, 1]),
    };
    const s = Math.SQRT1_2;
    const off = 2 * (1 + 1e-6); // λ₂ given 1e-6 too high, its shape exact
    const e = estimateEigenvalueErrors(
      K,
      M,
      [0, off],
      [Float64Array.from([s, s]), Float64Array.from([s, -s])],
      1e-10,
    );
    expect(e).toHaveLength(1);
    expect(e[0]!.index).toBe(2);
    expect(e[0]!.rayleigh).toBe(2);
    expect(e[0]!.firstOrder).toBeCloseTo(1e-6, 15);
    expect(e[0]!.secondOrder).toBe(0);
  });
});
