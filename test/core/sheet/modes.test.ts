import { describe, expect, it } from 'vitest';
import {
  evaluateSheet,
  type CalcBlockResult,
  type CriteriaBlockResult,
  type MatrixBlockResult,
  type ModesBlockResult,
  type Sheet,
  type SheetProgress,
} from '../../../core/index';

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('modes blocks: shear buildings', () => {
  it('solves the two-storey frame of REFERENCES.md item 3 (Chopra ch. 10 example, from memory)', () => {
    // Floor masses 2m (first floor) and m (roof), storey stiffnesses 2k and k.
    const m = 100e3; // kg
    const k = 50e6; // N/m
    const r = evaluateSheet({
      blocks: [
        {
          id: 'data',
          kind: 'calc',
          source: 'm_0 = 100 t\nk_0 = 50 kN/mm\nframe = storey_chain([2 m_0, m_0], [2 k_0, k_0])',
        },
        {
          id: 'solve',
          kind: 'modes',
          source: 'stiffness: frame.K\nmass: frame.M\ncount: 2\nname: floor',
        },
        { id: 'use', kind: 'calc', source: 'f_1 = floor.f[1]\nT_2 = floor.T[2]' },
      ],
    });
    expect(r.errors).toEqual([]);
    const modes = r.blocks[1] as ModesBlockResult;
    // ω₁ = √(k/2m), ω₂ = √(2k/m); relative 1e-10 (dense reference on well-separated λ).
    expect(rel(modes.modes[0]!.omega, Math.sqrt(k / (2 * m)))).toBeLessThan(1e-10);
    expect(rel(modes.modes[1]!.omega, Math.sqrt((2 * k) / m))).toBeLessThan(1e-10);
    // Effective masses 8/9 and 1/9 of the total, rᵀMr = 2m + m (every floor moves with the ground).
    expect(modes.participation?.direction).toBe('x');
    expect(rel(modes.participation!.mass, 3 * m)).toBeLessThan(1e-12);
    expect(Math.abs(modes.modes[0]!.ratio! - 8 / 9)).toBeLessThan(1e-10);
    expect(Math.abs(modes.modes[1]!.ratio! - 1 / 9)).toBeLessThan(1e-10);
    // Shapes (first floor, roof) ∝ [½, 1] and [−1, 1].
    const s = modes.shapes!;
    expect(Math.abs(s[0]![0]! / s[1]![0]! - 0.5)).toBeLessThan(1e-10);
    expect(Math.abs(s[0]![1]! / s[1]![1]! + 1)).toBeLessThan(1e-10);
    expect(modes.sturm).toMatchObject({ missed: false });
    // The results are bound with units for the blocks below.
    const use = r.blocks[2] as CalcBlockResult;
    const f1 = use.lines[0]!.value;
    expect(f1.type === 'quantity' && f1.unit).toBe('Hz');
    if (f1.type === 'quantity')
      expect(rel(f1.value, Math.sqrt(k / (2 * m)) / (2 * Math.PI))).toBeLessThan(1e-10);
    const T2 = use.lines[1]!.value;
    if (T2.type === 'quantity')
      expect(rel(T2.si, (2 * Math.PI) / Math.sqrt((2 * k) / m))).toBeLessThan(1e-10);
    else expect.fail('T_2 is not a quantity');
  });

  it('reproduces the five-storey ratios of REFERENCES.md item 4 with criteria on f1 and on 90 % of the mass', () => {
    const N = 5;
    const m = 50e3; // kg per floor
    const k = 80e6; // N/m per storey
    const sheet: Sheet = {
      blocks: [
        { id: 'intro', kind: 'text', source: 'Five-storey uniform shear frame.' },
        {
          id: 'storeys',
          kind: 'calc',
          source:
            'm_f = 50 t  # floor mass\nk_s = 80 kN/mm  # storey stiffness\nframe = storey_chain([m_f, m_f, m_f, m_f, m_f], [k_s, k_s, k_s, k_s, k_s])',
        },
        {
          id: 'modes',
          kind: 'modes',
          source: 'stiffness: frame.K\nmass: frame.M\nmethod: dense\ncount: 5\nname: bldg',
        },
        {
          id: 'checks',
          kind: 'criteria',
          source:
            'bldg.f[1] >= 1 Hz  # fundamental frequency above 1 Hz\n' +
            'bldg.cumulative[1] >= 0.9  # mode 1 alone reaches 90 % of the mass\n' +
            'bldg.cumulative[2] >= 0.9  # modes 1-2 reach 90 % (ASCE 7-16 §12.9.1.1, from memory)',
        },
      ],
    };
    const r = evaluateSheet(sheet);
    expect(r.errors).toEqual([]);
    const modes = r.blocks[2] as ModesBlockResult;
    // Chopra, Dynamics of Structures, ch. 13 tables (REFERENCES.md item 4): to the three
    // published decimals, so a tolerance of 0.0005.
    const published = [0.88, 0.087, 0.024, 0.008, 0.002];
    modes.modes.forEach((row, i) =>
      expect(Math.abs(row.ratio! - published[i]!)).toBeLessThan(5e-4),
    );
    // Fixed–free chain (REFERENCES.md item 2): λ_n = (4k/m) sin²((2n−1)π/(2(2N+1))).
    modes.modes.forEach((row, i) => {
      const theta = ((2 * (i + 1) - 1) * Math.PI) / (2 * (2 * N + 1));
      expect(rel(row.lambda, ((4 * k) / m) * Math.sin(theta) ** 2)).toBeLessThan(1e-10);
    });
    const c = (r.blocks[3] as CriteriaBlockResult).criteria;
    const f1 =
      Math.sqrt(((4 * k) / m) * Math.sin(Math.PI / (2 * (2 * N + 1))) ** 2) / (2 * Math.PI);
    expect(c.map((x) => x.pass)).toEqual([f1 >= 1, false, true]);
    expect(r.summary).toEqual({ passed: 2, failed: 1, errors: 0 });
  });

  it('solves a beam generated in a calc line (pinned-pinned: βL = nπ, REFERENCES.md item 1)', () => {
    // Steel deck: E = 210 GPa, I = 0.012 m^4, 1.2 t/m, 32 m; 20 Hermite elements, consistent mass.
    const E = 210e9;
    const I = 0.012;
    const mu = 1200;
    const L = 32;
    const r = evaluateSheet({
      blocks: [
        {
          id: 'c',
          kind: 'calc',
          source:
            'deck = beam({E: 210 GPa, I: 0.012 m^4, mass: 1.2 t/m, length: 32 m, elements: 20, ends: "pinned-pinned"})',
        },
        { id: 'm', kind: 'modes', source: 'stiffness: deck.K\nmass: deck.M\ncount: 2\nname: d' },
        {
          id: 'k',
          kind: 'criteria',
          source: 'd.f[1] >= 3 Hz  # pedestrian bridge guide, vertical (from memory)',
        },
      ],
    });
    expect(r.errors).toEqual([]);
    const modes = (r.blocks[1] as ModesBlockResult).modes;
    const omega = (n: number) => (n * Math.PI) ** 2 * Math.sqrt((E * I) / (mu * L ** 4));
    // A conforming mesh converges from above; 20 elements are within 0.01 % for modes 1–2.
    for (const n of [1, 2]) {
      const w = modes[n - 1]!.omega;
      expect(w).toBeGreaterThanOrEqual(omega(n) * (1 - 1e-12));
      expect(rel(w, omega(n))).toBeLessThan(1e-4);
    }
    expect((r.blocks[2] as CriteriaBlockResult).criteria[0]!.pass).toBe(
      omega(1) / (2 * Math.PI) >= 3,
    );
    // The shapes name their DOFs, so a plot can draw the deflection w without the rotations:
    // pinned ends keep their rotations θ1 and θ21 and lose w1 and w21.
    const block = r.blocks[1] as ModesBlockResult;
    expect(block.dofLabels).toHaveLength(block.shapes!.length);
    expect(block.dofLabels!.slice(0, 3)).toEqual(['θ1', 'w2', 'θ2']);
    expect(block.dofLabels!.at(-1)).toBe('θ21');
    // The first mode of a pinned–pinned beam is a half sine: all w of one sign, largest mid-span.
    const w = block.dofLabels!.flatMap((l, i) =>
      l.startsWith('w') ? [block.shapes![i]![0]!] : [],
    );
    expect(w).toHaveLength(19);
    expect(w.every((x) => Math.sign(x) === Math.sign(w[0]!))).toBe(true);
    expect(Math.abs(w[9]!)).toBeCloseTo(Math.max(...w.map(Math.abs)), 12);
  });

  it('warns, with a code, when K and M have no units', () => {
    const r = evaluateSheet({
      blocks: [
        { id: 'k', kind: 'matrix', source: 'name: K\n\n2000, -1000\n-1000, 1000' },
        { id: 'm', kind: 'matrix', source: 'name: M\n\n10, 0\n0, 10' },
        { id: 'x', kind: 'modes', source: 'stiffness: K\nmass: M\ncount: 2\nname: s' },
      ],
    });
    expect(r.errors).toEqual([]);
    const block = r.blocks[2] as ModesBlockResult;
    expect(block.warnings).toContainEqual({
      code: 'UNITS_ASSUMED_SI',
      message: expect.stringMatching(/no units: their entries are taken as consistent SI units/),
    });
    // The 2 × 2 pencil in SI (N/m and kg): det(K − λM) = 100 λ² − 30000 λ + 1e6 = 0, so
    // λ = 150 ± √(150² − 10⁴) (closed form of the quadratic).
    const lambdas = block.modes.map((m) => m.lambda);
    expect(lambdas[0]).toBeCloseTo(150 - Math.sqrt(150 ** 2 - 1e4), 9);
    expect(lambdas[1]).toBeCloseTo(150 + Math.sqrt(150 ** 2 - 1e4), 9);
  });

  it('gives no DOF labels for a typed matrix', () => {
    const r = evaluateSheet({
      blocks: [
        { id: 'k', kind: 'matrix', source: 'name: K\nunit: kN/m\n\n2000, -1000\n-1000, 1000' },
        { id: 'm', kind: 'matrix', source: 'name: M\nunit: t\n\n10, 0\n0, 10' },
        { id: 'x', kind: 'modes', source: 'stiffness: K\nmass: M\ncount: 2\nname: s' },
      ],
    });
    expect(r.errors).toEqual([]);
    const block = r.blocks[2] as ModesBlockResult;
    expect(block.shapes).toHaveLength(2);
    expect(block.dofLabels).toBeNull();
  });

  it('finds the modes nearest a shift given as a machine speed', () => {
    // Five-storey chain as above; shift at f₃ (from the closed form) gives mode 3 first.
    const N = 5;
    const lam = (n: number) =>
      ((4 * 80e6) / 50e3) * Math.sin(((2 * n - 1) * Math.PI) / (2 * (2 * N + 1))) ** 2;
    const f3rpm = (Math.sqrt(lam(3)) / (2 * Math.PI)) * 60 * 1.01;
    const r = evaluateSheet({
      blocks: [
        {
          id: 'c',
          kind: 'calc',
          source:
            'frame = storey_chain([50 t, 50 t, 50 t, 50 t, 50 t], 80 kN/mm * [1, 1, 1, 1, 1])',
        },
        {
          id: 'm',
          kind: 'modes',
          source: `stiffness: frame.K\nmass: frame.M\nmethod: shifted\nshift: ${f3rpm} rpm\ncount: 1\nname: near`,
        },
      ],
    });
    expect(r.errors).toEqual([]);
    expect(rel((r.blocks[1] as ModesBlockResult).modes[0]!.lambda, lam(3))).toBeLessThan(1e-8);
  });
});

describe('modes blocks: refusals', () => {
  const chain = {
    id: 'c',
    kind: 'calc' as const,
    source: 'frame = storey_chain([20 t, 10 t], [40 kN/mm, 20 kN/mm])',
  };

  it('says weights were entered instead of masses when M is in force units', () => {
    const r = evaluateSheet({
      blocks: [
        chain,
        { id: 'w', kind: 'matrix', source: 'name: W\nunit: kN\n196.2 0\n0 98.1' },
        { id: 'm', kind: 'modes', source: 'stiffness: frame.K\nmass: W\nname: bad' },
        { id: 'u', kind: 'calc', source: 'bad.f[1]' },
      ],
    });
    expect(r.errors[0]).toMatchObject({ blockId: 'm', line: 2 });
    expect(r.errors[0]!.message).toBe(
      'M is in kN; a mass matrix must be in mass units — did you enter weights instead of masses? Divide by g = 9.81 m/s².',
    );
    // A line that uses the failed block's name is not evaluated: a note names the first error.
    expect(r.errors[1]).toMatchObject({ blockId: 'u', severity: 'note', code: 'NOT_EVALUATED' });
    expect(r.errors[1]!.message).toBe(
      'Not evaluated: depends on "bad", which failed on line 3 of block 3 ("m").',
    );
    expect(r.summary.errors).toBe(1);
  });

  it('refuses K and M whose units do not reduce to 1/s²', () => {
    const r = evaluateSheet({
      blocks: [
        { id: 'k', kind: 'matrix', source: 'name: K\nunit: kN/m\n2 -1\n-1 1' },
        { id: 'mm', kind: 'matrix', source: 'name: M\nunit: kg/m\n1 0\n0 1' },
        { id: 'm', kind: 'modes', source: 'stiffness: K\nmass: M' },
      ],
    });
    expect(r.errors[0]!.message).toMatch(/K\/M must reduce to 1\/s²/);
  });

  it('names an unknown key and lists the known ones', () => {
    const r = evaluateSheet({
      blocks: [
        chain,
        { id: 'm', kind: 'modes', source: 'stiffness: frame.K\nmass: frame.M\nmodes: 3' },
      ],
    });
    expect(r.errors[0]).toMatchObject({ blockId: 'm', line: 3, code: 'SHEET_PARSE' });
    expect(r.errors[0]!.message).toMatch(
      /Unknown key "modes"; the keys of a modes block are stiffness, mass, method, count/,
    );
  });

  it('refuses an unknown method at its line', () => {
    const r = evaluateSheet({
      blocks: [
        chain,
        { id: 'm', kind: 'modes', source: 'stiffness: frame.K\nmass: frame.M\nmethod: fastest' },
      ],
    });
    expect(r.errors[0]).toMatchObject({ line: 3 });
    expect(r.errors[0]!.message).toMatch(/Unknown method "fastest"/);
  });
});

describe('matrix blocks', () => {
  it('binds a matrix with its unit for the blocks below', () => {
    const r = evaluateSheet({
      blocks: [
        {
          id: 'k',
          kind: 'matrix',
          source: 'name: K\nunit: kN/m  # storey stiffnesses\n48, -24\n-24, 24',
        },
        { id: 'c', kind: 'calc', source: 'K[1,1] to N/m' },
      ],
    });
    expect(r.errors).toEqual([]);
    expect((r.blocks[0] as MatrixBlockResult).value).toEqual({
      type: 'matrix',
      rows: 2,
      cols: 2,
      values: [
        [48, -24],
        [-24, 24],
      ],
      unit: 'kN/m',
    });
    expect((r.blocks[1] as CalcBlockResult).lines[0]!.display).toBe('48000 N/m');
  });

  it('refuses a non-symmetric matrix with the place and size of the worst asymmetry', () => {
    const r = evaluateSheet({
      blocks: [
        { id: 'k', kind: 'matrix', source: 'name: K\nunit: kN/m\n4 -2 0\n-2 4 -1\n0 -1.5 2' },
      ],
    });
    const b = r.blocks[0] as MatrixBlockResult;
    expect(b.asymmetry).toEqual({ row: 2, col: 3, upper: -1, lower: -1.5, relative: 0.5 / 4 });
    expect(r.errors[0]).toMatchObject({ blockId: 'k', line: 5, code: 'MATRIX_NOT_SYMMETRIC' });
    expect(r.errors[0]!.message).toMatch(
      /^K is not symmetric: K\[2,3\] = -1 but K\[3,2\] = -1.5 \(difference 12.5 % of the largest entry/,
    );
  });

  it('accepts an asymmetric matrix declared so', () => {
    const r = evaluateSheet({
      blocks: [{ id: 'k', kind: 'matrix', source: 'name: A\nsymmetric: no\n1 2\n3 4' }],
    });
    expect(r.errors).toEqual([]);
    expect((r.blocks[0] as MatrixBlockResult).symmetric).toBe(false);
  });

  it('names a bad entry, a short row and a missing name at their lines', () => {
    const r = evaluateSheet({
      blocks: [
        { id: 'a', kind: 'matrix', source: 'name: K\n1 2\n3 x' },
        { id: 'b', kind: 'matrix', source: 'name: K2\n1 2\n3' },
        { id: 'c', kind: 'matrix', source: '1 2\n2 1' },
      ],
    });
    expect(r.errors.map((e) => [e.blockId, e.line])).toEqual([
      ['a', 3],
      ['b', 3],
      ['c', 1],
    ]);
    expect(r.errors[0]!.message).toMatch(/"x" is not a number/);
    expect(r.errors[1]!.message).toMatch(/This row has 1 entries; the first row \(line 2\) has 2/);
    expect(r.errors[2]!.message).toMatch(/needs a name/);
  });

  it('refuses a from: naming no upload', () => {
    const r = evaluateSheet(
      { blocks: [{ id: 'a', kind: 'matrix', source: 'name: K\nfrom: tower.mtx' }] },
      { uploads: [{ name: 'deck.mtx', text: '' }] },
    );
    expect(r.errors[0]).toMatchObject({ line: 2 });
    expect(r.errors[0]!.message).toBe(
      'No uploaded file is named "tower.mtx"; the uploads are "deck.mtx".',
    );
  });
});

describe('plane_frame generator', () => {
  it('gives a cantilever column whose first sway frequency matches βL = 1.87510407 (REFERENCES.md item 1)', () => {
    // Steel column 4 m, E = 210 GPa, I = 8.36e-5 m^4, A = 5.38e-3 m^2, 42.2 kg/m; 10 members.
    const L = 4;
    const E = 210e9;
    const I = 8.36e-5;
    const mu = 42.2;
    const n = 10;
    const nodes = Array.from({ length: n + 1 }, (_, i) => `0 m, ${(L * i) / n} m`).join('; ');
    const members = Array.from({ length: n }, (_, i) => `${i + 1}, ${i + 2}`).join('; ');
    const r = evaluateSheet({
      blocks: [
        {
          id: 'c',
          kind: 'calc',
          source: `col = plane_frame({nodes: [${nodes}], members: [${members}], E: 210 GPa, A: 5.38e-3 m^2, I: 8.36e-5 m^4, mass: 42.2 kg/m, fixed: [1]})`,
        },
        {
          id: 'm',
          kind: 'modes',
          source: 'stiffness: col.K\nmass: col.M\ncount: 1\ndirection: ux\nname: sway',
        },
      ],
    });
    expect(r.errors).toEqual([]);
    const w = (r.blocks[1] as ModesBlockResult).modes[0]!.omega;
    const exact = 1.87510407 ** 2 * Math.sqrt((E * I) / (mu * L ** 4));
    // Conforming Hermite elements converge from above; 10 elements are within 0.01 %.
    expect(w).toBeGreaterThanOrEqual(exact * (1 - 1e-8));
    expect(rel(w, exact)).toBeLessThan(1e-4);
  });

  it('names a member with a node that does not exist', () => {
    const r = evaluateSheet({
      blocks: [
        {
          id: 'c',
          kind: 'calc',
          source:
            'f = plane_frame({nodes: [0 m, 0 m; 0 m, 3 m], members: [1, 3], E: 210 GPa, A: 1e-2 m^2, I: 1e-4 m^4, mass: 80 kg/m, fixed: [1]})',
        },
      ],
    });
    expect(r.errors[0]!.message).toBe(
      'plane_frame: member 1 entry 2 must be a node number from 1 to 2.',
    );
  });
});

const sheetOf = (): Sheet => ({
  blocks: [
    {
      id: 'data',
      kind: 'calc',
      source:
        'girder = beam({E: 210 GPa, I: 0.02 m^4, mass: 1.5 t/m, length: 60 m, elements: 30, ends: "pinned-pinned"})',
    },
    {
      id: 'solve',
      kind: 'modes',
      source: 'name: girder_modes\nstiffness: girder.K\nmass: girder.M\nmethod: inverse\ncount: 4',
    },
  ],
});

describe('modes blocks: progress while solving', () => {
  it("passes the solver's stage and each newly converged mode on to the sheet's progress", () => {
    const events: SheetProgress[] = [];
    const r = evaluateSheet(sheetOf(), { onProgress: (p) => events.push(p) });
    expect(r.errors).toEqual([]);
    // One report as each block starts…
    expect(events.filter((e) => e.stage === undefined).map((e) => e.blockId)).toEqual([
      'data',
      'solve',
    ]);
    // …and, from the solve, at least one report per converged mode, in order, up to all four.
    const solving = events.filter((e) => e.stage !== undefined);
    expect(solving.every((e) => e.blockId === 'solve' && e.stage === 'inverse iteration')).toBe(
      true,
    );
    expect(solving.every((e) => e.modesWanted === 4)).toBe(true);
    const converged = [...new Set(solving.map((e) => e.modesConverged))];
    expect(converged).toEqual([...converged].sort((a, b) => a! - b!));
    expect(converged).toEqual(expect.arrayContaining([1, 2, 3, 4]));
    expect(solving.at(-1)!.message).toBe(
      'Solving girder_modes (block 2 of 2): inverse iteration, 4 of 4 modes converged',
    );

    // With a clock that stands still, only a change in the modes converged gets through.
    const throttled: SheetProgress[] = [];
    evaluateSheet(sheetOf(), { onProgress: (p) => throttled.push(p), now: () => 0 });
    const counts = throttled.filter((e) => e.stage !== undefined).map((e) => e.modesConverged);
    expect(counts).toEqual([...new Set(counts)]);
    expect(counts.length).toBeLessThan(solving.length);
  });
});
