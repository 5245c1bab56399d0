/**
 * Walking response of a floor or footbridge mode: the peak acceleration of AISC Design Guide 11
 * (2nd ed., Eq. 4-1, from memory), a_p/g = P_o e^{−0.35 f_n} / (β W), with P_o = 0.29 kN for
 * floors and 0.41 kN for footbridges (from memory), β the modal damping ratio and W the effective
 * weight, taken here as g times the modal mass of the mode with its shape scaled to 1 where the
 * walker stands. Limits: 0.5 % g offices, 1.5 % g malls and indoor footbridges, 5 % g outdoor
 * footbridges (DG11 Table 4.1, from memory); EN 1990 A2 §A2.4.3.2 for footbridges: 0.7 m/s²
 * vertical, 0.2 m/s² horizontal in normal use (from memory).
 */
import { EngineError } from '../errors';
import { symmetricMultiply } from '../linalg/sparse';
import { checkBasis, dotProduct } from './modal-basis';
import { STANDARD_GRAVITY } from './spectra';
import type { ModalBasis } from './types';

/** P_o of DG11, N: floors and footbridges (from memory). */
export const WALKING_FORCE = { floor: 290, footbridge: 410 } as const;

export interface WalkingInput {
  basis: ModalBasis;
  /** 0-based mode. */
  mode: number;
  /** 0-based DOF where the walker stands (default: the largest component of the shape). */
  dof?: number;
  /** Modal damping ratio β. */
  damping: number;
  /** Constant force P_o, N (default 290 N, floors). */
  force?: number;
}

export interface WalkingResult {
  mode: number;
  dof: number;
  frequency: number;
  /** Modal mass with the shape scaled to 1 at `dof`, kg. */
  modalMass: number;
  /** Effective weight W = g · modal mass, N. */
  weight: number;
  force: number;
  damping: number;
  /** Peak acceleration, m/s². */
  acceleration: number;
  /** a_p / g. */
  ratio: number;
  method: string;
}

/**
 * Peak walking acceleration of one mode by AISC DG11 Eq. 4-1 (see the module comment).
 * @throws EngineError INVALID_OPTION for a mode or DOF out of range, a DOF that does not move in
 *   the mode, or damping outside (0, 1).
 * @example walkingResponse({ basis, mode: 0, damping: 0.01, force: 410 }).acceleration
 */
export function walkingResponse(input: WalkingInput): WalkingResult {
  const { basis } = input;
  const n = checkBasis(basis);
  const phi = basis.shapes[input.mode];
  if (!phi) {
    throw new EngineError(
      'INVALID_OPTION',
      `Mode ${input.mode + 1} was not found (the modes block has ${basis.shapes.length}).`,
      { mode: input.mode + 1 },
    );
  }
  let dof = input.dof ?? 0;
  if (input.dof === undefined) {
    for (let i = 1; i < n; i++) if (Math.abs(phi[i]!) > Math.abs(phi[dof]!)) dof = i;
  } else if (!Number.isInteger(dof) || dof < 0 || dof >= n) {
    throw new EngineError('INVALID_OPTION', `DOF ${dof + 1} is not in the model (it has ${n}).`, {
      dof: dof + 1,
    });
  }
  const ref = phi[dof]!;
  if (Math.abs(ref) < 1e-12 * Math.max(...Array.from(phi, Math.abs))) {
    throw new EngineError(
      'INVALID_OPTION',
      `DOF ${dof + 1} does not move in mode ${input.mode + 1}; a walker there excites nothing.`,
      { dof: dof + 1 },
    );
  }
  if (!(input.damping > 0 && input.damping < 1)) {
    throw new EngineError(
      'INVALID_OPTION',
      `The damping ratio must be above 0 and below 1 (got ${input.damping}).`,
    );
  }
  const scaled = Float64Array.from(phi, (x) => x / ref);
  const modalMass = dotProduct(scaled, symmetricMultiply(basis.M, scaled));
  const omega = basis.omega[input.mode]!;
  const frequency = omega / (2 * Math.PI);
  const force = input.force ?? WALKING_FORCE.floor;
  const weight = STANDARD_GRAVITY * modalMass;
  const ratio = (force * Math.exp(-0.35 * frequency)) / (input.damping * weight);
  return {
    mode: input.mode + 1,
    dof: dof + 1,
    frequency,
    modalMass,
    weight,
    force,
    damping: input.damping,
    acceleration: ratio * STANDARD_GRAVITY,
    ratio,
    method:
      'AISC Design Guide 11 (2nd ed.) Eq. 4-1, a_p/g = P_o e^(−0.35 f_n)/(βW), W = g × modal mass (from memory)',
  };
}
