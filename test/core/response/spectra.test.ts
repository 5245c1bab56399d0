import { describe, expect, it } from 'vitest';
import {
  asceSpectrum,
  EngineError,
  eurocodeSpectrum,
  STANDARD_GRAVITY,
  tableSpectrum,
} from '../../../core/index';

const g = STANDARD_GRAVITY; // NIST SP 811

describe('asceSpectrum (ASCE 7-16 §11.4.6, from memory)', () => {
  const s = asceSpectrum({ sds: 1.0, sd1: 0.6, tl: 8 });
  // T0 = 0.2 SD1/SDS = 0.12 s, TS = SD1/SDS = 0.6 s
  it('rises linearly from 0.4 S_DS at T = 0 to S_DS at T₀', () => {
    expect(s.sa(0) / g).toBeCloseTo(0.4, 12);
    expect(s.sa(0.06) / g).toBeCloseTo(0.4 + 0.6 * 0.5, 12);
    expect(s.sa(0.12) / g).toBeCloseTo(1.0, 12);
  });
  it('holds S_DS to T_S, then S_D1/T to T_L and S_D1 T_L/T² beyond', () => {
    expect(s.sa(0.6) / g).toBeCloseTo(1.0, 12);
    expect(s.sa(1.5) / g).toBeCloseTo(0.6 / 1.5, 12);
    expect(s.sa(10) / g).toBeCloseTo((0.6 * 8) / 100, 12);
  });
  it('divides by R/I_e for design forces', () => {
    const d = asceSpectrum({ sds: 1.0, sd1: 0.6, tl: 8, r: 8, ie: 1.25 });
    expect(d.sa(0.3)).toBeCloseTo((g * 1.25) / 8, 12);
  });
  it('refuses a non-positive parameter', () => {
    expect(() => asceSpectrum({ sds: 0, sd1: 0.6, tl: 8 })).toThrow(/S_DS must be a positive/);
  });
});

describe('eurocodeSpectrum (EN 1998-1 §3.2.2.2 and §3.2.2.5, Tables 3.2/3.3 from memory)', () => {
  it('gives a_g S η 2.5 on the plateau with η = 1 at 5 % damping (type 1, ground C: S = 1.15)', () => {
    const s = eurocodeSpectrum({ type: 1, ground: 'C', ag: 2.5 });
    expect(s.sa(0.4)).toBeCloseTo(2.5 * 1.15 * 2.5, 12);
    expect(s.sa(0)).toBeCloseTo(2.5 * 1.15, 12);
    // T_C = 0.6 s, T_D = 2.0 s
    expect(s.sa(1.2)).toBeCloseTo(2.5 * 1.15 * 2.5 * (0.6 / 1.2), 12);
    expect(s.sa(3)).toBeCloseTo(2.5 * 1.15 * 2.5 * ((0.6 * 2) / 9), 12);
  });
  it('takes η = √(10/(5+ξ)) with its lower bound 0.55', () => {
    const s10 = eurocodeSpectrum({ type: 2, ground: 'A', ag: 1, damping: 0.1 });
    expect(s10.sa(0.1)).toBeCloseTo(2.5 * Math.sqrt(10 / 15), 12);
    const s50 = eurocodeSpectrum({ type: 2, ground: 'A', ag: 1, damping: 0.5 });
    expect(s50.sa(0.1)).toBeCloseTo(2.5 * 0.55, 12);
  });
  it('with q gives the design spectrum: 2.5/q on the plateau and the floor 0.2 a_g', () => {
    const s = eurocodeSpectrum({ type: 1, ground: 'B', ag: 2, q: 4 });
    expect(s.sa(0.3)).toBeCloseTo((2 * 1.2 * 2.5) / 4, 12);
    expect(s.sa(0)).toBeCloseTo(2 * 1.2 * (2 / 3), 12);
    expect(s.sa(3.9)).toBeCloseTo(0.2 * 2, 12);
  });
  it('refuses an unknown ground type', () => {
    expect(() => eurocodeSpectrum({ type: 1, ground: 'F' as 'A', ag: 2 })).toThrow(
      /Ground type "F"/,
    );
  });
});

describe('tableSpectrum', () => {
  const s = tableSpectrum([
    [0, 2],
    [0.5, 6],
    [2, 3],
  ]);
  it('interpolates linearly in period (by construction of the table, exact)', () => {
    expect(s.sa(0.25)).toBeCloseTo(4, 14);
    expect(s.sa(1.25)).toBeCloseTo(4.5, 14);
    expect(s.sa(2)).toBe(3);
  });
  it('refuses a period outside the table, naming it', () => {
    expect(() => s.sa(2.5)).toThrow(EngineError);
    expect(() => s.sa(2.5)).toThrow(/2\.500 s is outside the spectrum table \(0 s to 2 s\)/);
  });
  it('refuses periods that do not increase, naming the row', () => {
    expect(() =>
      tableSpectrum([
        [0, 1],
        [0, 2],
      ]),
    ).toThrow(/row 2/);
  });
});
