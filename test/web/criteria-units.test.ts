// Criteria lines and the comparison's result changes in the sheet's unit system, on a real
// evaluation of the engine, run in Node. Factors: NIST SP 811 (2008), Appendix B.8 and B.9
// (1 in = 0.0254 m and 1 lb = 0.45359237 kg exactly, g_n = 9.80665 m/s²).
import { describe, expect, it } from 'vitest';
import {
  diffSheets,
  digestSheet,
  evaluateSheet,
  type CriteriaBlockResult,
  type Sheet,
} from '../../core/index';
import { criterionText } from '../../web/src/components/results/criterion-text';
import { changeValues } from '../../web/src/features/compare/lib/shown-values';

const sheet = (units: 'si' | 'us', span = '6 m'): Sheet => ({
  blocks: [
    { id: 'd', kind: 'calc', source: `L = ${span}\ndelta = L / 480\nF = 2 kN * 5` },
    {
      id: 'c',
      kind: 'criteria',
      source: [
        'delta <= 25 mm  # deflection',
        'F < 50 kN  # load',
        '(delta <= 25 mm) and (F >= 1 kN)  # both',
        'F / 1 kN > 3  # ratio',
      ].join('\n'),
    },
  ],
  settings: { units },
});

const criteria = (s: Sheet) =>
  (evaluateSheet(s).blocks.find((b) => b.kind === 'criteria') as CriteriaBlockResult).criteria;

describe('criterionText', () => {
  it('shows the engine text unchanged in SI', () => {
    const [deflection, load] = criteria(sheet('si'));
    // δ = L/480 = 6 m / 480 = 0.0125 m, computed, so the engine writes it in m.
    expect(criterionText(deflection!, 'si', 4)).toBe('0.0125 m vs 25 mm');
    expect(criterionText(load!, 'si', 4)).toBe(`${load!.lhs} vs ${load!.rhs}`);
  });

  it('shows both sides in inches in US customary: 12.5 mm = 0.4921 in, 25 mm = 0.9843 in (NIST SP 811 B.8, 1 in = 0.0254 m exactly)', () => {
    const [deflection] = criteria(sheet('us'));
    // 0.0125 / 0.0254 = 0.492126; 0.025 / 0.0254 = 0.984252; to 4 significant figures.
    expect(criterionText(deflection!, 'us', 4)).toBe('0.4921 in vs 0.9843 in');
  });

  it('shows forces in kip, both sides in the larger side’s unit: 10 kN = 2.248 kip, 50 kN = 11.24 kip (NIST SP 811 B.8, 1 kip = 4.448 222 E+03 N)', () => {
    const [, load] = criteria(sheet('us'));
    // 10000 / 4448.2216 = 2.24809; 50000 / 4448.2216 = 11.2404.
    expect(criterionText(load!, 'us', 4)).toBe('2.248 kip vs 11.24 kip');
  });

  it('converts each comparison of a compound criterion and keeps the words; numbers stay', () => {
    const [, , both, ratio] = criteria(sheet('us'));
    // 1 kN = 0.224809 kip (NIST SP 811 B.8); each comparison in its own larger side's unit.
    expect(criterionText(both!, 'us', 4)).toBe(
      '(0.4921 in <= 0.9843 in) and (2.248 kip >= 0.2248 kip)',
    );
    expect(criterionText(ratio!, 'us', 4)).toBe(criterionText(ratio!, 'si', 4));
  });

  it('leaves results stored before the sides carried their values as the engine wrote them', () => {
    const [deflection] = criteria(sheet('us'));
    const { shown: _shown, ...old } = deflection!;
    expect(criterionText(old, 'us', 4)).toBe('0.0125 m vs 25 mm');
  });

  it('gives the same SI results and results digest in both systems (display only)', () => {
    const si = sheet('si');
    const us = sheet('us');
    const a = evaluateSheet(si);
    const b = evaluateSheet(us);
    expect(JSON.stringify(b.blocks)).toBe(JSON.stringify(a.blocks));
    expect(digestSheet(us, b).digests.results).toBe(digestSheet(si, a).digests.results);
  });
});

describe('changeValues', () => {
  it('shows a changed deflection in inches from its SI values: 0.0125 m → 0.015 m is 0.492126 in → 0.590551 in (NIST SP 811 B.8)', () => {
    const before = sheet('us');
    const after = sheet('us', '7.2 m');
    const d = diffSheets(before, after, evaluateSheet(before), evaluateSheet(after));
    const change = d.results.find((r) => r.key === 'delta')!;
    // 0.015 / 0.0254 = 0.5905512 (six significant figures).
    expect(changeValues(change, 'us')).toEqual({ old: '0.492126 in', new: '0.590551 in' });
    expect(changeValues(change, 'si')).toEqual({ old: '0.0125 m', new: '0.015 m' });
    // L: 6 m → 7.2 m is 19.685 ft → 23.622 ft (1 ft = 0.3048 m exactly, NIST SP 811 B.8).
    expect(
      changeValues(
        d.results.find((r) => r.key === 'L')!,
        'us',
      ),
    ).toEqual({
      old: '19.685 ft',
      new: '23.622 ft',
    });
  });
});
