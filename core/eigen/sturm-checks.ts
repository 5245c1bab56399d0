/**
 * The Sturm checks of the shift-invert methods: the number of eigenvalues below a shift is the
 * number of negative pivots of K − σM = LDLᵀ (Sylvester's law of inertia; Parlett, *The Symmetric
 * Eigenvalue Problem*, §3.3), set against the modes found.
 */
import { EngineError } from '../errors';
import type { ShiftedOperator } from './shifted-operator';

/**
 * The Sturm proof made inside the method. Lowest-p mode: K − σM factored at `shift` = λ_p + δ
 * (δ = 1e-8·|λ_p|) has `countBelow` negative pivots; `belowSigma` eigenvalues lie below the
 * working shift σ (normally 0), so `countBelow − belowSigma` should equal `found`. Band mode:
 * `shift` is the band's upper end hi, `belowSigma` the count below its lower end lo, and `found`
 * the modes returned in [lo, hi).
 */
export interface LanczosSturm {
  shift: number;
  countBelow: number;
  belowSigma: number;
  found: number;
  ok: boolean;
  /** Band mode only: the band checked. */
  band?: { lo: number; hi: number };
}

/** A warning of the method in words, with an UPPER_SNAKE code (also written into `notes`). */
export interface MethodWarning {
  code: string;
  message: string;
}

/**
 * The Sturm count just above λ_p: K − σM factored at σ = λ_p(1 + δ), δ = 1e-8. When that counts
 * fewer eigenvalues than the modes found up to λ_p — impossible in exact arithmetic, so the
 * pivots are not to be trusted at that margin — δ grows by decades while the margin stays within
 * 100·ε·λ_max (λ_max ≥ `scale` = max K_ii/M_ii), the size of the rounding of the factorization
 * (Wilkinson's backward error of LDLᵀ, common practice for the margin). Null when the shift hits
 * a zero pivot. `widened` is the δ used when it had to grow.
 * @example
 * const c = sturmCountAbove(op, raw.lambdas, op.sigma, lambdaScale(K, M), op.factorization.negativePivots);
 * c && c.below - belowSigma === raw.lambdas.length; // nothing missed
 */
export function sturmCountAbove(
  op: ShiftedOperator,
  lambdas: number[],
  sigma: number,
  scale: number,
  belowSigma: number,
): { above: number; below: number; widened: number | null } | null {
  const lamP = lambdas[lambdas.length - 1]!;
  const floor = 1e-12 * Math.abs(sigma) + 1e-300;
  const limit = 100 * Number.EPSILON * scale;
  let delta = 1e-8;
  let widened: number | null = null;
  for (;;) {
    const above = lamP + Math.max(delta * Math.abs(lamP), floor);
    let below: number;
    try {
      below = op.countBelow(above);
    } catch (e) {
      if (e instanceof EngineError && e.code === 'ZERO_PIVOT') return null;
      throw e;
    }
    const needed = lambdas.filter((l) => l < above).length;
    const next = delta * 10;
    if (below - belowSigma >= needed || next * Math.abs(lamP) > limit) {
      return { above, below, widened };
    }
    delta = next;
    widened = delta;
  }
}

/**
 * The Sturm check of a band [lo, hi): the eigenvalues in it are (negative pivots of K − hi·M)
 * − (negative pivots of K − lo·M) by Sylvester's law of inertia; that count is set against the
 * modes found in the band. A mismatch is a STURM_MISMATCH warning naming how many are missing
 * (or how many too many were returned).
 * @example
 * const c = checkBandSturm({ lo, hi, belowLo: count(lo), belowHi: count(hi) }, raw.lambdas);
 * c.sturm.ok; c.warning?.message;
 */
export function checkBandSturm(
  band: { lo: number; hi: number; belowLo: number; belowHi: number },
  lambdas: readonly number[],
): { sturm: LanczosSturm; note: string; warning: MethodWarning | null } {
  const { lo, hi, belowLo, belowHi } = band;
  const counted = belowHi - belowLo;
  const found = lambdas.filter((l) => l >= lo && l < hi).length;
  const sturm: LanczosSturm = {
    shift: hi,
    countBelow: belowHi,
    belowSigma: belowLo,
    found,
    ok: counted === found,
    band: { lo, hi },
  };
  const range = `[${lo.toPrecision(6)}, ${hi.toPrecision(6)}) rad²/s²`;
  const note =
    `Sturm check of the band ${range}: K − λM has ${belowLo} negative pivot` +
    `${belowLo === 1 ? '' : 's'} at λ = lo and ${belowHi} at λ = hi, so ${counted} ` +
    `eigenvalue${counted === 1 ? '' : 's'} lie in the band; ${found} found.`;
  if (counted === found) return { sturm, note, warning: null };
  const message =
    counted > found
      ? `Sturm check failed for the band ${range}: the inertia of K − lo·M and K − hi·M counts ` +
        `${counted} eigenvalues in it, but ${found} were found: ${counted - found} mode` +
        `${counted - found === 1 ? ' is' : 's are'} missing (a repeated or closely spaced ` +
        'eigenvalue was skipped).'
      : `Sturm check failed for the band ${range}: the inertia of K − lo·M and K − hi·M counts ` +
        `${counted} eigenvalues in it, but ${found} were returned: ${found - counted} too many ` +
        '(the model is too ill-conditioned for its pivots to be trusted).';
  return { sturm, note, warning: { code: 'STURM_MISMATCH', message } };
}
