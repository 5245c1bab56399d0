// The parts of the dense solver one by one: the product kernel, the blocked tridiagonalization
// with its back-transformation, and inverse iteration on tridiagonal matrices with known spectra.
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { multiplyAdd } from '../../../core/linalg/dense-kernels';
import { symmetricEigenColumns } from '../../../core/eigen/dense/symmetric-eigen';
import { tridiagonalEigenvectors } from '../../../core/eigen/dense/tridiagonal-vectors';
import { backTransform, tridiagonalize } from '../../../core/eigen/dense/tridiagonalize';
import { seededRandom } from '../../../core/eigen/random';

function randomSymmetric(n: number, seed: number): Float64Array {
  const rand = seededRandom(seed);
  const A = new Float64Array(n * n);
  for (let i = 0; i < n; i++)
    for (let j = i; j < n; j++) {
      const v = 2 * rand() - 1;
      A[i * n + j] = v;
      A[j * n + i] = v;
    }
  return A;
}

/** max |ZᵀZ − I| over the columns of Z (n × n, row-major). */
function orthogonalityError(Z: Float64Array, n: number): number {
  let worst = 0;
  for (let a = 0; a < n; a++)
    for (let b = a; b < n; b++) {
      let s = 0;
      for (let i = 0; i < n; i++) s += (Z[i * n + a] as number) * (Z[i * n + b] as number);
      worst = Math.max(worst, Math.abs(s - (a === b ? 1 : 0)));
    }
  return worst;
}

/** max_k ‖T z_k − λ_k z_k‖∞ for the tridiagonal T = (d, e). */
function tridiagonalResidual(
  d: Float64Array,
  e: Float64Array,
  values: Float64Array,
  Z: Float64Array,
): number {
  const n = d.length;
  let worst = 0;
  for (let k = 0; k < n; k++)
    for (let i = 0; i < n; i++) {
      let t = (d[i] as number) * (Z[i * n + k] as number);
      if (i > 0) t += (e[i - 1] as number) * (Z[(i - 1) * n + k] as number);
      if (i < n - 1) t += (e[i] as number) * (Z[(i + 1) * n + k] as number);
      worst = Math.max(worst, Math.abs(t - (values[k] as number) * (Z[i * n + k] as number)));
    }
  return worst;
}

describe('multiplyAdd (the register-blocked product kernel)', () => {
  it('matches the triple loop C += s·P U on every remainder of its 16 × 8, 8 × 4 and 4 × 4 blocking, inside larger arrays', () => {
    // the definition of the product (common practice); shapes chosen to leave every remainder
    const rand = seededRandom(3);
    for (const rows of [1, 3, 4, 7, 8, 9, 13, 16, 17, 29, 40]) {
      for (const terms of [1, 3, 4, 5, 8, 11, 16, 19]) {
        const cols = 17;
        const [c0, c1] = [2, 15];
        const C = Float64Array.from({ length: (rows + 1) * cols + 5 }, () => rand());
        const P = Float64Array.from({ length: (rows + 2) * (terms + 3) }, () => rand());
        const U = Float64Array.from({ length: (terms + 1) * (cols + 2) + 4 }, () => rand());
        const expected = C.slice();
        const s = -2.5;
        for (let i = 0; i < rows; i++)
          for (let c = c0; c < c1; c++) {
            let acc = 0;
            for (let k = 0; k < terms; k++)
              acc += (P[3 + i * (terms + 3) + k] as number) * (U[4 + k * (cols + 2) + c] as number);
            expected[5 + i * cols + c] = (expected[5 + i * cols + c] as number) + s * acc;
          }
        multiplyAdd(
          { data: C, offset: 5, stride: cols },
          { data: P, offset: 3, stride: terms + 3 },
          { data: U, offset: 4, stride: cols + 2 },
          rows,
          terms,
          c0,
          c1,
          s,
        );
        C.forEach((v, i) => expect(v).toBeCloseTo(expected[i] as number, 12));
      }
    }
  });
});

describe('tridiagonalize and backTransform (blocked Householder, compact WY)', () => {
  it('gives an orthogonal Q with Qᵀ A Q = T across panel boundaries', () => {
    // An orthogonal similarity is what the reduction is (Golub & Van Loan, 4th ed., §8.3.1); the
    // sizes straddle the 32-reflector panel.
    for (const n of [1, 2, 3, 31, 33, 70]) {
      const A = randomSymmetric(n, n + 11);
      const R = A.slice();
      const { d, e, tau } = tridiagonalize(n, R);
      const Q = new Float64Array(n * n);
      for (let i = 0; i < n; i++) Q[i * n + i] = 1;
      backTransform(n, R, tau, Q, n);
      expect(orthogonalityError(Q, n)).toBeLessThan(1e-14 * Math.max(n, 10));
      // (Qᵀ A Q)(i, j) against T
      let worst = 0;
      for (let i = 0; i < n; i++)
        for (let j = 0; j < n; j++) {
          let s = 0;
          for (let a = 0; a < n; a++) {
            let t = 0;
            for (let b = 0; b < n; b++) t += (A[a * n + b] as number) * (Q[b * n + j] as number);
            s += (Q[a * n + i] as number) * t;
          }
          const tij =
            i === j ? (d[i] as number) : Math.abs(i - j) === 1 ? (e[Math.min(i, j)] as number) : 0;
          worst = Math.max(worst, Math.abs(s - tij));
        }
      expect(worst).toBeLessThan(1e-14 * Math.max(n, 10));
    }
  });
});

describe('tridiagonalEigenvectors (inverse iteration after the eigenvalues)', () => {
  it('reproduces the closed form of the second-difference matrix tridiag(−1, 2, −1)', () => {
    // λ_k = 2 − 2 cos(kπ/(n+1)), v_k(i) = sin(i k π/(n+1)) (the discrete Laplacian; Strang,
    // *Introduction to Applied Mathematics*, 1986, §1.5 — from memory). Its spectrum crowds at
    // both ends, where the neighbours fall inside the orthogonalization window.
    const n = 400;
    const d = new Float64Array(n).fill(2);
    const e = new Float64Array(n - 1).fill(-1);
    const sys = tridiagonalEigenvectors(d, e);
    expect(sys).not.toBeNull();
    const { values, Z } = sys!;
    for (let k = 0; k < n; k++) {
      const exact = 2 - 2 * Math.cos(((k + 1) * Math.PI) / (n + 1));
      expect(Math.abs((values[k] as number) - exact)).toBeLessThan(1e-14 * 4);
      let norm = 0;
      for (let i = 0; i < n; i++) norm += Math.sin(((i + 1) * (k + 1) * Math.PI) / (n + 1)) ** 2;
      const sign = Math.sign(Z[k] as number) || 1; // component 0 of vector k
      for (let i = 0; i < n; i += 37) {
        const v = Math.sin(((i + 1) * (k + 1) * Math.PI) / (n + 1)) / Math.sqrt(norm);
        // the eigenvalue gaps near the ends are ~1e-4: the vectors are good to eps/gap
        expect(Math.abs(sign * (Z[i * n + k] as number) - v)).toBeLessThan(1e-10);
      }
    }
    expect(orthogonalityError(Z, n)).toBeLessThan(1e-12);
    expect(tridiagonalResidual(d, e, values, Z)).toBeLessThan(1e-14 * 4 * 10);
  });

  it("separates Wilkinson's W₂₁⁺, whose eigenvalues come in pairs equal to 14 digits", () => {
    // d_i = |10 − i|, e_i = 1 (Wilkinson, *The Algebraic Eigenvalue Problem*, 1965, ch. 5 §45 —
    // from memory): the largest pair is 10.7461941829033… in both members. The values are checked
    // against ml-matrix's symmetric solver (REFERENCES.md item 5).
    const n = 21;
    const d = Float64Array.from({ length: n }, (_, i) => Math.abs(10 - i));
    const e = new Float64Array(n - 1).fill(1);
    const sys = tridiagonalEigenvectors(d, e);
    expect(sys).not.toBeNull();
    const { values, Z } = sys!;
    expect(values[n - 1] as number).toBeCloseTo(10.7461941829033, 12);
    expect(values[n - 2] as number).toBeCloseTo(10.7461941829033, 12);
    const T = Matrix.zeros(n, n);
    for (let i = 0; i < n; i++) T.set(i, i, d[i] as number);
    for (let i = 0; i < n - 1; i++) {
      T.set(i, i + 1, 1);
      T.set(i + 1, i, 1);
    }
    const ref = new EigenvalueDecomposition(T, { assumeSymmetric: true }).realEigenvalues.sort(
      (a, b) => a - b,
    );
    values.forEach((v, k) => expect(Math.abs(v - (ref[k] as number))).toBeLessThan(1e-13));
    // the two vectors of each pair are orthogonal although their eigenvalues agree to 1e-14
    expect(orthogonalityError(Z, n)).toBeLessThan(1e-13);
    expect(tridiagonalResidual(d, e, values, Z)).toBeLessThan(1e-13);
  });

  it('splits T where an off-diagonal vanishes: two equal blocks give double eigenvalues, each vector in one block', () => {
    // Two copies of tridiag(−1, 2, −1) of size 5, decoupled: the spectrum is the closed form
    // above, each value twice (the direct sum of the blocks).
    const m = 5;
    const n = 2 * m;
    const d = new Float64Array(n).fill(2);
    const e = new Float64Array(n - 1).fill(-1);
    e[m - 1] = 0;
    const { values, Z } = tridiagonalEigenvectors(d, e)!;
    for (let k = 0; k < m; k++) {
      const exact = 2 - 2 * Math.cos(((k + 1) * Math.PI) / (m + 1));
      expect(values[2 * k] as number).toBeCloseTo(exact, 14);
      expect(values[2 * k + 1] as number).toBeCloseTo(exact, 14);
    }
    for (let k = 0; k < n; k++) {
      let top = 0;
      let bottom = 0;
      for (let i = 0; i < n; i++) {
        if (i < m) top += (Z[i * n + k] as number) ** 2;
        else bottom += (Z[i * n + k] as number) ** 2;
      }
      expect(Math.min(top, bottom)).toBe(0);
    }
    expect(orthogonalityError(Z, n)).toBeLessThan(1e-14);
  });
});

describe('symmetricEigenColumns: the inverse-iteration route against the QL fallback', () => {
  it('gives the same eigenvalues and the same eigenvectors up to sign on a random 150 × 150 matrix', () => {
    // The QL iteration with accumulated rotations (Wilkinson & Reinsch's tql2) is the reference
    // route; both start from the same tridiagonalization.
    const n = 150;
    const A = randomSymmetric(n, 77);
    const m = { kind: 'dense' as const, rows: n, cols: n, data: A };
    const fast = symmetricEigenColumns(m);
    const ql = symmetricEigenColumns(m, { tridiagonalVectors: 'ql' });
    for (let r = 0; r < n; r++) {
      expect(Math.abs((fast.values[r] as number) - (ql.values[r] as number))).toBeLessThan(1e-13);
      const a = fast.order[r] as number;
      const b = ql.order[r] as number;
      let dot = 0;
      for (let i = 0; i < n; i++)
        dot += (fast.Z[i * n + a] as number) * (ql.Z[i * n + b] as number);
      // |cos| of the angle between them; the smallest gap of this spectrum is about 1e-3
      expect(Math.abs(Math.abs(dot) - 1)).toBeLessThan(1e-10);
    }
  });
});
