/**
 * Subspace iteration with a Rayleigh–Ritz step (Bathe, *Finite Element Procedures*, 2nd ed.,
 * §11.6; Bathe & Wilson, *Numerical Methods in Finite Element Analysis*, 1976).
 *
 * q = min(2p, p + 8) vectors (at most n). Each iteration: X̄ = (K − σM)⁻¹ M X, M-orthonormalized
 * (Gram–Schmidt twice), the projected pencil K̂ = X̄ᵀ K X̄, M̂ = X̄ᵀ M X̄ (≈ I), its q × q eigenproblem by Cholesky reduction and
 * the dense symmetric solver of part 1, then X = X̄ Z. Converged when the relative change of each
 * of the p wanted eigenvalues between two iterations is at most the tolerance.
 */
import { EngineError, NoConvergenceError } from '../errors';
import { diagonalOf } from '../linalg/factorize';
import { multiplyLower } from '../linalg/sparse-ldlt/shifted';
import { symmetricEigen } from './dense-eigensolver';
import { prepareShiftedOperator } from './shifted-operator';
import { combineBasis } from './vector-tools';
import { seededRandom } from './random';
import type { MethodInput, RawEigenResult } from './types';

/**
 * The lowest `count` modes (above the shift σ = `input.shift`) by subspace iteration.
 *
 * @throws EngineError CANCELLED when `signal.aborted` is seen between iterations;
 *   NoConvergenceError (partial: the current Ritz pairs) after `maxIterations` iterations;
 *   STIFFNESS_SINGULAR, MODEL_TOO_LARGE from the factorization; MASS_SINGULAR when the projected
 *   mass matrix is singular (fewer independent massive DOFs than vectors).
 * @example
 * const raw = subspaceIteration({ K, M, count: 5, tolerance: 1e-10, maxIterations: 200, shift: 0, seed: 1 });
 */
export function subspaceIteration(
  input: MethodInput,
  options: { memoryLimitBytes?: number } = {},
): RawEigenResult {
  const op = prepareShiftedOperator(input, options.memoryLimitBytes);
  const { n, K, M, factorization } = op;
  const notes = [...op.notes];
  const p = Math.min(input.count, n);
  const q = Math.min(n, Math.min(2 * p, p + 8));
  notes.push(`Subspace iteration with q = ${q} vectors for p = ${p} modes.`);
  if (p === 0) return { lambdas: [], vectors: [], iterations: [], histories: [], notes };
  // Start vectors (Bathe §11.6.3): the diagonal of M, unit vectors at the DOFs with the smallest
  // k_ii / m_ii, and one random vector.
  const dk = diagonalOf(K);
  const dm = diagonalOf(M);
  const rand = seededRandom(input.seed);
  let kScale = 0;
  for (let i = 0; i < n; i++) if (dm[i]! > 0) kScale = Math.max(kScale, Math.abs(dk[i]! / dm[i]!));
  let X: Float64Array[] = [];
  X.push(Float64Array.from(dm, (v) => (v > 0 ? v : 0)));
  const ratio = Array.from({ length: n }, (_, i) => i)
    .filter((i) => dm[i]! > 0)
    .sort((a, b) => dk[a]! / dm[a]! - dk[b]! / dm[b]! || a - b);
  for (let c = 0; X.length < q - 1 && c < ratio.length; c++) {
    const e = new Float64Array(n);
    e[ratio[c]!] = 1;
    X.push(e);
  }
  while (X.length < q) X.push(Float64Array.from({ length: n }, () => rand() - 0.5));

  const histories: number[][] = Array.from({ length: p }, () => []);
  const iterations = new Array<number>(p).fill(0);
  let previous: Float64Array | null = null;
  let MX = X.map((x) => multiplyLower(M, x));
  for (let it = 1; ; it++) {
    const Xb = MX.map((y) => factorization.solve(y));
    // M-orthonormalize X̄ before the projection: near a rigid-body mode the columns of X̄ are
    // dominated by one direction and X̄ᵀMX̄ would lose every digit to cancellation.
    const MXb = orthonormalizeM(Xb, M, rand);
    const KXb = Xb.map((x) => multiplyLower(K, x));
    const Kh = new Float64Array(q * q);
    const Mh = new Float64Array(q * q);
    for (let i = 0; i < q; i++) {
      for (let j = 0; j <= i; j++) {
        const kij = 0.5 * (dot(Xb[i]!, KXb[j]!) + dot(Xb[j]!, KXb[i]!));
        const mij = 0.5 * (dot(Xb[i]!, MXb[j]!) + dot(Xb[j]!, MXb[i]!));
        Kh[i * q + j] = kij;
        Kh[j * q + i] = kij;
        Mh[i * q + j] = mij;
        Mh[j * q + i] = mij;
      }
    }
    const { values, Z } = projectedEigen(Kh, Mh, q);
    const lambdas = Float64Array.from(values);
    X = Z.map((z) => combineBasis(Xb, z, q));
    MX = Z.map((z) => combineBasis(MXb, z, q));
    let converged = 0;
    for (let i = 0; i < p; i++) {
      const lam = lambdas[i]!;
      histories[i]!.push(lam);
      const change = previous ? Math.abs(lam - previous[i]!) : Infinity;
      // Relative change; a rigid-body mode (λ ≈ 0) only moves by rounding, about eps·‖K‖/‖M‖.
      const floor = 1e3 * Number.EPSILON * kScale;
      if (change <= Math.max(input.tolerance * Math.abs(lam), floor) && converged === i) {
        converged++;
        if (iterations[i] === 0) iterations[i] = it;
      }
    }
    previous = lambdas;
    input.onProgress?.({
      stage: 'subspace iteration',
      iteration: it,
      modesConverged: converged,
      modesWanted: p,
    });
    if (converged >= p || q === n) {
      for (let i = 0; i < p; i++) if (iterations[i] === 0) iterations[i] = it;
      return {
        lambdas: Array.from(lambdas.subarray(0, p)),
        vectors: X.slice(0, p),
        iterations,
        histories,
        notes,
      };
    }
    if (input.signal?.aborted) {
      throw new EngineError(
        'CANCELLED',
        `The subspace iteration was cancelled after ${it} iterations (${converged} of ${p} modes converged).`,
      );
    }
    if (it >= input.maxIterations) {
      throw new NoConvergenceError<RawEigenResult>(
        `Subspace iteration did not converge within ${input.maxIterations} iterations: ` +
          `${converged} of ${p} modes changed by less than the tolerance.`,
        {
          lambdas: Array.from(lambdas.subarray(0, converged)),
          vectors: X.slice(0, converged),
          iterations: iterations.slice(0, converged),
          histories: histories.slice(0, converged),
          notes,
        },
        { converged, wanted: p },
      );
    }
  }
}

/**
 * K̂ z = μ M̂ z for the small projected pencil: Cholesky M̂ = L Lᵀ, then the symmetric solver of
 * part 1 on L⁻¹ K̂ L⁻ᵀ; returns μ ascending and M̂-orthonormal z.
 */
function projectedEigen(
  Kh: Float64Array,
  Mh: Float64Array,
  q: number,
): { values: Float64Array; Z: Float64Array[] } {
  const L = new Float64Array(q * q);
  for (let j = 0; j < q; j++) {
    let d = Mh[j * q + j]!;
    for (let k = 0; k < j; k++) d -= L[j * q + k]! ** 2;
    if (!(d > 1e-14 * Math.abs(Mh[j * q + j]!)) || !(d > 0)) {
      throw new EngineError(
        'MASS_SINGULAR',
        'The iteration vectors became dependent in the mass metric: the model has fewer DOFs with ' +
          'mass than the subspace needs. Ask for fewer modes.',
      );
    }
    const ljj = Math.sqrt(d);
    L[j * q + j] = ljj;
    for (let i = j + 1; i < q; i++) {
      let s = Mh[i * q + j]!;
      for (let k = 0; k < j; k++) s -= L[i * q + k]! * L[j * q + k]!;
      L[i * q + j] = s / ljj;
    }
  }
  // C = L⁻¹ K̂ L⁻ᵀ
  const W = Float64Array.from(Kh);
  forwardColumns(L, W, q); // W ← L⁻¹ K̂
  const Wt = new Float64Array(q * q);
  for (let i = 0; i < q; i++) for (let j = 0; j < q; j++) Wt[i * q + j] = W[j * q + i]!;
  forwardColumns(L, Wt, q); // (L⁻¹ (L⁻¹ K̂)ᵀ) = L⁻¹ K̂ L⁻ᵀ (symmetric)
  for (let i = 0; i < q; i++) {
    for (let j = 0; j < i; j++) {
      const v = 0.5 * (Wt[i * q + j]! + Wt[j * q + i]!);
      Wt[i * q + j] = v;
      Wt[j * q + i] = v;
    }
  }
  const eig = symmetricEigen({ kind: 'dense', rows: q, cols: q, data: Wt });
  // z = L⁻ᵀ y
  const Z = eig.vectors.map((y) => {
    const z = Float64Array.from(y);
    for (let i = q - 1; i >= 0; i--) {
      let s = z[i]!;
      for (let k = i + 1; k < q; k++) s -= L[k * q + i]! * z[k]!;
      z[i] = s / L[i * q + i]!;
    }
    return z;
  });
  return { values: eig.values, Z };
}

/** B ← L⁻¹ B for lower-triangular L, every column of the row-major q × q B. */
function forwardColumns(L: Float64Array, B: Float64Array, q: number): void {
  for (let i = 0; i < q; i++) {
    const lii = L[i * q + i]!;
    for (let c = 0; c < q; c++) {
      let s = B[i * q + c]!;
      for (let k = 0; k < i; k++) s -= L[i * q + k]! * B[k * q + c]!;
      B[i * q + c] = s / lii;
    }
  }
}

/**
 * Modified Gram–Schmidt twice in the M-inner product, in place; a column that loses all but 1e-10
 * of its M-norm is replaced by a seeded random vector. Returns M X.
 */
function orthonormalizeM(
  X: Float64Array[],
  M: Parameters<typeof multiplyLower>[0],
  rand: () => number,
): Float64Array[] {
  const MX: Float64Array[] = [];
  for (let j = 0; j < X.length; j++) {
    let x = X[j]!;
    for (let attempt = 0; ; attempt++) {
      let mx = multiplyLower(M, x);
      const before = Math.sqrt(Math.max(dot(x, mx), 0));
      for (let pass = 0; pass < 2; pass++) {
        for (let i = 0; i < j; i++) {
          const c = dot(MX[i]!, x);
          const xi = X[i]!;
          for (let t = 0; t < x.length; t++) x[t]! -= c * xi[t]!;
        }
      }
      mx = multiplyLower(M, x);
      const after = Math.sqrt(Math.max(dot(x, mx), 0));
      if (after > 1e-10 * before && after > 0) {
        for (let t = 0; t < x.length; t++) {
          x[t]! /= after;
          mx[t]! /= after;
        }
        X[j] = x;
        MX.push(mx);
        break;
      }
      if (attempt > 4) {
        throw new EngineError(
          'MASS_SINGULAR',
          'The iteration vectors became dependent in the mass metric: the model has fewer DOFs ' +
            'with mass than the subspace needs. Ask for fewer modes.',
        );
      }
      x = Float64Array.from({ length: x.length }, () => rand() - 0.5);
    }
  }
  return MX;
}

function dot(x: Float64Array, y: Float64Array): number {
  let s = 0;
  for (let i = 0; i < x.length; i++) s += x[i]! * y[i]!;
  return s;
}
