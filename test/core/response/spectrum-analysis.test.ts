import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  combinePeaks,
  correlationMatrix,
  spectrumAnalysis,
  storeyChain,
  tableSpectrum,
  type Spectrum,
} from '../../../core/index';
import { basisOf, dense, sdof } from './helpers';

const flat = (sa: number): Spectrum => ({
  description: 'flat',
  source: 'test',
  sa: () => sa,
  points: () => [],
});
const rel = (a: number, b: number) => Math.abs(a / b - 1);

describe('spectrumAnalysis', () => {
  it('single DOF: peak displacement S_a/ω² and base shear m S_a (closed form; relative 1e-14)', () => {
    const m = 2.0e4;
    const w = 12.5;
    const r = spectrumAnalysis({
      basis: sdof(m, w),
      influence: Float64Array.of(1),
      spectrum: flat(3.2),
      damping: 0.05,
      combination: 'cqc',
    });
    expect(rel(r.displacement[0]!, 3.2 / w ** 2)).toBeLessThan(1e-14);
    expect(rel(r.baseShear, m * 3.2)).toBeLessThan(1e-14);
    expect(rel(r.modes[0]!.effectiveMass, m)).toBeLessThan(1e-14);
  });

  it('two-storey frame 2m, m / 2k, k: modal base shears are 8/9 and 1/9 of 3m·S_a (Chopra, chapter 10 example, from memory; relative 1e-12)', () => {
    const m = 1.0e5;
    const k = 4.0e7;
    const { K, M } = storeyChain({ masses: [2 * m, m], stiffnesses: [2 * k, k] });
    const sa = 2.0;
    const r = spectrumAnalysis({
      basis: basisOf(K, M),
      influence: Float64Array.of(1, 1),
      spectrum: flat(sa),
      damping: 0.05,
      combination: 'srss',
      storeyHeights: [3.5, 3.5],
    });
    expect(rel(r.modes[0]!.omega, Math.sqrt(k / (2 * m)))).toBeLessThan(1e-12);
    expect(rel(r.modes[1]!.omega, Math.sqrt((2 * k) / m))).toBeLessThan(1e-12);
    expect(rel(r.modes[0]!.baseShear, (8 / 9) * 3 * m * sa)).toBeLessThan(1e-12);
    expect(rel(r.modes[1]!.baseShear, (1 / 9) * 3 * m * sa)).toBeLessThan(1e-12);
    expect(rel(r.baseShear, 3 * m * sa * Math.sqrt((8 / 9) ** 2 + (1 / 9) ** 2))).toBeLessThan(
      1e-12,
    );
    expect(rel(r.massRatio, 1)).toBeLessThan(1e-12);
  });

  it('five-storey uniform shear frame: modal base shears are 0.880, 0.087, 0.024, 0.008, 0.002 of W·A (Chopra, chapter 13 tables; published to 3 decimals, so within 6e-4)', () => {
    const { K, M } = storeyChain({
      masses: new Array(5).fill(45e3),
      stiffnesses: new Array(5).fill(5.5e7),
    });
    const sa = 1.0;
    const r = spectrumAnalysis({
      basis: basisOf(K, M),
      influence: new Float64Array(5).fill(1),
      spectrum: flat(sa),
      damping: 0.05,
      combination: 'cqc',
    });
    const published = [0.88, 0.087, 0.024, 0.008, 0.002];
    r.modes.forEach((mode, i) => {
      expect(Math.abs(mode.baseShear / (5 * 45e3 * sa) - published[i]!)).toBeLessThan(6e-4);
    });
  });

  it('storey drifts are combined mode by mode: drift × k equals the combined storey shear, and differs from the difference of combined displacements (Chopra, chapter 13, from memory; relative 1e-10)', () => {
    const k = [6e7, 5e7, 4e7, 3e7];
    const { K, M } = storeyChain({ masses: [5e4, 5e4, 5e4, 4e4], stiffnesses: k });
    const spectrum = tableSpectrum([
      [0, 3],
      [0.2, 7],
      [0.6, 7],
      [3, 1.4],
    ]);
    const r = spectrumAnalysis({
      basis: basisOf(K, M),
      influence: new Float64Array(4).fill(1),
      spectrum,
      damping: 0.05,
      combination: 'cqc',
      storeyHeights: [4, 3.5, 3.5, 3.5],
    });
    const s = r.storeys!;
    s.drift.forEach((d, i) => expect(rel(d * k[i]!, s.shear[i]!)).toBeLessThan(1e-10));
    expect(rel(s.shear[0]!, r.baseShear)).toBeLessThan(1e-10);
    // the difference of combined roof and floor-3 displacements is not the combined drift
    const naive = r.displacement[3]! - r.displacement[2]!;
    expect(rel(naive, s.drift[3]!)).toBeGreaterThan(1e-3);
    expect(s.driftRatio[0]).toBeCloseTo(s.drift[0]! / 4, 15);
    // overturning at the base: Σ f_j H_j per mode (H = 4, 7.5, 11, 14.5 m), then combined
    const H = [4, 7.5, 11, 14.5];
    const modal = r.modes.map((m, n) =>
      r.modalDisplacement[n]!.reduce((acc, _u, j) => {
        const phi = r.modalDisplacement[n]!.map((x) => (x * m.omega ** 2) / (m.gamma * m.sa));
        const mass = [5e4, 5e4, 5e4, 4e4][j]!;
        return acc + m.gamma * m.sa * mass * phi[j]! * H[j]!;
      }, 0),
    );
    const rho = correlationMatrix(
      r.modes.map((m) => m.omega),
      r.modes.map((m) => m.damping),
      'cqc',
    );
    expect(rel(s.overturning[0]!, combinePeaks(modal, rho))).toBeLessThan(1e-10);
  });

  it('scales forces to the ELF base shear when the modal base shear is less (ASCE 7-16 §12.9.1.4.1, from memory), not the drifts', () => {
    const { K, M } = storeyChain({ masses: [5e4, 5e4], stiffnesses: [5e7, 5e7] });
    const base = {
      basis: basisOf(K, M),
      influence: Float64Array.of(1, 1),
      spectrum: flat(1.5),
      damping: 0.05,
      combination: 'cqc' as const,
      storeyHeights: [3, 3],
    };
    const plain = spectrumAnalysis(base);
    const target = plain.baseShear * 1.25;
    const scaled = spectrumAnalysis({ ...base, elfBaseShear: target });
    expect(scaled.scaling!.factor).toBeCloseTo(1.25, 12);
    expect(rel(scaled.scaledBaseShear, target)).toBeLessThan(1e-12);
    expect(rel(scaled.storeys!.shear[0]!, target)).toBeLessThan(1e-10);
    expect(scaled.storeys!.drift).toEqual(plain.storeys!.drift);
    const above = spectrumAnalysis({ ...base, elfBaseShear: plain.baseShear * 0.8 });
    expect(above.scaling!.factor).toBe(1);
  });

  it('names the mode and its period when the table does not reach it', () => {
    const { K, M } = storeyChain({ masses: [5e4], stiffnesses: [1e6] }); // T ≈ 1.40 s
    expect(() =>
      spectrumAnalysis({
        basis: basisOf(K, M),
        influence: Float64Array.of(1),
        spectrum: tableSpectrum([
          [0, 1],
          [1, 2],
        ]),
        damping: 0.05,
        combination: 'srss',
      }),
    ).toThrow(/^Mode 1 \(T = 1\.405 s\): The period 1\.405 s is outside the spectrum table/);
  });
});

describe('spectrumAnalysis against scipy/numpy (test/fixtures/response, scripts/fixtures/response.py)', () => {
  const fx = JSON.parse(
    readFileSync(new URL('../../fixtures/response/scipy-reference.json', import.meta.url), 'utf8'),
  );
  const c = fx.combination;
  const run = (combination: 'srss' | 'cqc') =>
    spectrumAnalysis({
      basis: basisOf(dense(c.K), dense(c.M)),
      influence: Float64Array.from(c.influence),
      spectrum: tableSpectrum(c.spectrum),
      damping: c.damping,
      combination,
    });
  it('has close modes where SRSS and CQC differ by more than 1 %', () => {
    const s = run('srss');
    expect(s.closeModes).toEqual([[2, 3]]);
    expect(rel(c.cqc.displacement[1], c.srss.displacement[1])).toBeGreaterThan(0.01);
  });
  for (const combination of ['srss', 'cqc'] as const) {
    it(`${combination.toUpperCase()}: displacements, base shear and a drift within relative 1e-9 of ${fx.tool} (scipy ${fx.scipy}, numpy ${fx.numpy})`, () => {
      const r = run(combination);
      const ref = c[combination];
      r.displacement.forEach((u, d) => expect(rel(u, ref.displacement[d])).toBeLessThan(1e-9));
      expect(rel(r.baseShear, ref.baseShear)).toBeLessThan(1e-9);
      const rho = correlationMatrix(
        r.modes.map((m) => m.omega),
        r.modes.map((m) => m.damping),
        combination,
      );
      const drift = combinePeaks(
        r.modalDisplacement.map((u) => u[0]! - u[1]!),
        rho,
      );
      expect(rel(drift, ref.drift12)).toBeLessThan(1e-9);
      r.modes.forEach((m, i) => expect(rel(m.period, c.periods[i])).toBeLessThan(1e-12));
    });
  }
});
