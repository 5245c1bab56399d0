import { describe, expect, it } from 'vitest';
import { solveModes } from '../../../core/eigen/solve-modes';
import { EngineError } from '../../../core/errors';
import { eulerBernoulliBeam } from '../../../core/models/euler-bernoulli-beam';
import { storeyChain } from '../../../core/models/storey-chain';
import { combine, toDense } from '../../../core/linalg/factorize';
import { sparseSymmetricFromTriplets } from '../../../core/linalg/sparse';

/** Root of f in [a, b] by bisection to machine precision (for the β L characteristic equations). */
function bisect(f: (x: number) => number, a: number, b: number): number {
  let fa = f(a);
  for (let k = 0; k < 200; k++) {
    const m = 0.5 * (a + b);
    const fm = f(m);
    if (fm === 0 || b - a < 1e-15 * m) return m;
    if (Math.sign(fm) === Math.sign(fa)) {
      a = m;
      fa = fm;
    } else b = m;
  }
  return 0.5 * (a + b);
}

// β_n L from the characteristic equations (REFERENCES.md item 1, Thomson App. D / Blevins 8-1),
// solved here rather than pasted; brackets around (n − ½)π and (n + ½)π.
const cantileverRoots = [1, 2, 3, 4, 5].map((n) =>
  bisect((x) => Math.cos(x) * Math.cosh(x) + 1, (n - 1) * Math.PI + 0.1, n * Math.PI),
);
const clampedClampedRoots = [1, 2, 3, 4, 5].map((n) =>
  bisect((x) => Math.cos(x) * Math.cosh(x) - 1, n * Math.PI + 0.01, (n + 1) * Math.PI - 0.01),
);

describe('storeyChain', () => {
  it('fixed–free chain: λ_n = (4k/m) sin²((2n−1)π/(2(2N+1))) to 1e-10 (closed form, REFERENCES.md 2)', () => {
    const N = 12;
    const m = 3;
    const k = 7;
    const { K, M } = storeyChain({
      masses: new Array(N).fill(m),
      stiffnesses: new Array(N).fill(k),
    });
    for (const method of ['dense', 'inverse'] as const) {
      const r = solveModes(K, M, { method, count: N });
      r.modes.forEach((mode, i) => {
        const exact =
          ((4 * k) / m) * Math.sin(((2 * (i + 1) - 1) * Math.PI) / (2 * (2 * N + 1))) ** 2;
        expect(Math.abs(mode.lambda - exact) / exact).toBeLessThan(1e-10);
      });
    }
  });

  it('fixed–fixed chain (N+1 springs): λ_n = (4k/m) sin²(nπ/(2(N+1))) (closed form)', () => {
    const N = 10;
    const { K, M } = storeyChain({
      masses: new Array(N).fill(1),
      stiffnesses: new Array(N).fill(1),
    });
    // add the top spring to a fixed support: K_NN += k
    const Kff = combine(K, 1, sparseSymmetricFromTriplets(N, [N - 1], [N - 1], [1]), 1);
    const r = solveModes(Kff, M, { method: 'dense' });
    r.modes.forEach((mode, i) => {
      const exact = 4 * Math.sin(((i + 1) * Math.PI) / (2 * (N + 1))) ** 2;
      expect(Math.abs(mode.lambda - exact) / exact).toBeLessThan(1e-10);
    });
  });

  it('free–free chain (N−1 springs) has one rigid-body mode, λ_n = (4k/m) sin²((n−1)π/(2N))', () => {
    const N = 30;
    const r: number[] = [];
    const c: number[] = [];
    const v: number[] = [];
    for (let i = 0; i + 1 < N; i++) {
      r.push(i, i + 1, i + 1);
      c.push(i, i, i + 1);
      v.push(1, -1, 1);
    }
    const K = sparseSymmetricFromTriplets(N, r, c, v);
    const M = sparseSymmetricFromTriplets(
      N,
      [...Array(N).keys()],
      [...Array(N).keys()],
      new Array(N).fill(1),
    );
    for (const method of ['inverse', 'dense'] as const) {
      const res = solveModes(K, M, { method, count: 6 });
      expect(res.rigidBodyModes).toBe(1);
      expect(res.warnings.map((w) => w.code)).toContain('RIGID_BODY_MODES');
      expect(Math.abs(res.modes[0]?.lambda as number)).toBeLessThan(1e-12);
      res.modes.slice(1).forEach((mode, i) => {
        const exact = 4 * Math.sin(((i + 1) * Math.PI) / (2 * N)) ** 2;
        expect(Math.abs(mode.lambda - exact) / exact).toBeLessThan(1e-10);
      });
      if (method === 'inverse') expect(res.methodNote).toMatch(/σ = -/);
    }
  });

  it('two-storey frame (2m, m; 2k, k): ω₁ = √(k/2m), ω₂ = √(2k/m), shapes [½, 1], [−1, 1], effective masses 8/9 and 1/9 (Chopra ch. 10, from memory)', () => {
    const m = 1.5e5;
    const k = 6e7;
    const { K, M, influence } = storeyChain({ masses: [2 * m, m], stiffnesses: [2 * k, k] });
    const r = solveModes(K, M, { method: 'dense', influence, normalize: { dof: 2 } });
    expect(r.modes[0]?.omega).toBeCloseTo(Math.sqrt(k / (2 * m)), 9);
    expect(r.modes[1]?.omega).toBeCloseTo(Math.sqrt((2 * k) / m), 9);
    expect(Array.from(r.modes[0]?.shape as Float64Array).map((x) => Number(x.toFixed(12)))).toEqual(
      [0.5, 1],
    );
    expect(Array.from(r.modes[1]?.shape as Float64Array).map((x) => Number(x.toFixed(12)))).toEqual(
      [-1, 1],
    );
    const p = r.participation[0];
    expect(p?.totalMass).toBeCloseTo(3 * m, 6);
    expect(p?.ratio[0]).toBeCloseTo(8 / 9, 12);
    expect(p?.ratio[1]).toBeCloseTo(1 / 9, 12);
    expect(p?.cumulative[1]).toBeCloseTo(1, 12);
  });

  it('five-storey uniform frame: effective mass ratios 0.880, 0.087, 0.024, 0.008, 0.002 (Chopra ch. 13 tables, published to 3 decimals)', () => {
    const { K, M, influence } = storeyChain({
      masses: new Array(5).fill(1e5),
      stiffnesses: new Array(5).fill(5e7),
    });
    for (const method of ['dense', 'inverse'] as const) {
      const r = solveModes(K, M, { method, count: 5, influence });
      const ratios = r.participation[0]?.ratio as number[];
      [0.88, 0.087, 0.024, 0.008, 0.002].forEach((ref, i) =>
        expect(Math.abs((ratios[i] as number) - ref)).toBeLessThan(0.0005 + 1e-12),
      );
      // effective masses of all modes add up to rᵀMr (REFERENCES.md, properties)
      expect(r.participation[0]?.cumulative[4]).toBeCloseTo(1, 12);
      // periods from the fixed–free closed form
      r.modes.forEach((mode, i) => {
        const exact = 4 * 500 * Math.sin(((2 * i + 1) * Math.PI) / 22) ** 2;
        expect(Math.abs(mode.lambda - exact) / exact).toBeLessThan(1e-10);
      });
    }
  });

  it('refuses negative or missing values, naming the storey', () => {
    expect(() => storeyChain({ masses: [1, 2], stiffnesses: [1] })).toThrow(
      /one stiffness per storey/,
    );
    try {
      storeyChain({ masses: [1, 2], stiffnesses: [1, -3] });
      expect.unreachable();
    } catch (e) {
      expect((e as EngineError).code).toBe('INVALID_MODEL');
      expect((e as EngineError).message).toContain('storey 2');
    }
  });
});

describe('eulerBernoulliBeam', () => {
  const props = { E: 2.1e11, I: 8e-6, massPerLength: 35, length: 6 };
  const omega = (bl: number) =>
    (bl / props.length) ** 2 * Math.sqrt((props.E * props.I) / props.massPerLength);

  it('100-element cantilever: lowest 5 within 1e-6 of β_n L (consistent mass)', () => {
    const { K, M } = eulerBernoulliBeam({
      ...props,
      elements: 100,
      left: 'clamped',
      right: 'free',
    });
    for (const method of ['inverse', 'dense'] as const) {
      const r = solveModes(K, M, { method, count: 5 });
      r.modes.forEach((mode, i) => {
        const bl = Math.sqrt(mode.omega / omega(1)); // β_n L of the mesh
        const exact = cantileverRoots[i] as number;
        expect(Math.abs(bl - exact) / exact).toBeLessThan(1e-6);
      });
    }
  });

  it('mesh refinement converges from above with consistent mass (cantilever, mode 2)', () => {
    const errs = [4, 8, 16].map((elements) => {
      const { K, M } = eulerBernoulliBeam({ ...props, elements, left: 'clamped', right: 'free' });
      const w = solveModes(K, M, { method: 'dense', count: 2 }).modes[1]?.omega as number;
      return w / omega(cantileverRoots[1] as number) - 1;
    });
    errs.forEach((e) => expect(e).toBeGreaterThan(0));
    expect(errs[1]).toBeLessThan(errs[0] as number);
    expect(errs[2]).toBeLessThan(errs[1] as number);
    // Hermite cubics: frequency error O(h⁴) — halving h cuts it by at least 8×
    expect((errs[1] as number) / (errs[2] as number)).toBeGreaterThan(8);
  });

  it('pinned–pinned: β_n L = nπ; clamped–clamped roots of cos βL cosh βL = 1 (to 1e-6, 100 elements)', () => {
    const pp = eulerBernoulliBeam({ ...props, elements: 100, left: 'pinned', right: 'pinned' });
    solveModes(pp.K, pp.M, { method: 'dense', count: 5 }).modes.forEach((mode, i) => {
      expect(Math.abs(mode.omega / omega((i + 1) * Math.PI) - 1)).toBeLessThan(1e-6);
    });
    const cc = eulerBernoulliBeam({ ...props, elements: 100, left: 'clamped', right: 'clamped' });
    solveModes(cc.K, cc.M, { method: 'inverse', count: 5 }).modes.forEach((mode, i) => {
      expect(Math.abs(mode.omega / omega(clampedClampedRoots[i] as number) - 1)).toBeLessThan(1e-6);
    });
  });

  it('free–free: two rigid-body modes, then the clamped–clamped roots', () => {
    const ff = eulerBernoulliBeam({ ...props, elements: 100, left: 'free', right: 'free' });
    for (const method of ['inverse', 'dense'] as const) {
      const r = solveModes(ff.K, ff.M, { method, count: 6 });
      expect(r.rigidBodyModes).toBe(2);
      expect(r.modes[0]?.omega).toBeLessThan(1e-3 * omega(clampedClampedRoots[0] as number));
      expect(r.modes[1]?.omega).toBeLessThan(1e-3 * omega(clampedClampedRoots[0] as number));
      r.modes.slice(2).forEach((mode, i) => {
        expect(Math.abs(mode.omega / omega(clampedClampedRoots[i] as number) - 1)).toBeLessThan(
          1e-6,
        );
      });
    }
  });

  it('lumped mass (massless rotations) is solved by inverse and dense and refused by forward', () => {
    const b = eulerBernoulliBeam({
      ...props,
      elements: 40,
      left: 'clamped',
      right: 'free',
      mass: 'lumped',
    });
    const inv = solveModes(b.K, b.M, { method: 'inverse', count: 3 });
    const den = solveModes(b.K, b.M, { method: 'dense', count: 3 });
    inv.modes.forEach((m, i) =>
      expect(Math.abs(m.lambda / (den.modes[i]?.lambda as number) - 1)).toBeLessThan(1e-9),
    );
    // lumped mass: 0.5 % of the exact fundamental at 40 elements (common practice: lumped converges slower)
    expect(
      Math.abs((inv.modes[0]?.omega as number) / omega(cantileverRoots[0] as number) - 1),
    ).toBeLessThan(5e-3);
    expect(den.methodNote).toMatch(/massless/);
    try {
      solveModes(b.K, b.M, { method: 'forward', count: 1 });
      expect.unreachable();
    } catch (e) {
      expect((e as EngineError).code).toBe('MASS_SINGULAR');
      expect((e as EngineError).message).toMatch(/massless DOF/);
    }
  });

  it('labels DOFs and builds the transverse influence vector', () => {
    const b = eulerBernoulliBeam({ ...props, elements: 2, left: 'pinned', right: 'free' });
    expect(b.dofs).toEqual(['θ1', 'w2', 'θ2', 'w3', 'θ3']);
    expect(Array.from(b.influence[0]?.vector as Float64Array)).toEqual([0, 1, 0, 1, 0]);
    // total mass of the moving DOFs: rᵀMr = ρA·L minus nothing restrained in w except node 1
    const Md = toDense(b.M);
    let total = 0;
    const r = b.influence[0]?.vector as Float64Array;
    for (let i = 0; i < 5; i++)
      for (let j = 0; j < 5; j++)
        total += (r[i] as number) * (Md.data[i * 5 + j] as number) * (r[j] as number);
    // consistent mass of two elements with w1 removed: mL − (156 + 54)·mh/420 contribution of node 1
    const h = props.length / 2;
    const mh = props.massPerLength * h;
    expect(total).toBeCloseTo(2 * mh - (mh * 156) / 420 - (2 * mh * 54) / 420, 6);
  });

  it('refuses a bad element count or end condition with the field', () => {
    expect(() =>
      eulerBernoulliBeam({ ...props, elements: 0, left: 'clamped', right: 'free' }),
    ).toThrow(/number of elements/);
    expect(() =>
      eulerBernoulliBeam({ ...props, elements: 4, left: 'welded' as 'free', right: 'free' }),
    ).toThrow(/left end/);
    expect(() =>
      eulerBernoulliBeam({ ...props, E: -1, elements: 4, left: 'clamped', right: 'free' }),
    ).toThrow(/Young/);
  });
});
