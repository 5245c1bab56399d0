// How the dense solver cuts its steps into parts (core/eigen/dense/team.ts), and the generator
// skip that lets inverse iteration start a part anywhere with the same start vectors.
import { describe, expect, it } from 'vitest';
import { evenSplit, SERIAL_TEAM, triangleSplit } from '../../../core/eigen/dense/team';
import { seededRandom } from '../../../core/eigen/random';

describe('triangleSplit', () => {
  it('cuts the rows of an upper triangle into runs of equal area, on the alignment', () => {
    // rows 0 … 999 of a 1000 × 1000 triangle: half the area lies above n − n/√2 ≈ 293
    const b = triangleSplit(0, 1000, 1000, 2, 4);
    expect(b).toHaveLength(3);
    expect(b[0]).toBe(0);
    expect(b[2]).toBe(1000);
    expect(b[1]! % 4).toBe(0);
    expect(Math.abs(b[1]! - 1000 * (1 - Math.SQRT1_2))).toBeLessThanOrEqual(4);
    // the trailing rows 600 … 999 (a 400-row triangle), aligned from 600
    const t = triangleSplit(600, 1000, 1000, 2, 8);
    expect((t[1]! - 600) % 8).toBe(0);
    const area = (a: number, z: number): number => {
      let s = 0;
      for (let r = a; r < z; r++) s += 1000 - r;
      return s;
    };
    const total = area(600, 1000);
    expect(Math.abs(area(600, t[1]!) - total / 2)).toBeLessThan(8 * 400);
  });

  it('weights each row with its fixed cost', () => {
    const plain = triangleSplit(0, 1000, 1000, 2, 1);
    const heavy = triangleSplit(0, 1000, 1000, 2, 1, 1000);
    // a row costs 2000 … 1001: Σ_{r<s} (2000 − r) = half of 1.5e6 at s = 2000 − √2.5e6 ≈ 418.9
    expect(heavy[1]!).toBeGreaterThan(plain[1]!);
    expect(Math.abs(heavy[1]! - (2000 - Math.sqrt(2.5e6)))).toBeLessThanOrEqual(1);
  });
});

describe('evenSplit', () => {
  it('cuts a range into runs of equal length on the alignment, never backwards', () => {
    expect(evenSplit(0, 1000, 2, 4)).toEqual([0, 500, 1000]);
    expect(evenSplit(0, 10, 4, 4)).toEqual([0, 4, 4, 8, 10]);
    expect(evenSplit(0, 1, 2, 4)).toEqual([0, 0, 1]);
  });
});

describe('SERIAL_TEAM', () => {
  it('runs every part on the caller, in order', () => {
    const seen: number[] = [];
    SERIAL_TEAM.run('any', (part) => seen.push(part), 3, [], []);
    expect(seen).toEqual([0, 1, 2]);
    expect(SERIAL_TEAM.shared(5)).toEqual(new Float64Array(5));
  });
});

describe('seededRandom with a skip', () => {
  it('starts where the generator would be after that many draws', () => {
    const a = seededRandom(7);
    for (let i = 0; i < 12345; i++) a();
    const b = seededRandom(7, 12345);
    for (let i = 0; i < 10; i++) expect(b()).toBe(a());
  });
});
