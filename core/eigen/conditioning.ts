/**
 * How many digits the model's conditioning allows the lowest eigenvalue. Rounding in the
 * factorization of K − σM perturbs the pencil by about ε‖K‖, which moves λ₁ by up to
 * ε·λ_max, a relative error ε·λ_max/λ₁ (Weyl's perturbation bound for the symmetric pencil:
 * Parlett, *The Symmetric Eigenvalue Problem*, §15.2; Golub & Van Loan, *Matrix Computations*,
 * 4th ed., §8.7, from memory). A very fine mesh can push that above 1: λ₁ is then not resolved at
 * all, and the message says so rather than let wrong digits through.
 */

const EPS = 2 ** -52;

/** Eigenvalues below this fraction of max K_ii/M_ii count as rigid-body modes (common practice). */
export const RIGID_BODY_THRESHOLD = 1e-10;

/** The conditioning of a solved pencil and, when it costs digits, the message in words. */
export interface ConditioningAssessment {
  /** Lower bound of λ_max: max K_ii/M_ii (Rayleigh quotient of a unit vector) or the largest λ found. */
  lambdaMax: number;
  /** The lowest flexible eigenvalue found (rad²/s²); NaN when none. */
  lambdaLowest: number;
  /** λ_max/λ₁ (a lower bound, since λ_max is); NaN when no flexible mode was found. */
  ratio: number;
  /** log10 of the ratio: the decimal digits of λ₁ rounding can take (of about 16). */
  digitsLost: number;
  /** ε·λ_max/λ₁: the relative error rounding may put on λ₁. */
  relativeError: number;
  /** True when rounding may move λ₁ by as much as λ₁ itself (relative error ≥ 1). */
  unresolved: boolean;
  /** The warning when the relative error exceeds the tolerance asked for; null otherwise. */
  message: string | null;
}

/**
 * Assesses λ_max/λ₁ for a set of eigenvalues found.
 *
 * @param lambdaMaxBound a lower bound of λ_max, normally `lambdaScale(K, M)` = max K_ii/M_ii.
 * @param lambdas the eigenvalues found (any order).
 * @param rigidFloor eigenvalues at or below this count as rigid-body modes and are skipped: 0 when
 *   K is regular (a fine mesh puts λ₁ far below any fraction of max K_ii/M_ii), the rigid-body
 *   threshold when K is singular.
 * @param tolerance the relative tolerance asked for; the message appears when ε·λ_max/λ₁ exceeds it.
 * @example
 * const c = assessConditioning(lambdaScale(K, M), raw.lambdas, 1e-10 * lambdaScale(K, M), 1e-10);
 * if (c.message) notes.push(c.message);
 */
export function assessConditioning(
  lambdaMaxBound: number,
  lambdas: readonly number[],
  rigidFloor: number,
  tolerance: number,
): ConditioningAssessment {
  let lambdaMax = lambdaMaxBound;
  let lambdaLowest = Infinity;
  for (const l of lambdas) {
    if (l > lambdaMax) lambdaMax = l;
    if (l > rigidFloor && l < lambdaLowest) lambdaLowest = l;
  }
  if (lambdaLowest === Infinity) lambdaLowest = NaN;
  const ratio = lambdaLowest > 0 ? lambdaMax / lambdaLowest : NaN;
  const digitsLost = Number.isFinite(ratio) ? Math.max(0, Math.log10(ratio)) : NaN;
  const relativeError = Number.isFinite(ratio) ? ratio * EPS : NaN;
  const unresolved = relativeError >= 1;
  let message: string | null = null;
  if (relativeError > tolerance) {
    const good = Math.floor(-Math.log10(relativeError));
    const head =
      `Conditioning: λ_max/λ₁ ≥ ${ratio.toPrecision(2)} (λ_max ≥ ${lambdaMax.toPrecision(3)} ` +
      `rad²/s² from max K_ii/M_ii and the modes found, λ₁ = ${lambdaLowest.toPrecision(3)} ` +
      `rad²/s² as computed), so rounding in double precision (ε = 2.2e-16) can move λ₁ by up ` +
      `to ε·λ_max/λ₁ ≈ ${relativeError.toPrecision(2)} of its value`;
    message = unresolved
      ? `${head}, more than λ₁ itself (log₁₀ of the ratio, ${digitsLost.toFixed(1)}, exceeds the ` +
        'about 16 digits of double precision): no digit of λ₁ can be trusted and the lowest ' +
        'eigenvalues are not meaningful (they may be wrong by a factor). No solver in double ' +
        'precision resolves them on this model: use a coarser mesh for the lowest modes.'
      : `${head}: about ${digitsLost.toFixed(1)} of 16 digits can be lost, so λ₁ is good to ` +
        (good >= 1 ? `about ${good} digit${good === 1 ? '' : 's'}` : 'less than one digit') +
        `, fewer than the tolerance asked for (${tolerance}) needs. A coarser mesh or a looser ` +
        'tolerance is consistent with the data.';
  }
  return { lambdaMax, lambdaLowest, ratio, digitsLost, relativeError, unresolved, message };
}
