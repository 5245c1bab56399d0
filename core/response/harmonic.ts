/**
 * Steady-state harmonic response by modal superposition with modal damping (Chopra, *Dynamics of
 * Structures*, §3.2 and §12.4, from memory): under p(t) = p₀ sin Ωt each mode answers
 * q_n = (φ_nᵀp₀ / M_n) / (ω_n² − Ω² + 2iζ_nω_nΩ), and u = Σ φ_n q_n. For one mode this is the
 * classical magnification 1/√((1−r²)² + (2ζr)²) of the static deflection, r = Ω/ω.
 * A rotating unbalance m_e·e gives the force amplitude m_e·e·Ω² (common practice, ACI 351.3R,
 * from memory). Only the modes found take part: modes far above the range add their static part,
 * which this leaves out.
 */
import { EngineError } from '../errors';
import { checkBasis, dampingPerMode, dotProduct, modalFactors } from './modal-basis';
import type { ModalBasis, ModalDamping } from './types';

export interface HarmonicLoad {
  /** Force amplitude per DOF, N (for `force`), or the direction of the unbalance force (unitless). */
  pattern: Float64Array;
  /** 'force': p₀ = pattern; 'unbalance': p₀ = pattern · m_e e Ω² with `unbalance` = m_e·e in kg·m. */
  kind: 'force' | 'unbalance';
  unbalance?: number;
}

export interface HarmonicInput {
  basis: ModalBasis;
  load: HarmonicLoad;
  damping: ModalDamping;
  /** Circular forcing frequencies Ω, rad/s. */
  frequencies: readonly number[];
  /** 0-based DOFs whose response is reported. */
  dofs: readonly number[];
}

export interface HarmonicDofResponse {
  dof: number;
  /** Displacement amplitude per frequency, m. */
  amplitude: number[];
  /** Phase lag of the displacement behind the force, rad (0 … 2π). */
  phase: number[];
  /** Velocity amplitude Ω|u|, m/s. */
  velocity: number[];
}

export interface HarmonicResult {
  frequencies: number[];
  damping: number[];
  dofs: HarmonicDofResponse[];
}

/**
 * The single-DOF dynamic magnification 1/√((1−r²)² + (2ζr)²) (classical).
 * @example magnification(1, 0.05) // 10
 */
export function magnification(r: number, zeta: number): number {
  return 1 / Math.sqrt((1 - r * r) ** 2 + (2 * zeta * r) ** 2);
}

/**
 * Amplitude and phase of the steady-state response at the chosen DOFs over a list of forcing
 * frequencies (see the module comment).
 * @throws EngineError INVALID_OPTION for a bad basis, damping, load size or DOF.
 * @example harmonicResponse({ basis, load: { kind: 'force', pattern }, damping: 0.02, frequencies: [10, 20], dofs: [0] })
 */
export function harmonicResponse(input: HarmonicInput): HarmonicResult {
  const { basis, load } = input;
  const n = checkBasis(basis);
  if (load.pattern.length !== n) {
    throw new EngineError(
      'MATRIX_SIZE_MISMATCH',
      `The force has ${load.pattern.length} entries but the model has ${n} DOFs.`,
    );
  }
  if (load.kind === 'unbalance' && !(load.unbalance !== undefined && load.unbalance > 0)) {
    throw new EngineError('INVALID_OPTION', 'A rotating unbalance needs m·e > 0 (kg·m).');
  }
  for (const d of input.dofs) {
    if (!Number.isInteger(d) || d < 0 || d >= n) {
      throw new EngineError(
        'INVALID_OPTION',
        `DOF ${d + 1} is not in the model (it has ${n} DOFs).`,
        { dof: d + 1 },
      );
    }
  }
  const zeta = dampingPerMode(input.damping, basis.omega.length);
  const { generalizedMass } = modalFactors(basis, null);
  const modalLoad = basis.shapes.map(
    (phi, i) => dotProduct(phi, load.pattern) / generalizedMass[i]!,
  );
  const dofs: HarmonicDofResponse[] = input.dofs.map((dof) => ({
    dof,
    amplitude: [],
    phase: [],
    velocity: [],
  }));
  for (const W of input.frequencies) {
    const scale = load.kind === 'unbalance' ? load.unbalance! * W * W : 1;
    for (const out of dofs) {
      let re = 0;
      let im = 0;
      basis.omega.forEach((w, i) => {
        // q = P / (a + ib), a = ω² − Ω², b = 2ζωΩ: q = P (a − ib) / (a² + b²)
        const a = w * w - W * W;
        const b = 2 * zeta[i]! * w * W;
        const P = modalLoad[i]! * scale * basis.shapes[i]![out.dof]!;
        const d = a * a + b * b;
        re += (P * a) / d;
        im -= (P * b) / d;
      });
      const amp = Math.hypot(re, im);
      let lag = -Math.atan2(im, re);
      if (lag < 0) lag += 2 * Math.PI;
      out.amplitude.push(amp);
      out.phase.push(amp === 0 ? 0 : lag);
      out.velocity.push(amp * W);
    }
  }
  return { frequencies: [...input.frequencies], damping: zeta, dofs };
}

/**
 * Evenly spaced circular frequencies from f₁ to f₂ (Hz), `count` points, with the given extra
 * frequencies (the running speed, the modes' own) inserted in order, all in rad/s.
 * @example frequencyGrid(1, 2, 3, []) // [2π, 3π, 4π]
 */
export function frequencyGrid(
  f1: number,
  f2: number,
  count: number,
  extra: readonly number[],
): number[] {
  if (!(f2 > f1 && f1 >= 0) || !(count >= 2)) {
    throw new EngineError(
      'INVALID_OPTION',
      'The frequency range must run upwards from a frequency ≥ 0, with at least two points.',
    );
  }
  const hz = Array.from({ length: count }, (_, i) => f1 + ((f2 - f1) * i) / (count - 1));
  for (const x of extra) if (x > f1 && x < f2) hz.push(x);
  hz.sort((a, b) => a - b);
  return hz.filter((x, i) => i === 0 || x !== hz[i - 1]).map((f) => 2 * Math.PI * f);
}
