import { EigenvalueDecomposition, Matrix, QrDecomposition } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import {
  denseEigensolver,
  symmetricEigen,
  tridiagonalQL,
} from '../../../core/eigen/dense-eigensolver';
import { seededRandom } from '../../../core/eigen/random';
import { EngineError } from '../../../core/errors';
import type { DenseMatrix, SparseSymmetricMatrix } from '../../../core/linalg/types';
import { addEntry, chain, chainLambda, input, lowerFromEntries } from './pencils';
import { checkPairs, mlMatrixEigenvalues } from './reference-pencils';

function dense(n: number, at: (i: number, j: number) => number): DenseMatrix {
  const data = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) data[i * n + j] = at(i, j);
  return { kind: 'dense', rows: n, cols: n, data };
}

/** max |VᵀV − I| and max |A v_k − λ_k v_k| / ‖A‖_max for a decomposition of A. */
function identities(
  A: DenseMatrix,
  values: Float64Array,
  vectors: Float64Array[],
): { orth: number; resid: number } {
  const n = A.rows;
  let orth = 0;
  for (let a = 0; a < n; a++)
    for (let b = 0; b <= a; b++) {
      let s = 0;
      const va = vectors[a] as Float64Array;
      const vb = vectors[b] as Float64Array;
      for (let i = 0; i < n; i++) s += (va[i] as number) * (vb[i] as number);
      orth = Math.max(orth, Math.abs(s - (a === b ? 1 : 0)));
    }
  let amax = 0;
  for (const v of A.data) amax = Math.max(amax, Math.abs(v));
  let resid = 0;
  vectors.forEach((v, k) => {
    for (let i = 0; i < n; i++) {
      let s = 0;
      for (let j = 0; j < n; j++) s += (A.data[i * n + j] as number) * (v[j] as number);
      resid = Math.max(resid, Math.abs(s - (values[k] as number) * (v[i] as number)) / amax);
    }
  });
  return { orth, resid };
}

/**
 * Number of eigenvalues of the tridiagonal (d, e) below x by the Sturm sequence of its LDLᵀ
 * pivots, and the eigenvalues by bisection on that count (Golub & Van Loan, 4th ed., §8.4.1):
 * an independent reference for the QL iteration.
 */
function bisectionEigenvalues(d: number[], e: number[]): number[] {
  const n = d.length;
  const below = (x: number): number => {
    let count = 0;
    let q = 1;
    for (let i = 0; i < n; i++) {
      const off = i > 0 ? (e[i - 1] as number) ** 2 : 0;
      q = (d[i] as number) - x - (i > 0 ? off / q : 0);
      if (q === 0) q = -1e-300;
      if (q < 0) count++;
    }
    return count;
  };
  let bound = 0;
  for (let i = 0; i < n; i++)
    bound = Math.max(
      bound,
      Math.abs(d[i] as number) + Math.abs(e[i - 1] ?? 0) + Math.abs(e[i] ?? 0),
    );
  const out: number[] = [];
  for (let k = 0; k < n; k++) {
    let lo = -bound;
    let hi = bound;
    for (let it = 0; it < 200 && hi - lo > 1e-15 * bound; it++) {
      const mid = 0.5 * (lo + hi);
      if (below(mid) > k) hi = mid;
      else lo = mid;
    }
    out.push(0.5 * (lo + hi));
  }
  return out;
}

/** The tridiagonal QL on (d, e) from the identity: ascending values and the vectors (columns). */
function tridiagonalEigen(d: number[], e: number[]): { values: number[]; vectors: number[][] } {
  const n = d.length;
  const dd = Float64Array.from(d);
  const ee = new Float64Array(n);
  e.forEach((v, i) => (ee[i] = v));
  const Z = new Float64Array(n * n);
  for (let i = 0; i < n; i++) Z[i * n + i] = 1;
  tridiagonalQL(dd, ee, Z, n);
  const order = Array.from({ length: n }, (_, k) => k).sort(
    (a, b) => (dd[a] as number) - (dd[b] as number),
  );
  return {
    values: order.map((k) => dd[k] as number),
    vectors: order.map((k) => Array.from({ length: n }, (_, i) => Z[i * n + k] as number)),
  };
}

describe('tridiagonalQL (implicit QL with batched sweeps)', () => {
  it('gives the second-difference matrix its closed-form eigenpairs', () => {
    // tridiag(−1, 2, −1) of order n: λ_k = 2 − 2 cos(kπ/(n+1)), v_k(j) ∝ sin(jkπ/(n+1))
    // (common closed form).
    const n = 120;
    const { values, vectors } = tridiagonalEigen(
      new Array<number>(n).fill(2),
      new Array<number>(n - 1).fill(-1),
    );
    for (let k = 1; k <= n; k++) {
      const exact = 2 - 2 * Math.cos((k * Math.PI) / (n + 1));
      // 1e-14 absolute: the QL iteration is backward stable with ‖T‖ ≤ 4
      expect(Math.abs((values[k - 1] as number) - exact)).toBeLessThan(1e-14);
      const v = vectors[k - 1] as number[];
      const norm = Math.sqrt(2 / (n + 1));
      const sign = Math.sign(v[0] as number);
      for (let j = 1; j <= n; j += 17) {
        const expected = norm * Math.sin((j * k * Math.PI) / (n + 1));
        // 1e-12: vector accuracy ≈ eps‖T‖ / gap with gaps ≥ 7e-4 here
        expect(Math.abs(sign * (v[j - 1] as number) - expected)).toBeLessThan(1e-12);
      }
    }
  });

  it('resolves the close top pair of Wilkinson W21+ and matches bisection', () => {
    // W21+: diagonal |10 − i| for i = 0..20, off-diagonal 1. Its two largest eigenvalues agree to
    // about 13 digits, ≈ 10.7461941829034 (from memory; the test uses bisection as reference).
    const d = Array.from({ length: 21 }, (_, i) => Math.abs(10 - i));
    const e = new Array<number>(20).fill(1);
    const { values, vectors } = tridiagonalEigen(d, e);
    const ref = bisectionEigenvalues(d, e);
    values.forEach((v, k) => expect(Math.abs(v - (ref[k] as number))).toBeLessThan(1e-13));
    expect(Math.abs((values[20] as number) - 10.7461941829034)).toBeLessThan(1e-12);
    expect((values[20] as number) - (values[19] as number)).toBeLessThan(1e-11);
    // the pair is still given two orthonormal vectors
    const a = vectors[19] as number[];
    const b = vectors[20] as number[];
    let ab = 0;
    let aa = 0;
    let bb = 0;
    for (let i = 0; i < 21; i++) {
      ab += (a[i] as number) * (b[i] as number);
      aa += (a[i] as number) ** 2;
      bb += (b[i] as number) ** 2;
    }
    // 1e-14: orthogonality of a product of plane rotations, n = 21
    expect(Math.abs(ab)).toBeLessThan(1e-14);
    expect(Math.abs(aa - 1)).toBeLessThan(1e-14);
    expect(Math.abs(bb - 1)).toBeLessThan(1e-14);
  });

  it('needs no sweep on a diagonal matrix and keeps Z unchanged', () => {
    const d = Float64Array.from([3, 1, 2]);
    const e = new Float64Array(3);
    const Z = Float64Array.from([1, 0, 0, 0, 1, 0, 0, 0, 1]);
    tridiagonalQL(d, e, Z, 3);
    expect(Array.from(d)).toEqual([3, 1, 2]);
    expect(Array.from(Z)).toEqual([1, 0, 0, 0, 1, 0, 0, 0, 1]);
  });
});

describe('symmetricEigen (blocked Householder reduction, inverse iteration, WY back-transformation)', () => {
  it('gives the identity one repeated eigenvalue and an orthonormal basis (full deflation)', () => {
    const n = 70;
    const A = dense(n, (i, j) => (i === j ? 1 : 0));
    const { values, vectors } = symmetricEigen(A);
    values.forEach((v) => expect(v).toBe(1));
    const { orth, resid } = identities(A, values, vectors);
    expect(orth).toBeLessThan(1e-15);
    expect(resid).toBeLessThan(1e-15);
  });

  it('handles a matrix with three eigenvalues of multiplicity 40 (heavy deflation)', () => {
    // A = Q diag(1 ×40, 2 ×40, 5 ×40) Qᵀ with Q an orthogonal matrix from ml-matrix's QR.
    const n = 120;
    const rand = seededRandom(5);
    const G = Matrix.zeros(n, n);
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) G.set(i, j, 2 * rand() - 1);
    const Q = new QrDecomposition(G).orthogonalMatrix;
    const spectrum = Array.from({ length: n }, (_, i) => (i < 40 ? 1 : i < 80 ? 2 : 5));
    const Am = Q.mmul(Matrix.diag(spectrum)).mmul(Q.transpose());
    const A = dense(n, (i, j) => 0.5 * (Am.get(i, j) + Am.get(j, i)));
    const { values, vectors } = symmetricEigen(A);
    // 1e-13 absolute: backward stability with ‖A‖ = 5 (the construction itself rounds at 1e-15)
    values.forEach((v, k) => expect(Math.abs(v - (spectrum[k] as number))).toBeLessThan(1e-13));
    const { orth, resid } = identities(A, values, vectors);
    expect(orth).toBeLessThan(1e-13);
    expect(resid).toBeLessThan(1e-13);
  });

  it('keeps ‖VᵀV − I‖ and ‖AV − VΛ‖ at rounding level on a seeded random 300 × 300 matrix', () => {
    const n = 300;
    const rand = seededRandom(23);
    const data = new Float64Array(n * n);
    for (let i = 0; i < n; i++)
      for (let j = 0; j <= i; j++) {
        const v = 2 * rand() - 1;
        data[i * n + j] = v;
        data[j * n + i] = v;
      }
    const A: DenseMatrix = { kind: 'dense', rows: n, cols: n, data };
    const { values, vectors } = symmetricEigen(A);
    for (let k = 1; k < n; k++)
      expect(values[k] as number).toBeGreaterThanOrEqual(values[k - 1] as number);
    const { orth, resid } = identities(A, values, vectors);
    // 1e-12: a few hundred eps for n = 300 (Householder and QL are backward stable)
    expect(orth).toBeLessThan(1e-12);
    expect(resid).toBeLessThan(1e-12);
    // and the values against ml-matrix's symmetric solver (REFERENCES.md item 5), 1e-12 ‖A‖
    const rows = Array.from({ length: n }, (_, i) => Array.from(data.subarray(i * n, i * n + n)));
    const ref = new EigenvalueDecomposition(new Matrix(rows), {
      assumeSymmetric: true,
    }).realEigenvalues
      .slice()
      .sort((a, b) => a - b);
    let amax = 0;
    for (const v of data) amax = Math.max(amax, Math.abs(v));
    values.forEach((v, k) => expect(Math.abs(v - (ref[k] as number)) / amax).toBeLessThan(1e-12));
  });
});

/** A seeded sparse pencil with a scattered pattern (so the band ordering really permutes). */
function scatteredPencil(
  n: number,
  seed: number,
): { K: SparseSymmetricMatrix; M: SparseSymmetricMatrix; Km: Matrix; Mm: Matrix } {
  const r = seededRandom(seed);
  const k = new Map<number, number>();
  const m = new Map<number, number>();
  const add = (map: Map<number, number>, i: number, j: number, v: number): void =>
    addEntry(map, n, i, j, v);
  // a ring of springs visited in a shuffled order, plus a few long links: a banded graph whose
  // natural numbering is scattered
  const order = Array.from({ length: n }, (_, i) => i);
  for (let i = n - 1; i > 0; i--) {
    const j = Math.floor(r() * (i + 1));
    [order[i], order[j]] = [order[j] as number, order[i] as number];
  }
  const link = (a: number, b: number, w: number, c: number): void => {
    add(k, a, a, w);
    add(k, b, b, w);
    add(k, a, b, -w);
    add(m, a, a, 2 * c);
    add(m, b, b, 2 * c);
    add(m, a, b, c); // consistent two-node mass: positive definite
  };
  for (let i = 0; i < n; i++) {
    const a = order[i] as number;
    add(k, a, a, 0.05 + r());
    add(m, a, a, 0.5 + r());
    link(a, order[(i + 1) % n] as number, 0.5 + r(), 0.1 * r());
    if (i % 7 === 0) link(a, order[(i + 3) % n] as number, 0.5 + r(), 0.1 * r());
  }
  const K = lowerFromEntries(n, k);
  const M = lowerFromEntries(n, m);
  const full = (A: SparseSymmetricMatrix): Matrix => {
    const X = Matrix.zeros(n, n);
    for (let j = 0; j < n; j++)
      for (let p = A.colPtr[j] as number; p < (A.colPtr[j + 1] as number); p++) {
        X.set(A.rowIdx[p] as number, j, A.values[p] as number);
        X.set(j, A.rowIdx[p] as number, A.values[p] as number);
      }
    return X;
  };
  return { K, M, Km: full(K), Mm: full(M) };
}

describe('denseEigensolver (band-ordered reduction, low modes refined)', () => {
  for (const [n, seed] of [
    [60, 3],
    [180, 4],
  ] as const) {
    it(`matches ml-matrix on a scattered sparse pencil of ${n} DOFs: λ to 1e-10, ΦᵀMΦ = I, residuals`, () => {
      const { K, M, Km, Mm } = scatteredPencil(n, seed);
      const raw = denseEigensolver(input(K, M, n));
      const ref = mlMatrixEigenvalues(Km, Mm);
      expect(raw.lambdas).toHaveLength(n);
      raw.lambdas.forEach((l, i) =>
        expect(Math.abs(l / (ref[i] as number) - 1)).toBeLessThan(1e-10),
      );
      const { orth, resid } = checkPairs(Km, Mm, raw.lambdas, raw.vectors);
      expect(orth).toBeLessThan(1e-10);
      expect(resid).toBeLessThan(1e-12);
    });
  }

  it('keeps relative accuracy on the lowest modes of a 1000-DOF fixed–free chain (λ_max/λ₁ ≈ 1.6e6)', () => {
    // closed form λ_j = 4 sin²((2j − 1)π / (2(2N + 1))) (REFERENCES.md item 2). Measured: the
    // reduction with M alone misses λ₁ … λ₇ by 9e-11 … 2.3e-12 relative (≈ eps·λ_max/λ_j); the
    // refinement brings λ₁ to 7e-13 and the others below 1e-13, hence 2e-12.
    const N = 1000;
    const { K, M } = chain(N);
    const raw = denseEigensolver(input(K, M, N));
    for (let j = 1; j <= 8; j++) {
      expect(Math.abs((raw.lambdas[j - 1] as number) / chainLambda(N, j) - 1)).toBeLessThan(2e-12);
    }
    // and the top of the spectrum from the reduction with M, 1e-12 relative
    for (const j of [N - 1, N]) {
      expect(Math.abs((raw.lambdas[j - 1] as number) / chainLambda(N, j) - 1)).toBeLessThan(1e-12);
    }
    expect(raw.notes.join(' ')).toMatch(/refined by \d+ steps of subspace iteration/);
    // the refined vectors are mass-normalized and M-orthogonal to the next ones (1e-12)
    for (const [a, b] of [
      [0, 0],
      [0, 1],
      [3, 40],
    ] as const) {
      let s = 0;
      for (let i = 0; i < N; i++)
        s += (raw.vectors[a]?.[i] as number) * (raw.vectors[b]?.[i] as number);
      expect(Math.abs(s - (a === b ? 1 : 0))).toBeLessThan(1e-12);
    }
  });

  it('returns only `count` modes and still refines the low ones', () => {
    const N = 600;
    const { K, M } = chain(N);
    const raw = denseEigensolver(input(K, M, 3));
    expect(raw.lambdas).toHaveLength(3);
    expect(raw.vectors).toHaveLength(3);
    raw.lambdas.forEach((l, i) =>
      expect(Math.abs(l / chainLambda(N, i + 1) - 1)).toBeLessThan(1e-12),
    );
  });

  it('solves a chain with massless nodes between the masses as the condensed chain', () => {
    // ground –k– node –k– mass –k– node –k– mass … : two springs in series between masses, so
    // the finite modes are those of the fixed–free chain with springs k/2 (static condensation,
    // hand computation); the N massless DOFs are infinite-frequency modes and are dropped.
    const N = 150;
    const n = 2 * N;
    const k = new Map<number, number>();
    const m = new Map<number, number>();
    const add = (map: Map<number, number>, i: number, j: number, v: number): void =>
      addEntry(map, n, i, j, v);
    for (let i = 0; i < n; i++) {
      add(k, i, i, 1);
      if (i > 0) {
        add(k, i - 1, i - 1, 1);
        add(k, i, i - 1, -1);
      }
      add(m, i, i, i % 2 === 1 ? 1 : 0);
    }
    const raw = denseEigensolver(input(lowerFromEntries(n, k), lowerFromEntries(n, m), n));
    expect(raw.lambdas).toHaveLength(N);
    for (const j of [1, 2, 3, N - 1, N]) {
      // 1e-10 relative: the reduction with K resolves every mode relative to itself
      expect(Math.abs((raw.lambdas[j - 1] as number) / chainLambda(N, j, 0.5) - 1)).toBeLessThan(
        1e-10,
      );
    }
    expect(raw.notes.join(' ')).toMatch(/150 infinite-frequency modes/);
  });

  it("names the DOF of a negative mass in the caller's numbering", () => {
    const N = 12;
    const { K } = chain(N);
    const m = new Map<number, number>();
    for (let i = 0; i < N; i++) m.set(i * N + i, i === 6 ? -1 : 1);
    try {
      denseEigensolver(input(K, lowerFromEntries(N, m), N));
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(EngineError);
      expect((e as EngineError).code).toBe('MASS_NOT_PSD');
      expect((e as EngineError).message).toMatch(/negative pivot at DOF 7\./);
    }
  });
});
