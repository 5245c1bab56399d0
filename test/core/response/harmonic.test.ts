import { describe, expect, it } from 'vitest';
import {
  frequencyGrid,
  harmonicResponse,
  magnification,
  rayleighCoefficients,
  rayleighRatio,
  storeyChain,
} from '../../../core/index';
import { basisOf, sdof } from './helpers';

const rel = (a: number, b: number) => Math.abs(a / b - 1);

describe('harmonicResponse', () => {
  const m = 1500;
  const w = 2 * Math.PI * 20;
  const k = m * w * w;
  const p0 = 800;
  it('single DOF: amplitude (p₀/k)/√((1−r²)² + (2ζr)²) and phase atan2(2ζr, 1−r²) (classical; relative 1e-12)', () => {
    for (const zeta of [0.02, 0.1]) {
      const ratios = [0, 0.3, 0.9, 1, 1.2, 3];
      const r = harmonicResponse({
        basis: sdof(m, w),
        load: { kind: 'force', pattern: Float64Array.of(p0) },
        damping: zeta,
        frequencies: ratios.map((x) => x * w),
        dofs: [0],
      });
      ratios.forEach((x, i) => {
        expect(rel(r.dofs[0]!.amplitude[i]!, (p0 / k) * magnification(x, zeta))).toBeLessThan(
          1e-12,
        );
        const lag = Math.atan2(2 * zeta * x, 1 - x * x);
        expect(r.dofs[0]!.phase[i]!).toBeCloseTo(lag, 12);
      });
    }
  });

  it('magnification peaks at 1/(2ζ√(1−ζ²)) at r = √(1−2ζ²) (classical; relative 1e-12)', () => {
    const zeta = 0.05;
    expect(
      rel(
        magnification(Math.sqrt(1 - 2 * zeta * zeta), zeta),
        1 / (2 * zeta * Math.sqrt(1 - zeta * zeta)),
      ),
    ).toBeLessThan(1e-12);
    expect(magnification(1, zeta)).toBeCloseTo(10, 12);
  });

  it('a rotating unbalance gives the force m_e·e·Ω² (ACI 351.3R, from memory)', () => {
    const me = 0.5; // kg·m
    const W = 0.8 * w;
    const r = harmonicResponse({
      basis: sdof(m, w),
      load: { kind: 'unbalance', pattern: Float64Array.of(1), unbalance: me },
      damping: 0.05,
      frequencies: [W],
      dofs: [0],
    });
    expect(
      rel(r.dofs[0]!.amplitude[0]!, ((me * W * W) / k) * magnification(0.8, 0.05)),
    ).toBeLessThan(1e-12);
    expect(rel(r.dofs[0]!.velocity[0]!, r.dofs[0]!.amplitude[0]! * W)).toBeLessThan(1e-15);
  });

  it('with Rayleigh damping matches the direct complex solve (K − Ω²M + iΩC) u = p on a 3-DOF chain (relative 1e-10)', () => {
    const { K, M } = storeyChain({ masses: [2e4, 2e4, 1e4], stiffnesses: [3e7, 2e7, 1e7] });
    const basis = basisOf(K, M);
    const c = rayleighCoefficients(basis.omega[0]!, 0.03, basis.omega[2]!, 0.03);
    expect(rayleighRatio(c, basis.omega[0]!)).toBeCloseTo(0.03, 14);
    expect(rayleighRatio(c, basis.omega[2]!)).toBeCloseTo(0.03, 14);
    const zeta = basis.omega.map((x) => rayleighRatio(c, x));
    const p = Float64Array.of(0, 0, 1000);
    const W = 1.1 * basis.omega[1]!;
    const r = harmonicResponse({
      basis,
      load: { kind: 'force', pattern: p },
      damping: zeta,
      frequencies: [W],
      dofs: [0, 1, 2],
    });
    // direct: A = K − Ω²M + iΩ(αM + βK), real 6×6 system [Re −Im; Im Re]
    const k = [
      [5e7, -2e7, 0],
      [-2e7, 3e7, -1e7],
      [0, -1e7, 1e7],
    ];
    const mm = [2e4, 2e4, 1e4];
    const A: number[][] = Array.from({ length: 6 }, () => new Array(6).fill(0));
    for (let i = 0; i < 3; i++)
      for (let j = 0; j < 3; j++) {
        const mij = i === j ? mm[i]! : 0;
        const re = k[i]![j]! - W * W * mij;
        const im = W * (c.alpha * mij + c.beta * k[i]![j]!);
        A[i]![j] = re;
        A[i]![j + 3] = -im;
        A[i + 3]![j] = im;
        A[i + 3]![j + 3] = re;
      }
    const b = [0, 0, 1000, 0, 0, 0];
    // Gaussian elimination with partial pivoting
    for (let col = 0; col < 6; col++) {
      let piv = col;
      for (let r2 = col + 1; r2 < 6; r2++)
        if (Math.abs(A[r2]![col]!) > Math.abs(A[piv]![col]!)) piv = r2;
      [A[col], A[piv]] = [A[piv]!, A[col]!];
      [b[col], b[piv]] = [b[piv]!, b[col]!];
      for (let r2 = col + 1; r2 < 6; r2++) {
        const f = A[r2]![col]! / A[col]![col]!;
        for (let c2 = col; c2 < 6; c2++) A[r2]![c2]! -= f * A[col]![c2]!;
        b[r2]! -= f * b[col]!;
      }
    }
    const x = new Array(6).fill(0);
    for (let i = 5; i >= 0; i--) {
      let s = b[i]!;
      for (let j = i + 1; j < 6; j++) s -= A[i]![j]! * x[j];
      x[i] = s / A[i]![i]!;
    }
    for (let d = 0; d < 3; d++) {
      expect(rel(r.dofs[d]!.amplitude[0]!, Math.hypot(x[d], x[d + 3]))).toBeLessThan(1e-10);
    }
  });

  it('refuses a DOF outside the model', () => {
    expect(() =>
      harmonicResponse({
        basis: sdof(m, w),
        load: { kind: 'force', pattern: Float64Array.of(1) },
        damping: 0.02,
        frequencies: [1],
        dofs: [3],
      }),
    ).toThrow(/DOF 4 is not in the model/);
  });
});

describe('frequencyGrid', () => {
  it('spaces points evenly and inserts the running speed', () => {
    const g = frequencyGrid(0, 10, 3, [7]).map((x) => x / (2 * Math.PI));
    expect(g).toEqual([0, 5, 7, 10]);
  });
});
