/**
 * Response-spectrum analysis of a modal basis for one direction of ground motion (Chopra,
 * *Dynamics of Structures*, chapter 13, from memory): per mode n with Γ_n = L_n/M_n,
 *   modal base shear V_n = M*_n S_a(T_n), peak displacements u_n = Γ_n φ_n S_a(T_n)/ω_n²,
 *   equivalent static forces f_n = Γ_n M φ_n S_a(T_n);
 * for a storey model (one DOF per floor, floor 1 lowest), storey shears, overturning moments and
 * inter-storey drifts are formed mode by mode and only then combined (SRSS or CQC) — never as
 * differences of combined displacements. Scaling to an equivalent-lateral-force base shear follows
 * ASCE 7-16 §12.9.1.4.1 (forces to 100 % of V_ELF when the modal base shear is less; from memory);
 * displacements and drifts are not scaled by it.
 */
import { EngineError } from '../errors';
import { symmetricMultiply } from '../linalg/sparse';
import { closeModes, combinePeaks, correlationMatrix, type ModalCombination } from './combination';
import { checkBasis, dampingPerMode, modalFactors } from './modal-basis';
import type { Spectrum } from './spectra';
import type { ModalBasis, ModalDamping } from './types';

export interface SpectrumAnalysisInput {
  basis: ModalBasis;
  /** Influence vector r of the ground motion (ones for a storey model). */
  influence: Float64Array;
  spectrum: Spectrum;
  damping: ModalDamping;
  combination: ModalCombination;
  /** Storey heights, floor 1 first, m: turns on storey forces, shears, overturning and drifts. */
  storeyHeights?: readonly number[];
  /** An equivalent-lateral-force base shear to scale the modal forces to, N. */
  elfBaseShear?: number;
  /** The share of V_ELF the modal base shear must reach (1.0 in ASCE 7-16; 0.85 in 7-10). */
  elfShare?: number;
}

export interface SpectrumModeRow {
  mode: number;
  period: number;
  omega: number;
  damping: number;
  /** Pseudo-acceleration S_a(T_n), m/s². */
  sa: number;
  gamma: number;
  effectiveMass: number;
  /** V_n = M*_n S_a, N (with sign of Γ_n²: always ≥ 0). */
  baseShear: number;
}

export interface StoreyResponse {
  /** Combined peak storey forces, N (scaled). */
  force: number[];
  /** Combined peak storey shears, N (scaled); shear[i] acts in storey i (below floor i). */
  shear: number[];
  /** Combined peak overturning moment at the base of storey i, N·m (scaled). */
  overturning: number[];
  /** Combined peak inter-storey drifts, m (mode by mode, then combined). */
  drift: number[];
  /** drift / storey height. */
  driftRatio: number[];
}

export interface SpectrumAnalysisResult {
  combination: ModalCombination;
  spectrum: { description: string; source: string };
  modes: SpectrumModeRow[];
  /** Combined peak base shear, N, before scaling. */
  baseShear: number;
  /** Combined peak displacement per DOF, m. */
  displacement: number[];
  /** Modal peak displacements, [mode][dof], m. */
  modalDisplacement: number[][];
  storeys: StoreyResponse | null;
  scaling: { elfBaseShear: number; share: number; factor: number } | null;
  /** Base shear after scaling, N. */
  scaledBaseShear: number;
  /** Modes not independent by EN 1998-1 §4.3.3.3.2 (1-based pairs). */
  closeModes: [number, number][];
  /** Σ M*_n / rᵀMr: the share of the mass the modes used carry. */
  massRatio: number;
  totalMass: number;
}

function cumulativeFromTop(xs: readonly number[]): number[] {
  const out = new Array<number>(xs.length).fill(0);
  let s = 0;
  for (let i = xs.length - 1; i >= 0; i--) {
    s += xs[i]!;
    out[i] = s;
  }
  return out;
}

/**
 * Runs a response-spectrum analysis (see the module comment for the method and its sources).
 * @throws EngineError INVALID_OPTION for a bad basis, damping, heights, or a period outside a
 *   spectrum table (the message names the mode and its period; details.mode, details.period).
 * @example
 * const r = spectrumAnalysis({ basis, influence: Float64Array.of(1, 1), spectrum, damping: 0.05, combination: 'cqc' });
 * r.baseShear // N
 */
export function spectrumAnalysis(input: SpectrumAnalysisInput): SpectrumAnalysisResult {
  const { basis, influence, spectrum } = input;
  const n = checkBasis(basis);
  if (influence.length !== n) {
    throw new EngineError(
      'MATRIX_SIZE_MISMATCH',
      `The influence vector has ${influence.length} entries but the model has ${n} DOFs.`,
    );
  }
  const count = basis.omega.length;
  const zeta = dampingPerMode(input.damping, count);
  const factors = modalFactors(basis, influence);
  const modes: SpectrumModeRow[] = basis.omega.map((w, i) => {
    const period = (2 * Math.PI) / w;
    let sa: number;
    try {
      sa = spectrum.sa(period);
    } catch (err) {
      if (err instanceof EngineError) {
        throw new EngineError(
          'INVALID_OPTION',
          `Mode ${i + 1} (T = ${period.toPrecision(4)} s): ${err.message}`,
          {
            mode: i + 1,
            period,
          },
        );
      }
      throw err;
    }
    return {
      mode: i + 1,
      period,
      omega: w,
      damping: zeta[i]!,
      sa,
      gamma: factors.gamma[i]!,
      effectiveMass: factors.effectiveMass[i]!,
      baseShear: factors.effectiveMass[i]! * sa,
    };
  });
  const rho = correlationMatrix(basis.omega, zeta, input.combination);
  const combine = (peaks: number[]) => combinePeaks(peaks, rho);
  const modalDisplacement = modes.map((m, i) => {
    const s = (m.gamma * m.sa) / (m.omega * m.omega);
    return Array.from(basis.shapes[i]!, (x) => x * s);
  });
  const displacement = Array.from({ length: n }, (_, d) =>
    combine(modalDisplacement.map((u) => u[d]!)),
  );
  const baseShear = combine(modes.map((m) => m.baseShear));

  let scaling: SpectrumAnalysisResult['scaling'] = null;
  let scale = 1;
  if (input.elfBaseShear !== undefined) {
    if (!(input.elfBaseShear > 0)) {
      throw new EngineError('INVALID_OPTION', 'The ELF base shear must be a positive force.');
    }
    const share = input.elfShare ?? 1;
    const target = share * input.elfBaseShear;
    scale = baseShear < target ? target / baseShear : 1;
    scaling = { elfBaseShear: input.elfBaseShear, share, factor: scale };
  }

  let storeys: StoreyResponse | null = null;
  if (input.storeyHeights) {
    const h = input.storeyHeights;
    if (h.length !== n || h.some((x) => !(x > 0))) {
      throw new EngineError(
        'INVALID_OPTION',
        `Storey heights: give ${n} positive heights, one per floor (floor 1 first); got ${h.length}.`,
      );
    }
    const level = h.reduce<number[]>((acc, x) => [...acc, (acc[acc.length - 1] ?? 0) + x], []);
    const modalForce = modes.map((m, i) =>
      Array.from(symmetricMultiply(basis.M, basis.shapes[i]!), (x) => x * m.gamma * m.sa),
    );
    const modalShear = modalForce.map(cumulativeFromTop);
    const modalMoment = modalForce.map((f) =>
      level.map((_, i) => {
        const below = i === 0 ? 0 : level[i - 1]!;
        let s = 0;
        for (let j = i; j < n; j++) s += f[j]! * (level[j]! - below);
        return s;
      }),
    );
    const modalDrift = modalDisplacement.map((u) => u.map((x, i) => x - (i === 0 ? 0 : u[i - 1]!)));
    const per = (a: number[][], s: number) =>
      Array.from({ length: n }, (_, d) => s * combine(a.map((row) => row[d]!)));
    const drift = per(modalDrift, 1);
    storeys = {
      force: per(modalForce, scale),
      shear: per(modalShear, scale),
      overturning: per(modalMoment, scale),
      drift,
      driftRatio: drift.map((d, i) => d / h[i]!),
    };
  }

  let totalMass = 0;
  const Mr = symmetricMultiply(basis.M, influence);
  for (let i = 0; i < n; i++) totalMass += influence[i]! * Mr[i]!;
  const massRatio =
    totalMass > 0 ? factors.effectiveMass.reduce((s, x) => s + x, 0) / totalMass : 0;

  return {
    combination: input.combination,
    spectrum: { description: spectrum.description, source: spectrum.source },
    modes,
    baseShear,
    displacement,
    modalDisplacement,
    storeys,
    scaling,
    // scaled to the target exactly, so a criterion V ≥ V_ELF reads true without rounding
    scaledBaseShear: scaling && scale > 1 ? scaling.share * scaling.elfBaseShear : baseShear,
    closeModes: closeModes(modes.map((m) => m.period)),
    massRatio,
    totalMass,
  };
}
