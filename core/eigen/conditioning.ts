/**
 * How many digits the computed eigenvalues really have. Two numbers, kept apart:
 *
 * - The worst case. Rounding in the factorization of K − σM perturbs the pencil by about ε‖K‖,
 *   which may move λ₁ by up to ε·λ_max, a relative error ε·λ_max/λ₁ (Weyl's perturbation bound
 *   for the symmetric pencil: Parlett, *The Symmetric Eigenvalue Problem*, §15.2; Golub & Van
 *   Loan, *Matrix Computations*, 4th ed., §8.7, from memory). Reported as `ratio` and
 *   `digitsLost`; on most models it is far from what happens.
 * - The estimate after the fact, which decides the warning. For each of the lowest modes found,
 *   the Rayleigh quotient ρ = φᵀKφ / φᵀMφ of its shape is evaluated in double-double arithmetic
 *   (Dekker, "A floating-point technique for extending the available precision", Numer. Math. 18,
 *   1971: exact products by splitting, compensated sums), on K and M as given. ρ is accurate to
 *   second order in the shape's error, so |λ − ρ|/ρ measures the error the solve put on λ
 *   (rounding of a factorization of an ill-conditioned K − σM, which the first-order
 *   cancellation in double precision hides). ρ's own error is bounded by Kato–Temple,
 *   ‖r‖²_{M⁻¹} / gap with r = Kφ − ρMφ (Parlett, §10.6), estimated with diag(M) in place of M and
 *   the gap to the nearest other group of modes found. The sum of the two is `relativeError`.
 */
import { diagonalOf, toSparse } from '../linalg/factorize';
import type { SparseSymmetricMatrix, SymmetricMatrix } from '../linalg/types';

const EPS = 2 ** -52;

/** Eigenvalues below this fraction of max K_ii/M_ii count as rigid-body modes (common practice). */
export const RIGID_BODY_THRESHOLD = 1e-10;

/** Modes whose error is estimated: the lowest flexible ones, where rounding costs most. */
export const ESTIMATED_MODES = 20;

/** Modes closer than this (relative) count as one group for the gap of Kato–Temple. */
const SAME_GROUP = 1e-6;

/** The a-posteriori error estimate of one mode. */
export interface ModeErrorEstimate {
  /** 1-based position in the eigenvalues given. */
  index: number;
  /** The eigenvalue as computed (rad²/s²). */
  lambda: number;
  /** φᵀKφ / φᵀMφ in double-double arithmetic. */
  rayleigh: number;
  /** |λ − ρ| / |ρ|. */
  firstOrder: number;
  /** Kato–Temple estimate of |ρ − λ_true| / |ρ|, with diag(M) for M. */
  secondOrder: number;
  /** firstOrder + secondOrder: the relative error estimated for λ. */
  relativeError: number;
}

/** The conditioning of a solved pencil and, when it costs digits, the message in words. */
export interface ConditioningAssessment {
  /** Lower bound of λ_max: max K_ii/M_ii (Rayleigh quotient of a unit vector) or the largest λ found. */
  lambdaMax: number;
  /** The lowest flexible eigenvalue found (rad²/s²); NaN when none. */
  lambdaLowest: number;
  /** λ_max/λ₁ (a lower bound, since λ_max is); NaN when no flexible mode was found. */
  ratio: number;
  /** log10 of the ratio: the decimal digits of λ₁ rounding may take in the worst case (of about 16). */
  digitsLost: number;
  /** ε·λ_max/λ₁: the relative error rounding may put on λ₁ in the worst case. */
  worstCase: number;
  /** The largest relative error estimated after the fact over the modes checked; NaN when none. */
  relativeError: number;
  /** The mode (1-based) with that largest estimated error; 0 when none was checked. */
  worstMode: number;
  /** True when the estimated error is as large as the eigenvalue itself (relative error ≥ 1). */
  unresolved: boolean;
  /** The warning when the estimated error exceeds the tolerance asked for; null otherwise. */
  message: string | null;
}

const SPLIT = 134217729; // 2^27 + 1, Veltkamp's splitting constant for doubles

/** a·b = p + e exactly (Dekker's product without a fused multiply–add). */
function twoProduct(a: number, b: number, out: Float64Array): void {
  const p = a * b;
  let t = SPLIT * a;
  const ah = t - (t - a);
  const al = a - ah;
  t = SPLIT * b;
  const bh = t - (t - b);
  const bl = b - bh;
  out[0] = p;
  out[1] = ah * bh - p + ah * bl + al * bh + al * bl;
}

/** y = A x as unevaluated sums hi + lo (double-double), A symmetric in lower-triangle CSC. */
function multiplyDoubleDouble(
  A: SparseSymmetricMatrix,
  x: Float64Array,
): { hi: Float64Array; lo: Float64Array } {
  const n = A.n;
  const hi = new Float64Array(n);
  const lo = new Float64Array(n);
  const pe = new Float64Array(2);
  const add = (i: number, a: number, b: number): void => {
    twoProduct(a, b, pe);
    const p = pe[0]!;
    const h = hi[i]!;
    const s = h + p;
    const bb = s - h;
    hi[i] = s;
    lo[i] = lo[i]! + (h - (s - bb) + (p - bb)) + pe[1]!;
  };
  const { colPtr, rowIdx, values } = A;
  for (let j = 0; j < n; j++) {
    const end = colPtr[j + 1]!;
    for (let p = colPtr[j]!; p < end; p++) {
      const i = rowIdx[p]!;
      const v = values[p]!;
      add(i, v, x[j]!);
      if (i !== j) add(j, v, x[i]!);
    }
  }
  return { hi, lo };
}

/** xᵀ(hi + lo) in double-double, rounded once at the end. */
function dotDoubleDouble(x: Float64Array, y: { hi: Float64Array; lo: Float64Array }): number {
  const pe = new Float64Array(2);
  let s = 0;
  let c = 0;
  for (let i = 0; i < x.length; i++) {
    twoProduct(x[i]!, y.hi[i]!, pe);
    const p = pe[0]!;
    const t = s + p;
    const bb = t - s;
    c += s - (t - bb) + (p - bb) + pe[1]! + x[i]! * y.lo[i]!;
    s = t;
  }
  return s + c;
}

/**
 * The a-posteriori relative error of the lowest `ESTIMATED_MODES` flexible modes found (see the
 * module's comment): Rayleigh quotients in double-double arithmetic against the computed λ, plus
 * the Kato–Temple term. O(nnz) per mode.
 *
 * @param rigidFloor modes at or below this λ are rigid-body modes and are not checked.
 * @example
 * const errors = estimateEigenvalueErrors(K, M, raw.lambdas, raw.vectors, 0);
 * errors[0].relativeError; // ≈ the error of λ₁ the solve made
 */
export function estimateEigenvalueErrors(
  K: SymmetricMatrix,
  M: SymmetricMatrix,
  lambdas: readonly number[],
  vectors: readonly Float64Array[],
  rigidFloor: number,
): ModeErrorEstimate[] {
  const Ks = toSparse(K);
  const Ms = toSparse(M);
  const dm = diagonalOf(Ms);
  const order = lambdas
    .map((l, i) => ({ l, i }))
    .filter((e) => e.l > rigidFloor && vectors[e.i] !== undefined)
    .sort((a, b) => a.l - b.l)
    .slice(0, ESTIMATED_MODES);
  const out: ModeErrorEstimate[] = [];
  const pe = new Float64Array(2);
  for (const { l: lambda, i } of order) {
    const phi = vectors[i]!;
    const kx = multiplyDoubleDouble(Ks, phi);
    const mx = multiplyDoubleDouble(Ms, phi);
    const rayleigh = dotDoubleDouble(phi, kx) / dotDoubleDouble(phi, mx);
    // r = Kφ − ρMφ, formed before rounding to double, and ‖r‖² in diag(M)⁻¹
    let rr = 0;
    for (let t = 0; t < phi.length; t++) {
      if (!(dm[t]! > 0)) continue;
      twoProduct(rayleigh, mx.hi[t]!, pe);
      const r = kx.hi[t]! - pe[0]! + (kx.lo[t]! - pe[1]! - rayleigh * mx.lo[t]!);
      rr += (r * r) / dm[t]!;
    }
    let phiM = dotDoubleDouble(phi, mx);
    if (!(phiM > 0)) phiM = 1;
    // the gap to the nearest other group of modes found (|ρ| itself when there is none)
    let gap = Math.abs(rayleigh);
    lambdas.forEach((other, j) => {
      const d = Math.abs(other - lambda);
      if (j !== i && d > SAME_GROUP * Math.abs(lambda)) gap = Math.min(gap, d);
    });
    const firstOrder = Math.abs(lambda - rayleigh) / Math.abs(rayleigh);
    const secondOrder = rr / phiM / (gap * Math.abs(rayleigh));
    out.push({
      index: i + 1,
      lambda,
      rayleigh,
      firstOrder,
      secondOrder,
      relativeError: firstOrder + secondOrder,
    });
  }
  return out;
}

/**
 * Assesses the digits of the eigenvalues found: the worst case λ_max/λ₁ for the record, and the
 * estimate after the fact (`estimateEigenvalueErrors`) for the warning, which is given when that
 * estimate exceeds the tolerance asked for.
 *
 * @param lambdaMaxBound a lower bound of λ_max, normally `lambdaScale(K, M)` = max K_ii/M_ii.
 * @param lambdas the eigenvalues found (any order).
 * @param rigidFloor eigenvalues at or below this count as rigid-body modes and are skipped: 0 when
 *   K is regular (a fine mesh puts λ₁ far below any fraction of max K_ii/M_ii), the rigid-body
 *   threshold when K is singular.
 * @param tolerance the relative tolerance asked for.
 * @param errors the estimates of `estimateEigenvalueErrors` for these modes.
 * @example
 * const errors = estimateEigenvalueErrors(K, M, raw.lambdas, raw.vectors, 0);
 * const c = assessConditioning(lambdaScale(K, M), raw.lambdas, 0, 1e-10, errors);
 * if (c.message) notes.push(c.message);
 */
export function assessConditioning(
  lambdaMaxBound: number,
  lambdas: readonly number[],
  rigidFloor: number,
  tolerance: number,
  errors: readonly ModeErrorEstimate[],
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
  const worstCase = Number.isFinite(ratio) ? ratio * EPS : NaN;
  let worst: ModeErrorEstimate | null = null;
  for (const e of errors) if (!worst || !(e.relativeError <= worst.relativeError)) worst = e;
  const relativeError = worst ? worst.relativeError : NaN;
  const unresolved = relativeError >= 1;
  let message: string | null = null;
  if (worst && !(relativeError <= tolerance)) {
    const k = worst.index;
    const sub = k === 1 ? '₁' : `_${k}`;
    const good = Math.floor(-Math.log10(relativeError));
    const head =
      `Conditioning: λ_max/λ₁ ≥ ${ratio.toPrecision(2)} (λ_max ≥ ${lambdaMax.toPrecision(3)} ` +
      `rad²/s² from max K_ii/M_ii and the modes found, λ₁ = ${lambdaLowest.toPrecision(3)} ` +
      `rad²/s² as computed), and here it costs digits: the Rayleigh quotient of mode ${k}'s ` +
      `shape, evaluated in double-double arithmetic on K and M as given, is ` +
      `${worst.rayleigh.toPrecision(6)} rad²/s² against λ${sub} = ${worst.lambda.toPrecision(6)} ` +
      `rad²/s² as computed, an estimated error of ${relativeError.toPrecision(2)} of its value`;
    message = unresolved
      ? `${head}, as much as λ${sub} itself: no digit of λ${sub} can be trusted and the lowest ` +
        'eigenvalues are not meaningful (they may be wrong by a factor). Rounding in double ' +
        'precision cannot resolve them on this model: use a coarser mesh for the lowest modes.'
      : `${head}: λ${sub} is good to ` +
        (good >= 1 ? `about ${good} digit${good === 1 ? '' : 's'}` : 'less than one digit') +
        `, fewer than the tolerance asked for (${tolerance}) needs. A coarser mesh or a looser ` +
        'tolerance is consistent with the data.';
  }
  return {
    lambdaMax,
    lambdaLowest,
    ratio,
    digitsLost,
    worstCase,
    relativeError,
    worstMode: worst ? worst.index : 0,
    unresolved,
    message,
  };
}
