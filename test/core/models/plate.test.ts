import { describe, expect, it } from 'vitest';
import { buildPlaneStressPlate } from '../../../core/models/plate';
import { multiplyLower } from '../../../core/linalg/sparse-ldlt';
import { EngineError } from '../../../core/errors';

// The benchmark plate: 2 m × 1 m × 10 mm steel, E = 210 GPa, ν = 0.3, ρ = 7850 kg/m³.
const base = { lengthX: 2, lengthY: 1, thickness: 0.01, E: 210e9, nu: 0.3, density: 7850 };

function quad(A: Parameters<typeof multiplyLower>[0], x: Float64Array, y: Float64Array): number {
  const Ay = multiplyLower(A, y);
  let s = 0;
  for (let i = 0; i < x.length; i++) s += x[i]! * Ay[i]!;
  return s;
}

describe('buildPlaneStressPlate', () => {
  it('has the DOF counts of the issue meshes (2·nx·(ny+1) with x = 0 clamped)', () => {
    const p = buildPlaneStressPlate({ ...base, nx: 100, ny: 50 });
    expect(p.n).toBe(2 * 100 * 51); // "about 10k DOF"
    expect(p.K.n).toBe(p.n);
  });

  it('conserves mass: rᵀ M r = ρ t Lx Ly in both directions (consistent mass)', () => {
    const p = buildPlaneStressPlate({ ...base, nx: 12, ny: 7, clamp: 'none' });
    const expected = 7850 * 0.01 * 2 * 1; // 157 kg
    expect(Math.abs(quad(p.M, p.influence.ux, p.influence.ux) - expected) / expected).toBeLessThan(
      1e-12,
    );
    expect(Math.abs(quad(p.M, p.influence.uy, p.influence.uy) - expected) / expected).toBeLessThan(
      1e-12,
    );
    expect(p.totalMass).toBeCloseTo(expected, 10);
  });

  it('has no strain energy in rigid-body motion (two translations and the in-plane rotation)', () => {
    const nx = 9;
    const ny = 5;
    const p = buildPlaneStressPlate({ ...base, nx, ny, clamp: 'none' });
    const rot = new Float64Array(p.n);
    for (let i = 0; i <= nx; i++) {
      for (let j = 0; j <= ny; j++) {
        const node = i * (ny + 1) + j;
        rot[p.dofIndex[2 * node]!] = -(j / ny); // u = −y θ
        rot[p.dofIndex[2 * node + 1]!] = (2 * i) / nx; // v = x θ
      }
    }
    const scale = 210e9 * 0.01; // E t, the size of a stiffness entry
    for (const r of [p.influence.ux, p.influence.uy, rot]) {
      const f = multiplyLower(p.K, r);
      const worst = f.reduce((a, v) => Math.max(a, Math.abs(v)), 0);
      expect(worst).toBeLessThan(1e-9 * scale); // round-off only
    }
  });

  it('passes the patch test: uniform stress σx = E ε gives edge forces σx t Ly and none inside', () => {
    // u = ε x, v = −ν ε y is an exact plane-stress state with σx = E ε, σy = τ = 0 (closed form);
    // bilinear elements reproduce it exactly (Irons' patch test, common practice).
    const nx = 8;
    const ny = 4;
    const eps = 1e-4;
    const p = buildPlaneStressPlate({ ...base, nx, ny, clamp: 'none' });
    const u = new Float64Array(p.n);
    for (let i = 0; i <= nx; i++) {
      for (let j = 0; j <= ny; j++) {
        const node = i * (ny + 1) + j;
        u[p.dofIndex[2 * node]!] = eps * ((2 * i) / nx);
        u[p.dofIndex[2 * node + 1]!] = -0.3 * eps * (j / ny);
      }
    }
    const f = multiplyLower(p.K, u);
    let right = 0;
    let inside = 0;
    for (let i = 0; i <= nx; i++) {
      for (let j = 0; j <= ny; j++) {
        const node = i * (ny + 1) + j;
        const fx = f[p.dofIndex[2 * node]!]!;
        const fy = f[p.dofIndex[2 * node + 1]!]!;
        if (i === nx) right += fx;
        if (i > 0 && i < nx) inside = Math.max(inside, Math.abs(fx), Math.abs(fy));
        else if (j > 0 && j < ny) inside = Math.max(inside, Math.abs(fy));
      }
    }
    const expected = 210e9 * eps * 0.01 * 1; // σx t Ly = 210 kN
    expect(Math.abs(right - expected) / expected).toBeLessThan(1e-12);
    expect(inside / expected).toBeLessThan(1e-12);
  });

  it('refuses a bad Poisson ratio or mesh, naming the field', () => {
    let err: unknown;
    try {
      buildPlaneStressPlate({ ...base, nu: 0.5, nx: 2, ny: 2 });
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(EngineError);
    expect((err as EngineError).details).toEqual({ field: 'nu' });
    expect(() => buildPlaneStressPlate({ ...base, nx: 0, ny: 2 })).toThrow(
      /nx must be a whole number/,
    );
  });
});
