// The client's unit-system helpers (web/src/components/results/units.tsx, modes-csv.ts) on a real
// evaluation of the engine, run in Node. Factors: NIST SP 811 (2008), Appendix B.8.
import { describe, expect, it } from 'vitest';
import { evaluateSheet, type CalcBlockResult, type ModesBlockResult } from '../../core/index';
import { modesCsv } from '../../web/src/components/results/modes-csv';
import { unitsFor, usCalcResult } from '../../web/src/components/results/units';

const sheet = evaluateSheet({
  blocks: [
    { id: 'd', kind: 'calc', source: 'm_0 = 100 t\nk_0 = 50 kN/mm\nk_2 = 2 k_0\nF = k_0 * 2 mm' },
    {
      id: 's',
      kind: 'calc',
      source: 'frame = storey_chain([2 m_0, m_0], [2 k_0, k_0])',
    },
    { id: 'm', kind: 'modes', source: 'stiffness: frame.K\nmass: frame.M\ncount: 2\nname: fl' },
    { id: 'f', kind: 'calc', source: 'f_1 = fl.f[1]' },
  ],
});
const calc = sheet.blocks[0] as CalcBlockResult;
const modes = sheet.blocks[2] as ModesBlockResult;

describe('usCalcResult', () => {
  it('keeps a typed value in the unit written', () => {
    expect(usCalcResult(calc.lines[1]!, 'us', 4)).toBeNull();
  });

  it('shows a computed stiffness in kip/in: 100 kN/mm = 571.0 kip/in (NIST SP 811 B.8, kip/in 1.751 268 E+05 N/m)', () => {
    const r = usCalcResult(calc.lines[2]!, 'us', 4)!;
    // 1e8 N/m / 1.751268e5 N/m = 571.01; shown to 4 figures.
    expect(r.display).toBe('571 kip/in');
    expect(r.tex).toContain('\\mathrm{kip/in}');
  });

  it('leaves SI sheets and frequencies as the engine wrote them', () => {
    expect(usCalcResult(calc.lines[2]!, 'si', 4)).toBeNull();
    const f = (sheet.blocks[3] as CalcBlockResult).lines[0]!;
    expect(usCalcResult(f, 'us', 4)).toBeNull();
  });
});

describe('unitsFor', () => {
  it('writes forces in kip and displacements in in under US customary', () => {
    const u = unitsFor('us');
    // 44.482216 kN = 10 kip; 25.4 mm = 1 in (NIST SP 811 B.8).
    expect(u.text('force', 44482.216152605)).toBe('10 kip');
    expect(u.text('displacement', 0.0254)).toBe('1 in');
    expect(u.unit('period')).toBe('s');
    expect(unitsFor('si').text('force', 2500)).toBe('2.5 kN');
  });
});

describe('modesCsv in US customary units', () => {
  it('gives Γ and effective mass in lbf·s²/in with the unit in the header; f and T unchanged', () => {
    const [head, first] = modesCsv(modes, 'us')
      .trim()
      .split(/\r?\n/)
      .map((l) => l.split(','));
    const si = modesCsv(modes, 'si').trim().split(/\r?\n/)[1]!.split(',');
    expect(head).toContain('effective mass (lbf*s^2/in)');
    const col = head!.indexOf('effective mass (lbf*s^2/in)');
    // 1 lbf·s²/in = 4.448 222 N / 0.0254 m/s² = 175.1268 kg (NIST SP 811 B.8), relative 5e-7.
    const ratio = Number(si[col]) / Number(first![col]);
    expect(Math.abs(ratio - 4.448222 / 0.0254) / (4.448222 / 0.0254)).toBeLessThan(5e-7);
    expect(first![1]).toBe(si[1]);
  });
});
