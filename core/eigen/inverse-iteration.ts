/**
 * Inverse vector iteration with the Rayleigh quotient and M-orthogonal deflation (Bathe,
 * *Finite Element Procedures*, 1996, §11.2.1 and §11.2.5):
 *
 *   solve (K − σM) x̄ = y,  deflate x̄ against the converged φ_i (twice),  ȳ = M x̄,
 *   ρ = x̄ᵀy / x̄ᵀȳ (no product with K),  y ← ȳ / √(x̄ᵀȳ),  λ ≈ σ + ρ.
 *
 * With σ = 0 it converges to the lowest modes one after another; with σ = μ (`shifted`) to the
 * modes nearest μ. Convergence: the estimated error of λ from the last two changes of ρ,
 * δ_k q/(1 − q) with q = δ_k/δ_{k−1}, at or below the tolerance, and the vector residual
 * ‖ρx̄ − x‖_M at or below tolerance^¾ (or at or below √tolerance once it stops decreasing).
 */
import { EngineError, NoConvergenceError } from '../errors';
import { combine, factorizeSymmetric } from '../linalg/factorize';
import { symmetricMultiply } from '../linalg/sparse';
import type { SymmetricFactorization } from '../linalg/types';
import { seededRandom } from './random';
import type { MethodInput, RawEigenResult } from './types';
import {
  acceptMassNormalized,
  byAscendingLambda,
  checkCancelled,
  mOrthogonalize,
  pencilSize,
  RayleighConvergence,
  startVector,
} from './vector-tools';

/**
 * Vector iteration on (K − σM)⁻¹M for `count` modes (σ = `input.shift`).
 * `input.factorization`, when given, must factor K − σM.
 * @throws EngineError ZERO_PIVOT when K − σM is singular; MASS_NOT_PSD when x̄ᵀMx̄ ≤ 0 for a
 *   nonzero x̄; NoConvergenceError (NO_CONVERGENCE) carrying the converged modes as a
 *   RawEigenResult in `partial` when a mode exceeds `maxIterations`; CANCELLED.
 * @example inverseIteration({ K, M, count: 3, tolerance: 1e-10, maxIterations: 500, shift: 0, seed: 1 })
 */
export function inverseIteration(input: MethodInput, label = 'inverse iteration'): RawEigenResult {
  const { K, M, count, tolerance, maxIterations, shift, signal, onProgress } = input;
  const n = pencilSize(K, M);
  const F: SymmetricFactorization =
    input.factorization ?? factorizeSymmetric(shift === 0 ? K : combine(K, 1, M, -shift));
  const rand = seededRandom(input.seed);
  const phis: Float64Array[] = [];
  const psis: Float64Array[] = [];
  const result: RawEigenResult = {
    lambdas: [],
    vectors: [],
    iterations: [],
    histories: [],
    notes: [],
  };
  const want = Math.min(count, n);
  const xb = new Float64Array(n);
  const yb = new Float64Array(n);
  for (let mode = 0; mode < want; mode++) {
    // start vector, M-orthogonal to the converged ones and with xᵀMx > 0
    let x = startVector(n, rand);
    const y = new Float64Array(n);
    for (let attempt = 0; ; attempt++) {
      mOrthogonalize(x, phis, psis);
      symmetricMultiply(M, x, y);
      let xy = 0;
      for (let i = 0; i < n; i++) xy += (x[i] as number) * (y[i] as number);
      if (xy > 0) {
        const c = 1 / Math.sqrt(xy);
        for (let i = 0; i < n; i++) {
          x[i] = (x[i] as number) * c;
          y[i] = (y[i] as number) * c;
        }
        break;
      }
      if (attempt > 3) {
        throw new EngineError(
          'MASS_SINGULAR',
          `M has no mass left for mode ${mode + 1}: every start vector M-orthogonal to the ${mode} modes found has zero mass. Ask for at most ${mode} modes.`,
          { mode: mode + 1 },
        );
      }
      x = startVector(n, rand);
    }
    const history: number[] = [];
    const test = new RayleighConvergence(tolerance);
    let converged = false;
    let it = 0;
    while (it < maxIterations) {
      it++;
      checkCancelled(signal, () => `${label}, mode ${mode + 1}, iteration ${it}`);
      F.solve(y, xb);
      mOrthogonalize(xb, phis, psis);
      symmetricMultiply(M, xb, yb);
      let a = 0;
      let b = 0;
      for (let i = 0; i < n; i++) {
        a += (xb[i] as number) * (y[i] as number);
        b += (xb[i] as number) * (yb[i] as number);
      }
      if (!(b > 0)) {
        throw new EngineError(
          'MASS_NOT_PSD',
          `During ${label} (mode ${mode + 1}) a vector had x̄ᵀMx̄ = ${b.toPrecision(3)} ≤ 0: M is not positive semi-definite, or its mass lies only in modes already found.`,
          { mode: mode + 1 },
        );
      }
      const rho = a / b;
      // ‖ρx̄ − x‖_M² = (ρx̄ − x)ᵀ(ρȳ − y)
      let s2 = 0;
      for (let i = 0; i < n; i++) {
        s2 +=
          (rho * (xb[i] as number) - (x[i] as number)) *
          (rho * (yb[i] as number) - (y[i] as number));
      }
      const resid = Math.sqrt(Math.max(0, s2));
      const c = 1 / Math.sqrt(b);
      for (let i = 0; i < n; i++) {
        x[i] = (xb[i] as number) * c;
        y[i] = (yb[i] as number) * c;
      }
      const lambda = shift + rho;
      history.push(lambda);
      if (test.converged(rho, Math.max(Math.abs(lambda), Math.abs(shift)), resid)) {
        converged = true;
        break;
      }
      onProgress?.({ stage: label, iteration: it, modesConverged: mode, modesWanted: want });
    }
    if (!converged) {
      const last = history[history.length - 1] ?? NaN;
      throw new NoConvergenceError<RawEigenResult>(
        `${label[0]?.toUpperCase()}${label.slice(1)} did not converge for mode ${mode + 1} of ${want} within ${maxIterations} iterations (last estimate λ ≈ ${last.toPrecision(8)}); ${mode} mode${mode === 1 ? '' : 's'} converged. Raise the iteration limit, loosen the tolerance, or use the dense or shifted method for closely spaced modes.`,
        result,
        { mode: mode + 1, modesConverged: mode, iterations: it },
      );
    }
    // final vector: M-orthogonalize once more (roundoff) and renormalize
    const phi = acceptMassNormalized(M, x, y, phis, psis);
    result.lambdas.push(history[history.length - 1] as number);
    result.vectors.push(phi);
    result.iterations.push(it);
    result.histories.push(history);
    onProgress?.({ stage: label, iteration: it, modesConverged: mode + 1, modesWanted: want });
  }
  // shifted iteration finds the modes in order of distance from the shift
  return byAscendingLambda(result);
}
