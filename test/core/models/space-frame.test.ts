import { describe, expect, it } from 'vitest';
import {
  buildBuildingFrame,
  spaceFrameElement,
  STEEL_BUILDING_DEFAULTS,
} from '../../../core/models/space-frame';
import { multiplyLower } from '../../../core/linalg/sparse-ldlt';
import { denseEigenvalues } from './dense-pencil';

function quad(A: Parameters<typeof multiplyLower>[0], x: Float64Array): number {
  const y = multiplyLower(A, x);
  let s = 0;
  for (let i = 0; i < x.length; i++) s += x[i]! * y[i]!;
  return s;
}

describe('buildBuildingFrame', () => {
  it('has the DOF count of the issue building (6 per node above the clamped base, ~53k)', () => {
    const { baysX, baysY, storeys } = STEEL_BUILDING_DEFAULTS;
    expect(6 * (baysX + 1) * (baysY + 1) * storeys).toBe(52_920);
    const small = buildBuildingFrame({
      ...STEEL_BUILDING_DEFAULTS,
      baysX: 2,
      baysY: 3,
      storeys: 2,
    });
    expect(small.n).toBe(6 * 3 * 4 * 2);
  });

  it('moves the mass a unit ground displacement carries: slab + beams + 156/420 of the columns', () => {
    // One storey: a translation ux of the floor moves every beam rigidly (its full mass ρAL, axial
    // (2+1+1+2)/6 = 1 or transverse (156+54+54+156)/420 = 1 of the consistent matrices) and the
    // columns' top end only (156/420 of ρAh, Hermite consistent mass, from memory).
    const input = { ...STEEL_BUILDING_DEFAULTS, baysX: 2, baysY: 1, storeys: 1 };
    const b = buildBuildingFrame(input);
    const { bayWidth: w, storeyHeight: h, column, beam, floorMassPerArea } = input;
    const beams = 2 * 2 + 3 * 1; // along x: 2 bays × 2 lines; along y: 1 bay × 3 lines
    const columns = 3 * 2;
    const expected =
      floorMassPerArea * (2 * w) * w +
      beams * beam.density * beam.A * w +
      columns * column.density * column.A * h * (156 / 420);
    expect(Math.abs(quad(b.M, b.influence.ux) - expected) / expected).toBeLessThan(1e-12);
    expect(Math.abs(quad(b.M, b.influence.uy) - expected) / expected).toBeLessThan(1e-12);
  });

  it('gives a column of 12-DOF elements the clamped–free bending and torsion frequencies', () => {
    // Bending: β₁L = 1.87510407 (REFERENCES.md item 1) about both axes, ω = (β₁L)²√(EI/(ρA L⁴));
    // torsion of a clamped–free shaft: ω₁ = (π/2L)√(GJ/(ρ I_p)), I_p = Iy + Iz (classical).
    const sec = STEEL_BUILDING_DEFAULTS.column;
    const L = 7;
    const ne = 12;
    const n = 6 * ne;
    const K = new Float64Array(n * n);
    const M = new Float64Array(n * n);
    const ke = new Float64Array(144);
    const me = new Float64Array(144);
    spaceFrameElement(sec, L / ne, 'z', ke, me);
    for (let e = 0; e < ne; e++) {
      const base = 6 * (e - 1); // element e joins nodes e and e+1; node 0 is clamped
      for (let i = 0; i < 12; i++) {
        for (let j = 0; j < 12; j++) {
          const gi = base + i;
          const gj = base + j;
          if (gi < 0 || gj < 0) continue;
          K[gi * n + gj]! += ke[i * 12 + j]!;
          M[gi * n + gj]! += me[i * 12 + j]!;
        }
      }
    }
    const toSparse = (D: Float64Array) => {
      const colPtr = new Int32Array(n + 1);
      const rows: number[] = [];
      const vals: number[] = [];
      for (let j = 0; j < n; j++) {
        for (let i = j; i < n; i++) {
          if (D[i * n + j] !== 0 || i === j) {
            rows.push(i);
            vals.push(D[i * n + j]!);
          }
        }
        colPtr[j + 1] = rows.length;
      }
      return {
        kind: 'sparse-symmetric' as const,
        n,
        colPtr,
        rowIdx: Int32Array.from(rows),
        values: Float64Array.from(vals),
      };
    };
    const omegas = denseEigenvalues(toSparse(K), toSparse(M)).map(Math.sqrt);
    const m = sec.density * sec.A;
    const bend = (I: number) => 1.87510407 ** 2 * Math.sqrt((sec.E * I) / (m * L ** 4));
    const torsion =
      (Math.PI / (2 * L)) * Math.sqrt((sec.G * sec.J) / (sec.density * (sec.Iy + sec.Iz)));
    // Each closed-form frequency appears among the computed ones to 1e-4 relative (12 Hermite
    // elements: bending error ~1e-7; linear torsion/axial elements converge as h²: ~2e-3, so 5e-3).
    const near = (w: number, tol: number) => omegas.some((o) => Math.abs(o - w) / w < tol);
    expect(near(bend(sec.Iy), 1e-4)).toBe(true);
    expect(near(bend(sec.Iz), 1e-4)).toBe(true);
    expect(near(torsion, 5e-3)).toBe(true);
    // And the lowest is the weak-axis bending mode.
    expect(Math.abs(omegas[0]! - bend(Math.min(sec.Iy, sec.Iz))) / omegas[0]!).toBeLessThan(1e-4);
  });
});
