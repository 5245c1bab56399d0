import katex from 'katex';
import { describe, expect, it } from 'vitest';
import { evaluateSheet, latexName, type CalcBlockResult, type Sheet } from '../../../core/index';

function calc(source: string, significantFigures?: number) {
  const sheet: Sheet = { blocks: [{ id: 'c1', kind: 'calc', source }] };
  if (significantFigures) sheet.settings = { significantFigures };
  const r = evaluateSheet(sheet);
  const block = r.blocks[0] as CalcBlockResult;
  return { r, block, line: (n: number) => block.lines.find((l) => l.line === n) };
}

describe('calc blocks: values and units', () => {
  // Each row: the lines before, the line checked, the expected value in the expected display
  // unit (computed here from SI definitions), and the relative tolerance written out.
  const rows: {
    what: string;
    setup: string;
    line: string;
    value: number;
    unit: string;
    tol: number;
  }[] = [
    // 1 kN/mm = 1000 N / 0.001 m = 1e6 N/m (SI prefixes, common practice).
    {
      what: 'kN/mm to N/m',
      setup: 'k = 24 kN/mm',
      line: 'k to N/m',
      value: (24 * 1e3) / 1e-3,
      unit: 'N/m',
      tol: 1e-12,
    },
    // 1 t = 1000 kg (SI brochure, non-SI units accepted for use with SI).
    {
      what: 't to kg',
      setup: 'm_1 = 18 t',
      line: 'm_1 to kg',
      value: 18 * 1000,
      unit: 'kg',
      tol: 1e-12,
    },
    // 1 rpm = 1/60 Hz (one revolution per minute of 60 s).
    {
      what: 'rpm to Hz',
      setup: 'n = 1480 rpm',
      line: 'n to Hz',
      value: 1480 / 60,
      unit: 'Hz',
      tol: 1e-12,
    },
    // Closed form f = √(k/m)/(2π) with k = 24e6 N/m, m = 18e3 kg.
    {
      what: 'frequency of a spring and mass shown in Hz',
      setup: 'k = 24 kN/mm\nm_1 = 18 t',
      line: 'f = sqrt(k/m_1)/(2 pi)',
      value: Math.sqrt(24e6 / 18e3) / (2 * Math.PI),
      unit: 'Hz',
      tol: 1e-12,
    },
    // ω = √(k/m) in rad/s for names starting with omega (display rule of core/sheet/format.ts).
    {
      what: 'omega shown in rad/s',
      setup: 'k = 24 kN/mm\nm_1 = 18 t',
      line: 'omega = sqrt(k/m_1)',
      value: Math.sqrt(24e6 / 18e3),
      unit: 'rad/s',
      tol: 1e-12,
    },
    // T = 1/f in seconds.
    {
      what: 'period in s',
      setup: 'f = 2.5 Hz',
      line: 'T = 1/f',
      value: 0.4,
      unit: 's',
      tol: 1e-12,
    },
    // Force = stiffness × displacement: 24 kN/mm × 2 mm = 48 kN.
    {
      what: 'compound unit simplified to kN',
      setup: 'k = 24 kN/mm',
      line: 'F = k * 2 mm',
      value: 48,
      unit: 'kN',
      tol: 1e-12,
    },
    // Stress = force / area: 48 kN / (40 mm × 100 mm) = 12 MPa.
    {
      what: 'stress simplified to MPa',
      setup: 'F = 48 kN',
      line: 'sigma = F / (40 mm * 100 mm)',
      value: 48e3 / (0.04 * 0.1) / 1e6,
      unit: 'MPa',
      tol: 1e-12,
    },
    // Moment = force × lever arm: 12 kN × 3 m = 36 kN m.
    {
      what: 'moment in kN m',
      setup: 'P = 12 kN',
      line: 'M_0 = P * 3 m',
      value: 36,
      unit: 'kN m',
      tol: 1e-12,
    },
    // EI of a steel section: 210 GPa × 8.36e-5 m^4 = 1.7556e7 N m^2 = 17.556 MN m^2.
    {
      what: 'bending stiffness in MN m^2',
      setup: 'E = 210 GPa\nI = 8.36e-5 m^4',
      line: 'EI = E * I',
      value: (210e9 * 8.36e-5) / 1e6,
      unit: 'MN m^2',
      tol: 1e-12,
    },
    // A dimension with no named unit is shown in SI base units: 2 kg × 3 s = 6 kg s.
    {
      what: 'dimension without a named unit in SI',
      setup: 'a = 2 kg',
      line: 'a * 3 s',
      value: 6,
      unit: 'kg s',
      tol: 1e-12,
    },
    // Weight of 18 t under g = 9.81 m/s² (common practice for g): 176.58 kN.
    {
      what: 'weight from mass and g',
      setup: 'm_1 = 18 t\ng_0 = 9.81 m/s^2',
      line: 'W = m_1 * g_0',
      value: (18e3 * 9.81) / 1e3,
      unit: 'kN',
      tol: 1e-12,
    },
    // A unit the engineer wrote is kept: 24 kN/mm stays kN/mm.
    {
      what: "engineer's unit kept",
      setup: '',
      line: 'k = 24 kN/mm',
      value: 24,
      unit: 'kN/mm',
      tol: 0,
    },
    // Plain numbers stay numbers.
    {
      what: 'dimensionless ratio',
      setup: 'k_1 = 24 kN/mm\nk_2 = 20 kN/mm',
      line: 'k_1 / k_2',
      value: 1.2,
      unit: '',
      tol: 1e-12,
    },
  ];

  it.each(rows)('computes $what', ({ setup, line, value, unit, tol }) => {
    const source = setup ? `${setup}\n${line}` : line;
    const n = source.split('\n').length;
    const { r, line: at } = calc(source);
    expect(r.errors).toEqual([]);
    const v = at(n)!.value;
    if (unit === '') {
      expect(v.type).toBe('number');
      if (v.type === 'number')
        expect(Math.abs(v.value - value)).toBeLessThanOrEqual(tol * Math.abs(value));
    } else {
      expect(v.type).toBe('quantity');
      if (v.type === 'quantity') {
        expect(v.unit).toBe(unit);
        expect(Math.abs(v.value - value)).toBeLessThanOrEqual(tol * Math.abs(value));
      }
    }
  });

  it("shows the result to the sheet's significant figures", () => {
    // √(24e6/18e3)/(2π) = 5.8115… Hz (closed form above).
    expect(calc('k = 24 kN/mm\nm_1 = 18 t\nf = sqrt(k/m_1)/(2 pi)').line(3)!.display).toBe(
      '5.812 Hz',
    );
    expect(calc('k = 24 kN/mm\nm_1 = 18 t\nf = sqrt(k/m_1)/(2 pi)', 6).line(3)!.display).toBe(
      '5.81152 Hz',
    );
  });

  it('carries units through matrices and vectors of results', () => {
    const { r, line } = calc('k = 24 kN/mm\nK = [2, -1; -1, 1] * k\nf = [2 Hz, 4.5 Hz]\nf[2]');
    expect(r.errors).toEqual([]);
    const K = line(2)!.value;
    expect(K.type).toBe('matrix');
    // 2 × 24 kN/mm = 48 MN/m; shown in MN/m (prefix chosen so entries read 1–1000).
    if (K.type === 'matrix') {
      expect(K.unit).toBe('MN/m');
      expect(K.values).toEqual([
        [48, -24],
        [-24, 24],
      ]);
    }
    const f = line(3)!.value;
    expect(f).toEqual({ type: 'vector', length: 2, values: [2, 4.5], unit: 'Hz' });
    // mathjs indexing is 1-based.
    expect(line(4)!.display).toBe('4.5 Hz');
  });

  it('writes the formula, the substituted values and the result as LaTeX', () => {
    const { line } = calc('k_1 = 24 kN/mm\nm_1 = 18 t\nf_1 = sqrt(k_1/m_1)/(2 pi)');
    const l = line(3)!;
    expect(l.latex.formula).toContain('f_{1}=');
    expect(l.latex.formula).toContain('k_{1}');
    expect(l.latex.substituted).toContain('24\\,\\mathrm{kN}/\\mathrm{mm}');
    expect(l.latex.substituted).toContain('18\\,\\mathrm{t}');
    expect(l.latex.result).toBe('5.812\\,\\mathrm{Hz}');
    // Parentheses that a fraction bar makes redundant are not written: ÷ (2π) is a plain 2π.
    expect(l.latex.formula).not.toContain('\\left(');
    // A product keeps a space between \cdot and the next name so the LaTeX stays valid.
    expect(calc('a = 2\nb = 3 a').line(2)!.latex.formula).not.toMatch(/\\cdot[a-z]/);
  });

  it('writes a generator call on one line and its model as a short summary', () => {
    const { line } = calc(
      'E = 210 GPa\nI_v = 0.052 m^4\nL = 31.5 m\nm = 2.9 t/m\n' +
        'deck = beam({E: E, I: I_v, mass: m, length: L, elements: 4, ends: "pinned-pinned"})',
    );
    const l = line(5)!;
    // The object argument as written, not as a two-column table; the word keeps its hyphen.
    expect(l.latex.formula).not.toContain('\\begin');
    expect(l.latex.formula).toContain('\\mathrm{E}{:}');
    expect(l.latex.formula).toContain('\\text{“pinned-pinned”}');
    expect(l.latex.substituted).toContain('210\\,\\mathrm{GPa}');
    // 4 elements, pinned at both ends: 5 nodes × (w, θ) = 10 DOFs less the 2 pinned w = 8
    // (Hermite beam elements, common practice).
    expect(l.latex.result).toContain('\\mathrm{K}\\;[8\\times8]');
    expect(l.latex.result).toContain('\\mathrm{n}=8');
    for (const tex of [l.latex.formula, l.latex.substituted!, l.latex.result]) {
      expect(() => katex.renderToString(tex, { throwOnError: true })).not.toThrow();
    }
  });

  it('shows no substituted form for a plain reference', () => {
    const { line } = calc('f = 4 Hz\ng = f');
    expect(line(2)!.latex.substituted).toBeNull();
    expect(line(2)!.latex.result).toBe('4\\,\\mathrm{Hz}');
  });

  it('renders engineering names', () => {
    expect(latexName('f_1')).toBe('f_{1}');
    expect(latexName('k_storey')).toBe('k_{\\mathrm{storey}}');
    expect(latexName('omega')).toBe('\\omega');
    expect(latexName('phi_1')).toBe('\\phi_{1}');
    expect(latexName('Delta_t')).toBe('\\Delta_{t}');
    expect(latexName('k1')).toBe('k_{1}');
  });
});

describe('calc blocks: errors at the right line', () => {
  it('names an unknown name with a suggestion', () => {
    const { r } = calc('k_2 = 20 kN/mm\n\nx = k2 * 2');
    expect(r.errors).toHaveLength(1);
    expect(r.errors[0]).toMatchObject({
      blockId: 'c1',
      blockIndex: 0,
      line: 3,
      code: 'SHEET_EVAL',
    });
    expect(r.errors[0]!.message).toBe('Unknown name "k2" — did you mean "k_2"?');
  });

  it('refuses a unit hidden by a value of the same name (m = 5 t, then 9.81 m/s^2)', () => {
    // mathjs resolves a name before the unit of the same spelling; 9.81 m/s^2 would silently
    // become 9.81 × 5 t / s^2.
    const { r } = calc('m = 5 t\nk = 2000 kN/m\ng = 9.81 m/s^2');
    // line 2 (2000 kN/m) and line 3 (9.81 m/s^2) both write the metre
    expect(r.errors.map((e) => e.line)).toEqual([2, 3]);
    expect(r.errors[0]).toMatchObject({ blockId: 'c1', line: 2, code: 'SHEET_EVAL' });
    expect(r.errors[1]!.message).toMatch(/^"m" here reads as the metre, but a value named m/);
    // k / m with m a value is ordinary arithmetic, not unit notation
    expect(calc('m = 5 t\nk_1 = 2000 kN/mm\nw = sqrt(k_1 / m)').r.errors).toHaveLength(0);
    const ok = calc('m_1 = 5 t\ng = 9.81 m/s^2');
    expect(ok.r.errors).toHaveLength(0);
    expect(ok.line(2)!.display).toBe('9.81 m/s^2');
  });

  it('says which units do not match', () => {
    const { r } = calc('a = 3 kN\nb = 2 m\nc = a + b');
    expect(r.errors[0]).toMatchObject({ line: 3 });
    expect(r.errors[0]!.message).toBe('Units do not match: cannot add kN and m.');
  });

  it('reports division by zero', () => {
    const { r } = calc('F = 3 kN\nA = 0 m^2\nsigma = F / A');
    expect(r.errors[0]).toMatchObject({ line: 3 });
    expect(r.errors[0]!.message).toMatch(/^Division by zero/);
  });

  it('reports a syntax error and the names it leaves undefined below', () => {
    const { r, block } = calc('a = (1 +\nb = a * 2\nc = 3');
    expect(r.errors.map((e) => e.line)).toEqual([1, 2]);
    expect(r.errors[0]!.code).toBe('SHEET_PARSE');
    expect(r.errors[1]!.message).toBe(
      'Not evaluated: depends on "a", which failed on line 1 of block 1 ("c1").',
    );
    expect(r.errors[1]).toMatchObject({ severity: 'note', dependsOn: 'a' });
    // Evaluation goes on after errors.
    expect(block.lines.map((l) => l.name)).toEqual(['c']);
  });

  it('names a block the editor made by its place in the sheet, not its generated id', () => {
    const r = evaluateSheet({
      blocks: [
        { id: 'b0a1b2c3d4e5f', kind: 'calc', source: 'a = (1 +' },
        { id: 'b123456789abc', kind: 'calc', source: 'b = a * 2' },
      ],
    });
    expect(r.errors[1]!.message).toBe(
      'Not evaluated: depends on "a", which failed on line 1 of block 1.',
    );
  });

  it('refuses two statements on one line', () => {
    const { r } = calc('a = 1; b = 2');
    expect(r.errors[0]).toMatchObject({ line: 1, code: 'SHEET_PARSE' });
  });

  it('carries scope from block to block, top to bottom only', () => {
    const r = evaluateSheet({
      blocks: [
        { id: 'a', kind: 'calc', source: 'x = y + 1' },
        { id: 'b', kind: 'calc', source: 'y = 2 m\nz = y * 3' },
      ],
    });
    expect(r.errors).toHaveLength(1);
    expect(r.errors[0]).toMatchObject({ blockId: 'a', line: 1 });
    expect((r.blocks[1] as CalcBlockResult).lines[1]!.display).toBe('6 m');
  });
});
