/**
 * Relative accuracy for the lowest modes of an ill-conditioned pencil, after the reduction with M.
 *
 * The reduction C = L⁻¹ K L⁻ᵀ resolves every λ to about eps·λ_max absolutely, so a mode with
 * λ ≪ λ_max keeps only log10(λ/(eps·λ_max)) digits. Those modes are refined by block inverse
 * (subspace) iteration with K's factorization, started from the reduction's own vectors, with a
 * Rayleigh–Ritz step in the inverse form M y = μ K y (μ = 1/λ) after every block solve (Bathe,
 * *Finite Element Procedures*, 2nd ed., §11.6; Golub & Van Loan, 4th ed., §8.2.4 and §8.7).
 * In the inverse form the largest μ — the lowest λ — are resolved relative to themselves, as a
 * full reduction with K's Cholesky factor would give them, at the cost of a few sparse solves.
 */
import { denseCholesky } from '../../linalg/dense';
import { symmetricMultiply } from '../../linalg/sparse';
import type { SymmetricFactorization, SymmetricMatrix } from '../../linalg/types';
import { symmetricEigen } from './symmetric-eigen';

/** What `refineLowModes` returns: the refined lowest `lambdas.length` modes, M-normalized. */
export interface RefinedModes {
  lambdas: number[];
  vectors: Float64Array[];
  iterations: number;
}

/**
 * Refines the lowest `count` modes of K φ = λ M φ by subspace iteration with the factorization
 * F of K (positive definite), starting from `start` (at least `count` approximate modes, lowest
 * first; the extra ones are guard vectors that speed up convergence at the top of the block).
 * Stops when no Ritz value moves by more than 1e-14 relative, or after `maxIterations`.
 * @example refineLowModes(K, M, factorizeSymmetric(K), phis.slice(0, 12), 8, 4)
 */
export function refineLowModes(
  M: SymmetricMatrix,
  F: Pick<SymmetricFactorization, 'n' | 'solve'>,
  start: Float64Array[],
  count: number,
  maxIterations: number,
): RefinedModes {
  const q = start.length;
  const n = F.n;
  let X = start;
  let lambdas = new Array<number>(count).fill(NaN);
  let iterations = 0;
  for (let it = 0; it < maxIterations; it++) {
    iterations++;
    // Y = K⁻¹ M X; then Yᵀ K Y = Yᵀ (M X) needs no product with K (whose large entries would
    // cancel for these smooth vectors).
    const MX = X.map((x) => symmetricMultiply(M, x));
    const Y = MX.map((b) => F.solve(b));
    const MY = Y.map((y) => symmetricMultiply(M, y));
    const A = new Float64Array(q * q); // Yᵀ M Y
    const B = new Float64Array(q * q); // Yᵀ K Y
    for (let i = 0; i < q; i++) {
      const yi = Y[i] as Float64Array;
      for (let j = 0; j <= i; j++) {
        const yj = Y[j] as Float64Array;
        // the loops live in small functions, which the JIT optimizes after a few calls (one
        // long-running loop here would wait for on-stack replacement)
        const a = dot(yi, MY[j] as Float64Array);
        const b = dot(yi, MX[j] as Float64Array) + dot(yj, MX[i] as Float64Array);
        A[i * q + j] = a;
        A[j * q + i] = a;
        B[i * q + j] = 0.5 * b;
        B[j * q + i] = 0.5 * b;
      }
    }
    // M y = μ K y projected: with B = R Rᵀ, (R⁻¹ A R⁻ᵀ) w = μ w and s = R⁻ᵀ w.
    const R = denseCholesky({ kind: 'dense', rows: q, cols: q, data: B }).L;
    const C = new Float64Array(q * q);
    for (let j = 0; j < q; j++) {
      const col = new Float64Array(q);
      for (let i = 0; i < q; i++) col[i] = A[i * q + j] as number;
      forward(R, q, col);
      for (let i = 0; i < q; i++) C[i * q + j] = col[i] as number;
    }
    for (let i = 0; i < q; i++) {
      const row = C.subarray(i * q, i * q + q);
      forward(R, q, row);
    }
    for (let i = 0; i < q; i++)
      for (let j = 0; j < i; j++) {
        const v = 0.5 * ((C[i * q + j] as number) + (C[j * q + i] as number));
        C[i * q + j] = v;
        C[j * q + i] = v;
      }
    const eig = symmetricEigen({ kind: 'dense', rows: q, cols: q, data: C });
    const next: Float64Array[] = [];
    const nextLambdas: number[] = [];
    for (let r = 0; r < q; r++) {
      const k = q - 1 - r; // largest μ first: lowest λ first
      const mu = eig.values[k] as number;
      const s = Float64Array.from(eig.vectors[k] as Float64Array);
      backward(R, q, s);
      // sᵀ B s = 1 gives xᵀ K x = 1 and xᵀ M x = μ: rescale to xᵀ M x = 1
      const c = 1 / Math.sqrt(mu);
      const x = new Float64Array(n);
      for (let j = 0; j < q; j++) axpy(x, (s[j] as number) * c, Y[j] as Float64Array);
      next.push(x);
      nextLambdas.push(1 / mu);
    }
    let change = 0;
    for (let r = 0; r < count; r++) {
      const prev = lambdas[r] as number;
      const now = nextLambdas[r] as number;
      change = Math.max(change, Number.isNaN(prev) ? Infinity : Math.abs(now - prev) / now);
    }
    X = next;
    lambdas = nextLambdas.slice(0, count);
    if (change <= 1e-14) break;
  }
  return { lambdas, vectors: X.slice(0, count), iterations };
}

function dot(x: Float64Array, y: Float64Array): number {
  let s = 0;
  for (let k = 0; k < x.length; k++) s += (x[k] as number) * (y[k] as number);
  return s;
}

/** x += a y */
function axpy(x: Float64Array, a: number, y: Float64Array): void {
  for (let k = 0; k < x.length; k++) x[k] = (x[k] as number) + a * (y[k] as number);
}

/** Solves R x = x in place, R lower triangular row-major q × q. */
function forward(R: Float64Array, q: number, x: Float64Array): void {
  for (let i = 0; i < q; i++) {
    let s = x[i] as number;
    for (let k = 0; k < i; k++) s -= (R[i * q + k] as number) * (x[k] as number);
    x[i] = s / (R[i * q + i] as number);
  }
}

/** Solves Rᵀ x = x in place. */
function backward(R: Float64Array, q: number, x: Float64Array): void {
  for (let i = q - 1; i >= 0; i--) {
    const xi = (x[i] as number) / (R[i * q + i] as number);
    x[i] = xi;
    for (let k = 0; k < i; k++) x[k] = (x[k] as number) - (R[i * q + k] as number) * xi;
  }
}
