/**
 * Modal quantities every response analysis needs: generalized mass M_n = φ_nᵀMφ_n, the
 * excitation factor L_n = φ_nᵀMr, Γ_n = L_n / M_n and the effective mass L_n² / M_n (Chopra,
 * *Dynamics of Structures*, chapter 13), and the checks of the inputs.
 */
import { EngineError } from '../errors';
import { symmetricMultiply } from '../linalg/sparse';
import type { ModalBasis, ModalDamping } from './types';

function dot(a: Float64Array, b: Float64Array): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += (a[i] as number) * (b[i] as number);
  return s;
}

/** Per-mode generalized mass, excitation factor, participation factor and effective mass. */
export interface ModalFactors {
  generalizedMass: number[];
  excitation: number[];
  gamma: number[];
  effectiveMass: number[];
}

/**
 * Checks a modal basis: at least one mode, shapes as long as M, finite positive frequencies.
 * @throws EngineError INVALID_OPTION naming the mode at fault.
 * @example checkBasis({ omega: [10], shapes: [Float64Array.of(1)], M })
 */
export function checkBasis(basis: ModalBasis): number {
  const n = basis.shapes[0]?.length ?? 0;
  if (basis.omega.length === 0 || basis.omega.length !== basis.shapes.length) {
    throw new EngineError('INVALID_OPTION', 'A response analysis needs at least one mode.');
  }
  basis.omega.forEach((w, i) => {
    if (!(w > 0) || !Number.isFinite(w)) {
      throw new EngineError(
        'INVALID_OPTION',
        `Mode ${i + 1} has ω = ${w} rad/s; a response analysis needs modes with a positive, finite frequency (remove rigid-body modes by restraining the model).`,
        { mode: i + 1 },
      );
    }
    if (basis.shapes[i]!.length !== n) {
      throw new EngineError('INVALID_OPTION', `Mode ${i + 1} has a shape of a different size.`);
    }
  });
  return n;
}

/**
 * Generalized masses M_n = φᵀMφ and, with an influence vector r, L_n = φᵀMr, Γ_n = L_n/M_n and
 * the effective mass L_n²/M_n (Chopra, *Dynamics of Structures*, §13.1; from memory).
 * @example modalFactors(basis, Float64Array.of(1, 1)).gamma
 */
export function modalFactors(basis: ModalBasis, r: Float64Array | null): ModalFactors {
  const out: ModalFactors = { generalizedMass: [], excitation: [], gamma: [], effectiveMass: [] };
  for (const phi of basis.shapes) {
    const Mphi = symmetricMultiply(basis.M, phi);
    const Mn = dot(phi, Mphi);
    if (!(Mn > 0)) {
      throw new EngineError(
        'INVALID_OPTION',
        'A mode shape has no mass (φᵀMφ = 0); it cannot take part in a response analysis.',
      );
    }
    const Ln = r ? dot(Mphi, r) : 0;
    out.generalizedMass.push(Mn);
    out.excitation.push(Ln);
    out.gamma.push(Ln / Mn);
    out.effectiveMass.push((Ln * Ln) / Mn);
  }
  return out;
}

/**
 * Damping ratio per mode from one ratio or a list.
 * @throws EngineError INVALID_OPTION for a ratio outside [0, 1) or a list of the wrong length.
 * @example dampingPerMode(0.05, 3) // [0.05, 0.05, 0.05]
 */
export function dampingPerMode(damping: ModalDamping, count: number): number[] {
  const list = typeof damping === 'number' ? new Array<number>(count).fill(damping) : [...damping];
  if (list.length !== count) {
    throw new EngineError(
      'INVALID_OPTION',
      `The damping gives ${list.length} ratios for ${count} modes; give one ratio, or one per mode.`,
    );
  }
  list.forEach((z, i) => {
    if (!(z >= 0 && z < 1)) {
      throw new EngineError(
        'INVALID_OPTION',
        `The damping ratio of mode ${i + 1} is ${z}; a ratio is at least 0 and below 1 (5 % is 0.05).`,
        { mode: i + 1 },
      );
    }
  });
  return list;
}

/**
 * Rayleigh damping C = αM + βK through two frequencies ω₁, ω₂ (rad/s) with ratios ζ₁, ζ₂:
 * ζ(ω) = α/(2ω) + βω/2 (Chopra, *Dynamics of Structures*, §11.4; from memory).
 * @example rayleighCoefficients(10, 0.05, 40, 0.05) // { alpha: 0.8, beta: 0.002 }
 */
export function rayleighCoefficients(
  w1: number,
  z1: number,
  w2: number,
  z2: number,
): { alpha: number; beta: number } {
  if (!(w1 > 0 && w2 > 0) || w1 === w2) {
    throw new EngineError(
      'INVALID_OPTION',
      'Rayleigh damping needs two different, positive frequencies.',
    );
  }
  const beta = (2 * (z2 * w2 - z1 * w1)) / (w2 * w2 - w1 * w1);
  const alpha = 2 * z1 * w1 - beta * w1 * w1;
  return { alpha, beta };
}

/**
 * The ratio Rayleigh damping gives a mode of circular frequency ω: α/(2ω) + βω/2.
 * @example rayleighRatio({ alpha: 0.8, beta: 0.002 }, 20) // 0.04
 */
export function rayleighRatio(c: { alpha: number; beta: number }, omega: number): number {
  return c.alpha / (2 * omega) + (c.beta * omega) / 2;
}

export { dot as dotProduct };
