import { describe, expect, it } from 'vitest';
import { lanczos } from '../../../core/eigen/lanczos';
import type { SparseSymmetricMatrix } from '../../../core/linalg/types';
import { eulerBernoulliBeam } from '../../../core/models/euler-bernoulli-beam';
import { input } from './pencils';

// The Sturm proof on a model so ill-conditioned that the pivots of K − σM at λ_p(1 + 1e-8) are
// not to be trusted: a 2000-element Hermite cantilever (λ_max/λ₁ ≈ 5e14). The count at that
// margin comes out one short of the modes found, which is impossible in exact arithmetic; the
// margin must grow to the size of the rounding (about ε·λ_max) and the proof then hold.

function cantilever(elements: number): { K: SparseSymmetricMatrix; M: SparseSymmetricMatrix } {
  // The benchmark's steel cantilever (scripts/bench/problems.ts, invented): EI = 210 GPa · 8e-6 m⁴,
  // 40 kg/m, 10 m.
  const { K, M } = eulerBernoulliBeam({
    E: 210e9,
    I: 8e-6,
    massPerLength: 40,
    length: 10,
    elements,
    left: 'clamped',
    right: 'free',
  });
  return { K: K as SparseSymmetricMatrix, M: M as SparseSymmetricMatrix };
}

describe('lanczos Sturm margin on an ill-conditioned model', () => {
  it('widens δ past the rounding and proves all 10 modes of a 2000-element cantilever', () => {
    const { K, M } = cantilever(2000);
    const raw = lanczos(input(K, M, 10, { seed: 1, maxIterations: 300 }));
    expect(raw.lambdas).toHaveLength(10);
    expect(raw.sturm).toBeDefined();
    const s = raw.sturm!;
    expect(s.countBelow - s.belowSigma).toBe(10);
    expect(s.ok).toBe(true);
    // The shift is above λ₁₀ by more than 1e-8 relative (widened) and below λ₁₁, which for a
    // cantilever is about (β₁₁/β₁₀)⁴ ≈ 1.5 λ₁₀ (β_n L ≈ (2n − 1)π/2, Blevins Table 8-1).
    const l10 = raw.lambdas[9]!;
    expect(s.shift / l10 - 1).toBeGreaterThan(1e-8);
    expect(s.shift).toBeLessThan(1.1 * l10);
    expect(raw.notes.join(' ')).toMatch(/shift was moved to λ_10·\(1 \+ 1e-\d\)/);
    expect(raw.warnings.map((w) => w.code)).not.toContain('STURM_MISMATCH');
  });
});
