// The client's number formatting (web/src/lib/format.ts): pure functions, run without a browser.
import { describe, expect, it } from 'vitest';
import { rhoAxis } from '../../web/src/components/results/rho-axis';
import { participationFactor, percent, sig } from '../../web/src/lib/format';

describe('number formatting of results', () => {
  it('gives significant figures without trailing noise, with a minus sign', () => {
    expect(sig(3.0721, 4)).toBe('3.072');
    expect(sig(-86.0512, 4)).toBe('−86.05');
    expect(sig(0)).toBe('0');
    expect(sig(null)).toBe('—');
    expect(sig(1.5e-7, 2)).toBe('1.5e−7');
  });

  it('shows a ratio as a percentage with one decimal', () => {
    expect(percent(0.8703)).toBe('87.0 %');
    expect(percent(null)).toBe('—');
  });

  it('shows a participation factor below a millionth of the largest as ≈ 0', () => {
    // An antisymmetric mode of a symmetric pinned span has Γ = 0 exactly (mode shapes of a
    // simply supported beam, sin(2πx/L) integrates to zero; closed form): rounding leaves 4e-7.
    const all = [270.5, 4.352e-7, -86.05];
    expect(participationFactor(4.352e-7, all)).toBe('≈ 0');
    expect(participationFactor(-86.05, all)).toBe('−86.05');
    // Not hidden when it is the only, or a real, value: a millionth is the line.
    expect(participationFactor(3e-4, [3e-4])).toBe('0.0003');
    expect(participationFactor(null, all)).toBe('—');
  });
});

describe('the ρ axis of the convergence plot', () => {
  it('gives a flat history a band around its value and enough figures to tell the ticks apart', () => {
    // Lanczos on a plate: ρ is 1.2634e6 at the first and the last step.
    const flat = rhoAxis([1.2634e6, 1.2634e6]);
    expect(flat.digits).toBe(7);
    const [lo, hi] = flat.domain as [number, number];
    expect(lo).toBeLessThan(1.2634e6);
    expect(hi).toBeGreaterThan(1.2634e6);
    expect(sig(lo, flat.digits)).not.toBe(sig(hi, flat.digits));
  });

  it('keeps four figures for a history that falls well, more when it moves in the last digits', () => {
    expect(rhoAxis([430, 372.6, 372.4])).toEqual({ domain: ['auto', 'auto'], digits: 4 });
    // a range 1e-4 of the value: 1000.0 against 1000.1 differ in the fifth figure, ticks in the sixth
    expect(rhoAxis([1000, 1000.1]).digits).toBe(6);
  });
});
