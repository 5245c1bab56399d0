/**
 * Modal time histories: each modal equation q̈ + 2ζωq̇ + ω²q = P(t) is stepped on its own and the
 * DOF histories are superposed, u(t) = Σ φ_n q_n(t).
 *
 * - `exact`: the exact solution for a load linear between steps (Nigam & Jennings 1969; the
 *   recurrence coefficients of Chopra, *Dynamics of Structures*, Table 5.2.1, from memory).
 * - `newmark`: Newmark's average-acceleration method, γ = ½, β = ¼ (Newmark 1959),
 *   unconditionally stable.
 * Loads: a force pattern p times a time function f(t), P_n = φ_nᵀp f(t) / M_n; or a ground
 * acceleration ü_g(t) in the direction r, P_n = −Γ_n ü_g(t), displacements relative to the ground
 * and the base shear V_b(t) = Σ L_n ω_n² q_n(t) (Chopra, chapter 13). The record is sampled
 * linearly on the step; after its end the load is zero (free vibration).
 * For comparison with explicit integration, the central-difference stable step 2/ω_max and, with
 * damping ζ in the top mode, (2/ω_max)(√(1+ζ²) − ζ) (Belytschko, Liu & Moran, from memory).
 */
import { EngineError } from '../errors';
import { checkBasis, dampingPerMode, dotProduct, modalFactors } from './modal-basis';
import type { ModalBasis, ModalDamping } from './types';

export type StepMethod = 'exact' | 'newmark';

export interface TimeRecord {
  /** Times, s, increasing from ≥ 0. */
  time: readonly number[];
  /** Values: a force factor (unitless) or a ground acceleration (m/s²). */
  value: readonly number[];
}

export type HistoryLoad =
  | { kind: 'force'; pattern: Float64Array; record: TimeRecord }
  | { kind: 'ground'; influence: Float64Array; record: TimeRecord };

export interface TimeHistoryInput {
  basis: ModalBasis;
  load: HistoryLoad;
  damping: ModalDamping;
  /** Time step, s. */
  step: number;
  /** End time, s (default: the record's end). */
  duration?: number;
  method?: StepMethod;
  /** 0-based DOFs whose histories are kept. */
  dofs: readonly number[];
  /** Largest number of steps (default 200 000): refused above it before allocating. */
  maxSteps?: number;
}

export interface ResponsePeak {
  /** Largest |value| and the time it occurs, s. */
  peak: number;
  time: number;
}

export interface TimeHistoryResult {
  method: StepMethod;
  step: number;
  time: number[];
  /** Modal coordinates per mode. */
  modal: number[][];
  dofs: { dof: number; displacement: number[]; peak: ResponsePeak }[];
  /** Base shear history, N (ground motion only). */
  baseShear: { values: number[]; peak: ResponsePeak } | null;
  /** Central-difference stable step 2/ω_max and its damped value, s. */
  centralDifference: { dtCr: number; dtCrDamped: number; omegaMax: number };
}

function peakOf(values: readonly number[], time: readonly number[]): ResponsePeak {
  let k = 0;
  for (let i = 1; i < values.length; i++) if (Math.abs(values[i]!) > Math.abs(values[k]!)) k = i;
  return { peak: Math.abs(values[k] ?? 0), time: time[k] ?? 0 };
}

/** Samples a record linearly at t (zero outside it). */
function sampleRecord(rec: TimeRecord, t: number, hint: { k: number }): number {
  const T = rec.time;
  if (t < T[0]! || t > T[T.length - 1]!) return 0;
  while (hint.k < T.length - 2 && T[hint.k + 1]! < t) hint.k++;
  const t0 = T[hint.k]!;
  const t1 = T[hint.k + 1]!;
  const v0 = rec.value[hint.k]!;
  const v1 = rec.value[hint.k + 1]!;
  return v0 + ((v1 - v0) * (t - t0)) / (t1 - t0);
}

function checkRecord(rec: TimeRecord): void {
  if (rec.time.length < 2 || rec.time.length !== rec.value.length) {
    throw new EngineError(
      'INVALID_OPTION',
      'A load record needs at least two rows of time and value.',
    );
  }
  rec.time.forEach((t, i) => {
    if (!Number.isFinite(t) || !Number.isFinite(rec.value[i]!) || t < 0) {
      throw new EngineError(
        'INVALID_OPTION',
        `Row ${i + 1} of the record is not a time ≥ 0 and a value.`,
        {
          row: i + 1,
        },
      );
    }
    if (i > 0 && !(t > rec.time[i - 1]!)) {
      throw new EngineError(
        'INVALID_OPTION',
        `The times of the record must increase: row ${i + 1} (${t} s) follows ${rec.time[i - 1]} s.`,
        { row: i + 1 },
      );
    }
  });
}

/**
 * Steps one modal equation q̈ + 2ζωq̇ + ω²q = P(t) from rest, P sampled at each step.
 * @example stepModalEquation(2 * Math.PI, 0, loads, 0.01, 'exact')
 */
export function stepModalEquation(
  omega: number,
  zeta: number,
  load: readonly number[],
  dt: number,
  method: StepMethod,
): number[] {
  const q = new Array<number>(load.length).fill(0);
  const k = omega * omega;
  const c = 2 * zeta * omega;
  if (method === 'exact') {
    const sq = Math.sqrt(1 - zeta * zeta);
    const wd = omega * sq;
    const e = Math.exp(-zeta * omega * dt);
    const s = Math.sin(wd * dt);
    const co = Math.cos(wd * dt);
    const z = zeta / sq;
    const A = e * (z * s + co);
    const B = (e * s) / wd;
    const C =
      (1 / k) *
      ((2 * zeta) / (omega * dt) +
        e * (((1 - 2 * zeta * zeta) / (wd * dt) - z) * s - (1 + (2 * zeta) / (omega * dt)) * co));
    const D =
      (1 / k) *
      (1 -
        (2 * zeta) / (omega * dt) +
        e * (((2 * zeta * zeta - 1) / (wd * dt)) * s + ((2 * zeta) / (omega * dt)) * co));
    const A1 = -e * ((omega / sq) * s);
    const B1 = e * (co - z * s);
    const C1 = (1 / k) * (-1 / dt + e * ((omega / sq + zeta / (dt * sq)) * s + co / dt));
    const D1 = (1 / (k * dt)) * (1 - e * (z * s + co));
    let u = 0;
    let v = 0;
    for (let i = 0; i + 1 < load.length; i++) {
      const p0 = load[i]!;
      const p1 = load[i + 1]!;
      const un = A * u + B * v + C * p0 + D * p1;
      const vn = A1 * u + B1 * v + C1 * p0 + D1 * p1;
      u = un;
      v = vn;
      q[i + 1] = u;
    }
    return q;
  }
  // Newmark, average acceleration (γ = ½, β = ¼), unit mass.
  const g = 0.5;
  const b = 0.25;
  const kh = k + (g / (b * dt)) * c + 1 / (b * dt * dt);
  const a1 = 1 / (b * dt * dt) + (g * c) / (b * dt);
  const a2 = 1 / (b * dt) + (g / b - 1) * c;
  const a3 = 1 / (2 * b) - 1 + dt * (g / (2 * b) - 1) * c;
  let u = 0;
  let v = 0;
  let a = load[0] ?? 0;
  for (let i = 0; i + 1 < load.length; i++) {
    const un = (load[i + 1]! + a1 * u + a2 * v + a3 * a) / kh;
    const vn = (g / (b * dt)) * (un - u) + (1 - g / b) * v + dt * (1 - g / (2 * b)) * a;
    const an = (un - u) / (b * dt * dt) - v / (b * dt) - (1 / (2 * b) - 1) * a;
    u = un;
    v = vn;
    a = an;
    q[i + 1] = u;
  }
  return q;
}

/**
 * A modal time history under a force or a ground-acceleration record (see the module comment).
 * @throws EngineError INVALID_OPTION for a bad record, step, DOF or damping; SHEET_LIMIT above
 *   `maxSteps`.
 * @example modalTimeHistory({ basis, load: { kind: 'ground', influence, record }, damping: 0.05, step: 0.01, dofs: [2] })
 */
export function modalTimeHistory(input: TimeHistoryInput): TimeHistoryResult {
  const { basis, load } = input;
  const n = checkBasis(basis);
  checkRecord(load.record);
  const vec = load.kind === 'force' ? load.pattern : load.influence;
  if (vec.length !== n) {
    throw new EngineError(
      'MATRIX_SIZE_MISMATCH',
      `The ${load.kind === 'force' ? 'force' : 'direction'} has ${vec.length} entries but the model has ${n} DOFs.`,
    );
  }
  if (!(input.step > 0) || !Number.isFinite(input.step)) {
    throw new EngineError(
      'INVALID_OPTION',
      `The time step must be a positive time (got ${input.step} s).`,
    );
  }
  for (const d of input.dofs) {
    if (!Number.isInteger(d) || d < 0 || d >= n) {
      throw new EngineError('INVALID_OPTION', `DOF ${d + 1} is not in the model (it has ${n}).`, {
        dof: d + 1,
      });
    }
  }
  const duration = input.duration ?? load.record.time[load.record.time.length - 1]!;
  const steps = Math.round(duration / input.step);
  const maxSteps = input.maxSteps ?? 200_000;
  if (!(steps >= 1) || steps > maxSteps) {
    throw new EngineError(
      steps > maxSteps ? 'SHEET_LIMIT' : 'INVALID_OPTION',
      `${duration} s in steps of ${input.step} s is ${steps} steps; a history takes 1 to ${maxSteps}.`,
    );
  }
  const method = input.method ?? 'exact';
  const zeta = dampingPerMode(input.damping, basis.omega.length);
  const factors = modalFactors(basis, load.kind === 'ground' ? load.influence : null);
  const time = Array.from({ length: steps + 1 }, (_, i) => i * input.step);
  const hint = { k: 0 };
  const f = time.map((t) => sampleRecord(load.record, t, hint));
  const modal = basis.omega.map((w, i) => {
    const scale =
      load.kind === 'force'
        ? dotProduct(basis.shapes[i]!, load.pattern) / factors.generalizedMass[i]!
        : -factors.gamma[i]!;
    return stepModalEquation(
      w,
      zeta[i]!,
      f.map((x) => x * scale),
      input.step,
      method,
    );
  });
  const dofs = input.dofs.map((dof) => {
    const displacement = time.map((_, k) =>
      modal.reduce((s, q, i) => s + basis.shapes[i]![dof]! * q[k]!, 0),
    );
    return { dof, displacement, peak: peakOf(displacement, time) };
  });
  let baseShear: TimeHistoryResult['baseShear'] = null;
  if (load.kind === 'ground') {
    const values = time.map((_, k) =>
      modal.reduce((s, q, i) => s + factors.excitation[i]! * basis.omega[i]! ** 2 * q[k]!, 0),
    );
    baseShear = { values, peak: peakOf(values, time) };
  }
  let top = 0;
  basis.omega.forEach((w, i) => {
    if (w > basis.omega[top]!) top = i;
  });
  const omegaMax = basis.omega[top]!;
  const zt = zeta[top]!;
  const dtCr = 2 / omegaMax;
  return {
    method,
    step: input.step,
    time,
    modal,
    dofs,
    baseShear,
    centralDifference: { dtCr, dtCrDamped: dtCr * (Math.sqrt(1 + zt * zt) - zt), omegaMax },
  };
}
