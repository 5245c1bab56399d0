/**
 * Modal and directional combination of peak responses.
 *
 * - CQC correlation coefficient (Der Kiureghian 1981; Wilson, Der Kiureghian & Bayo 1981, "A
 *   replacement for the SRSS method in seismic analysis"), for modal damping ζ_i, ζ_j and
 *   β = ω_j/ω_i: ρ_ij = 8√(ζ_iζ_j)(ζ_i + βζ_j)β^{3/2} / ((1−β²)² + 4ζ_iζ_jβ(1+β²) + 4(ζ_i²+ζ_j²)β²),
 *   which for equal damping is 8ζ²(1+β)β^{3/2} / ((1−β²)² + 4ζ²β(1+β)²).
 * - SRSS: ρ_ij = δ_ij.
 * - EN 1998-1 §4.3.3.3.2: modes i, j may be taken as independent when T_j ≤ 0.9 T_i.
 * - Directions: SRSS, or the 100 %/30 % rule (EN 1998-1 §4.3.3.5.1; ASCE 7-16 §12.5.3.1, from
 *   memory).
 */
import { EngineError } from '../errors';

export type ModalCombination = 'srss' | 'cqc';
export type DirectionalCombination = 'srss' | '100-30';

/**
 * The CQC correlation coefficient of modes with circular frequencies ωi, ωj and damping ζi, ζj.
 * @example cqcCorrelation(10, 10, 0.05, 0.05) // 1
 */
export function cqcCorrelation(wi: number, wj: number, zi: number, zj: number): number {
  if (wi === wj && zi === zj) return 1;
  if (zi === 0 && zj === 0) return wi === wj ? 1 : 0;
  const b = wj / wi;
  const num = 8 * Math.sqrt(zi * zj) * (zi + b * zj) * b ** 1.5;
  const den = (1 - b * b) ** 2 + 4 * zi * zj * b * (1 + b * b) + 4 * (zi * zi + zj * zj) * b * b;
  return num / den;
}

/**
 * The correlation matrix of a set of modes for the chosen rule.
 * @example correlationMatrix([10, 11], [0.05, 0.05], 'cqc')
 */
export function correlationMatrix(
  omega: readonly number[],
  damping: readonly number[],
  rule: ModalCombination,
): number[][] {
  return omega.map((wi, i) =>
    omega.map((wj, j) =>
      i === j ? 1 : rule === 'srss' ? 0 : cqcCorrelation(wi, wj, damping[i]!, damping[j]!),
    ),
  );
}

/**
 * √(Σ_i Σ_j ρ_ij r_i r_j): the peak of a response from its modal peaks r (with signs).
 * @example combinePeaks([3, 4], [[1, 0], [0, 1]]) // 5
 */
export function combinePeaks(
  peaks: readonly number[],
  rho: readonly (readonly number[])[],
): number {
  let s = 0;
  for (let i = 0; i < peaks.length; i++) {
    const ri = peaks[i]!;
    if (ri === 0) continue;
    const row = rho[i]!;
    for (let j = 0; j < peaks.length; j++) s += row[j]! * ri * peaks[j]!;
  }
  return Math.sqrt(Math.max(s, 0));
}

/**
 * Pairs of modes that are not independent by EN 1998-1 §4.3.3.3.2 (T_j > 0.9 T_i for T_j ≤ T_i),
 * 1-based, each pair once.
 * @example closeModes([1.0, 0.95, 0.3]) // [[1, 2]]
 */
export function closeModes(periods: readonly number[]): [number, number][] {
  const out: [number, number][] = [];
  for (let i = 0; i < periods.length; i++) {
    for (let j = i + 1; j < periods.length; j++) {
      const hi = Math.max(periods[i]!, periods[j]!);
      const lo = Math.min(periods[i]!, periods[j]!);
      if (lo > 0.9 * hi) out.push([i + 1, j + 1]);
    }
  }
  return out;
}

/**
 * Combines the peaks of one response under two or three directions of excitation: SRSS, or the
 * largest of E_a + 0.3 E_b (+ 0.3 E_c) over the choice of the leading direction.
 * @example combineDirections([1, 1], 'srss') // √2
 */
export function combineDirections(peaks: readonly number[], rule: DirectionalCombination): number {
  if (peaks.length === 0) throw new EngineError('INVALID_OPTION', 'No directions to combine.');
  const abs = peaks.map(Math.abs);
  if (rule === 'srss') return Math.sqrt(abs.reduce((s, x) => s + x * x, 0));
  let best = 0;
  for (let lead = 0; lead < abs.length; lead++) {
    const v = abs.reduce((s, x, k) => s + (k === lead ? x : 0.3 * x), 0);
    best = Math.max(best, v);
  }
  return best;
}
