import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { modalTimeHistory, stepModalEquation, storeyChain } from '../../../core/index';
import { basisOf, sdof } from './helpers';

describe('stepModalEquation', () => {
  const w = 2 * Math.PI * 1.5;
  const dt = 0.01;
  const steps = 400;
  const P = 3.0;
  const load = new Array(steps + 1).fill(P);
  it('exact method: undamped step load gives (P/ω²)(1 − cos ωt), peak 2× static (closed form; 1e-12 of static)', () => {
    const q = stepModalEquation(w, 0, load, dt, 'exact');
    const st = P / (w * w);
    q.forEach((x, i) =>
      expect(Math.abs(x - st * (1 - Math.cos(w * i * dt)))).toBeLessThan(1e-12 * st),
    );
    expect(Math.max(...q) / st).toBeCloseTo(2, 3);
  });
  it('exact method: damped step response (closed form, Chopra §4.3 from memory; 1e-12 of static)', () => {
    const z = 0.05;
    const q = stepModalEquation(w, z, load, dt, 'exact');
    const st = P / (w * w);
    const wd = w * Math.sqrt(1 - z * z);
    q.forEach((x, i) => {
      const t = i * dt;
      const ref =
        st *
        (1 -
          Math.exp(-z * w * t) *
            (Math.cos(wd * t) + (z / Math.sqrt(1 - z * z)) * Math.sin(wd * t)));
      expect(Math.abs(x - ref)).toBeLessThan(1e-12 * st);
    });
  });
  it('Newmark average acceleration: step load within 1 % of the static deflection at Δt = T/67 over the first period, and stays bounded at Δt = 2T (unconditionally stable, Newmark 1959)', () => {
    const q = stepModalEquation(w, 0, load, dt, 'newmark');
    const st = P / (w * w);
    // first period (67 steps): the phase error of period elongation is still small
    q.slice(0, 68).forEach((x, i) =>
      expect(Math.abs(x - st * (1 - Math.cos(w * i * dt)))).toBeLessThan(0.01 * 2 * st),
    );
    const big = stepModalEquation(
      w,
      0,
      new Array(1000).fill(P),
      (2 * (2 * Math.PI)) / w,
      'newmark',
    );
    expect(Math.max(...big.map(Math.abs))).toBeLessThanOrEqual(2 * st * (1 + 1e-12));
  });
});

describe('modalTimeHistory', () => {
  it('single DOF under a step force: peak 2 P/k at t = π/ω (closed form; relative 1e-9)', () => {
    const m = 1000;
    const w = 2 * Math.PI;
    const r = modalTimeHistory({
      basis: sdof(m, w),
      load: {
        kind: 'force',
        pattern: Float64Array.of(500),
        record: { time: [0, 5], value: [1, 1] },
      },
      damping: 0,
      step: 0.005,
      dofs: [0],
    });
    expect(Math.abs(r.dofs[0]!.peak.peak / ((2 * 500) / (m * w * w)) - 1)).toBeLessThan(1e-9);
    // undamped: the same peak recurs each period; its time is π/ω + kT
    expect(r.dofs[0]!.peak.time % 1).toBeCloseTo(0.5, 9);
    expect(r.centralDifference.dtCr).toBeCloseTo(2 / w, 15);
  });

  const fx = JSON.parse(
    readFileSync(new URL('../../fixtures/response/scipy-reference.json', import.meta.url), 'utf8'),
  );
  const h = fx.history;
  const { K, M } = storeyChain({ masses: h.masses, stiffnesses: h.stiffnesses });
  const run = (method: 'exact' | 'newmark') =>
    modalTimeHistory({
      basis: basisOf(K, M),
      load: { kind: 'ground', influence: Float64Array.of(1, 1, 1), record: h.record },
      damping: h.damping,
      step: h.step,
      duration: h.duration,
      method,
      dofs: [2],
    });
  it(`ground motion, exact method: roof displacement and base shear within 1e-6 of the peak of ${fx.tool} (scipy ${fx.scipy})`, () => {
    const r = run('exact');
    expect(r.time).toHaveLength(h.time.length);
    const roof = r.dofs[0]!.displacement;
    roof.forEach((u, i) => expect(Math.abs(u - h.roof[i])).toBeLessThan(1e-6 * h.roofPeak));
    r.baseShear!.values.forEach((v, i) =>
      expect(Math.abs(v - h.baseShear[i])).toBeLessThan(1e-6 * h.baseShearPeak),
    );
    expect(r.dofs[0]!.peak.time).toBeCloseTo(h.roofPeakTime, 9);
  });
  it('ground motion, Newmark: roof peak within 2 % of scipy at Δt = 0.01 s (period elongation of the top mode)', () => {
    const r = run('newmark');
    expect(Math.abs(r.dofs[0]!.peak.peak / h.roofPeak - 1)).toBeLessThan(0.02);
  });
  it('refuses a history longer than the step limit before allocating', () => {
    expect(() =>
      modalTimeHistory({
        basis: sdof(1, 1),
        load: {
          kind: 'force',
          pattern: Float64Array.of(1),
          record: { time: [0, 1000], value: [0, 1] },
        },
        damping: 0.02,
        step: 1e-4,
        dofs: [0],
      }),
    ).toThrow(/10000000 steps; a history takes 1 to 200000/);
  });
});
