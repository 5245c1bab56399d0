import { describe, expect, it } from 'vitest';
import { evaluateSheet, type CriteriaBlockResult } from '../../../core/index';

function sheet(calc: string, criteria: string) {
  return evaluateSheet({
    blocks: [
      { id: 'c', kind: 'calc', source: calc },
      { id: 'k', kind: 'criteria', source: criteria },
    ],
  });
}

describe('criteria blocks', () => {
  it('gives pass or fail per line with the comment as label, and counts them', () => {
    // f = √(k/m)/(2π) = 5.81 Hz for k = 24 kN/mm, m = 18 t (closed form).
    const r = sheet(
      'k = 24 kN/mm\nm_1 = 18 t\nf = sqrt(k/m_1)/(2 pi)',
      'f >= 3 Hz  # walking comfort, vertical (common practice)\nf >= 8 Hz # stiff floor\nf < 100 Hz',
    );
    expect(r.errors).toEqual([]);
    const b = r.blocks[1] as CriteriaBlockResult;
    expect(b.criteria.map((c) => [c.line, c.label, c.pass])).toEqual([
      [1, 'walking comfort, vertical (common practice)', true],
      [2, 'stiff floor', false],
      [3, 'f < 100 Hz', true],
    ]);
    expect(b.criteria[0]!.lhs).toBe('5.812 Hz');
    expect(b.criteria[0]!.rhs).toBe('3 Hz');
    expect(r.summary).toEqual({ passed: 2, failed: 1, errors: 0 });
  });

  it('compares across units', () => {
    // 1480 rpm = 24.67 Hz; 20 % away from it is 19.73 Hz.
    const r = sheet(
      'n = 1480 rpm\nf = 30 Hz',
      'f > 1.2 n  # 20 % above the running speed (common practice)',
    );
    expect((r.blocks[1] as CriteriaBlockResult).criteria[0]!.pass).toBe(30 > 1.2 * (1480 / 60));
  });

  it('refuses a line that is not true or false, at that line', () => {
    const r = sheet('f = 4 Hz', 'f > 3 Hz\nf * 2');
    expect(r.errors).toHaveLength(1);
    expect(r.errors[0]).toMatchObject({ blockId: 'k', blockIndex: 1, line: 2, code: 'SHEET_EVAL' });
    expect(r.errors[0]!.message).toMatch(/not true or false: it gives 8 Hz/);
  });

  it('shows the values of each comparison of a criterion joined with or / and', () => {
    // r = 24.2 Hz / 24.75 Hz = 0.9778: neither below 0.5 nor above 1.5 (fails); within 0.9–1.1.
    const r = sheet(
      'r = 24.2 Hz / (1485 rpm)',
      'r <= 0.5 or r >= 1.5  # away from resonance\n(r > 0.9) and not (r > 1.1)',
    );
    const [a, b] = (r.blocks[1] as CriteriaBlockResult).criteria;
    expect(a!.pass).toBe(false);
    expect([a!.lhs, a!.rhs]).toEqual([null, null]);
    expect(a!.values).toBe('0.9778 <= 0.5 or 0.9778 >= 1.5');
    expect(b!.pass).toBe(true);
    expect(b!.values).toBe('(0.9778 > 0.9) and not (0.9778 > 1.1)');
  });

  it('refuses an assignment', () => {
    const r = sheet('f = 4 Hz', 'g = f > 3 Hz');
    expect(r.errors[0]!.message).toMatch(/cannot define a name/);
  });

  it('reports a unit mismatch in a comparison', () => {
    const r = sheet('f = 4 Hz', 'f > 3 m');
    expect(r.errors[0]!.message).toBe('Units do not match: cannot compare Hz and m.');
  });
});
