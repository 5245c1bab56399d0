/**
 * The modal quantities of DESIGN.md §5 computed from the eigenpairs: ω, f, T, normalized shapes,
 * backward errors, orthogonality, participation factors and effective masses, closely spaced
 * modes and the critical time step of central-difference integration.
 *
 * Participation factor and effective mass: Chopra, *Dynamics of Structures*, chapter 13
 * (Γ_n = φ_nᵀMr / φ_nᵀMφ_n, M*_n = Γ_n² φ_nᵀMφ_n). Critical time step: Belytschko, Liu & Moran,
 * *Nonlinear Finite Elements for Continua and Structures*, §6.3 (from memory).
 */
import { EngineError } from '../errors';
import { norm2 } from '../linalg/factorize';
import { symmetricMultiply } from '../linalg/sparse';
import type { SymmetricMatrix } from '../linalg/types';
import { orthogonalityWorst } from './dense/orthogonality';
import { type DenseTeam, SERIAL_TEAM } from './dense/team';
import type { InfluenceVector, Participation, ShapeNormalization } from './types';

/**
 * ω = √λ (0 for λ ≤ 0), f = ω/2π, T = 1/f.
 * @example frequencies(4 * Math.PI ** 2) // { omega: 2π, frequencyHz: 1, periodS: 1 }
 */
export function frequencies(lambda: number): {
  omega: number;
  frequencyHz: number;
  periodS: number;
} {
  const omega = lambda > 0 ? Math.sqrt(lambda) : 0;
  const frequencyHz = omega / (2 * Math.PI);
  return { omega, frequencyHz, periodS: frequencyHz > 0 ? 1 / frequencyHz : Infinity };
}

/**
 * Flips the sign of φ in place so that its largest-magnitude component is positive.
 * @example fixSign(phi)
 */
export function fixSign(phi: Float64Array): void {
  let k = 0;
  for (let i = 1; i < phi.length; i++)
    if (Math.abs(phi[i] as number) > Math.abs(phi[k] as number)) k = i;
  if ((phi[k] as number) < 0) for (let i = 0; i < phi.length; i++) phi[i] = -(phi[i] as number);
}

/**
 * A copy of the mass-normalized shape φ scaled as asked: 'mass' (φᵀMφ = 1, as given), 'max'
 * (largest component +1) or { dof } (component `dof`, 1-based, equal to 1).
 * @throws EngineError INVALID_OPTION when the chosen DOF does not move in this mode.
 * @example normalizeShape(phi, { dof: 3 }, 2)
 */
export function normalizeShape(
  phi: Float64Array,
  how: ShapeNormalization,
  modeIndex: number,
): Float64Array {
  const out = Float64Array.from(phi);
  if (how === 'mass') return out;
  let ref: number;
  if (how === 'max') {
    let k = 0;
    for (let i = 1; i < out.length; i++)
      if (Math.abs(out[i] as number) > Math.abs(out[k] as number)) k = i;
    ref = out[k] as number;
  } else {
    ref = out[how.dof - 1] as number;
    let m = 0;
    for (let i = 0; i < out.length; i++) m = Math.max(m, Math.abs(out[i] as number));
    if (!(Math.abs(ref) > 1e-12 * m)) {
      throw new EngineError(
        'INVALID_OPTION',
        `Mode ${modeIndex} cannot be normalized to 1 at DOF ${how.dof}: that DOF does not move in this mode (component ${ref.toPrecision(3)}). Choose another DOF or normalize by mass or by the largest component.`,
        { mode: modeIndex, dof: how.dof },
      );
    }
  }
  if (ref !== 0) for (let i = 0; i < out.length; i++) out[i] = (out[i] as number) / ref;
  return out;
}

/**
 * Backward error of an eigenpair: ‖Kφ − λMφ‖₂ / ((‖K‖₁ + |λ| ‖M‖₁) ‖φ‖₂) (the normwise backward
 * error of Higham & Higham, 1998, with the 1-norm as a cheap bound of the 2-norm).
 * @example backwardError(K, M, lambda, phi, normOne(K), normOne(M))
 */
export function backwardError(
  K: SymmetricMatrix,
  M: SymmetricMatrix,
  lambda: number,
  phi: Float64Array,
  normK: number,
  normM: number,
): number {
  const kp = symmetricMultiply(K, phi);
  const mp = symmetricMultiply(M, phi);
  for (let i = 0; i < kp.length; i++) kp[i] = (kp[i] as number) - lambda * (mp[i] as number);
  const denom = (normK + Math.abs(lambda) * normM) * norm2(phi);
  return denom > 0 ? norm2(kp) / denom : 0;
}

/**
 * max |ΦᵀMΦ − I| over mass-normalized vectors. Over many modes (all modes of a dense solve:
 * p² n / 2 multiply–adds) the triangle of Φᵀ(MΦ) is formed band by band with the blocked product
 * kernel, in parts a `DenseTeam` may share (./dense/orthogonality.ts); over few, with plain dot
 * products.
 * @example massOrthogonality(M, vectors)
 */
export function massOrthogonality(
  M: SymmetricMatrix,
  vectors: Float64Array[],
  team: DenseTeam = SERIAL_TEAM,
): number {
  const p = vectors.length;
  if (p >= BLOCKED_GRAM_MODES) {
    return orthogonalityWorst(vectors, (v) => symmetricMultiply(M, v), team);
  }
  const mv = vectors.map((v) => symmetricMultiply(M, v));
  let worst = 0;
  for (let i = 0; i < p; i++) {
    for (let j = 0; j <= i; j++) {
      const a = vectors[i] as Float64Array;
      const b = mv[j] as Float64Array;
      let s = 0;
      for (let k = 0; k < a.length; k++) s += (a[k] as number) * (b[k] as number);
      worst = Math.max(worst, Math.abs(s - (i === j ? 1 : 0)));
    }
  }
  return worst;
}

/** From this many modes on, ΦᵀMΦ goes through the blocked kernel (common practice: measured). */
const BLOCKED_GRAM_MODES = 32;

/**
 * Participation factors Γ_n = φ_nᵀMr (mass-normalized φ), effective masses Γ_n², their ratios to
 * the total rᵀMr and the cumulative ratios, for each influence vector r.
 * @throws EngineError INVALID_OPTION when an influence vector has the wrong length.
 * @example participation(M, vectors, [{ name: 'x', vector: ones }])
 */
export function participation(
  M: SymmetricMatrix,
  vectors: Float64Array[],
  influence: InfluenceVector[],
): Participation[] {
  return influence.map(({ name, vector }) => {
    const n = vectors[0]?.length ?? vector.length;
    if (vector.length !== n) {
      throw new EngineError(
        'INVALID_OPTION',
        `The influence vector '${name}' has ${vector.length} entries but the model has ${n} DOFs.`,
        { field: 'influence', name },
      );
    }
    const mr = symmetricMultiply(M, vector);
    let totalMass = 0;
    for (let i = 0; i < n; i++) totalMass += (vector[i] as number) * (mr[i] as number);
    const gamma = vectors.map((phi) => {
      let s = 0;
      for (let i = 0; i < n; i++) s += (phi[i] as number) * (mr[i] as number);
      return s;
    });
    const effectiveMass = gamma.map((g) => g * g);
    const ratio = effectiveMass.map((m) => (totalMass > 0 ? m / totalMass : 0));
    let acc = 0;
    const cumulative = ratio.map((r) => (acc += r));
    return { name, totalMass, gamma, effectiveMass, ratio, cumulative };
  });
}

/**
 * Pairs of modes (1-based, i < j) with T_j / T_i > 0.9, the usual "closely spaced" test of modal
 * combination rules (common practice; ASCE 7 and EN 1998 use 10 %, from memory).
 * @example closelySpacedPairs([1.0, 0.95, 0.5]) // [[1, 2]]
 */
export function closelySpacedPairs(periods: number[]): [number, number][] {
  const pairs: [number, number][] = [];
  for (let i = 0; i < periods.length; i++) {
    const ti = periods[i] as number;
    if (!Number.isFinite(ti) || ti <= 0) continue;
    for (let j = i + 1; j < periods.length; j++) {
      const tj = periods[j] as number;
      if (!Number.isFinite(tj) || tj <= 0) continue;
      const r = Math.min(ti, tj) / Math.max(ti, tj);
      if (r > 0.9) pairs.push([i + 1, j + 1]);
    }
  }
  return pairs;
}

/**
 * Central-difference critical time step Δt_cr = 2/ω_max, and with a damping ratio ξ in the top
 * mode Δt_cr = (2/ω_max)(√(1+ξ²) − ξ) (Belytschko, Liu & Moran, from memory).
 * @example criticalTimeStep(1000, 0.05)
 */
export function criticalTimeStep(
  omegaMax: number,
  dampingRatio?: number,
): { dtCr: number; omegaMax: number; dampingRatio?: number; dtCrDamped?: number } {
  const dtCr = 2 / omegaMax;
  if (dampingRatio === undefined) return { dtCr, omegaMax };
  const xi = dampingRatio;
  return { dtCr, omegaMax, dampingRatio: xi, dtCrDamped: dtCr * (Math.sqrt(1 + xi * xi) - xi) };
}
