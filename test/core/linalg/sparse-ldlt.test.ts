import { describe, expect, it } from 'vitest';
import { EigenvalueDecomposition, Matrix, solve as mlSolve } from 'ml-matrix';
import {
  analyzeSparseLdlt,
  createShiftedPencil,
  factorizeSparseLdlt,
  multiplyLower,
  orderNestedDissection,
} from '../../../core/linalg/sparse-ldlt';
import type { SparseSymmetricMatrix } from '../../../core/linalg/types';
import { EngineError } from '../../../core/errors';

// Seeded generator (mulberry32), so every random matrix here is reproducible.
function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function fromDense(n: number, a: Float64Array): SparseSymmetricMatrix {
  const colPtr = new Int32Array(n + 1);
  const rows: number[] = [];
  const vals: number[] = [];
  for (let j = 0; j < n; j++) {
    for (let i = j; i < n; i++) {
      const v = a[i * n + j]!;
      if (v !== 0 || i === j) {
        rows.push(i);
        vals.push(v);
      }
    }
    colPtr[j + 1] = rows.length;
  }
  return {
    kind: 'sparse-symmetric',
    n,
    colPtr,
    rowIdx: Int32Array.from(rows),
    values: Float64Array.from(vals),
  };
}

/** A random sparse symmetric matrix, dense storage, with `density` off-diagonal fill. */
function randomSparse(n: number, density: number, seed: number, diagShift: number): Float64Array {
  const r = rng(seed);
  const a = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < i; j++) {
      if (r() < density) {
        const v = 2 * r() - 1;
        a[i * n + j] = v;
        a[j * n + i] = v;
      }
    }
  }
  // Diagonal: row sums of |a| plus diagShift (diagShift > 0: diagonally dominant, so SPD).
  for (let i = 0; i < n; i++) {
    let s = 0;
    for (let j = 0; j < n; j++) if (j !== i) s += Math.abs(a[i * n + j]!);
    a[i * n + i] = s + diagShift;
  }
  return a;
}

function toMl(n: number, a: Float64Array): Matrix {
  const m = new Matrix(n, n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) m.set(i, j, a[i * n + j]!);
  return m;
}

function relDiff(x: Float64Array, y: ArrayLike<number>): number {
  let num = 0;
  let den = 0;
  for (let i = 0; i < x.length; i++) {
    num = Math.max(num, Math.abs(x[i]! - y[i]!));
    den = Math.max(den, Math.abs(y[i]!));
  }
  return num / den;
}

describe('factorizeSparseLdlt', () => {
  it('solves random sparse SPD systems like a dense solver (ml-matrix LU) and has no negative pivots', () => {
    for (const [n, density, seed] of [
      [50, 0.08, 1],
      [200, 0.02, 2],
      [400, 0.01, 3],
    ] as const) {
      const a = randomSparse(n, density, seed, 1);
      const A = fromDense(n, a);
      const f = factorizeSparseLdlt(A);
      const r = rng(seed + 100);
      const b = Float64Array.from({ length: n }, () => r() - 0.5);
      const x = f.solve(b);
      const ref = mlSolve(toMl(n, a), Matrix.columnVector(Array.from(b))).getColumn(0);
      // Diagonally dominant matrices are well conditioned: 1e-10 relative is generous.
      expect(relDiff(x, ref)).toBeLessThan(1e-10);
      expect(f.negativePivots).toBe(0);
      expect(f.method).toBe('sparse-ldlt');
    }
  });

  it('gives the inertia of indefinite matrices (negative pivots = negative eigenvalues from ml-matrix)', () => {
    for (const [n, density, seed, shift] of [
      [60, 0.1, 11, -2],
      [150, 0.03, 12, -0.7],
      [300, 0.02, 13, -1.3],
    ] as const) {
      const a = randomSparse(n, density, seed, 0);
      for (let i = 0; i < n; i++) a[i * n + i]! += shift; // indefinite: A − |shift| I
      const eig = new EigenvalueDecomposition(toMl(n, a)).realEigenvalues;
      const negatives = eig.filter((v) => v < 0).length;
      // Guard that the test matrix is genuinely indefinite and not near-singular.
      expect(negatives).toBeGreaterThan(0);
      expect(negatives).toBeLessThan(n);
      expect(Math.min(...eig.map(Math.abs))).toBeGreaterThan(1e-6);
      const A = fromDense(n, a);
      const f = factorizeSparseLdlt(A);
      expect(f.negativePivots).toBe(negatives);
      const r = rng(seed);
      const b = Float64Array.from({ length: n }, () => r() - 0.5);
      const x = f.solve(b);
      // Residual check: ‖A x − b‖∞ / ‖b‖∞ (no pivoting; 1e-8 allows modest growth).
      const ax = multiplyLower(A, x);
      expect(relDiff(ax, b)).toBeLessThan(1e-8);
    }
  });

  it('reuses one symbolic analysis for every shift of K − σM (Sturm counts of a fixed–free chain)', () => {
    // Fixed–free chain of N unit masses and unit springs: λ_n = 4 sin²((2n−1)π/(2(2N+1)))
    // (REFERENCES.md item 2, classical).
    const N = 2000;
    const K = chain(N);
    const M = identity(N);
    const pencil = createShiftedPencil(K, M);
    const lam = (j: number): number =>
      4 * Math.sin(((2 * j - 1) * Math.PI) / (2 * (2 * N + 1))) ** 2;
    for (const j of [1, 5, 37, 1000, 1999]) {
      const between = 0.5 * (lam(j) + lam(j + 1));
      expect(pencil.factorize(between).negativePivots).toBe(j);
    }
    expect(pencil.factorize(5).negativePivots).toBe(N); // beyond λ_max < 4
    expect(pencil.factorize(-1).negativePivots).toBe(0);
  });

  it('gives the same solution and inertia with the multifrontal and the up-looking kernels', () => {
    // Two independent numeric algorithms on the same symbolic analysis (a 2D grid shifted to be
    // indefinite): solutions agree to 1e-10 relative, negative pivots exactly.
    const A0 = grid(40);
    const A = { ...A0, values: Float64Array.from(A0.values) };
    for (let j = 0; j < A.n; j++) A.values[A.colPtr[j]!]! -= 1.3; // 4 − 1.3 on the diagonal
    const sym = analyzeSparseLdlt(A);
    const mf = factorizeSparseLdlt(A, { symbolic: sym, kernel: 'multifrontal' });
    const up = factorizeSparseLdlt(A, { symbolic: sym, kernel: 'up-looking' });
    expect(mf.negativePivots).toBe(up.negativePivots);
    expect(mf.negativePivots).toBeGreaterThan(0);
    const r = rng(5);
    const b = Float64Array.from({ length: A.n }, () => r() - 0.5);
    expect(relDiff(mf.solve(b), up.solve(b))).toBeLessThan(1e-10);
  });

  it('counts the eigenvalues of the two-storey shear frame below shifts between and beyond them', () => {
    // REFERENCES.md item 3 (Chopra, two-storey example, from memory): masses 2m and m, storey
    // stiffnesses 2k and k; ω₁² = k/(2m), ω₂² = 2k/m. Sylvester's law: negative pivots of K − σM
    // = eigenvalues below σ.
    const m = 1.5e5; // kg
    const k = 6e7; // N/m
    const K = fromDense(2, Float64Array.from([3 * k, -k, -k, k]));
    const M = fromDense(2, Float64Array.from([2 * m, 0, 0, m]));
    const l1 = k / (2 * m);
    const l2 = (2 * k) / m;
    const pencil = createShiftedPencil(K, M);
    expect(pencil.factorize(0.5 * l1).negativePivots).toBe(0);
    expect(pencil.factorize(l1 * (1 + 1e-9)).negativePivots).toBe(1);
    expect(pencil.factorize(l1 * (1 - 1e-9)).negativePivots).toBe(0);
    expect(pencil.factorize(0.5 * (l1 + l2)).negativePivots).toBe(1);
    expect(pencil.factorize(l2 * (1 + 1e-9)).negativePivots).toBe(2);
    expect(pencil.factorize(10 * l2).negativePivots).toBe(2);
    // A result truncated to one mode is caught: the count just above λ₂ says two.
    const found = [l1];
    expect(pencil.factorize(l2 * (1 + 1e-6)).negativePivots - found.length).toBe(1);
  });

  it('reports a zero pivot with the 1-based DOF in the original numbering', () => {
    // Free–free chain (N − 1 springs): K is singular (rigid-body mode); natural order puts the
    // vanishing pivot on the last DOF.
    const n = 6;
    const a = new Float64Array(n * n);
    for (let e = 0; e < n - 1; e++) {
      a[e * n + e]! += 1;
      a[(e + 1) * n + e + 1]! += 1;
      a[e * n + e + 1]! -= 1;
      a[(e + 1) * n + e]! -= 1;
    }
    const A = fromDense(n, a);
    let err: unknown;
    try {
      factorizeSparseLdlt(A, { symbolic: analyzeSparseLdlt(A, { ordering: 'natural' }) });
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(EngineError);
    expect((err as EngineError).code).toBe('ZERO_PIVOT');
    expect((err as EngineError).details).toEqual(expect.objectContaining({ dof: 6 }));
    expect((err as EngineError).message).toMatch(/DOF 6/);
  });

  it('refuses a model above the memory limit with the estimate in MB, before factoring', () => {
    const A = chain(10_000);
    const sym = analyzeSparseLdlt(A);
    expect(sym.memoryEstimateBytes).toBeGreaterThan(0);
    let err: unknown;
    try {
      factorizeSparseLdlt(A, { memoryLimitBytes: 1000 });
    } catch (e) {
      err = e;
    }
    expect((err as EngineError).code).toBe('MODEL_TOO_LARGE');
    expect((err as EngineError).message).toMatch(/about \d+ MB/);
  });

  it('refuses a symbolic analysis made for another pattern', () => {
    const sym = analyzeSparseLdlt(chain(10));
    expect(() => factorizeSparseLdlt(identity(10), { symbolic: sym })).toThrow(
      /different sparsity/,
    );
  });

  it('keeps fill low on a 2D grid (nested dissection beats the natural band order)', () => {
    // 5-point Laplacian on a 60×60 grid: natural (band) order fills ~n·60; nested dissection is
    // O(n log n) (George 1973). We require at least 25 % less fill than the band.
    const g = 60;
    const A = grid(g);
    const nd = analyzeSparseLdlt(A);
    const nat = analyzeSparseLdlt(A, { ordering: 'natural' });
    expect(nd.factorNonzeros).toBeLessThan(0.75 * nat.factorNonzeros);
    const perm = orderNestedDissection(A);
    expect(Array.from(perm).sort((x, y) => x - y)).toEqual(
      Array.from({ length: g * g }, (_, i) => i),
    );
    // And the factor of the grid solves: A x = A·1 gives x = 1 to 1e-10.
    const ones = new Float64Array(g * g).fill(1);
    const x = factorizeSparseLdlt(A).solve(multiplyLower(A, ones));
    expect(relDiff(x, ones)).toBeLessThan(1e-10);
  });
});

function chain(n: number): SparseSymmetricMatrix {
  // Fixed–free chain, unit springs: diag 2 (last 1), off-diagonal −1.
  const colPtr = new Int32Array(n + 1);
  const rowIdx: number[] = [];
  const values: number[] = [];
  for (let j = 0; j < n; j++) {
    rowIdx.push(j);
    values.push(j === n - 1 ? 1 : 2);
    if (j + 1 < n) {
      rowIdx.push(j + 1);
      values.push(-1);
    }
    colPtr[j + 1] = rowIdx.length;
  }
  return {
    kind: 'sparse-symmetric',
    n,
    colPtr,
    rowIdx: Int32Array.from(rowIdx),
    values: Float64Array.from(values),
  };
}

function identity(n: number): SparseSymmetricMatrix {
  return {
    kind: 'sparse-symmetric',
    n,
    colPtr: Int32Array.from({ length: n + 1 }, (_, i) => i),
    rowIdx: Int32Array.from({ length: n }, (_, i) => i),
    values: new Float64Array(n).fill(1),
  };
}

function grid(g: number): SparseSymmetricMatrix {
  const n = g * g;
  const colPtr = new Int32Array(n + 1);
  const rowIdx: number[] = [];
  const values: number[] = [];
  for (let j = 0; j < n; j++) {
    const x = j % g;
    const y = Math.floor(j / g);
    rowIdx.push(j);
    values.push(4);
    if (x + 1 < g) {
      rowIdx.push(j + 1);
      values.push(-1);
    }
    if (y + 1 < g) {
      rowIdx.push(j + g);
      values.push(-1);
    }
    colPtr[j + 1] = rowIdx.length;
  }
  return {
    kind: 'sparse-symmetric',
    n,
    colPtr,
    rowIdx: Int32Array.from(rowIdx),
    values: Float64Array.from(values),
  };
}
