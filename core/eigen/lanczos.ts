/**
 * Shift-invert Lanczos for K φ = λ M φ with M-inner products, full reorthogonalization (classical
 * Gram–Schmidt applied twice) and thick restarts.
 *
 * The operator is OP = (K − σM)⁻¹ M, self-adjoint in the M-inner product; its eigenvalues
 * θ = 1/(λ − σ) are largest for the λ just above σ (Ericsson & Ruhe, "The spectral transformation
 * Lanczos method", Math. Comp. 35, 1980). The basis is kept M-orthonormal by Gram–Schmidt twice
 * ("twice is enough": Parlett, *The Symmetric Eigenvalue Problem*, §6.9). When the basis is full,
 * the wanted Ritz vectors are kept and the iteration goes on from the last Lanczos vector (thick
 * restart: Wu & Simon, SIAM J. Matrix Anal. Appl. 22, 2000), so the relation
 * OP Q = Q H + β q e_mᵀ holds throughout and |β y_m| is the residual of each Ritz pair.
 */
import { EngineError, NoConvergenceError } from '../errors';
import {
  assessConditioning,
  estimateEigenvalueErrors,
  RIGID_BODY_THRESHOLD,
  type ConditioningAssessment,
} from './conditioning';
import { multiplyLower } from '../linalg/sparse-ldlt/shifted';
import type { SparseSymmetricMatrix, SymmetricFactorization } from '../linalg/types';
import { symmetricEigen } from './dense-eigensolver';
import { seededRandom } from './random';
import { prepareShiftedOperator } from './shifted-operator';
import {
  checkBandSturm,
  sturmCountAbove,
  type LanczosSturm,
  type MethodWarning,
} from './sturm-checks';
import type { MethodInput, RawEigenResult } from './types';
import { combineBasis, dotv, lambdaScale, orthogonalize } from './vector-tools';

/** Extra options of the Lanczos method. */
export interface LanczosOptions {
  /**
   * All modes with λ in [lo, hi] (rad²/s²) instead of the lowest `count`: the number is counted
   * first by Sturm sequences at lo and hi.
   */
  band?: { lo: number; hi: number };
  /** Basis size before a restart (default max(2·count + 10, count + 20), at most n). */
  basisSize?: number;
  /** Memory limit of the factorization, bytes. */
  memoryLimitBytes?: number;
}
/**
 * What `lanczos` returns: the raw result plus its Sturm proof, its conditioning estimate and
 * the warnings (STURM_MISMATCH, ILL_CONDITIONED), each of which is also in `notes`.
 */
export type LanczosResult = RawEigenResult & {
  sturm?: LanczosSturm;
  conditioning: ConditioningAssessment;
  warnings: MethodWarning[];
};

/**
 * The lowest `count` modes (or every mode in `options.band`) by shift-invert Lanczos.
 * Convergence: a Ritz pair is accepted when its residual |β y_m| ≤ tolerance · |θ|.
 *
 * After the run a Sturm count proves that no mode was missed: just above the highest mode found
 * (lowest-p mode) or at both ends of the band (band mode: the inertia of K − lo·M and K − hi·M
 * counts the eigenvalues in [lo, hi)). Missing copies of a repeated eigenvalue are found by runs
 * locked against the converged modes; a count that still disagrees is a STURM_MISMATCH warning
 * naming how many are missing. The digits of the lowest modes are estimated after the fact
 * (`conditioning.ts`: Rayleigh quotients in double-double arithmetic), beside the worst case
 * λ_max/λ₁ (λ_max ≥ max K_ii/M_ii); this is assessed
 * too: when it costs λ₁ digits beyond the tolerance, an ILL_CONDITIONED warning says how many and,
 * when none survive, that the lowest eigenvalues are not meaningful.
 *
 * @throws EngineError CANCELLED when `signal.aborted` is seen between restarts;
 *   NoConvergenceError (with the converged modes as `partial`) after `maxIterations` restarts;
 *   STIFFNESS_SINGULAR, MODEL_TOO_LARGE from the factorization.
 * @example
 * const raw = lanczos({ K, M, count: 10, tolerance: 1e-10, maxIterations: 300, shift: 0, seed: 1 });
 * raw.warnings; // [] on a well-conditioned model whose Sturm count agrees
 */
export function lanczos(input: MethodInput, options: LanczosOptions = {}): LanczosResult {
  const op = prepareShiftedOperator(input, options.memoryLimitBytes);
  const { n, M } = op;
  let sigma = op.sigma;
  const notes = [...op.notes];
  const warnings: MethodWarning[] = [];
  const scale = lambdaScale(op.K, op.M);
  const finish = (raw: RawEigenResult, sturm?: LanczosSturm): LanczosResult => {
    const floor = op.singularAtShift ? RIGID_BODY_THRESHOLD * scale : 0;
    const errors = estimateEigenvalueErrors(op.K, op.M, raw.lambdas, raw.vectors, floor);
    const conditioning = assessConditioning(scale, raw.lambdas, floor, input.tolerance, errors);
    if (conditioning.message) {
      warnings.push({ code: 'ILL_CONDITIONED', message: conditioning.message });
      notes.push(conditioning.message);
    }
    return { ...raw, notes, conditioning, warnings, ...(sturm ? { sturm } : {}) };
  };
  const none: RawEigenResult = { lambdas: [], vectors: [], iterations: [], histories: [], notes };
  let factorization = op.factorization;
  let p = Math.min(input.count, n);
  let band: { lo: number; hi: number; belowLo: number; belowHi: number } | undefined;
  if (options.band) {
    const { lo, hi } = options.band;
    if (!(hi > lo)) {
      throw new EngineError(
        'INVALID_OPTION',
        `The frequency band must have its upper end above the lower one (got ${lo} to ${hi}).`,
      );
    }
    const belowLo = op.countBelow(lo);
    const belowHi = op.countBelow(hi);
    p = belowHi - belowLo;
    notes.push(`${p} eigenvalue${p === 1 ? '' : 's'} in the band (Sturm counts at both ends).`);
    if (p === 0) {
      return finish(none, {
        shift: hi,
        countBelow: belowHi,
        belowSigma: belowLo,
        found: 0,
        ok: true,
        band: { lo, hi },
      });
    }
    // Shift to the lower end: the band's eigenvalues are the largest θ = 1/(λ − σ) > 0.
    sigma = lo;
    factorization = op.factorizeAt(lo);
    band = { lo, hi, belowLo, belowHi };
  }
  if (p === 0) return finish(none);
  const rand = seededRandom(input.seed);
  let result: RawEigenResult = lanczosRun(
    input,
    M,
    factorization,
    sigma,
    p,
    [],
    [],
    rand,
    options.basisSize,
  );
  let sturm: LanczosSturm | undefined;
  // A single start vector sees one copy of a repeated eigenvalue. The Sturm count just above the
  // highest mode found (or at the band's upper end) tells how many are missing; those are found
  // by a new run orthogonal to (locked against) the converged modes, until the count and the
  // modes agree.
  const MAX_LOCKED_RUNS = 8;
  let cutThrough: { lambda: number; counted: number } | undefined;
  let widened: number | null = null;
  for (let round = 0; ; round++) {
    let above: number;
    let below: number;
    let found: number;
    if (band) {
      above = band.hi;
      below = band.belowHi;
      found = result.lambdas.filter((l) => l >= band.lo && l < band.hi).length;
    } else {
      const counted = sturmCountAbove(
        op,
        result.lambdas,
        sigma,
        scale,
        factorization.negativePivots,
      );
      if (!counted) break;
      ({ above, below } = counted);
      if (counted.widened !== null) widened = counted.widened;
      found = result.lambdas.filter((l) => l < above).length;
    }
    const before = factorization.negativePivots;
    const inside = below - before;
    sturm = { shift: above, countBelow: below, belowSigma: before, found, ok: inside === found };
    if (inside <= found || round >= MAX_LOCKED_RUNS) break;
    const lockedM = result.vectors.map((v) => multiplyLower(M, v));
    const extra = lanczosRun(
      input,
      M,
      factorization,
      sigma,
      inside - found,
      result.vectors,
      lockedM,
      rand,
      options.basisSize,
    );
    const lamP = result.lambdas[result.lambdas.length - 1]!;
    if (
      result.lambdas.length >= p &&
      extra.lambdas.every((l) => l >= lamP - 1e-8 * Math.abs(lamP))
    ) {
      // Nothing new below λ_p: the uncounted ones are further copies of λ_p itself, so the
      // count asked for cuts through a repeated eigenvalue. The modes found are right.
      cutThrough = { lambda: lamP, counted: inside };
      break;
    }
    notes.push(
      `${inside - found} repeated or hidden mode${inside - found === 1 ? '' : 's'} ` +
        'found by a second Lanczos run locked against the converged ones (Sturm count).',
    );
    result = mergeResults(result, extra, Math.max(p, result.lambdas.length));
  }
  if (band) {
    // Keep exactly the modes inside [lo, hi) (a Ritz value can sit just outside by rounding),
    // then the band's own Sturm check on what is returned.
    const { lo, hi } = band;
    const keep = result.lambdas.map((l) => l >= lo && l < hi);
    const kept: RawEigenResult = {
      lambdas: result.lambdas.filter((_, i) => keep[i]),
      vectors: result.vectors.filter((_, i) => keep[i]),
      iterations: result.iterations.filter((_, i) => keep[i]),
      histories: result.histories.filter((_, i) => keep[i]),
      notes,
    };
    const check = checkBandSturm(band, kept.lambdas);
    notes.push(check.note);
    if (check.warning) {
      warnings.push(check.warning);
      notes.push(check.warning.message);
    }
    return finish(kept, check.sturm);
  }
  if (sturm) {
    const inside = sturm.countBelow - sturm.belowSigma;
    if (widened !== null) {
      notes.push(
        `Sturm check: just above λ_${sturm.found} (δ = 1e-8) the pivots of K − σM counted fewer ` +
          'eigenvalues than were found, which cannot be in exact arithmetic: rounding of this ' +
          `ill-conditioned model moves eigenvalues by about ε·λ_max, so the shift was moved to ` +
          `λ_${sturm.found}·(1 + ${widened.toExponential(0)}).`,
      );
    }
    notes.push(
      `Sturm check: ${inside} eigenvalue${inside === 1 ? '' : 's'} between ` +
        `σ = ${sigma.toPrecision(4)} and ${sturm.shift.toPrecision(6)} rad²/s², ${sturm.found} found` +
        (inside < sturm.found
          ? ' — fewer than found: the model is too ill-conditioned for its pivots to be trusted.'
          : '.'),
    );
    if (cutThrough) {
      const more = cutThrough.counted - sturm.found;
      const message =
        `Sturm check: K − σM at σ = ${sturm.shift.toPrecision(6)} rad²/s² counts ` +
        `${cutThrough.counted} eigenvalues up to just above λ_${sturm.found} = ` +
        `${cutThrough.lambda.toPrecision(6)} rad²/s², but ${sturm.found} modes were asked for: ` +
        `that eigenvalue is repeated past the count, with ${more} more ` +
        `cop${more === 1 ? 'y' : 'ies'} at it. The modes found are right; ask for at least ` +
        `${cutThrough.counted} modes to have its whole eigenspace.`;
      warnings.push({ code: 'REPEATED_BEYOND_COUNT', message });
      notes.push(message);
    } else if (inside > sturm.found) {
      const missing = inside - sturm.found;
      const message =
        `Sturm check failed: K − σM at σ = ${sturm.shift.toPrecision(6)} rad²/s² (just above the ` +
        `highest mode found) counts ${inside} eigenvalues above the shift ` +
        `${sigma.toPrecision(4)}, but ${sturm.found} were found: ${missing} mode` +
        `${missing === 1 ? ' is' : 's are'} missing (a repeated or closely spaced eigenvalue ` +
        'was skipped even after locked runs).';
      warnings.push({ code: 'STURM_MISMATCH', message });
      notes.push(message);
    }
  }
  return finish(result, sturm);
}

function mergeResults(a: RawEigenResult, b: RawEigenResult, p: number): RawEigenResult {
  const idx = [
    ...a.lambdas.map((l, i) => ({ l, s: a, i })),
    ...b.lambdas.map((l, i) => ({ l, s: b, i })),
  ];
  idx.sort((x, y) => x.l - y.l);
  const top = idx.slice(0, p);
  return {
    lambdas: top.map((t) => t.l),
    vectors: top.map((t) => t.s.vectors[t.i]!),
    iterations: top.map((t) => t.s.iterations[t.i]!),
    histories: top.map((t) => t.s.histories[t.i]!),
    notes: a.notes,
  };
}

/** One thick-restart Lanczos run for the `p` largest θ, orthogonal to the `locked` vectors. */
function lanczosRun(
  input: MethodInput,
  M: SparseSymmetricMatrix,
  factorization: SymmetricFactorization,
  sigma: number,
  p: number,
  locked: Float64Array[],
  lockedM: Float64Array[],
  rand: () => number,
  basisSize: number | undefined,
): RawEigenResult {
  const n = M.n;
  const notes: string[] = [];
  const free = n - locked.length;
  const m = Math.min(free, basisSize ?? Math.max(2 * p + 10, p + 20));
  p = Math.min(p, m);
  const Q: Float64Array[] = [];
  const MQ: Float64Array[] = [];
  const H = new Float64Array(m * m);
  const mq = new Float64Array(n);
  const tol = input.tolerance;
  const deflate = (w: Float64Array): void => {
    if (locked.length > 0) orthogonalize(w, locked, lockedM, locked.length, null);
  };

  // Start vector: OP applied to a random vector, which removes the components of massless DOFs
  // (the infinite eigenvalues) — Ericsson & Ruhe 1980.
  const start = (): { q: Float64Array; Mq: Float64Array } | null => {
    for (let attempt = 0; attempt < 5; attempt++) {
      const r = new Float64Array(n);
      for (let i = 0; i < n; i++) r[i] = rand() - 0.5;
      multiplyLower(M, r, mq);
      const w = factorization.solve(mq);
      deflate(w);
      orthogonalize(w, Q, MQ, Q.length, null);
      deflate(w);
      const Mw = multiplyLower(M, w);
      const nrm = Math.sqrt(Math.max(dotv(w, Mw), 0));
      if (nrm > 0) {
        scale(w, 1 / nrm);
        scale(Mw, 1 / nrm);
        return { q: w, Mq: Mw };
      }
    }
    return null;
  };
  const first = start();
  if (!first) {
    throw new EngineError('MASS_SINGULAR', 'M has no positive mass: no mode can be found.');
  }
  Q.push(first.q);
  MQ.push(first.Mq);
  const histories: number[][] = Array.from({ length: p }, () => []);
  const iterations = new Array<number>(p).fill(0);
  const h = new Float64Array(m + 1);
  let beta = 0;
  let restart = 0;
  let kept = 0; // basis vectors carried over from the last restart
  let lastRitz: { theta: number[]; Y: Float64Array[]; j: number };
  let converged: number;
  for (;;) {
    // Extend the basis to m vectors (plus the continuation vector Q[m]).
    for (let j = Q.length - 1; j < m; j++) {
      const w = factorization.solve(MQ[j]!);
      h.fill(0, 0, j + 1);
      deflate(w);
      orthogonalizeOnce(w, M, Q, MQ, j + 1, h);
      deflate(w);
      for (let i = 0; i <= j; i++) {
        if (i < kept && j === kept) {
          // The arrow coupling of a thick restart: keep the stored value (equal in exact arithmetic).
          continue;
        }
        H[i * m + j] = h[i]!;
        H[j * m + i] = h[i]!;
      }
      const Mw = multiplyLower(M, w);
      beta = Math.sqrt(Math.max(dotv(w, Mw), 0));
      const hnorm = Math.sqrt(dotv(h.subarray(0, j + 1), h.subarray(0, j + 1)));
      if (!(beta > 1e-12 * hnorm)) {
        // Invariant subspace: continue with a fresh vector orthogonal to the basis.
        beta = 0;
        const fresh = start();
        // The whole space is spanned (n small): a zero continuation vector ends the basis.
        Q.push(fresh ? fresh.q : new Float64Array(n));
        MQ.push(fresh ? fresh.Mq : new Float64Array(n));
      } else {
        scale(w, 1 / beta);
        scale(Mw, 1 / beta);
        Q.push(w);
        MQ.push(Mw);
      }
      if (j + 1 < m) {
        H[(j + 1) * m + j] = beta;
        H[j * m + j + 1] = beta;
      }
    }
    const size = Math.min(m, Q.length - 1);
    // Rayleigh–Ritz on H (size × size).
    const Hs = new Float64Array(size * size);
    for (let i = 0; i < size; i++) for (let j = 0; j < size; j++) Hs[i * size + j] = H[i * m + j]!;
    const eig = symmetricEigen({ kind: 'dense', rows: size, cols: size, data: Hs });
    // Largest θ first.
    const order = Array.from({ length: size }, (_, i) => size - 1 - i);
    const theta = order.map((i) => eig.values[i]!);
    const Y = order.map((i) => eig.vectors[i]!);
    converged = 0;
    for (let i = 0; i < p && i < size; i++) {
      const res = Math.abs(beta * Y[i]![size - 1]!);
      const lam = sigma + 1 / theta[i]!;
      histories[i]!.push(lam);
      if (res <= tol * Math.abs(theta[i]!) && converged === i) {
        converged++;
        if (iterations[i] === 0) iterations[i] = restart + 1;
      }
    }
    lastRitz = { theta, Y, j: size };
    input.onProgress?.({
      stage: 'Lanczos',
      iteration: restart + 1,
      modesConverged: converged,
      modesWanted: p,
    });
    if (converged >= p || size >= n) break;
    if (input.signal?.aborted) {
      throw new EngineError(
        'CANCELLED',
        `The Lanczos solve was cancelled after ${restart + 1} restarts (${converged} of ${p} modes converged).`,
      );
    }
    restart++;
    if (restart >= input.maxIterations) {
      const partial = ritzResult(lastRitz, converged, Q, MQ, sigma, iterations, histories, notes);
      throw new NoConvergenceError(
        `Lanczos did not converge within ${input.maxIterations} restarts: ${converged} of ${p} ` +
          'modes met the tolerance.',
        partial,
        { converged, wanted: p },
      );
    }
    // Thick restart: keep k Ritz vectors, then the continuation vector.
    const k = Math.min(size - 1, Math.max(p + Math.floor((size - p) / 2), p + 1));
    const newQ: Float64Array[] = [];
    const newMQ: Float64Array[] = [];
    for (let i = 0; i < k; i++) {
      newQ.push(combineBasis(Q, Y[i]!, size));
      newMQ.push(combineBasis(MQ, Y[i]!, size));
    }
    const cont = Q[size]!;
    const contM = MQ[size]!;
    H.fill(0);
    for (let i = 0; i < k; i++) {
      H[i * m + i] = theta[i]!;
      const b = beta * Y[i]![size - 1]!;
      H[i * m + k] = b;
      H[k * m + i] = b;
    }
    Q.length = 0;
    MQ.length = 0;
    Q.push(...newQ, cont);
    MQ.push(...newMQ, contM);
    kept = k;
  }
  return ritzResult(lastRitz!, Math.min(converged, p), Q, MQ, sigma, iterations, histories, notes);
}

function ritzResult(
  ritz: { theta: number[]; Y: Float64Array[]; j: number },
  count: number,
  Q: Float64Array[],
  _MQ: Float64Array[],
  sigma: number,
  iterations: number[],
  histories: number[][],
  notes: string[],
): RawEigenResult {
  const pairs: { lambda: number; phi: Float64Array; it: number; hist: number[] }[] = [];
  for (let i = 0; i < count; i++) {
    pairs.push({
      lambda: sigma + 1 / ritz.theta[i]!,
      phi: combineBasis(Q, ritz.Y[i]!, ritz.j),
      it: iterations[i]!,
      hist: histories[i]!,
    });
  }
  pairs.sort((a, b) => a.lambda - b.lambda);
  return {
    lambdas: pairs.map((q) => q.lambda),
    vectors: pairs.map((q) => q.phi),
    iterations: pairs.map((q) => q.it),
    histories: pairs.map((q) => q.hist),
    notes,
  };
}

/**
 * w ← w − Σ q_i (q_iᵀ M w), with a second pass only when the first removed more than half of
 * ‖w‖²_M (the Daniel–Gragg–Kaufman–Stewart criterion, Math. Comp. 30, 1976): "twice is enough",
 * and once is enough when little cancellation happened. Accumulates the coefficients into h.
 */
function orthogonalizeOnce(
  w: Float64Array,
  M: SparseSymmetricMatrix,
  Q: Float64Array[],
  MQ: Float64Array[],
  count: number,
  h: Float64Array,
): void {
  const n = w.length;
  // The three-term part first (the newest vectors carry almost all of w), so that the full pass
  // below only removes rounding-sized components and usually needs no repetition.
  for (let i = count - 1; i >= Math.max(0, count - 2); i--) {
    const mq = MQ[i]!;
    let c = 0;
    for (let t = 0; t < n; t++) c += mq[t]! * w[t]!;
    const q = Q[i]!;
    for (let t = 0; t < n; t++) w[t]! -= c * q[t]!;
    h[i]! += c;
  }
  const before = dotv(w, multiplyLower(M, w));
  for (let pass = 0; pass < 2; pass++) {
    let removed = 0;
    for (let i = 0; i < count; i++) {
      const mq = MQ[i]!;
      let c = 0;
      for (let t = 0; t < n; t++) c += mq[t]! * w[t]!;
      const q = Q[i]!;
      for (let t = 0; t < n; t++) w[t]! -= c * q[t]!;
      h[i]! += c;
      removed += c * c;
    }
    if (pass === 0 && before - removed > 0.5 * before) break;
  }
}

function scale(x: Float64Array, c: number): void {
  for (let i = 0; i < x.length; i++) x[i]! *= c;
}
