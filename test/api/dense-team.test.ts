// The dense eigensolver's worker-thread team (api/workers/dense-team.ts): the helpers really run
// parts, the result is bitwise the one of the caller alone, and a solve's arrays are reused
// zeroed for the next one.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  denseEigensolver,
  massOrthogonality,
  type MethodInput,
  solveModes,
  symmetricMultiply,
} from '../../core/index';
import { backSubstitutePart } from '../../core/eigen/dense/reduction';
import { createDenseTeam, type ThreadTeam } from '../../api/workers/dense-team';
import { chain, chainLambda, input, randomPencil } from '../core/eigen/pencils';

let team: ThreadTeam;

beforeAll(async () => {
  team = await createDenseTeam(1);
});

afterAll(async () => {
  await team.close();
});

function expectSameBits(
  a: { lambdas: number[]; vectors: Float64Array[] },
  b: { lambdas: number[]; vectors: Float64Array[] },
): void {
  expect(b.lambdas.length).toBe(a.lambdas.length);
  // Object.is tells −0 from 0 and compares every bit that matters to a double
  expect(b.lambdas.every((l, i) => Object.is(l, a.lambdas[i]))).toBe(true);
  for (let k = 0; k < a.vectors.length; k++) {
    const x = a.vectors[k] as Float64Array;
    const y = b.vectors[k] as Float64Array;
    expect(y.every((v, i) => Object.is(v, x[i]))).toBe(true);
  }
}

describe('createDenseTeam', () => {
  it('gives the same modes bit for bit as one thread, with the helper running parts of every kind of step', () => {
    // 600 DOFs: every step is cut in two (SPLIT_MIN = 128), the pencil random and sparse
    const { K, M } = randomPencil(600, 11);
    const one: MethodInput = input(K, M, 600, { maxIterations: 0 });
    const before = team.helperParts();
    const alone = denseEigensolver(one);
    expect(team.helperParts()).toBe(before);
    const shared = denseEigensolver({ ...one, team });
    // the reduction has ~470 split product steps and ~15 split trailing updates; the congruence,
    // the tridiagonal vectors, the back-transformation and the back-substitution one each
    expect(team.helperParts() - before).toBeGreaterThan(100);
    expectSameBits(alone, shared);
  });

  it('solves the fixed–free chain to its closed form through solveModes and the team', () => {
    // λ_j = (4k/m) sin²((2j − 1)π / (2(2N + 1))) (REFERENCES.md item 2)
    const N = 400;
    const { K, M } = chain(N);
    const r = solveModes(K, M, { method: 'dense', count: N, team });
    for (const j of [1, 2, 200, 399, 400]) {
      const exact = chainLambda(N, j);
      expect(Math.abs((r.modes[j - 1]!.lambda - exact) / exact)).toBeLessThan(1e-11);
    }
    const alone = solveModes(K, M, { method: 'dense', count: N });
    expect(r.modes.map((m) => m.lambda)).toEqual(alone.modes.map((m) => m.lambda));
  });

  it('hands a solve’s arrays to the next one zeroed, and runs a step on the caller when an array is not shared', () => {
    const a = team.shared(1000);
    a.fill(7);
    team.release();
    const b = team.shared(1000);
    expect(b.every((x) => x === 0)).toBe(true);
    // L = 2I (first[i] = i), Z = ones: the back-substitution halves every entry
    const n = 300;
    const L = team.shared(n * n);
    const first = team.shared(n);
    for (let i = 0; i < n; i++) {
      L[i * n + i] = 2;
      first[i] = i;
    }
    const Z = new Float64Array(n * n).fill(1); // not from team.shared
    const before = team.helperParts();
    team.run('backSubstitute', backSubstitutePart, 2, [L, first, Z], [n, 0, 152, n]);
    expect(team.helperParts()).toBe(before);
    expect(Z.every((x) => x === 0.5)).toBe(true);
    const Zs = team.shared(n * n).fill(1);
    team.run('backSubstitute', backSubstitutePart, 2, [L, first, Zs], [n, 0, 152, n]);
    expect(Zs.every((x) => x === 0.5)).toBe(true);
    team.release();
  });
});

describe('massOrthogonality over many modes', () => {
  it('is bitwise the same on the team as alone, agrees with every entry of ΦᵀMΦ formed plainly, and finds a planted defect', () => {
    // 300 modes: the triangle of ΦᵀMΦ in two parts (SPLIT_MIN = 128), bands of 32 rows
    const { K, M } = randomPencil(300, 5);
    const r = solveModes(K, M, { method: 'dense', count: 300 });
    const vectors = r.modes.map((m) => Float64Array.from(m.shape));
    // mass-normalize (the shapes are scaled for display), then plant φ₁₀ += 1e-6 φ₂₀₀:
    // (ΦᵀMΦ)(10, 200) becomes about 1e-6 (φ₂₀₀ᵀMφ₂₀₀ = 1), every other entry stays near rounding
    for (const v of vectors) {
      const mv = symmetricMultiply(M, v);
      const s = Math.sqrt(v.reduce((a, x, i) => a + x * (mv[i] as number), 0));
      for (let i = 0; i < v.length; i++) v[i] = (v[i] as number) / s;
    }
    const plainWorst = (vs: Float64Array[]): number => {
      const mv = vs.map((v) => symmetricMultiply(M, v));
      let w = 0;
      for (let i = 0; i < vs.length; i++) {
        for (let j = 0; j < vs.length; j++) {
          let s = 0;
          for (let k = 0; k < 300; k++) s += (vs[i]![k] as number) * (mv[j]![k] as number);
          w = Math.max(w, Math.abs(s - (i === j ? 1 : 0)));
        }
      }
      return w;
    };
    const alone = massOrthogonality(M, vectors);
    // parts go first come first served: on a loaded machine the caller may take both before a
    // sleeping helper wakes, so the check is repeated (each time bitwise the same) until it has
    const before = team.helperParts();
    for (let k = 0; k < 10 && team.helperParts() === before; k++) {
      expect(Object.is(alone, massOrthogonality(M, vectors, team))).toBe(true);
    }
    expect(team.helperParts() - before).toBeGreaterThan(0);
    const plain = plainWorst(vectors);
    expect(alone).toBeLessThan(1e-12);
    // the same figure up to the rounding of a sum taken in another order
    expect(Math.abs(alone - plain)).toBeLessThan(1e-14);
    const planted = vectors.map((v) => Float64Array.from(v));
    for (let i = 0; i < 300; i++) planted[9]![i]! += 1e-6 * (vectors[199]![i] as number);
    const found = massOrthogonality(M, planted, team);
    expect(found / plainWorst(planted)).toBeCloseTo(1, 10);
    expect(found).toBeCloseTo(1e-6, 9);
  });
});
