/**
 * The shifted operator of the shift-invert methods (Lanczos, subspace iteration): K − σM factored
 * once at the working shift, with the Sturm counts at other shifts made on the same symbolic
 * analysis (Ericsson & Ruhe, "The spectral transformation Lanczos method", Math. Comp. 35, 1980).
 */
import { EngineError } from '../errors';
import { diagonalOf, toSparse } from '../linalg/factorize';
import { createShiftedPencil } from '../linalg/sparse-ldlt/shifted';
import type { SparseSymmetricMatrix, SymmetricFactorization } from '../linalg/types';
import type { MethodInput } from './types';

/** The shifted operator used by both subspace iteration and Lanczos. */
export interface ShiftedOperator {
  readonly n: number;
  readonly K: SparseSymmetricMatrix;
  readonly M: SparseSymmetricMatrix;
  readonly sigma: number;
  readonly factorization: SymmetricFactorization;
  readonly notes: string[];
  /** True when K − σM was singular at the shift asked for (rigid-body modes) and σ was moved. */
  readonly singularAtShift: boolean;
  /** Counts eigenvalues below s (Sturm sequence of K − sM) with the same symbolic analysis. */
  countBelow(s: number): number;
  /** LDLᵀ of K − sM with the same symbolic analysis. */
  factorizeAt(s: number): SymmetricFactorization;
}

/**
 * Factorizes K − σM for the given shift, reusing `input.factorization` when the caller has one.
 * When K − σM is singular at σ = 0 (rigid-body modes), moves σ to a small negative value and says
 * so in `notes`.
 * @throws EngineError STIFFNESS_SINGULAR when no nearby shift gives a regular K − σM.
 * @example
 * const op = prepareShiftedOperator({ K, M, count: 10, tolerance: 1e-10, maxIterations: 300, shift: 0, seed: 1 });
 * op.factorization.solve(Mx); op.countBelow(lambdaTop * (1 + 1e-8));
 */
export function prepareShiftedOperator(
  input: MethodInput,
  memoryLimitBytes?: number,
): ShiftedOperator {
  const K = toSparse(input.K);
  const M = toSparse(input.M);
  if (K.n !== M.n) {
    throw new EngineError(
      'MATRIX_SIZE_MISMATCH',
      `K is ${K.n} × ${K.n} but M is ${M.n} × ${M.n}; they must be the same size.`,
    );
  }
  const pencil =
    input.pencil && input.pencil.n === K.n
      ? input.pencil
      : createShiftedPencil(K, M, memoryLimitBytes === undefined ? {} : { memoryLimitBytes });
  const notes: string[] = [];
  let sigma = input.shift;
  let factorization: SymmetricFactorization | undefined = input.factorization;
  if (!factorization) {
    // Scale of λ from the diagonals, for a shift past a singular K (rigid-body modes).
    const dk = diagonalOf(K);
    const dm = diagonalOf(M);
    let sk = 0;
    let sm = 0;
    for (let i = 0; i < K.n; i++) {
      sk += Math.abs(dk[i]!);
      sm += Math.abs(dm[i]!);
    }
    const scale = sm > 0 ? sk / sm : 1;
    const trials = [sigma, sigma - 1e-10 * scale, sigma - 1e-8 * scale, sigma - 1e-6 * scale];
    for (const trial of trials) {
      try {
        // A pivot below 1e-14 of its row is rounding noise of an exactly singular K − σM (a
        // rigid-body mode at σ): shift past it. A slender model's genuine pivots, (h/L)³ of
        // the element stiffness, stay above that for h/L > 2e-5.
        factorization = pencil.factorize(trial, 1e-14);
        if (trial !== input.shift) {
          notes.push(
            `K − σM is singular at σ = ${input.shift.toPrecision(3)} (rigid-body or mechanism ` +
              `modes); shifted to σ = ${trial.toPrecision(3)} rad²/s².`,
          );
        }
        sigma = trial;
        break;
      } catch (e) {
        if (!(e instanceof EngineError) || e.code !== 'ZERO_PIVOT') throw e;
      }
    }
    if (!factorization) {
      throw new EngineError(
        'STIFFNESS_SINGULAR',
        `K − σM is singular at σ = ${input.shift.toPrecision(3)} and at three shifts below it: a ` +
          'DOF has neither stiffness nor mass. Restrain it or give it mass.',
      );
    }
  }
  return {
    n: K.n,
    K,
    M,
    sigma,
    factorization,
    notes,
    singularAtShift: sigma !== input.shift,
    countBelow: (s: number) => pencil.factorize(s).negativePivots,
    factorizeAt: (s: number) => pencil.factorize(s),
  };
}
