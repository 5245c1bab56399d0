import { describe, expect, it } from 'vitest';
import { eulerBernoulliBeam, STANDARD_GRAVITY, walkingResponse } from '../../../core/index';
import { basisOf } from './helpers';

describe('walkingResponse (AISC Design Guide 11, 2nd ed., Eq. 4-1, from memory)', () => {
  // pinned–pinned footbridge deck, 30 m, 1.6 t/m
  const L = 30;
  const mass = 1600;
  const { K, M } = eulerBernoulliBeam({
    E: 210e9,
    I: 0.02,
    massPerLength: mass,
    length: L,
    elements: 20,
    left: 'pinned',
    right: 'pinned',
  });
  const basis = basisOf(K, M, 2);
  it('takes W from the modal mass with the shape 1 at midspan: half the deck mass for sin(πx/L) (closed form ∫sin² = L/2; 0.5 %)', () => {
    const r = walkingResponse({ basis, mode: 0, damping: 0.01, force: 410 });
    expect(Math.abs(r.modalMass / (0.5 * mass * L) - 1)).toBeLessThan(0.005);
    const fn = r.frequency;
    // f₁ = (π/2L²)√(EI/m) (pinned–pinned beam, REFERENCES.md item 1; 0.1 % at 20 elements)
    expect(
      Math.abs(fn / ((Math.PI / (2 * L * L)) * Math.sqrt((210e9 * 0.02) / mass)) - 1),
    ).toBeLessThan(1e-3);
    const ap = (410 * Math.exp(-0.35 * fn)) / (0.01 * STANDARD_GRAVITY * r.modalMass);
    expect(r.ratio).toBeCloseTo(ap, 12);
    expect(r.acceleration).toBeCloseTo(ap * STANDARD_GRAVITY, 12);
  });
  it('refuses a DOF that does not move in the mode', () => {
    // rotation DOFs and midspan: mode 2 (antisymmetric) has a node at midspan (w at node 11)
    const shape = basis.shapes[1]!;
    let node = 0;
    for (let i = 0; i < shape.length; i++)
      if (Math.abs(shape[i]!) < 1e-9 * Math.max(...Array.from(shape, Math.abs))) node = i;
    expect(() => walkingResponse({ basis, mode: 1, dof: node, damping: 0.01 })).toThrow(
      /does not move in mode 2/,
    );
  });
  it('refuses a mode that was not found', () => {
    expect(() => walkingResponse({ basis, mode: 4, damping: 0.01 })).toThrow(
      /Mode 5 was not found/,
    );
  });
});
