import { describe, expect, it } from 'vitest';
import { lanczos } from '../../../core/eigen/lanczos';
import { solveModes } from '../../../core/eigen/solve-modes';
import { diagonalOf } from '../../../core/linalg/factorize';
import type { SparseSymmetricMatrix } from '../../../core/linalg/types';
import { eulerBernoulliBeam } from '../../../core/models/euler-bernoulli-beam';
import { chain, chainLambda, input } from './pencils';

// Lanczos names the model's ill-conditioning itself (its result's `conditioning`, `warnings` and
// `notes`), so a caller of the method alone (the bench, scripts/solve.ts) is told when λ₁ cannot
// be resolved in double precision.

const EPS = 2 ** -52;
// A steel cantilever in SI units: EI = 210 GPa · 8.3e-6 m⁴, 30 kg/m, 4 m (invented).
const E = 210e9;
const I = 8.3e-6;
const MASS = 30;
const L = 4;
/** Clamped–free β_n L (Blevins, *Formulas for Natural Frequency and Mode Shape*, Table 8-1). */
const BETA_L = [1.8751, 4.6941, 7.8548];
/** λ_n = (β_n L)⁴ EI / (m L⁴): ω_n = (β_n L)² √(EI / (m L⁴)) squared (REFERENCES.md item 1). */
const handbook = BETA_L.map((b) => (b ** 4 * E * I) / (MASS * L ** 4));

function cantilever(elements: number): { K: SparseSymmetricMatrix; M: SparseSymmetricMatrix } {
  const { K, M } = eulerBernoulliBeam({
    E,
    I,
    massPerLength: MASS,
    length: L,
    elements,
    left: 'clamped',
    right: 'free',
  });
  return { K: K as SparseSymmetricMatrix, M: M as SparseSymmetricMatrix };
}

/** max K_ii/M_ii, computed here from the matrices: a lower bound of λ_max (Rayleigh quotient). */
function diagonalBound(K: SparseSymmetricMatrix, M: SparseSymmetricMatrix): number {
  const dk = diagonalOf(K);
  const dm = diagonalOf(M);
  let s = 0;
  for (let i = 0; i < dk.length; i++) if (dm[i]! > 0) s = Math.max(s, dk[i]! / dm[i]!);
  return s;
}

describe('lanczos conditioning estimate', () => {
  it('matches the handbook on a 40-element cantilever and stays silent: the worst case is not what happens', () => {
    const { K, M } = cantilever(40);
    const raw = lanczos(input(K, M, 3));
    raw.lambdas.forEach((l, i) => {
      // Blevins gives β L to 5 digits, so (β L)⁴ is good to about 1e-4 relative; the Hermite
      // mesh converges from above (conforming Rayleigh–Ritz, REFERENCES.md item 1).
      expect(Math.abs(l - handbook[i]!) / handbook[i]!).toBeLessThan(2e-4);
    });
    const ratio = diagonalBound(K, M) / raw.lambdas[0]!;
    expect(raw.conditioning.ratio).toBeCloseTo(ratio, 0);
    // 40 elements: max K_ii/M_ii = 420 EI/(m h⁴) (rotation DOF of the consistent mass), so the
    // ratio is 420·40⁴/1.8751⁴ ≈ 8.7e7 and the worst case ε·ratio ≈ 1.9e-8 > the tolerance 1e-10,
    // which the old warning reported.
    expect(ratio).toBeGreaterThan(8e7);
    expect(ratio).toBeLessThan(9.5e7);
    expect(raw.conditioning.worstCase).toBeCloseTo(ratio * EPS, 20);
    expect(raw.conditioning.worstCase).toBeGreaterThan(1e-10);
    // The estimate after the fact (Rayleigh quotients in double-double) finds λ₁ good to better
    // than the tolerance, so no warning: the 6.7e-9 between λ₁ and the exact root of
    // cos βL cosh βL = −1 is the mesh's (from above), not the solver's.
    expect(raw.conditioning.relativeError).toBeLessThan(1e-10);
    expect(raw.conditioning.unresolved).toBe(false);
    expect(raw.warnings).toEqual([]);
    expect(raw.notes.some((n) => n.startsWith('Conditioning'))).toBe(false);
  });

  it('says the lowest eigenvalues are not meaningful on a 25 000-element cantilever', () => {
    const { K, M } = cantilever(25_000);
    const raw = lanczos(input(K, M, 3));
    const bound = diagonalBound(K, M);
    // λ_max/λ₁ ≥ max K_ii/M_ii / λ₁(found) ≥ 2.5e17: ε·ratio > 50, more than λ₁ itself.
    const ratio = bound / raw.lambdas[0]!;
    expect(ratio).toBeGreaterThanOrEqual(2.5e17);
    expect(raw.conditioning.lambdaMax).toBe(bound);
    expect(raw.conditioning.ratio).toBeCloseTo(ratio, -14);
    expect(raw.conditioning.unresolved).toBe(true);
    const w = raw.warnings.find((x) => x.code === 'ILL_CONDITIONED');
    expect(w?.message).toContain('the lowest eigenvalues are not meaningful');
    expect(w?.message).toContain(`λ_max/λ₁ ≥ ${ratio.toPrecision(2)}`);
    expect(w?.message).toContain(`λ_max ≥ ${bound.toPrecision(3)} rad²/s²`);
    expect(w?.message).toContain('double-double');
    // Against the handbook λ₁ (Blevins): λ₁ as computed is off by a factor, and the estimate
    // says at least as much.
    const error = Math.abs(raw.lambdas[0]! - handbook[0]!) / handbook[0]!;
    expect(error).toBeGreaterThan(1);
    expect(raw.conditioning.relativeError).toBeGreaterThanOrEqual(error);
    // The notes, which the bench prints, carry it too.
    expect(raw.notes.some((n) => n.includes('not meaningful'))).toBe(true);
  });

  it('stays silent on a well-conditioned chain', () => {
    const N = 500;
    const { K, M } = chain(N);
    const raw = lanczos(input(K, M, 5));
    // Fixed–free chain, k = m = 1: λ_max ≤ 4 and λ₁ = 4 sin²(π/(2(2N+1))) (REFERENCES.md item 2),
    // so ε·λ_max/λ₁ ≤ 4ε/λ₁ ≈ 9e-11 < 1e-10.
    expect((4 * EPS) / chainLambda(N, 1)).toBeLessThan(1e-10);
    expect(raw.conditioning.message).toBeNull();
    expect(raw.conditioning.unresolved).toBe(false);
    expect(raw.warnings).toEqual([]);
    expect(raw.notes.some((n) => n.startsWith('Conditioning'))).toBe(false);
  });

  it('solveModes reports the same warning once, not again in the method note', () => {
    const { K, M } = cantilever(3000);
    const raw = lanczos({ ...input(K, M, 3), seed: 1 });
    const r = solveModes(K, M, { method: 'lanczos', count: 3 });
    const ill = r.warnings.filter((w) => w.code === 'ILL_CONDITIONED');
    expect(ill).toHaveLength(1);
    expect(ill[0]!.message).toBe(raw.conditioning.message);
    expect(r.methodNote).not.toContain('Conditioning');
    expect(r.conditioning.estimate).toBe(raw.conditioning.ratio);
  });
});
