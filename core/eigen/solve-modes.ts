/**
 * `solveModes`: the single entry point of the eigen engine. It checks the pencil and the options,
 * picks the method, handles rigid-body modes and massless DOFs, runs the method module and turns
 * its `RawEigenResult` into a `ModalResult` with every quantity of DESIGN.md §5.
 */
import { EngineError } from '../errors';
import {
  assertSymmetricMatrix,
  combine,
  diagonalOf,
  factorizeSymmetric,
  normOne,
  toSparse,
} from '../linalg/factorize';
import { createShiftedPencil, type ShiftedPencil } from '../linalg/sparse-ldlt/shifted';
import type { SymmetricFactorization, SymmetricMatrix } from '../linalg/types';
import { denseEigensolver } from './dense-eigensolver';
import type { DenseTeam } from './dense/team';
import { forwardIteration } from './forward-iteration';
import { inverseIteration } from './inverse-iteration';
import { assessConditioning, estimateEigenvalueErrors, RIGID_BODY_THRESHOLD } from './conditioning';
import { lanczos, type LanczosResult } from './lanczos';
import type { LanczosSturm } from './sturm-checks';
import {
  backwardError,
  closelySpacedPairs,
  criticalTimeStep,
  fixSign,
  frequencies,
  massOrthogonality,
  normalizeShape,
  participation,
} from './modal-quantities';
import { shiftedInverseIteration } from './shifted-inverse-iteration';
import { subspaceIteration } from './subspace-iteration';
import type {
  MethodInput,
  MethodName,
  ModalResult,
  Mode,
  RawEigenResult,
  ResolvedSolveOptions,
  SolveOptions,
} from './types';
import { lambdaScale, pencilSize, sturmCount } from './vector-tools';

const EPS = 2 ** -52;
/** Largest model `auto` sends to the dense method. */
export const AUTO_DENSE_LIMIT = 400;
const METHODS: MethodName[] = [
  'auto',
  'inverse',
  'forward',
  'shifted',
  'dense',
  'subspace',
  'lanczos',
];

function invalid(field: string, message: string): EngineError {
  return new EngineError('INVALID_OPTION', message, { field });
}

function resolveOptions(n: number, o: SolveOptions): ResolvedSolveOptions {
  const method = o.method ?? 'auto';
  if (!METHODS.includes(method)) {
    throw invalid(
      'method',
      `Unknown method '${String(method)}'; choose one of ${METHODS.join(', ')}.`,
    );
  }
  const count = o.count ?? (method === 'dense' ? n : Math.min(10, n));
  if (!Number.isInteger(count) || count < 1) {
    throw invalid('count', `The number of modes must be a whole number ≥ 1, got ${count}.`);
  }
  const tolerance = o.tolerance ?? 1e-10;
  if (!(tolerance > 0 && tolerance < 1)) {
    throw invalid(
      'tolerance',
      `The tolerance is relative on λ and must lie between 0 and 1, got ${tolerance}.`,
    );
  }
  const maxIterations = o.maxIterations ?? 2000;
  if (!Number.isInteger(maxIterations) || maxIterations < 1) {
    throw invalid(
      'maxIterations',
      `The iteration limit must be a whole number ≥ 1, got ${maxIterations}.`,
    );
  }
  if (o.shift !== undefined && !Number.isFinite(o.shift)) {
    throw invalid('shift', `The shift must be a finite number (rad²/s²), got ${o.shift}.`);
  }
  if (method === 'shifted' && o.shift === undefined) {
    throw invalid(
      'shift',
      'The shifted method needs a target: give a shift (λ in rad²/s², or a frequency in Hz on the command line).',
    );
  }
  const seed = o.seed ?? 1;
  if (!Number.isInteger(seed))
    throw invalid('seed', `The seed must be a whole number, got ${seed}.`);
  const normalize = o.normalize ?? 'mass';
  if (typeof normalize === 'object') {
    if (!Number.isInteger(normalize.dof) || normalize.dof < 1 || normalize.dof > n) {
      throw invalid(
        'normalize',
        `Shapes can be normalized at a DOF between 1 and ${n}, got ${normalize.dof}.`,
      );
    }
  } else if (normalize !== 'mass' && normalize !== 'max') {
    throw invalid(
      'normalize',
      `Normalization must be 'mass', 'max' or { dof }, got '${String(normalize)}'.`,
    );
  }
  const xi = o.dampingRatio;
  if (xi !== undefined && !(xi >= 0 && xi < 1)) {
    throw invalid('dampingRatio', `The damping ratio must lie in [0, 1), got ${xi}.`);
  }
  return {
    method,
    count: Math.min(count, n),
    tolerance,
    maxIterations,
    shift: o.shift ?? null,
    seed,
    normalize,
    dampingRatio: xi ?? null,
  };
}

function tryFactorize(A: SymmetricMatrix): SymmetricFactorization | EngineError {
  try {
    return factorizeSymmetric(A);
  } catch (e) {
    if (e instanceof EngineError && e.code === 'ZERO_PIVOT') return e;
    throw e;
  }
}

/**
 * Solves K φ = λ M φ with the method asked for (`auto` by default) and returns every modal
 * quantity of DESIGN.md §5. See the module files for each method's published source.
 *
 * Rigid-body modes (K singular) are detected by a zero pivot and counted with a Sturm count at
 * 1e-10 · max K_ii/M_ii; the inverse family then iterates on K − σM with σ = −1e-10 · max K_ii/M_ii
 * (stated in `methodNote`). Massless DOFs are handled by inverse, shifted and dense, refused by
 * forward (MASS_SINGULAR).
 *
 * @throws EngineError MATRIX_SIZE_MISMATCH, MATRIX_NOT_SQUARE, MATRIX_NOT_SYMMETRIC,
 *   MATRIX_NOT_FINITE, MASS_NOT_PSD, MASS_SINGULAR (forward), STIFFNESS_NOT_PSD, INVALID_OPTION,
 *   INVALID_MODEL (empty model), CANCELLED, NO_CONVERGENCE (NoConvergenceError with the converged
 *   modes as a RawEigenResult in `partial`), MODEL_TOO_LARGE (details n, method, estimateBytes,
 *   limitBytes) when `memoryLimitBytes` is given and the method's arrays would exceed it.
 * @example
 * const { K, M, influence } = storeyChain({ masses: [2e5, 1e5], stiffnesses: [4e7, 2e7] });
 * const r = solveModes(K, M, { count: 2, influence });
 * r.modes[0].frequencyHz;
 */
export function solveModes(
  K: SymmetricMatrix,
  M: SymmetricMatrix,
  options: SolveOptions = {},
): ModalResult {
  const n = pencilSize(K, M);
  if (n === 0) throw new EngineError('INVALID_MODEL', 'The model has no DOFs: K and M are empty.');
  assertSymmetricMatrix(K, 'K');
  assertSymmetricMatrix(M, 'M');
  const opts = resolveOptions(n, options);
  const dm = diagonalOf(M);
  const dk = diagonalOf(K);
  for (let i = 0; i < n; i++) {
    if ((dm[i] as number) < 0) {
      throw new EngineError(
        'MASS_NOT_PSD',
        `M[${i + 1},${i + 1}] = ${dm[i]} is negative: a mass matrix cannot have negative mass at a DOF (DOF ${i + 1}).`,
        { dof: i + 1 },
      );
    }
    if ((dk[i] as number) < 0) {
      throw new EngineError(
        'STIFFNESS_NOT_PSD',
        `K[${i + 1},${i + 1}] = ${dk[i]} is negative: a stiffness matrix cannot have negative stiffness on its diagonal (DOF ${i + 1}).`,
        { dof: i + 1 },
      );
    }
  }
  for (const inf of options.influence ?? []) {
    if (inf.vector.length !== n) {
      throw invalid(
        'influence',
        `The influence vector '${inf.name}' has ${inf.vector.length} entries but the model has ${n} DOFs.`,
      );
    }
  }
  let massless = 0;
  for (let i = 0; i < n; i++) if (dm[i] === 0) massless++;

  // method choice
  let method: Exclude<MethodName, 'auto'>;
  const noteParts: string[] = [];
  if (opts.method === 'auto') {
    if (opts.shift !== null) {
      method = 'shifted';
      noteParts.push(
        'auto: a target was given, so shifted inverse iteration finds the modes nearest it.',
      );
    } else if (n <= AUTO_DENSE_LIMIT) {
      method = 'dense';
      noteParts.push(
        `auto: ${n} DOFs ≤ ${AUTO_DENSE_LIMIT}, so the dense method computes every mode.`,
      );
    } else if (K.kind === 'sparse-symmetric') {
      method = 'lanczos';
      noteParts.push(
        `auto: ${n} DOFs > ${AUTO_DENSE_LIMIT} in sparse storage, so shift-invert Lanczos finds the lowest ${opts.count}.`,
      );
    } else {
      method = 'inverse';
      noteParts.push(
        `auto: ${n} DOFs > ${AUTO_DENSE_LIMIT} (dense storage), so inverse iteration finds the lowest ${opts.count}.`,
      );
    }
  } else {
    method = opts.method;
  }
  // Refuse before allocating when the configured memory would not hold the solve.
  const pencil =
    options.memoryLimitBytes === undefined
      ? undefined
      : checkMemory(K, M, n, method, opts.count, options.memoryLimitBytes);
  // stiffness: singular (rigid-body modes) or indefinite? For the shift-invert methods at σ = 0
  // the factor of K − 0·M on the pencil is the one the method iterates with and the Sturm counts
  // reuse its analysis: one factorization per shift (the method's own pivot tolerance, 1e-14; a
  // zero pivot there falls back to the check below and lets the method move its shift).
  const scale = lambdaScale(K, M);
  let sharedPencil = pencil;
  let shared: SymmetricFactorization | undefined;
  const shiftInvert = (method === 'lanczos' && opts.shift === null) || method === 'subspace';
  if (shiftInvert && K.kind === 'sparse-symmetric' && M.kind === 'sparse-symmetric') {
    sharedPencil ??= createShiftedPencil(K, M);
    try {
      shared = sharedPencil.factorize(0, 1e-14);
    } catch (e) {
      if (!(e instanceof EngineError) || e.code !== 'ZERO_PIVOT') throw e;
    }
  }
  const kf = shared ?? tryFactorize(K);
  let rigidBodyModes = 0;
  let shift = 0;
  let factorization: SymmetricFactorization | undefined;
  if (kf instanceof EngineError) {
    rigidBodyModes = sturmCount(K, M, RIGID_BODY_THRESHOLD * scale);
    if (rigidBodyModes === 0) rigidBodyModes = 1; // K singular yet nothing below the threshold: at least one
  } else {
    if (kf.negativePivots > 0) {
      throw new EngineError(
        'STIFFNESS_NOT_PSD',
        `K is not positive semi-definite: it has ${kf.negativePivots} negative eigenvalue${kf.negativePivots === 1 ? '' : 's'} (negative pivots of K = LDLᵀ). Check for negative spring stiffnesses or a sign error.`,
        { negativePivots: kf.negativePivots },
      );
    }
    factorization = kf;
  }
  if (rigidBodyModes > 0) {
    noteParts.push(
      `K is singular: ${rigidBodyModes} rigid-body mode${rigidBodyModes === 1 ? '' : 's'} (λ ≈ 0) detected (zero pivot at DOF ${String((kf as EngineError).details?.dof)}).`,
    );
  }
  if (method === 'inverse' && rigidBodyModes > 0) {
    factorization = undefined;
    for (const f of [1, 100, 1e4]) {
      const sigma = -RIGID_BODY_THRESHOLD * f * (scale > 0 ? scale : 1);
      const F = tryFactorize(combine(K, 1, M, -sigma));
      if (!(F instanceof EngineError)) {
        shift = sigma;
        factorization = F;
        break;
      }
    }
    if (!factorization) {
      throw new EngineError(
        'STIFFNESS_SINGULAR',
        'K is singular and K − σM stays singular for small negative σ: some DOF has neither stiffness nor mass. Remove it or give it a support or a mass.',
      );
    }
    noteParts.push(
      `Inverse iteration ran on K − σM with σ = ${shift.toPrecision(3)} to step past them.`,
    );
  }
  if (massless > 0) {
    noteParts.push(
      `${massless} DOF${massless === 1 ? ' has' : 's have'} no mass on the diagonal of M: ${method === 'forward' ? 'forward iteration needs M⁻¹.' : 'their infinite-frequency modes are never reached.'}`,
    );
  }

  const input: MethodInput = {
    K,
    M,
    count: opts.count,
    tolerance: opts.tolerance,
    maxIterations: opts.maxIterations,
    shift:
      method === 'shifted' || (method === 'lanczos' && opts.shift !== null)
        ? (opts.shift as number)
        : shift,
    seed: opts.seed,
    ...(method === 'inverse' && factorization ? { factorization } : {}),
    ...(shared ? { factorization: shared } : {}),
    ...(sharedPencil && (method === 'lanczos' || method === 'subspace')
      ? { pencil: sharedPencil }
      : {}),
    ...(options.onProgress ? { onProgress: options.onProgress } : {}),
    ...(options.signal ? { signal: options.signal } : {}),
    ...(options.team ? { team: options.team } : {}),
  };
  const limit =
    options.memoryLimitBytes === undefined ? {} : { memoryLimitBytes: options.memoryLimitBytes };
  const raw: RawEigenResult =
    method === 'dense'
      ? denseEigensolver(input)
      : method === 'inverse'
        ? inverseIteration(input)
        : method === 'shifted'
          ? shiftedInverseIteration(input)
          : method === 'forward'
            ? forwardIteration(input)
            : method === 'subspace'
              ? subspaceIteration(input, limit)
              : lanczos(input, limit);
  // Lanczos writes its own warnings into its notes (for callers of the method alone); here they
  // come once, as warnings of the result, so they are not repeated in the method note.
  const methodWarnings = (raw as Partial<LanczosResult>).warnings ?? [];
  const warned = new Set(methodWarnings.map((w) => w.message));
  noteParts.push(...raw.notes.filter((note) => !warned.has(note)));
  const result = buildResult(K, M, raw, {
    method,
    opts,
    n,
    rigidBodyModes,
    scale,
    methodNote: noteParts.join(' '),
    influence: options.influence ?? [],
    massless,
    methodWarnings,
    methodSturm:
      method === 'lanczos' && opts.shift === null ? (raw as LanczosResult).sturm : undefined,
    countBelow: (sigma) => sturmCount(K, M, sigma, sharedPencil),
    ...(options.team ? { team: options.team } : {}),
  });
  return result;
}

/**
 * n × n arrays of doubles the dense method holds at its peak: M's Cholesky factor, K densified
 * (the congruence works in it), the standard form C (the tridiagonalization works in it), and the
 * tridiagonal eigenvectors with their transpose; counted from core/eigen/dense-eigensolver.ts and
 * core/eigen/dense/ (re-count when they change). The refinement of the low modes afterwards holds
 * the same number: the factor, the vectors, the transformed ones, K densified and its factor.
 */
export const DENSE_METHOD_ARRAYS = 5;
/** n × n arrays a dense-storage factorization of K − σM holds (K − σM, its factor, a copy). */
const DENSE_FACTOR_ARRAYS = 3;

function megabytes(bytes: number): string {
  if (bytes < 2 ** 20) return `${Math.round(bytes / 2 ** 10)} kB`;
  return `${(bytes / 2 ** 20).toFixed(bytes < 10 * 2 ** 20 ? 1 : 0)} MB`;
}

/**
 * The memory check of `solveModes`: estimates the largest arrays of the method and refuses with
 * MODEL_TOO_LARGE (details: n, method, estimateBytes, limitBytes) when they exceed `limit`. Sparse
 * storage is estimated by the symbolic analysis of K − σM (the factor's nonzeros) plus the
 * method's iteration vectors; the analysed pencil is returned for Lanczos and subspace iteration
 * to reuse. Dense storage and the dense method count their n × n arrays.
 */
function checkMemory(
  K: SymmetricMatrix,
  M: SymmetricMatrix,
  n: number,
  method: Exclude<MethodName, 'auto'>,
  count: number,
  limit: number,
): ShiftedPencil | undefined {
  if (!(limit > 0))
    throw invalid('memoryLimitBytes', `The memory limit must be positive, got ${limit}.`);
  const refuse = (estimate: number, what: string): never => {
    throw new EngineError(
      'MODEL_TOO_LARGE',
      `The ${method} solve of this ${n}-DOF model needs about ${megabytes(estimate)} (${what}), ` +
        `more than the ${megabytes(limit)} this evaluation may use.`,
      { n, method, estimateBytes: estimate, limitBytes: limit },
    );
  };
  const square = 8 * n * n;
  if (method === 'dense') {
    const estimate = DENSE_METHOD_ARRAYS * square;
    if (estimate > limit) refuse(estimate, `${DENSE_METHOD_ARRAYS} arrays of ${n} × ${n} numbers`);
    return undefined;
  }
  // Iteration vectors of n numbers each: Lanczos' basis and its M-products (basis size as in
  // lanczos.ts) plus the modes kept; subspace iteration's five blocks of q vectors; two per
  // mode (φ, Mφ) and a few work vectors for the vector iterations.
  const p = Math.min(count, n);
  const vectors =
    method === 'lanczos'
      ? 2 * (Math.min(n, Math.max(2 * p + 10, p + 20)) + 1) + 2 * p
      : method === 'subspace'
        ? 5 * Math.min(n, 2 * p, p + 8)
        : 2 * p + 6;
  const work = 8 * n * vectors;
  const sparse =
    (K.kind === 'sparse-symmetric' && M.kind === 'sparse-symmetric') ||
    method === 'lanczos' ||
    method === 'subspace';
  if (!sparse) {
    const estimate = DENSE_FACTOR_ARRAYS * square + work;
    if (estimate > limit) {
      refuse(estimate, `${DENSE_FACTOR_ARRAYS} arrays of ${n} × ${n} numbers in dense storage`);
    }
    return undefined;
  }
  const pencil = createShiftedPencil(toSparse(K), toSparse(M));
  const factor = pencil.symbolic().memoryEstimateBytes;
  if (factor + work > limit) {
    refuse(
      factor + work,
      `${megabytes(factor)} for the sparse factor of K − σM and ${megabytes(work)} for ` +
        `${vectors} vectors`,
    );
  }
  return pencil;
}

interface BuildContext {
  method: Exclude<MethodName, 'auto'>;
  opts: ResolvedSolveOptions;
  n: number;
  rigidBodyModes: number;
  scale: number;
  methodNote: string;
  influence: { name: string; vector: Float64Array }[];
  massless: number;
  /** Warnings the method made itself (Lanczos), used in place of the generic ones here. */
  methodWarnings: { code: string; message: string }[];
  /** The Sturm proof the method made itself (Lanczos, lowest modes), used as it is. */
  methodSturm: LanczosSturm | undefined;
  /** Eigenvalues below σ, on the method's pencil when there is one. */
  countBelow(sigma: number): number;
  /** Threads the check of ΦᵀMΦ over many modes may share. */
  team?: DenseTeam;
}

function buildResult(
  K: SymmetricMatrix,
  M: SymmetricMatrix,
  raw: RawEigenResult,
  c: BuildContext,
): ModalResult {
  const { method, opts, n } = c;
  const warnings: { code: string; message: string }[] = [];
  const normK = normOne(K);
  const normM = normOne(M);
  const vectors = raw.vectors.map((v) => {
    const phi = Float64Array.from(v);
    fixSign(phi);
    return phi;
  });
  const modes: Mode[] = raw.lambdas.map((lambda, k) => {
    const phi = vectors[k] as Float64Array;
    const fr = frequencies(lambda);
    return {
      index: k + 1,
      lambda,
      ...fr,
      shape: normalizeShape(phi, opts.normalize, k + 1),
      residual: backwardError(K, M, lambda, phi, normK, normM),
      iterations: raw.iterations[k] ?? 0,
      history: raw.histories[k] ?? [],
    };
  });
  const orthogonality = massOrthogonality(M, vectors, c.team);
  const parts = participation(M, vectors, c.influence);

  // conditioning: the worst case λ_max / λ_1 (λ_max ≥ max K_ii/M_ii, λ_1 the lowest flexible mode
  // found) and the estimate after the fact that decides the warning; Lanczos has made it already
  // (the same assessment, so the same words)
  const floor = c.rigidBodyModes > 0 ? RIGID_BODY_THRESHOLD * c.scale : 0;
  const cond =
    (raw as Partial<LanczosResult>).conditioning ??
    assessConditioning(
      c.scale,
      raw.lambdas,
      floor,
      opts.tolerance,
      estimateEigenvalueErrors(K, M, raw.lambdas, raw.vectors, floor),
    );
  const estimate = cond.ratio;
  const digitsLost = cond.digitsLost;
  if (cond.message) warnings.push({ code: 'ILL_CONDITIONED', message: cond.message });

  // Sturm check
  let sturm: ModalResult['sturm'];
  const lams = raw.lambdas;
  if (lams.length > 0) {
    const delta = 1e-6;
    const floor = RIGID_BODY_THRESHOLD * (c.scale > 0 ? c.scale : 1);
    const hiL = lams[lams.length - 1] as number;
    const loL = lams[0] as number;
    const hi = hiL + delta * Math.max(Math.abs(hiL), floor);
    const lo = loL - delta * Math.max(Math.abs(loL), floor);
    const found = lams.length;
    // Lanczos has made this check already, with locked runs: its verdict, in its words.
    const said = c.methodWarnings.find(
      (w) => w.code === 'STURM_MISMATCH' || w.code === 'REPEATED_BEYOND_COUNT',
    );
    const proof = c.methodSturm;
    if (proof && proof.belowSigma === 0 && proof.found === found && (proof.ok || said)) {
      // Its count just above λ_p was made on the factorization at that shift: not repeated here.
      sturm = { shift: proof.shift, countBelow: proof.countBelow, found, ok: proof.ok };
      if (!proof.ok && said) warnings.push(said);
    } else if (method === 'forward') {
      const below = c.countBelow(lo);
      const above = n - c.massless - below;
      sturm = { shift: lo, countBelow: below, found, ok: above === found };
      if (!sturm.ok) {
        warnings.push({
          code: 'STURM_MISMATCH',
          message: `Sturm check failed: K − σM at σ = ${lo.toPrecision(6)} (just below the lowest mode found) shows ${above} eigenvalues above σ, but forward iteration found ${found}: ${Math.abs(above - found)} mode${Math.abs(above - found) === 1 ? ' is' : 's are'} missing or repeated.`,
        });
      }
    } else {
      const lowest = !(method === 'shifted' || (method === 'lanczos' && opts.shift !== null));
      const below = c.countBelow(hi);
      const belowLo = lowest ? 0 : c.countBelow(lo);
      const inside = below - belowLo;
      sturm = { shift: hi, countBelow: below, found, ok: inside === found };
      if (!sturm.ok && said) {
        warnings.push(said);
      } else if (!sturm.ok) {
        warnings.push({
          code: 'STURM_MISMATCH',
          message: lowest
            ? `Sturm check failed: K − σM at σ = ${hi.toPrecision(6)} (just above the highest mode found) has ${below} negative pivots, so ${below} eigenvalues lie below σ, but ${found} were found: ${below - found} mode${Math.abs(below - found) === 1 ? ' is' : 's are'} missing (a repeated or closely spaced eigenvalue may have been skipped).`
            : `Sturm check failed: ${inside} eigenvalues lie between σ = ${lo.toPrecision(6)} and ${hi.toPrecision(6)}, but ${found} were found there: ${inside - found} missing.`,
        });
      }
    }
  }

  let critical: ModalResult['criticalTimeStep'];
  const allFinite = n - c.massless;
  if (
    (method === 'forward' || (method === 'dense' && modes.length >= allFinite)) &&
    modes.length > 0
  ) {
    const top = modes[modes.length - 1] as Mode;
    if (top.omega > 0) critical = criticalTimeStep(top.omega, opts.dampingRatio ?? undefined);
  }

  const worst = Math.max(0, ...modes.map((m) => m.residual));
  if (worst > Math.max(1e-8, 1e3 * EPS * (Number.isFinite(estimate) ? estimate : 1))) {
    warnings.push({
      code: 'RESIDUAL_LARGE',
      message: `The largest backward error ${worst.toPrecision(2)} is above what the model's conditioning explains: check the results before use.`,
    });
  }
  if (c.rigidBodyModes > 0) {
    warnings.push({
      code: 'RIGID_BODY_MODES',
      message: `K is singular: the model has ${c.rigidBodyModes} rigid-body mode${c.rigidBodyModes === 1 ? '' : 's'} (λ ≈ 0). Check supports if the structure should be restrained.`,
    });
  }
  const closelySpaced = closelySpacedPairs(modes.map((m) => m.periodS));
  return {
    method,
    methodNote: c.methodNote || `${method} as asked.`,
    options: opts,
    n,
    modes,
    orthogonality,
    participation: parts,
    rigidBodyModes: c.rigidBodyModes,
    closelySpaced,
    ...(critical ? { criticalTimeStep: critical } : {}),
    ...(sturm ? { sturm } : {}),
    conditioning: {
      estimate,
      digitsLost,
      relativeError: cond.relativeError,
      unresolved: cond.unresolved,
    },
    warnings,
  };
}
