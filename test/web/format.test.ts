// The client's number formatting (web/src/lib/format.ts): pure functions, run without a browser.
import { describe, expect, it } from 'vitest';
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
