import { describe, expect, it } from 'vitest';
import {
  closeModes,
  combineDirections,
  combinePeaks,
  correlationMatrix,
  cqcCorrelation,
} from '../../../core/index';

// Der Kiureghian (1981); equal-damping form as in REFERENCES.md
const rhoEqual = (z: number, b: number) =>
  (8 * z * z * (1 + b) * b ** 1.5) / ((1 - b * b) ** 2 + 4 * z * z * b * (1 + b) ** 2);

describe('cqcCorrelation (Der Kiureghian 1981)', () => {
  it('is 1 for β = 1 with equal damping', () => {
    expect(cqcCorrelation(10, 10, 0.05, 0.05)).toBe(1);
    expect(cqcCorrelation(10, 10 * (1 + 1e-9), 0.05, 0.05)).toBeCloseTo(1, 9);
  });
  it('reduces to the equal-damping form for ζ_i = ζ_j (relative 1e-13)', () => {
    for (const b of [0.3, 0.8, 0.9, 0.95, 1.05, 1.5]) {
      const got = cqcCorrelation(10, 10 * b, 0.05, 0.05);
      expect(Math.abs(got / rhoEqual(0.05, b) - 1)).toBeLessThan(1e-13);
    }
  });
  it('is symmetric in the two modes with unequal damping (relative 1e-13)', () => {
    const a = cqcCorrelation(10, 11, 0.02, 0.07);
    const b = cqcCorrelation(11, 10, 0.07, 0.02);
    expect(Math.abs(a / b - 1)).toBeLessThan(1e-13);
  });
  it('tends to 0 for well-separated modes (β = 0.1, ζ = 5 %: below 0.003)', () => {
    expect(cqcCorrelation(10, 1, 0.05, 0.05)).toBeLessThan(0.003);
  });
});

describe('combinePeaks', () => {
  it('is SRSS with the identity correlation (3-4-5)', () => {
    expect(combinePeaks([3, -4], correlationMatrix([1, 2], [0.05, 0.05], 'srss'))).toBe(5);
  });
  it('is the absolute sum for fully correlated modes', () => {
    expect(
      combinePeaks(
        [3, 4],
        [
          [1, 1],
          [1, 1],
        ],
      ),
    ).toBe(7);
    expect(
      combinePeaks(
        [3, -4],
        [
          [1, 1],
          [1, 1],
        ],
      ),
    ).toBe(1);
  });
});

describe('closeModes (EN 1998-1 §4.3.3.3.2, T_j ≤ 0.9 T_i independent; from memory)', () => {
  it('lists pairs within 10 % of period', () => {
    expect(closeModes([1.0, 0.95, 0.9, 0.3])).toEqual([
      [1, 2],
      [2, 3],
    ]);
  });
});

describe('combineDirections (EN 1998-1 §4.3.3.5.1, from memory)', () => {
  it('takes SRSS or the larger of 100 % + 30 %', () => {
    expect(combineDirections([3, 4], 'srss')).toBe(5);
    expect(combineDirections([3, 4], '100-30')).toBeCloseTo(4 + 0.9, 14);
    expect(combineDirections([-10, 1], '100-30')).toBeCloseTo(10.3, 14);
  });
});
