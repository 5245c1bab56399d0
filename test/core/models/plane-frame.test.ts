import { describe, expect, it } from 'vitest';
import { buildPlaneFrame } from '../../../core/models/plane-frame';
import { EngineError } from '../../../core/errors';
import { denseEigenvalues, toDense } from './dense-pencil';

// Steel beam, SI units: the values only need to be physical; the checks are closed forms.
const E = 210e9;
const I = 8.0e-6; // m⁴
const A = 5.0e-3; // m²
const m = 40; // kg/m

function beamAlong(
  L: number,
  elements: number,
  angle: number,
  supports: Parameters<typeof buildPlaneFrame>[0]['supports'],
) {
  const c = Math.cos(angle);
  const s = Math.sin(angle);
  const nodes = Array.from({ length: elements + 1 }, (_, k) => ({
    x: (k * L * c) / elements,
    y: (k * L * s) / elements,
  }));
  const members = Array.from({ length: elements }, (_, k) => ({
    from: k,
    to: k + 1,
    E,
    A,
    I,
    massPerLength: m,
  }));
  return buildPlaneFrame({ nodes, members, supports: supports ?? [] });
}

describe('buildPlaneFrame', () => {
  it('gives the pinned–pinned beam frequencies (nπ)²√(EI/(mL⁴)) for a simply supported beam', () => {
    // REFERENCES.md item 1: pinned–pinned β_n L = nπ (Thomson, Appendix D). 24 Hermite members
    // with consistent mass converge from above; 1e-4 relative on the first three is the
    // discretization error of 24 elements (h⁴ convergence, about 1e-6 for n = 1).
    const L = 6;
    const ne = 24;
    const frame = beamAlong(L, ne, 0, [
      { node: 0, ux: true, uy: true },
      { node: ne, uy: true },
    ]);
    expect(frame.n).toBe(3 * (ne + 1) - 3);
    const lam = denseEigenvalues(frame.K, frame.M);
    // The axial modes are far higher (bar frequency √(E/ρ)/(2L) ≫ bending), so the lowest three
    // eigenvalues are the bending ones.
    for (let k = 1; k <= 3; k++) {
      const omega = (k * Math.PI) ** 2 * Math.sqrt((E * I) / (m * L ** 4));
      const got = Math.sqrt(lam[k - 1]!);
      expect(got).toBeGreaterThanOrEqual(omega * (1 - 1e-9)); // from above (Rayleigh–Ritz)
      expect(Math.abs(got - omega) / omega).toBeLessThan(1e-4);
    }
  });

  it('is invariant to the member direction: an inclined cantilever has the clamped–free values', () => {
    // Clamped–free β₁L = 1.87510407, β₂L = 4.69409113 (REFERENCES.md item 1); at 37° the
    // transformation must leave the eigenvalues unchanged.
    const L = 4;
    const ne = 16;
    const frame = beamAlong(L, ne, (37 * Math.PI) / 180, [
      { node: 0, ux: true, uy: true, rz: true },
    ]);
    const lam = denseEigenvalues(frame.K, frame.M);
    for (const [k, bl] of [
      [0, 1.87510407],
      [1, 4.69409113],
    ] as const) {
      const omega = bl ** 2 * Math.sqrt((E * I) / (m * L ** 4));
      // 1e-4 relative: eight handbook digits, 16-element discretization error well below that.
      expect(Math.abs(Math.sqrt(lam[k]!) - omega) / omega).toBeLessThan(1e-4);
    }
  });

  it('carries the total mass in its influence vectors: rᵀMr = m L + lumped masses', () => {
    // Consistent mass conserves translational mass (rigid translation is in the element's
    // interpolation space); a 500 kg lumped mass adds to both directions.
    const frame = buildPlaneFrame({
      nodes: [
        { x: 0, y: 0 },
        { x: 0, y: 3 },
        { x: 5, y: 3 },
        { x: 5, y: 0 },
      ],
      members: [
        { from: 0, to: 1, E, A, I, massPerLength: m },
        { from: 1, to: 2, E, A, I, massPerLength: 2 * m },
        { from: 2, to: 3, E, A, I, massPerLength: m },
      ],
      supports: [],
      lumpedMasses: [{ node: 1, mass: 500 }],
    });
    const M = toDense(frame.M);
    const rx = frame.influence.ux;
    let mass = 0;
    for (let i = 0; i < frame.n; i++)
      for (let j = 0; j < frame.n; j++) mass += rx[i]! * M.get(i, j) * rx[j]!;
    const expected = m * 3 + 2 * m * 5 + m * 3 + 500;
    expect(Math.abs(mass - expected) / expected).toBeLessThan(1e-12);
    // An unsupported frame has three rigid-body modes (λ = 0): K r = 0 for a translation.
    const K = toDense(frame.K);
    let maxKr = 0;
    for (let i = 0; i < frame.n; i++) {
      let s = 0;
      for (let j = 0; j < frame.n; j++) s += K.get(i, j) * rx[j]!;
      maxKr = Math.max(maxKr, Math.abs(s));
    }
    expect(maxKr).toBeLessThan(1e-6 * ((E * A) / 3)); // round-off relative to the axial stiffness
  });

  it('refuses a member with zero length or a missing node, naming it', () => {
    expect(() =>
      buildPlaneFrame({
        nodes: [
          { x: 0, y: 0 },
          { x: 0, y: 0 },
        ],
        members: [{ from: 0, to: 1, E, A, I, massPerLength: m }],
      }),
    ).toThrow(/Member 1 has zero length/);
    let err: unknown;
    try {
      buildPlaneFrame({
        nodes: [{ x: 0, y: 0 }],
        members: [{ from: 0, to: 3, E, A, I, massPerLength: m }],
      });
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(EngineError);
    expect((err as EngineError).message).toMatch(/Member 1 refers to node 4/);
  });
});
