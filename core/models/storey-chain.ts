/**
 * A shear-building storey chain on a fixed base: floor masses m_1…m_N (floor 1 lowest) and storey
 * stiffnesses k_1…k_N (k_1 between the ground and floor 1). K is tridiagonal with
 * K_ii = k_i + k_{i+1}, K_{i,i+1} = −k_{i+1}; M is diagonal (Chopra, *Dynamics of Structures*,
 * chapter 9, shear building idealization).
 */
import { EngineError } from '../errors';
import { sparseSymmetricFromTriplets } from '../linalg/sparse';
import type { ModelMatrices } from './types';
import { positiveNumber } from './validate';

/** Input of `storeyChain` in SI numbers: kg, N/m, m. */
export interface StoreyChainInput {
  masses: number[];
  stiffnesses: number[];
  /** Optional storey heights (m), to report floor heights. */
  storeyHeights?: number[];
}

/**
 * Builds K, M, the DOF labels u1…uN and the influence vector 'x' (all ones: ground sway).
 * @throws EngineError INVALID_MODEL naming the field and storey for a missing, negative or
 *   non-finite value or lists of different lengths (a floor may have zero mass; a storey needs
 *   stiffness > 0).
 * @example const { K, M, influence } = storeyChain({ masses: [2e5, 1e5], stiffnesses: [4e7, 2e7] });
 */
export function storeyChain(input: StoreyChainInput): ModelMatrices {
  const { masses, stiffnesses } = input;
  if (!Array.isArray(masses) || masses.length === 0) {
    throw new EngineError('INVALID_MODEL', 'A storey chain needs at least one floor mass.', {
      field: 'masses',
    });
  }
  if (!Array.isArray(stiffnesses) || stiffnesses.length !== masses.length) {
    throw new EngineError(
      'INVALID_MODEL',
      `A storey chain needs one stiffness per storey: ${masses.length} masses but ${Array.isArray(stiffnesses) ? stiffnesses.length : 0} stiffnesses.`,
      { field: 'stiffnesses' },
    );
  }
  const n = masses.length;
  masses.forEach((m, i) => positiveNumber(m, `masses[${i}]`, `The mass of floor ${i + 1}`, true));
  stiffnesses.forEach((k, i) =>
    positiveNumber(k, `stiffnesses[${i}]`, `The stiffness of storey ${i + 1}`),
  );
  const r: number[] = [];
  const c: number[] = [];
  const v: number[] = [];
  for (let i = 0; i < n; i++) {
    const below = stiffnesses[i] as number;
    const above = i + 1 < n ? (stiffnesses[i + 1] as number) : 0;
    r.push(i);
    c.push(i);
    v.push(below + above);
    if (i + 1 < n) {
      r.push(i + 1);
      c.push(i);
      v.push(-above);
    }
  }
  const K = sparseSymmetricFromTriplets(n, r, c, v);
  const idx = masses.map((_, i) => i);
  const M = sparseSymmetricFromTriplets(n, idx, idx, masses);
  const out: ModelMatrices = {
    K,
    M,
    dofs: idx.map((i) => `u${i + 1}`),
    influence: [{ name: 'x', vector: new Float64Array(n).fill(1) }],
  };
  if (input.storeyHeights) {
    if (input.storeyHeights.length !== n) {
      throw new EngineError(
        'INVALID_MODEL',
        `Storey heights: ${input.storeyHeights.length} given for ${n} storeys.`,
        { field: 'storeyHeights' },
      );
    }
    let h = 0;
    out.heights = input.storeyHeights.map(
      (s, i) => (h += positiveNumber(s, `storeyHeights[${i}]`, `The height of storey ${i + 1}`)),
    );
  }
  return out;
}
