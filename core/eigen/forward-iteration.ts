/**
 * Forward vector iteration for the highest modes (Bathe, *Finite Element Procedures*, 1996,
 * §11.2.2), with M-orthogonal deflation (twice) against the converged ones:
 *
 *   solve M x̄ = y (y = Kx),  deflate,  ȳ = K x̄,  ρ = x̄ᵀȳ / x̄ᵀy,  y ← ȳ/√(x̄ᵀy).
 *
 * It needs M⁻¹: a singular M (massless DOFs) is refused with MASS_SINGULAR. The highest ω gives
 * the critical time step of central-difference integration, Δt_cr = 2/ω_max.
 */
import { EngineError, NoConvergenceError } from '../errors';
import { factorizeSymmetric } from '../linalg/factorize';
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
 * The `count` highest modes, returned in ascending λ with M-normalized vectors.
 * @throws EngineError MASS_SINGULAR (with the DOF) when M cannot be factorized; MASS_NOT_PSD when M
 *   has a negative pivot; NoConvergenceError with the converged modes in `partial`; CANCELLED.
 * @example forwardIteration({ K, M, count: 1, tolerance: 1e-10, maxIterations: 5000, shift: 0, seed: 1 })
 */
export function forwardIteration(input: MethodInput): RawEigenResult {
  const { K, M, count, tolerance, maxIterations, signal, onProgress } = input;
  const n = pencilSize(K, M);
  let FM: SymmetricFactorization;
  try {
    FM = factorizeSymmetric(M);
  } catch (e) {
    if (e instanceof EngineError && e.code === 'ZERO_PIVOT') {
      throw new EngineError(
        'MASS_SINGULAR',
        `Forward iteration needs M⁻¹, but M is singular at DOF ${String(e.details?.dof)} (a massless DOF). Use the inverse, shifted or dense method, or give every DOF some mass.`,
        { dof: e.details?.dof },
      );
    }
    throw e;
  }
  if (FM.negativePivots > 0) {
    throw new EngineError(
      'MASS_NOT_PSD',
      `M is not positive semi-definite: its factorization has ${FM.negativePivots} negative pivot${FM.negativePivots === 1 ? '' : 's'}.`,
      { negativePivots: FM.negativePivots },
    );
  }
  const rand = seededRandom(input.seed);
  const phis: Float64Array[] = [];
  const psis: Float64Array[] = [];
  const out: RawEigenResult = {
    lambdas: [],
    vectors: [],
    iterations: [],
    histories: [],
    notes: [],
  };
  const want = Math.min(count, n);
  const xb = new Float64Array(n);
  const yb = new Float64Array(n);
  const mxb = new Float64Array(n);
  for (let mode = 0; mode < want; mode++) {
    const x = startVector(n, rand);
    mOrthogonalize(x, phis, psis);
    const mx = symmetricMultiply(M, x);
    let xy = 0;
    for (let i = 0; i < n; i++) xy += (x[i] as number) * (mx[i] as number);
    let c = 1 / Math.sqrt(xy);
    for (let i = 0; i < n; i++) {
      x[i] = (x[i] as number) * c;
      mx[i] = (mx[i] as number) * c;
    }
    const y = symmetricMultiply(K, x);
    const history: number[] = [];
    const test = new RayleighConvergence(tolerance);
    let converged = false;
    let it = 0;
    while (it < maxIterations) {
      it++;
      checkCancelled(signal, () => `forward iteration, mode ${mode + 1}, iteration ${it}`);
      FM.solve(y, xb);
      mOrthogonalize(xb, phis, psis);
      symmetricMultiply(M, xb, mxb);
      symmetricMultiply(K, xb, yb);
      let a = 0;
      let b = 0;
      for (let i = 0; i < n; i++) {
        a += (xb[i] as number) * (yb[i] as number);
        b += (xb[i] as number) * (mxb[i] as number);
      }
      const rho = a / b;
      // ‖x̄/ρ − x‖_M² = (x̄/ρ − x)ᵀ(Mx̄/ρ − Mx)
      let s2 = 0;
      for (let i = 0; i < n; i++) {
        s2 +=
          ((xb[i] as number) / rho - (x[i] as number)) *
          ((mxb[i] as number) / rho - (mx[i] as number));
      }
      const resid = Math.sqrt(Math.max(0, s2));
      c = 1 / Math.sqrt(b);
      for (let i = 0; i < n; i++) {
        x[i] = (xb[i] as number) * c;
        mx[i] = (mxb[i] as number) * c;
        y[i] = (yb[i] as number) * c;
      }
      history.push(rho);
      if (test.converged(rho, Math.abs(rho), resid)) {
        converged = true;
        break;
      }
      onProgress?.({
        stage: 'forward iteration',
        iteration: it,
        modesConverged: mode,
        modesWanted: want,
      });
    }
    if (!converged) {
      const last = history[history.length - 1] ?? NaN;
      throw new NoConvergenceError<RawEigenResult>(
        `Forward iteration did not converge for the ${mode + 1}. highest mode within ${maxIterations} iterations (last estimate λ ≈ ${last.toPrecision(8)}); ${mode} mode${mode === 1 ? '' : 's'} converged. The highest modes are closely spaced: raise the iteration limit or use the dense method.`,
        out,
        { mode: mode + 1, modesConverged: mode, iterations: it },
      );
    }
    const phi = acceptMassNormalized(M, x, mx, phis, psis);
    out.lambdas.push(history[history.length - 1] as number);
    out.vectors.push(phi);
    out.iterations.push(it);
    out.histories.push(history);
  }
  return byAscendingLambda(out);
}
