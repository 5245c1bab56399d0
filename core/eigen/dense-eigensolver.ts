/**
 * The dense reference solver: every mode of K φ = λ M φ.
 *
 * 1. Band ordering and reduction to standard form with the Cholesky factor M = L Lᵀ:
 *    C = L⁻¹ K L⁻ᵀ, φ = L⁻ᵀ z (Golub & Van Loan, *Matrix Computations*, 4th ed., §8.7.2), in
 *    O(n² b) for a band width b (`./dense/reduction`).
 * 2. Blocked Householder tridiagonalization, the tridiagonal eigenvectors by inverse iteration
 *    and their back-transformation in compact WY blocks (`./dense/symmetric-eigen`; the QL
 *    iteration with accumulated rotations is the fallback). See `./dense/README.md`.
 * 3. The lowest modes, which step 1 resolves only to eps·λ_max, are refined by subspace iteration
 *    with K's Cholesky factor when K is positive definite (`./dense/refine-low-modes`).
 *
 * When M is singular (massless DOFs) the reduction uses A = K − σM instead (σ = 0 when K is
 * positive definite, else a stated negative σ): L⁻¹ M L⁻ᵀ z = μ z with λ = σ + 1/μ; the μ = 0
 * modes are the infinite-frequency ones of the massless DOFs and are dropped. That form already
 * resolves the lowest modes relative to λ.
 */
import { EngineError } from '../errors';
import { combine, diagonalOf, toSparse } from '../linalg/factorize';
import { matrixSize } from '../linalg/sparse';
import {
  backSubstituteColumns,
  bandOrdering,
  type BandOrdering,
  columnInOriginalOrder,
  columnsInOriginalOrder,
  congruence,
  permutedDense,
  profileCholesky,
  profileSolver,
  type ProfileFactor,
} from './dense/reduction';
import { refineLowModes } from './dense/refine-low-modes';
import { symmetricEigenColumns } from './dense/symmetric-eigen';
import { type DenseTeam, SERIAL_TEAM } from './dense/team';
import type { MethodInput, RawEigenResult } from './types';

export { symmetricEigen } from './dense/symmetric-eigen';
export { tridiagonalQL } from './dense/tridiagonal-ql';

/** Modes below this fraction of λ_max are refined with K's factorization. See `refineLowModes`. */
const REFINE_BELOW = 1e-3;

/**
 * Every finite mode of K φ = λ M φ, lowest first, mass-normalized (`count` keeps the lowest ones).
 * @throws EngineError MASS_NOT_PSD when M has a negative pivot; STIFFNESS_SINGULAR when both K and
 *   M are singular and no positive definite K − σM is found; MODEL_TOO_LARGE above 3000 DOFs.
 * @example denseEigensolver({ K, M, count: 5, tolerance: 1e-10, maxIterations: 0, shift: 0, seed: 1 })
 */
export function denseEigensolver(input: MethodInput): RawEigenResult {
  const n = matrixSize(input.K);
  if (n > 3000) {
    throw new EngineError(
      'MODEL_TOO_LARGE',
      `The dense method holds ${n} × ${n} matrices in memory; above 3000 DOFs use 'inverse' or 'shifted'.`,
      { n },
    );
  }
  const team = input.team ?? SERIAL_TEAM;
  try {
    return solveDense(input, n, team);
  } finally {
    team.release();
  }
}

function solveDense(input: MethodInput, n: number, team: DenseTeam): RawEigenResult {
  const ord = bandOrdering(input.K, input.M);
  const notes: string[] = [];
  const massF = massFactor(input, ord, team);
  let lambdas: number[];
  let vectors: Float64Array[];
  if (massF) {
    const { values, Z, order } = solveStandardForm(massF, permutedDense(input.K, ord, team), team);
    lambdas = Array.from(values);
    const kept = Math.min(input.count, n);
    vectors = columnsInOriginalOrder(
      ord,
      Z,
      order.slice(0, Math.max(kept, guardCount(lambdas, kept))),
      1,
    );
    refine(input, ord, lambdas, vectors, notes, team);
  } else {
    // M singular: reduce with a positive definite A = K − σM.
    const dg = diagonalOf(input.M);
    const dk = diagonalOf(input.K);
    let s = 0;
    for (let i = 0; i < n; i++)
      if ((dg[i] as number) > 0) s = Math.max(s, (dk[i] as number) / (dg[i] as number));
    let sigma = 0;
    let AF: ProfileFactor | null = null;
    for (const trial of [0, -1e-10 * s, -1e-8 * s, -1e-6 * s]) {
      try {
        const A = trial === 0 ? input.K : combine(toSparse(input.K), 1, toSparse(input.M), -trial);
        AF = profileCholesky(permutedDense(A, ord, team), ord, team);
        sigma = trial;
        break;
      } catch (e) {
        if (!(e instanceof EngineError) || e.code !== 'ZERO_PIVOT') throw e;
      }
    }
    if (!AF) {
      throw new EngineError(
        'STIFFNESS_SINGULAR',
        'Both K and M are singular and K − σM is not positive definite for any small negative σ: a DOF has neither stiffness nor mass, or K is not positive semi-definite.',
      );
    }
    const F = AF;
    const { values, Z, order } = solveStandardForm(F, permutedDense(input.M, ord, team), team);
    const muMax = Math.max(...Array.from(values).map(Math.abs), 0);
    const pairs: { lambda: number; phi: Float64Array }[] = [];
    let dropped = 0;
    // largest μ first = lowest λ first; only the modes asked for are transformed back
    for (let k = n - 1; k >= 0; k--) {
      const mu = values[k] as number;
      if (!(mu > 1e-13 * muMax)) {
        dropped++;
        continue;
      }
      if (pairs.length >= input.count) continue;
      // zᵀz = 1 gives φᵀAφ = 1 and φᵀMφ = μ: rescale to φᵀMφ = 1
      const phi = columnInOriginalOrder(ord, Z, order[k] as number, 1 / Math.sqrt(mu));
      pairs.push({ lambda: sigma + 1 / mu, phi });
    }
    pairs.sort((a, b) => a.lambda - b.lambda);
    lambdas = pairs.map((p) => p.lambda);
    vectors = pairs.map((p) => p.phi);
    notes.push(
      `M is singular (massless DOFs): reduced with ${sigma === 0 ? 'K' : `K − σM, σ = ${sigma.toPrecision(3)}`} instead of M; ${dropped} infinite-frequency mode${dropped === 1 ? '' : 's'} of the massless DOFs dropped.`,
    );
  }
  const count = Math.min(input.count, lambdas.length);
  return {
    lambdas: lambdas.slice(0, count),
    vectors: vectors.slice(0, count),
    iterations: new Array<number>(count).fill(0),
    histories: lambdas.slice(0, count).map(() => []),
    notes,
  };
}

/**
 * The Cholesky factor of the permuted M, or null when M is singular (a zero pivot).
 * @throws EngineError MASS_NOT_PSD on a negative pivot.
 */
function massFactor(input: MethodInput, ord: BandOrdering, team: DenseTeam): ProfileFactor | null {
  try {
    return profileCholesky(permutedDense(input.M, ord, team), ord, team);
  } catch (e) {
    if (!(e instanceof EngineError) || e.code !== 'ZERO_PIVOT') throw e;
    const det = e.details ?? {};
    if (det.negative === true) {
      throw new EngineError(
        'MASS_NOT_PSD',
        `M is not positive semi-definite: the Cholesky factorization met a negative pivot at DOF ${String(det.dof)}. A mass matrix must have xᵀMx ≥ 0 for every x.`,
        { dof: det.dof },
      );
    }
    return null;
  }
}

/**
 * Every eigenpair of L⁻¹ A L⁻ᵀ for the permuted A (overwritten), transformed back to x = L⁻ᵀ z:
 * Z (n × n) holds the vector of `values[r]` in column `order[r]`, in the band ordering. The n × n
 * work arrays live only in here, which keeps the solver's peak at DENSE_METHOD_ARRAYS of them.
 */
function solveStandardForm(
  F: ProfileFactor,
  A: Float64Array,
  team: DenseTeam,
): { values: Float64Array; Z: Float64Array; order: number[] } {
  const n = F.n;
  const C = congruence(F, A, team);
  const eig = symmetricEigenColumns(
    { kind: 'dense', rows: n, cols: n, data: C },
    { overwrite: true, team },
  );
  backSubstituteColumns(F, eig.Z, team);
  return eig;
}

/** How many of the lowest modes are refined (λ < REFINE_BELOW·λ_max), with guard vectors. */
function lowModeCounts(lambdas: number[], kept: number): { refine: number; block: number } {
  const n = lambdas.length;
  const lmax = lambdas[n - 1] as number;
  let p = 0;
  while (p < Math.min(kept, n) && (lambdas[p] as number) < REFINE_BELOW * lmax) p++;
  // subspace iteration's q = min(2p, p + 8) (Bathe §11.6.3), within the model
  return { refine: p, block: Math.min(n, Math.min(2 * p, p + 8)) };
}

function guardCount(lambdas: number[], kept: number): number {
  return lowModeCounts(lambdas, kept).block;
}

/**
 * Replaces the lowest modes that the reduction with M resolves only to eps·λ_max by the result
 * of `refineLowModes` with K's factorization, when K is positive definite.
 */
function refine(
  input: MethodInput,
  ord: BandOrdering,
  lambdas: number[],
  vectors: Float64Array[],
  notes: string[],
  team: DenseTeam,
): void {
  const n = lambdas.length;
  const kept = Math.min(input.count, n);
  const { refine: p, block: q } = lowModeCounts(lambdas, kept);
  if (p === 0 || !((lambdas[0] as number) > 0)) return;
  // K's Cholesky factor in the same band ordering, O(n b²); a zero or negative pivot means K is
  // not positive definite and the reduction's values stand
  let F: ReturnType<typeof profileSolver> | null = null;
  try {
    F = profileSolver(profileCholesky(permutedDense(input.K, ord, team), ord, team), ord);
  } catch (e) {
    if (!(e instanceof EngineError) || e.code !== 'ZERO_PIVOT') throw e;
  }
  if (!F) return;
  const lmax = lambdas[n - 1] as number;
  let res: ReturnType<typeof refineLowModes>;
  try {
    res = refineLowModes(input.M, F, vectors.slice(0, q), p, 4);
  } catch (e) {
    // the projected K is not positive definite in floating point (start vectors nearly
    // dependent): keep the reduction's values rather than fail the solve
    if (!(e instanceof EngineError) || e.code !== 'ZERO_PIVOT') throw e;
    notes.push(refineSkipped(p));
    return;
  }
  if (!res.lambdas.every((l) => Number.isFinite(l) && l > 0)) {
    notes.push(refineSkipped(p));
    return;
  }
  for (let r = 0; r < p; r++) {
    lambdas[r] = res.lambdas[r] as number;
    vectors[r] = res.vectors[r] as Float64Array;
  }
  notes.push(
    `Dense: λ_max/λ₁ ≈ ${(lmax / (lambdas[0] as number)).toPrecision(2)}, so the ${p} lowest mode${p === 1 ? '' : 's'} (λ < ${REFINE_BELOW}·λ_max) were refined by ${res.iterations} steps of subspace iteration with K's factorization (accurate relative to λ); the rest come from the reduction with M.`,
  );
}

function refineSkipped(p: number): string {
  return `Dense: the refinement of the ${p} lowest mode${p === 1 ? '' : 's'} with K's factorization broke down (nearly dependent start vectors); they come from the reduction with M and may carry only eps·λ_max/λ accuracy.`;
}
