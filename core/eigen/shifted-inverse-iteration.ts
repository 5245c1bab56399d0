/**
 * Shifted inverse iteration: inverse iteration on K − μM, which converges to the modes whose λ is
 * nearest the target μ (Bathe, *Finite Element Procedures*, 1996, §11.2.3). A μ that falls on an
 * eigenvalue (zero pivot) is moved by 1e-8 relative and the move is stated.
 */
import { EngineError } from '../errors';
import { combine, factorizeSymmetric } from '../linalg/factorize';
import type { SymmetricFactorization } from '../linalg/types';
import { inverseIteration } from './inverse-iteration';
import type { MethodInput, RawEigenResult } from './types';

/**
 * The `count` modes nearest `input.shift` (μ in rad²/s²), returned in ascending λ.
 * @throws as `inverseIteration`; ZERO_PIVOT when μ cannot be moved off an eigenvalue.
 * @example shiftedInverseIteration({ K, M, count: 2, tolerance: 1e-10, maxIterations: 500, shift: (2 * Math.PI * 50) ** 2, seed: 1 })
 */
export function shiftedInverseIteration(input: MethodInput): RawEigenResult {
  let mu = input.shift;
  const notes: string[] = [];
  let F: SymmetricFactorization | undefined = input.factorization;
  for (let attempt = 0; !F; attempt++) {
    try {
      F = factorizeSymmetric(combine(input.K, 1, input.M, -mu));
    } catch (e) {
      if (!(e instanceof EngineError) || e.code !== 'ZERO_PIVOT' || attempt >= 3) throw e;
      const moved = mu === 0 ? 1e-8 : mu * (1 + 1e-8 * 10 ** attempt);
      notes.push(
        `The target λ = ${mu.toPrecision(8)} falls on an eigenvalue (K − μM is singular); moved to ${moved.toPrecision(12)}.`,
      );
      mu = moved;
    }
  }
  const raw = inverseIteration(
    { ...input, shift: mu, factorization: F },
    'shifted inverse iteration',
  );
  raw.notes.unshift(...notes);
  return raw;
}
