/**
 * The dense reference solver: every mode of K φ = λ M φ.
 *
 * 1. Reduction to standard form with the Cholesky factor M = L Lᵀ: C = L⁻¹ K L⁻ᵀ, φ = L⁻ᵀ z
 *    (Golub & Van Loan, *Matrix Computations*, 4th ed., §8.7.2).
 * 2. Householder tridiagonalization and the implicit QL iteration with accumulated
 *    transformations (the `tred2`/`tql2` procedures of Wilkinson & Reinsch, *Handbook for
 *    Automatic Computation* vol. II, 1971; written here for row-major typed arrays).
 *
 * When M is singular (massless DOFs) the reduction uses A = K − σM instead (σ = 0 when K is
 * positive definite, else a stated negative σ): L⁻¹ M L⁻ᵀ z = μ z with λ = σ + 1/μ; the μ = 0
 * modes are the infinite-frequency ones of the massless DOFs and are dropped.
 */
import { EngineError, NoConvergenceError } from '../errors';
import { denseCholesky, solveLowerTransposeInPlace } from '../linalg/dense';
import { combine, diagonalOf, toDense } from '../linalg/factorize';
import type { DenseMatrix } from '../linalg/types';
import type { MethodInput, RawEigenResult } from './types';

/**
 * Eigenvalues (ascending) and orthonormal eigenvectors of a dense symmetric matrix.
 * `vectors[k]` is the eigenvector of `values[k]`.
 * @throws NoConvergenceError when the QL iteration exceeds 30 sweeps for one eigenvalue.
 * @example const { values, vectors } = symmetricEigen(denseFromRows([[2, 1], [1, 2]]));
 */
export function symmetricEigen(A: DenseMatrix): { values: Float64Array; vectors: Float64Array[] } {
  const n = A.rows;
  const V = Float64Array.from(A.data); // A is symmetric: its transpose is itself
  const d = new Float64Array(n);
  const e = new Float64Array(n);
  if (n === 0) return { values: d, vectors: [] };
  tred2(n, V, d, e);
  // tred2 works on the transpose (contiguous inner loops); its accumulated transformation then
  // holds eigenvector k in row k, which the QL rotations update two rows at a time.
  const W = V;
  tql2(n, W, d, e);
  const order = Array.from({ length: n }, (_, k) => k).sort(
    (a, b) => (d[a] as number) - (d[b] as number),
  );
  const values = new Float64Array(n);
  const vectors: Float64Array[] = [];
  order.forEach((k, r) => {
    values[r] = d[k] as number;
    vectors.push(W.slice(k * n, k * n + n));
  });
  return { values, vectors };
}

function tred2(n: number, V: Float64Array, d: Float64Array, e: Float64Array): void {
  for (let j = 0; j < n; j++) d[j] = V[j * n + (n - 1)] as number;
  for (let i = n - 1; i > 0; i--) {
    let scale = 0;
    let h = 0;
    for (let k = 0; k < i; k++) scale += Math.abs(d[k] as number);
    if (scale === 0) {
      e[i] = d[i - 1] as number;
      for (let j = 0; j < i; j++) {
        d[j] = V[j * n + (i - 1)] as number;
        V[j * n + i] = 0;
        V[i * n + j] = 0;
      }
    } else {
      for (let k = 0; k < i; k++) {
        d[k] = (d[k] as number) / scale;
        h += (d[k] as number) ** 2;
      }
      let f = d[i - 1] as number;
      let g = Math.sqrt(h);
      if (f > 0) g = -g;
      e[i] = scale * g;
      h -= f * g;
      d[i - 1] = f - g;
      for (let j = 0; j < i; j++) e[j] = 0;
      for (let j = 0; j < i; j++) {
        f = d[j] as number;
        V[i * n + j] = f;
        g = (e[j] as number) + (V[j * n + j] as number) * f;
        for (let k = j + 1; k <= i - 1; k++) {
          const vkj = V[j * n + k] as number;
          g += vkj * (d[k] as number);
          e[k] = (e[k] as number) + vkj * f;
        }
        e[j] = g;
      }
      f = 0;
      for (let j = 0; j < i; j++) {
        e[j] = (e[j] as number) / h;
        f += (e[j] as number) * (d[j] as number);
      }
      const hh = f / (h + h);
      for (let j = 0; j < i; j++) e[j] = (e[j] as number) - hh * (d[j] as number);
      for (let j = 0; j < i; j++) {
        f = d[j] as number;
        g = e[j] as number;
        for (let k = j; k <= i - 1; k++) {
          V[j * n + k] = (V[j * n + k] as number) - (f * (e[k] as number) + g * (d[k] as number));
        }
        d[j] = V[j * n + (i - 1)] as number;
        V[j * n + i] = 0;
      }
    }
    d[i] = h;
  }
  for (let i = 0; i < n - 1; i++) {
    V[i * n + (n - 1)] = V[i * n + i] as number;
    V[i * n + i] = 1;
    const h = d[i + 1] as number;
    if (h !== 0) {
      for (let k = 0; k <= i; k++) d[k] = (V[(i + 1) * n + k] as number) / h;
      for (let j = 0; j <= i; j++) {
        let g = 0;
        for (let k = 0; k <= i; k++) g += (V[(i + 1) * n + k] as number) * (V[j * n + k] as number);
        for (let k = 0; k <= i; k++) V[j * n + k] = (V[j * n + k] as number) - g * (d[k] as number);
      }
    }
    for (let k = 0; k <= i; k++) V[(i + 1) * n + k] = 0;
  }
  for (let j = 0; j < n; j++) {
    d[j] = V[j * n + (n - 1)] as number;
    V[j * n + (n - 1)] = 0;
  }
  V[(n - 1) * n + (n - 1)] = 1;
  e[0] = 0;
}

/** Implicit QL on the tridiagonal (d, e); W holds eigenvector k in row k. */
function tql2(n: number, W: Float64Array, d: Float64Array, e: Float64Array): void {
  for (let i = 1; i < n; i++) e[i - 1] = e[i] as number;
  e[n - 1] = 0;
  let f = 0;
  let tst1 = 0;
  const eps = 2 ** -52;
  for (let l = 0; l < n; l++) {
    tst1 = Math.max(tst1, Math.abs(d[l] as number) + Math.abs(e[l] as number));
    let m = l;
    while (m < n) {
      if (Math.abs(e[m] as number) <= eps * tst1) break;
      m++;
    }
    if (m > l) {
      let iter = 0;
      do {
        iter++;
        if (iter > 60) {
          throw new NoConvergenceError(
            `The tridiagonal QL iteration did not converge for eigenvalue ${l + 1} of ${n} within 60 sweeps.`,
            { eigenvalue: l + 1 },
          );
        }
        let g = d[l] as number;
        let p = ((d[l + 1] as number) - g) / (2 * (e[l] as number));
        let r = Math.hypot(p, 1);
        if (p < 0) r = -r;
        d[l] = (e[l] as number) / (p + r);
        d[l + 1] = (e[l] as number) * (p + r);
        const dl1 = d[l + 1] as number;
        let h = g - (d[l] as number);
        for (let i = l + 2; i < n; i++) d[i] = (d[i] as number) - h;
        f += h;
        p = d[m] as number;
        let c = 1;
        let c2 = c;
        let c3 = c;
        const el1 = e[l + 1] as number;
        let s = 0;
        let s2 = 0;
        for (let i = m - 1; i >= l; i--) {
          c3 = c2;
          c2 = c;
          s2 = s;
          g = c * (e[i] as number);
          h = c * p;
          r = Math.hypot(p, e[i] as number);
          e[i + 1] = s * r;
          s = (e[i] as number) / r;
          c = p / r;
          p = c * (d[i] as number) - s * g;
          d[i + 1] = h + s * (c * g + s * (d[i] as number));
          const ri = i * n;
          const ri1 = (i + 1) * n;
          for (let k = 0; k < n; k++) {
            const wk1 = W[ri1 + k] as number;
            const wk = W[ri + k] as number;
            W[ri1 + k] = s * wk + c * wk1;
            W[ri + k] = c * wk - s * wk1;
          }
        }
        p = (-s * s2 * c3 * el1 * (e[l] as number)) / dl1;
        e[l] = s * p;
        d[l] = c * p;
      } while (Math.abs(e[l] as number) > eps * tst1);
    }
    d[l] = (d[l] as number) + f;
    e[l] = 0;
  }
}

/** C = L⁻¹ A L⁻ᵀ for symmetric A (row-major), L lower triangular. */
function congruence(L: Float64Array, A: Float64Array, n: number): DenseMatrix {
  // X = L⁻¹ A (row by row), then C = L⁻¹ Xᵀ
  const X = Float64Array.from(A);
  forwardRows(L, X, n);
  const Y = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) Y[j * n + i] = X[i * n + j] as number;
  forwardRows(L, Y, n);
  for (let i = 0; i < n; i++)
    for (let j = 0; j < i; j++) {
      const v = 0.5 * ((Y[i * n + j] as number) + (Y[j * n + i] as number));
      Y[i * n + j] = v;
      Y[j * n + i] = v;
    }
  return { kind: 'dense', rows: n, cols: n, data: Y };
}

/** Solves L X = B in place for all columns of B (B row-major). */
function forwardRows(L: Float64Array, B: Float64Array, n: number): void {
  for (let i = 0; i < n; i++) {
    const bi = i * n;
    for (let k = 0; k < i; k++) {
      const lik = L[i * n + k] as number;
      if (lik === 0) continue;
      const bk = k * n;
      for (let j = 0; j < n; j++) B[bi + j] = (B[bi + j] as number) - lik * (B[bk + j] as number);
    }
    const lii = L[i * n + i] as number;
    for (let j = 0; j < n; j++) B[bi + j] = (B[bi + j] as number) / lii;
  }
}

/**
 * Every finite mode of K φ = λ M φ, lowest first, mass-normalized (`count` keeps the lowest ones).
 * @throws EngineError MASS_NOT_PSD when M has a negative pivot; STIFFNESS_SINGULAR when both K and
 *   M are singular and no positive definite K − σM is found; MODEL_TOO_LARGE above 3000 DOFs.
 * @example denseEigensolver({ K, M, count: 5, tolerance: 1e-10, maxIterations: 0, shift: 0, seed: 1 })
 */
export function denseEigensolver(input: MethodInput): RawEigenResult {
  const Kd = toDense(input.K);
  const Md = toDense(input.M);
  const n = Kd.rows;
  if (n > 3000) {
    throw new EngineError(
      'MODEL_TOO_LARGE',
      `The dense method holds ${n} × ${n} matrices in memory; above 3000 DOFs use 'inverse' or 'shifted'.`,
      { n },
    );
  }
  const notes: string[] = [];
  let lambdas: number[];
  let vectors: Float64Array[];
  let massL: Float64Array | null = null;
  try {
    massL = denseCholesky(Md).L;
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
  }
  if (massL) {
    const C = congruence(massL, Kd.data, n);
    const { values, vectors: Z } = symmetricEigen(C);
    lambdas = Array.from(values);
    vectors = Z.map((z) => {
      const phi = Float64Array.from(z);
      solveLowerTransposeInPlace(massL as Float64Array, n, phi);
      return phi;
    });
    // The reduction with M resolves λ to eps·λ_max absolutely, so on an ill-conditioned model
    // the lowest modes lose digits. The reduction with K (μ = 1/λ) resolves them to eps·λ
    // relative instead: use it for the lower half of the spectrum when K is positive definite.
    const positive = lambdas.filter((l) => l > 0);
    const lmax = lambdas[n - 1] as number;
    const lmin = positive.length > 0 ? Math.min(...positive) : 0;
    if (lmin > 0 && lmax / lmin > 1e4) {
      let stiffL: Float64Array | null = null;
      try {
        stiffL = denseCholesky(Kd).L;
      } catch (e) {
        if (!(e instanceof EngineError) || e.code !== 'ZERO_PIVOT') throw e;
      }
      if (stiffL) {
        const split = Math.sqrt(lmin * lmax);
        const lowCount = lambdas.filter((l) => l < split).length;
        const needed = Math.min(lowCount, input.count);
        if (needed > 0) {
          const Cm = congruence(stiffL, Md.data, n);
          const { values: mu, vectors: Y } = symmetricEigen(Cm);
          for (let r = 0; r < needed; r++) {
            const k = n - 1 - r; // largest μ first = lowest λ
            const m = mu[k] as number;
            const phi = Float64Array.from(Y[k] as Float64Array);
            solveLowerTransposeInPlace(stiffL, n, phi);
            const c = 1 / Math.sqrt(m);
            for (let i = 0; i < n; i++) phi[i] = (phi[i] as number) * c;
            lambdas[r] = 1 / m;
            vectors[r] = phi;
          }
          notes.push(
            `Dense: λ_max/λ₁ ≈ ${(lmax / lmin).toPrecision(2)}, so the ${needed} lowest mode${needed === 1 ? '' : 's'} came from the reduction with K (accurate relative to λ) and the rest from the reduction with M.`,
          );
        }
      }
    }
  } else {
    // M singular: reduce with a positive definite A = K − σM.
    const dg = diagonalOf(input.M);
    const dk = diagonalOf(input.K);
    let s = 0;
    for (let i = 0; i < n; i++)
      if ((dg[i] as number) > 0) s = Math.max(s, (dk[i] as number) / (dg[i] as number));
    let sigma = 0;
    let AL: Float64Array | null = null;
    for (const trial of [0, -1e-10 * s, -1e-8 * s, -1e-6 * s]) {
      try {
        AL = denseCholesky(trial === 0 ? Kd : toDense(combine(input.K, 1, input.M, -trial))).L;
        sigma = trial;
        break;
      } catch (e) {
        if (!(e instanceof EngineError) || e.code !== 'ZERO_PIVOT') throw e;
      }
    }
    if (!AL) {
      throw new EngineError(
        'STIFFNESS_SINGULAR',
        'Both K and M are singular and K − σM is not positive definite for any small negative σ: a DOF has neither stiffness nor mass, or K is not positive semi-definite.',
      );
    }
    const C = congruence(AL, Md.data, n);
    const { values, vectors: Z } = symmetricEigen(C);
    const muMax = Math.max(...Array.from(values).map(Math.abs), 0);
    const pairs: { lambda: number; phi: Float64Array }[] = [];
    let dropped = 0;
    for (let k = 0; k < n; k++) {
      const mu = values[k] as number;
      if (!(mu > 1e-13 * muMax)) {
        dropped++;
        continue;
      }
      const phi = Float64Array.from(Z[k] as Float64Array);
      solveLowerTransposeInPlace(AL, n, phi);
      // zᵀz = 1 gives φᵀAφ = 1 and φᵀMφ = μ: rescale to φᵀMφ = 1
      const c = 1 / Math.sqrt(mu);
      for (let i = 0; i < n; i++) phi[i] = (phi[i] as number) * c;
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
