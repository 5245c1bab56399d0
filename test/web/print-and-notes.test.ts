// The conditioning note's words (web/src/components/results/modes-warnings.tsx) and the printed
// page numbers' CSS (web/src/features/print/lib/page-margins.ts): pure, run without a browser.
import { describe, expect, it } from 'vitest';
import { conditioningWords } from '../../web/src/components/results/modes-warnings';
import { cssString, pageMarginCss } from '../../web/src/features/print/lib/page-margins';

describe('conditioningWords', () => {
  // λ_max/λ₁ = 5.6e7: log10 = 7.75 digits lost; ε·5.6e7 = 1.24e-8 leaves floor(7.9) = 7 digits.
  const conditioning = { estimate: 5.6e7, digitsLost: Math.log10(5.6e7), tolerance: 1e-10 };

  it('agrees with backward errors near ε instead of saying they cannot reach the tolerance', () => {
    const words = conditioningWords(conditioning, 1.8e-16);
    expect(words).toContain('at least 7.7 of 16 digits are lost');
    expect(words).toContain('leaving at most 7 for the lowest modes');
    expect(words).toContain('may not reach the tolerance 1e−10');
    expect(words).toContain('backward errors in the table (largest 1.8 × 10⁻¹⁶) are small');
    // 1.8e-16 × 5.6e7 = 1.008e-8
    expect(words).toContain('≈ 1.0 × 10⁻⁸');
    expect(words).not.toMatch(/backward errors cannot reach/);
  });

  it('explains backward errors above the tolerance by the conditioning', () => {
    const words = conditioningWords(conditioning, 3.2e-9);
    expect(words).toContain('backward errors above the tolerance (largest 3.2 × 10⁻⁹)');
  });

  it('says nothing about backward errors when none are shown', () => {
    expect(conditioningWords({ ...conditioning, tolerance: null }, null)).not.toContain('backward');
  });
});

describe('pageMarginCss', () => {
  it('numbers pages in the top-right margin box with Chromium’s page counters', () => {
    expect(pageMarginCss('DYN-01 · Rev 2')).toBe(
      `@page { @top-right { content: "DYN-01 · Rev 2 · Page " counter(page) " of " counter(pages); font: 8pt 'IBM Plex Sans', sans-serif; color: #222; } }`,
    );
  });

  it('escapes quotes and backslashes so a sheet number cannot break the rule', () => {
    expect(cssString('A"B\\C\nD')).toBe('"A\\"B\\\\C D"');
  });
});
