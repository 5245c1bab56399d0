/**
 * Small helpers shared by the vector-iteration methods: M-orthogonal Gram–Schmidt deflation,
 * seeded start vectors, the λ scale of a pencil, the Sturm count and cancellation checks.
 */
import { EngineError } from '../errors';
import { combine, diagonalOf, factorizeSymmetric } from '../linalg/factorize';
import { matrixSize, symmetricMultiply } from '../linalg/sparse';
import type { ShiftedPencil } from '../linalg/sparse-ldlt/shifted';
import type { SymmetricMatrix } from '../linalg/types';
import type { RawEigenResult } from './types';

/**
 * Removes from x its M-components along the converged vectors φ_i (ψ_i = Mφ_i, φ_iᵀMφ_i = 1):
 * x ← x − Σ (ψ_iᵀx) φ_i, applied twice ("twice is enough": Parlett, *The Symmetric Eigenvalue
 * Problem*, §6.9; Giraud et al. 2005).
 * @example mOrthogonalize(x, found, foundM)
 */
export function mOrthogonalize(x: Float64Array, phis: Float64Array[], psis: Float64Array[]): void {
  const n = x.length;
  for (let pass = 0; pass < 2; pass++) {
    for (let k = 0; k < phis.length; k++) {
      const phi = phis[k] as Float64Array;
      const psi = psis[k] as Float64Array;
      let c = 0;
      for (let i = 0; i < n; i++) c += (psi[i] as number) * (x[i] as number);
      if (c === 0) continue;
      for (let i = 0; i < n; i++) x[i] = (x[i] as number) - c * (phi[i] as number);
    }
  }
}

/**
 * A start vector with entries uniform in [−1, 1) from a seeded generator.
 * @example startVector(n, rand)
 */
export function startVector(n: number, rand: () => number): Float64Array {
  const x = new Float64Array(n);
  for (let i = 0; i < n; i++) x[i] = 2 * rand() - 1;
  return x;
}

/**
 * max_i K_ii / M_ii over the DOFs with mass: a lower bound of λ_max (Rayleigh quotient of a unit
 * vector) and the scale used for rigid-body thresholds and automatic shifts.
 * @example lambdaScale(K, M)
 */
export function lambdaScale(K: SymmetricMatrix, M: SymmetricMatrix): number {
  const dk = diagonalOf(K);
  const dm = diagonalOf(M);
  let s = 0;
  for (let i = 0; i < dk.length; i++)
    if ((dm[i] as number) > 0) s = Math.max(s, (dk[i] as number) / (dm[i] as number));
  return s;
}

/**
 * Sturm count: the number of eigenvalues of K φ = λ M φ below σ, from the negative pivots of
 * K − σM = LDLᵀ (Sylvester's law of inertia). A zero pivot (σ on an eigenvalue) moves σ up by
 * 1e-9 relative and tries again, at most three times. With `pencil` (the union pattern of K and M,
 * analysed once) only the numeric factorization is repeated.
 * @throws EngineError ZERO_PIVOT when σ cannot be moved off an eigenvalue.
 * @example sturmCount(K, M, 1.01 * lambdaTop)
 */
export function sturmCount(
  K: SymmetricMatrix,
  M: SymmetricMatrix,
  sigma: number,
  pencil?: ShiftedPencil,
): number {
  let s = sigma;
  for (let attempt = 0; ; attempt++) {
    try {
      if (pencil) return pencil.factorize(s).negativePivots;
      return factorizeSymmetric(s === 0 ? K : combine(K, 1, M, -s)).negativePivots;
    } catch (e) {
      if (!(e instanceof EngineError) || e.code !== 'ZERO_PIVOT' || attempt >= 3) throw e;
      s = s === 0 ? 1e-12 : s * (1 + 1e-9 * 10 ** attempt);
    }
  }
}

/**
 * Throws EngineError('CANCELLED') when the caller's signal says so.
 * @example checkCancelled(signal, 'inverse iteration, mode 3')
 */
export function checkCancelled(
  signal: { readonly aborted: boolean } | undefined,
  where: string | (() => string),
): void {
  if (signal?.aborted) {
    const at = typeof where === 'function' ? where() : where;
    throw new EngineError('CANCELLED', `The solve was cancelled during ${at}.`);
  }
}

/** Size check shared by the methods. */
export function pencilSize(K: SymmetricMatrix, M: SymmetricMatrix): number {
  const n = matrixSize(K);
  if (matrixSize(M) !== n) {
    throw new EngineError(
      'MATRIX_SIZE_MISMATCH',
      `K is ${n} × ${n} but M is ${matrixSize(M)} × ${matrixSize(M)}; they must be the same size.`,
      { kSize: n, mSize: matrixSize(M) },
    );
  }
  return n;
}

/**
 * Accepts a converged iterate as a mode: M-orthogonalizes it once more against the modes already
 * found (roundoff), scales it to φᵀMφ = 1, and appends φ and Mφ to `phis` and `psis` so the next
 * modes deflate against it. `mx` is scratch of length n. Returns φ.
 */
export function acceptMassNormalized(
  M: SymmetricMatrix,
  x: Float64Array,
  mx: Float64Array,
  phis: Float64Array[],
  psis: Float64Array[],
): Float64Array {
  const n = x.length;
  mOrthogonalize(x, phis, psis);
  symmetricMultiply(M, x, mx);
  let xy = 0;
  for (let i = 0; i < n; i++) xy += (x[i] as number) * (mx[i] as number);
  const c = 1 / Math.sqrt(xy);
  const phi = new Float64Array(n);
  const psi = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    phi[i] = (x[i] as number) * c;
    psi[i] = (mx[i] as number) * c;
  }
  phis.push(phi);
  psis.push(psi);
  return phi;
}

/** w ← w − Σ q_i (q_iᵀ M w), twice; accumulates the coefficients into h when given. */
export function orthogonalize(
  w: Float64Array,
  Q: Float64Array[],
  MQ: Float64Array[],
  count: number,
  h: Float64Array | null,
): void {
  const n = w.length;
  for (let pass = 0; pass < 2; pass++) {
    for (let i = 0; i < count; i++) {
      const mq = MQ[i]!;
      let c = 0;
      for (let t = 0; t < n; t++) c += mq[t]! * w[t]!;
      const q = Q[i]!;
      for (let t = 0; t < n; t++) w[t]! -= c * q[t]!;
      if (h) h[i]! += c;
    }
  }
}

/** Σ_i y_i B_i over the first `count` basis vectors. */
export function combineBasis(B: Float64Array[], y: Float64Array, count: number): Float64Array {
  const n = B[0]!.length;
  const out = new Float64Array(n);
  for (let i = 0; i < count; i++) {
    const c = y[i]!;
    if (c === 0) continue;
    const b = B[i]!;
    for (let t = 0; t < n; t++) out[t]! += c * b[t]!;
  }
  return out;
}

/** xᵀ y without the checks of `dot` (hot loops of the iterations). */
export function dotv(x: Float64Array, y: Float64Array): number {
  let s = 0;
  for (let i = 0; i < x.length; i++) s += x[i]! * y[i]!;
  return s;
}

const EPS = 2 ** -52;

/**
 * The stopping rule of forward and inverse vector iteration (Bathe, *Finite Element Procedures*,
 * 1996, §11.2.1; the error estimate is Aitken's: with q = δ_k/δ_{k−1} < 1 the error left in ρ is
 * about δ_k q/(1 − q)). A mode has converged when that estimate is at or below the tolerance (or
 * the change δ_k is at roundoff, 16ε) and the vector residual ‖·‖_M is at or below tolerance^¾,
 * or at or below √tolerance once it has stopped decreasing (within 5 %).
 * @example const test = new RayleighConvergence(1e-10); if (test.converged(rho, Math.abs(rho), r)) …
 */
export class RayleighConvergence {
  private prevRho = NaN;
  private prevDelta = NaN;
  private prevResid = Infinity;
  private readonly sqrtTol: number;
  private readonly vecTol: number;

  constructor(private readonly tolerance: number) {
    this.sqrtTol = Math.sqrt(tolerance);
    this.vecTol = tolerance ** 0.75;
  }

  /**
   * Takes this iteration's quotient ρ, the scale δ is measured against, and the vector residual;
   * true when the mode has converged.
   */
  converged(rho: number, scale: number, resid: number): boolean {
    const delta = Math.abs(rho - this.prevRho) / Math.max(scale, Number.MIN_VALUE);
    if (Number.isFinite(delta)) {
      const q = delta / this.prevDelta;
      const estimate = Number.isFinite(q) && q < 1 ? (delta * q) / (1 - q) : delta;
      const vectorOk =
        resid <= this.vecTol || (resid <= this.sqrtTol && resid >= 0.95 * this.prevResid);
      if (vectorOk && (estimate <= this.tolerance || delta <= 16 * EPS)) return true;
    }
    this.prevDelta = delta;
    this.prevRho = rho;
    this.prevResid = resid;
    return false;
  }
}

/**
 * The modes of a vector-iteration result in ascending order of λ (shifted and forward iteration
 * find them in another order).
 * @example byAscendingLambda({ lambdas: [4, 1], vectors, iterations, histories, notes })
 */
export function byAscendingLambda(r: RawEigenResult): RawEigenResult {
  const order = r.lambdas
    .map((_, k) => k)
    .sort((p, q) => (r.lambdas[p] as number) - (r.lambdas[q] as number));
  return {
    ...r,
    lambdas: order.map((k) => r.lambdas[k] as number),
    vectors: order.map((k) => r.vectors[k] as Float64Array),
    iterations: order.map((k) => r.iterations[k] as number),
    histories: order.map((k) => r.histories[k] as number[]),
  };
}
