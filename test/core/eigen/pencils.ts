// Test helpers shared by the subspace-iteration and Lanczos tests: seeded sparse pencils and the
// fixed–free chain of REFERENCES.md item 2.
import type { SparseSymmetricMatrix } from '../../../core/linalg/types';
import type { MethodInput } from '../../../core/eigen/types';

export function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Adds v at (i, j) of a symmetric matrix kept as entries of its lower triangle (key i·n + j, i ≥ j). */
export function addEntry(
  map: Map<number, number>,
  n: number,
  i: number,
  j: number,
  v: number,
): void {
  const key = i >= j ? i * n + j : j * n + i;
  map.set(key, (map.get(key) ?? 0) + v);
}

export function lowerFromEntries(n: number, entries: Map<number, number>): SparseSymmetricMatrix {
  // key = i * n + j with i ≥ j
  const cols: { i: number; v: number }[][] = Array.from({ length: n }, () => []);
  for (const [key, v] of entries) cols[key % n]!.push({ i: Math.floor(key / n), v });
  const colPtr = new Int32Array(n + 1);
  const rows: number[] = [];
  const vals: number[] = [];
  for (let j = 0; j < n; j++) {
    cols[j]!.sort((a, b) => a.i - b.i);
    for (const e of cols[j]!) {
      rows.push(e.i);
      vals.push(e.v);
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

/** A seeded sparse SPD pencil: K a random graph Laplacian plus a diagonal, M diagonally dominant. */
export function randomPencil(
  n: number,
  seed: number,
): { K: SparseSymmetricMatrix; M: SparseSymmetricMatrix } {
  const r = rng(seed);
  const k = new Map<number, number>();
  const m = new Map<number, number>();
  const add = (map: Map<number, number>, i: number, j: number, v: number): void =>
    addEntry(map, n, i, j, v);
  for (let i = 0; i < n; i++) {
    add(k, i, i, 0.1 + r());
    add(m, i, i, 1 + r());
  }
  for (let e = 0; e < 3 * n; e++) {
    const i = Math.floor(r() * n);
    const j = Math.floor(r() * n);
    if (i === j) continue;
    const w = 0.5 + r();
    add(k, i, i, w);
    add(k, j, j, w);
    add(k, i, j, -w);
    const c = 0.2 * r();
    add(m, i, i, c);
    add(m, j, j, c);
    add(m, i, j, c); // +c off-diagonal keeps M diagonally dominant: positive definite
  }
  return { K: lowerFromEntries(n, k), M: lowerFromEntries(n, m) };
}

/** Fixed–free chain of N masses m and springs k (tridiagonal). */
export function chain(
  N: number,
  k = 1,
  mass = 1,
): { K: SparseSymmetricMatrix; M: SparseSymmetricMatrix } {
  const colPtr = new Int32Array(N + 1);
  const rows: number[] = [];
  const vals: number[] = [];
  for (let j = 0; j < N; j++) {
    rows.push(j);
    vals.push(j === N - 1 ? k : 2 * k);
    if (j + 1 < N) {
      rows.push(j + 1);
      vals.push(-k);
    }
    colPtr[j + 1] = rows.length;
  }
  const K: SparseSymmetricMatrix = {
    kind: 'sparse-symmetric',
    n: N,
    colPtr,
    rowIdx: Int32Array.from(rows),
    values: Float64Array.from(vals),
  };
  const M: SparseSymmetricMatrix = {
    kind: 'sparse-symmetric',
    n: N,
    colPtr: Int32Array.from({ length: N + 1 }, (_, i) => i),
    rowIdx: Int32Array.from({ length: N }, (_, i) => i),
    values: new Float64Array(N).fill(mass),
  };
  return { K, M };
}

/** λ_n of the fixed–free chain: (4k/m) sin²((2n−1)π/(2(2N+1))) (REFERENCES.md item 2). */
export function chainLambda(N: number, j: number, k = 1, mass = 1): number {
  return ((4 * k) / mass) * Math.sin(((2 * j - 1) * Math.PI) / (2 * (2 * N + 1))) ** 2;
}

/** Two uncoupled copies of a pencil: every eigenvalue twice. */
export function doubled(A: SparseSymmetricMatrix): SparseSymmetricMatrix {
  const n = A.n;
  const nnz = A.colPtr[n]!;
  const colPtr = new Int32Array(2 * n + 1);
  const rowIdx = new Int32Array(2 * nnz);
  const values = new Float64Array(2 * nnz);
  for (let j = 0; j <= n; j++) colPtr[j] = A.colPtr[j]!;
  for (let j = 1; j <= n; j++) colPtr[n + j] = nnz + A.colPtr[j]!;
  rowIdx.set(A.rowIdx);
  values.set(A.values);
  for (let p = 0; p < nnz; p++) {
    rowIdx[nnz + p] = A.rowIdx[p]! + n;
    values[nnz + p] = A.values[p]!;
  }
  return { kind: 'sparse-symmetric', n: 2 * n, colPtr, rowIdx, values };
}

export function input(
  K: SparseSymmetricMatrix,
  M: SparseSymmetricMatrix,
  count: number,
  extra: Partial<MethodInput> = {},
): MethodInput {
  return { K, M, count, tolerance: 1e-10, maxIterations: 500, shift: 0, seed: 7, ...extra };
}

/** max over modes of ‖Kφ − λMφ‖∞ / (‖Kφ‖∞ + |λ|‖Mφ‖∞), and max |ΦᵀMΦ − I|. */
export function checkModes(
  K: SparseSymmetricMatrix,
  M: SparseSymmetricMatrix,
  lambdas: number[],
  vectors: Float64Array[],
  mul: (A: SparseSymmetricMatrix, x: Float64Array) => Float64Array,
): { residual: number; orthogonality: number } {
  let residual = 0;
  let orthogonality = 0;
  const Mv = vectors.map((v) => mul(M, v));
  vectors.forEach((v, a) => {
    const kv = mul(K, v);
    let num = 0;
    let den = 0;
    for (let i = 0; i < v.length; i++) {
      num = Math.max(num, Math.abs(kv[i]! - lambdas[a]! * Mv[a]![i]!));
      den = Math.max(den, Math.abs(kv[i]!) + Math.abs(lambdas[a]! * Mv[a]![i]!));
    }
    residual = Math.max(residual, num / den);
    vectors.forEach((w, b) => {
      let s = 0;
      for (let i = 0; i < v.length; i++) s += w[i]! * Mv[a]![i]!;
      orthogonality = Math.max(orthogonality, Math.abs(s - (a === b ? 1 : 0)));
    });
  });
  return { residual, orthogonality };
}
