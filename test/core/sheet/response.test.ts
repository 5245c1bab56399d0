import { describe, expect, it } from 'vitest';
import {
  diffResults,
  evaluateSheet,
  STANDARD_GRAVITY,
  type CalcBlockResult,
  type CriteriaBlockResult,
  type ModesBlockResult,
  type ResponseBlockResult,
  type SheetBlock,
} from '../../../core/index';

const rel = (a: number, b: number) => Math.abs(a / b - 1);

const frame: SheetBlock[] = [
  {
    id: 'data',
    kind: 'calc',
    source: 'm_0 = 100 t\nk_0 = 40 kN/mm\nframe = storey_chain([2 m_0, m_0], [2 k_0, k_0])',
  },
  { id: 'solve', kind: 'modes', source: 'stiffness: frame.K\nmass: frame.M\nname: floor' },
  { id: 'S', kind: 'matrix', source: 'name: S\nsymmetric: no\n0, 3\n10, 3' },
];

function run(blocks: SheetBlock[], uploads: { name: string; text: string }[] = []) {
  return evaluateSheet({ blocks }, { uploads });
}

describe('response blocks: spectrum', () => {
  it('two-storey frame 2m, m / 2k, k with a flat table spectrum: modal base shears 8/9 and 1/9 of 3m·S_a, bound for calc and criteria (Chopra, chapter 10 example, from memory; relative 1e-10)', () => {
    const r = run([
      ...frame,
      {
        id: 'rsa',
        kind: 'response',
        source:
          'modes: floor\nanalysis: spectrum\nspectrum: table\ntable: S\ntable unit: m/s^2\ndamping: 0.05\ncombine: srss\nheights: 3.5 m\nelf base shear: 1000 kN\nname: rsa',
      },
      { id: 'use', kind: 'calc', source: 'V_b = rsa.V\nd_1 = rsa.drift[1]' },
      {
        id: 'check',
        kind: 'criteria',
        source:
          'rsa.V >= rsa.V_elf   # modal base shear at least V_ELF (ASCE 7-16 §12.9.1.4.1)\nrsa.drift_ratio[2] <= 0.02  # drift',
      },
    ]);
    expect(r.errors).toEqual([]);
    const b = r.blocks[3] as ResponseBlockResult;
    expect(b.ok).toBe(true);
    const d = b.spectrum!.directions[0]!;
    const m = 1e5;
    expect(rel(d.modes[0]!.baseShear, (8 / 9) * 3 * m * 3)).toBeLessThan(1e-10);
    expect(rel(d.modes[1]!.baseShear, (1 / 9) * 3 * m * 3)).toBeLessThan(1e-10);
    // V = 3m·3·√(64+1)/9 ≈ 806 kN < 1000 kN: scaled up to V_ELF
    expect(d.scaling!.factor).toBeGreaterThan(1);
    expect(rel(d.scaledBaseShear, 1e6)).toBeLessThan(1e-12);
    expect(b.method).toMatch(/SRSS/);
    expect(b.caution).toMatch(/engineer’s responsibility/);
    expect(b.notes.join(' ')).toMatch(/§12\.9\.1\.4\.1/);
    const calc = r.blocks[4] as CalcBlockResult;
    expect(calc.lines[0]!.display).toMatch(/^1 MN$/);
    const crit = r.blocks[5] as CriteriaBlockResult;
    expect(crit.criteria.map((c) => c.pass)).toEqual([true, true]);
  });

  it('ASCE 7-16 spectrum from its parameters: the plateau S_DS·g·I_e/R for a stiff frame (§11.4.6, from memory)', () => {
    const r = run([
      ...frame,
      {
        id: 'rsa',
        kind: 'response',
        source:
          'modes: floor\nanalysis: spectrum\nspectrum: ASCE 7-16\nSDS: 1.0\nSD1: 0.6\nTL: 8 s\nR: 8\nIe: 1.0\ndamping: 0.05\nname: rsa',
      },
    ]);
    expect(r.errors).toEqual([]);
    const d = (r.blocks[3] as ResponseBlockResult).spectrum!.directions[0]!;
    // T₂ = 2π/√(2k/m) = 0.222 s lies on the plateau (T₀ = 0.12 s, T_S = 0.6 s)
    expect(d.modes[1]!.sa).toBeCloseTo((1.0 * STANDARD_GRAVITY) / 8, 12);
    expect(d.combination).toBe('cqc');
  });

  it('names the block, line and mode when the table does not reach a period', () => {
    const r = run([
      ...frame.slice(0, 2),
      { id: 'S', kind: 'matrix', source: 'name: S\nsymmetric: no\n0, 3\n0.3, 3' },
      {
        id: 'rsa',
        kind: 'response',
        source: 'modes: floor\nanalysis: spectrum\nspectrum: table\ntable: S\ndamping: 0.05',
      },
    ]);
    expect(r.errors).toHaveLength(1);
    expect(r.errors[0]).toMatchObject({ blockId: 'rsa', line: 4 });
    expect(r.errors[0]!.message).toMatch(
      /^Mode 1 \(T = 0\.4443 s\): The period 0\.4443 s is outside the spectrum table/,
    );
  });

  it('reads the table from an uploaded CSV with a header row', () => {
    const r = run(
      [
        ...frame.slice(0, 2),
        {
          id: 'rsa',
          kind: 'response',
          source:
            'modes: floor\nanalysis: spectrum\nspectrum: table\ntable: spec.csv\ntable unit: g\ndamping: 0.05',
        },
      ],
      [{ name: 'spec.csv', text: 'T_s,Sa_g\n0,0.5\n5,0.5\n' }],
    );
    expect(r.errors).toEqual([]);
    const d = (r.blocks[2] as ResponseBlockResult).spectrum!.directions[0]!;
    expect(d.modes[0]!.sa).toBeCloseTo(0.5 * STANDARD_GRAVITY, 12);
  });
});

describe('response blocks: refusals name the block and line', () => {
  const cases: [string, string, number, RegExp][] = [
    [
      'an unknown key',
      'modes: floor\nanalysis: walking\ndamping: 0.01\nspeed: 3',
      4,
      /Unknown key "speed"/,
    ],
    [
      'a key of another analysis',
      'modes: floor\nanalysis: walking\ndamping: 0.01\ncombine: cqc',
      4,
      /"combine:" is not a key of a walking analysis/,
    ],
    [
      'a name that is not a modes result',
      'modes: frame\nanalysis: walking\ndamping: 0.01',
      1,
      /"frame" is not the name of a modes block above/,
    ],
    [
      'an unknown analysis',
      'modes: floor\nanalysis: pushover\ndamping: 0.01',
      2,
      /Unknown analysis "pushover"/,
    ],
    [
      'a damping ratio given in per cent',
      'modes: floor\nanalysis: walking\ndamping: 5',
      3,
      /ratio of mode 1 is 5/,
    ],
    [
      'more output DOFs than a block reports',
      'modes: floor\nanalysis: harmonic\nforce: [1 kN, 0]\ndofs: [1,2,1,2,1,2,1,2,1,2,1,2,1]\ndamping: 0.02',
      4,
      /lists 13 DOFs; a response block reports at most 12/,
    ],
    [
      'a force that is zero everywhere',
      'modes: floor\nanalysis: harmonic\nforce: [0, 0]\ndamping: 0.02',
      3,
      /zero at every DOF/,
    ],
    [
      'a spectrum without its parameters',
      'modes: floor\nanalysis: spectrum\nspectrum: ASCE 7-16\nSDS: 1\ndamping: 0.05',
      3,
      /needs "sd1:"/,
    ],
  ];
  for (const [what, source, line, message] of cases) {
    it(`refuses ${what}`, () => {
      const r = run([...frame, { id: 'resp', kind: 'response', source }]);
      expect(r.errors).toHaveLength(1);
      expect(r.errors[0]).toMatchObject({ blockId: 'resp', line });
      expect(r.errors[0]!.message).toMatch(message);
    });
  }
  it('reports a failed response name where it is used below', () => {
    const r = run([
      ...frame,
      {
        id: 'resp',
        kind: 'response',
        source: 'modes: floor\nanalysis: walking\ndamping: 2\nname: walk',
      },
      { id: 'use', kind: 'calc', source: 'a = walk.a' },
    ]);
    expect(r.errors).toHaveLength(2);
    expect(r.errors[1]).toMatchObject({ blockId: 'use', line: 1 });
  });
});

describe('response blocks: harmonic, history, walking', () => {
  // one DOF: m = 2 t, k = 800 kN/m, ω = 20 rad/s
  const sdof: SheetBlock[] = [
    { id: 'block', kind: 'calc', source: 'base = storey_chain([2 t], [800 kN/m])' },
    { id: 'solve', kind: 'modes', source: 'stiffness: base.K\nmass: base.M\nname: pump' },
  ];
  it('harmonic: a rotating unbalance at the running speed gives (m·e·Ω²/k)/√((1−r²)² + (2ζr)²) (classical; relative 1e-10)', () => {
    const r = run([
      ...sdof,
      {
        id: 'h',
        kind: 'response',
        source:
          'modes: pump\nanalysis: harmonic\nunbalance: 0.5 kg m\nat: 1\nrunning speed: 2.5 Hz\ndamping: 0.05\nname: ph',
      },
      {
        id: 'c',
        kind: 'criteria',
        source: 'ph.separation >= 0.2  # ±20 % from running speed (ACI 351.3R)',
      },
    ]);
    expect(r.errors).toEqual([]);
    const h = (r.blocks[2] as ResponseBlockResult).harmonic!;
    const W = 2 * Math.PI * 2.5;
    const ratio = W / 20;
    const expected =
      (0.5 * W * W) / 800e3 / Math.sqrt((1 - ratio ** 2) ** 2 + (2 * 0.05 * ratio) ** 2);
    expect(rel(h.atRunning![0]!.amplitude, expected)).toBeLessThan(1e-10);
    // f_n = 20/(2π) = 3.183 Hz: 27 % above 2.5 Hz
    expect(h.separation).toBeCloseTo(20 / (2 * Math.PI) / 2.5 - 1, 12);
    expect((r.blocks[3] as CriteriaBlockResult).criteria[0]!.pass).toBe(true);
  });

  it('history: a step force gives the peak 2P/k at t = π/ω (closed form; relative 1e-6 on a 1 ms grid)', () => {
    const r = run([
      ...sdof,
      { id: 'P', kind: 'matrix', source: 'name: P\nsymmetric: no\n0, 1\n2, 1' },
      {
        id: 'th',
        kind: 'response',
        source:
          'modes: pump\nanalysis: history\nforce: [4 kN]\nrecord: P\nstep: 0.001 s\ndamping: 0\nname: th',
      },
      { id: 'use', kind: 'calc', source: 'u_pk = th.peak[1]' },
    ]);
    expect(r.errors).toEqual([]);
    const h = (r.blocks[3] as ResponseBlockResult).history!;
    // the peak is read on the 1 ms grid: 1 − cos differs from 2 by at most (ωΔt/2)²/2 ≈ 5e-5 of it
    expect(rel(h.dofs[0]!.peak, (2 * 4e3) / 800e3)).toBeLessThan(1e-6);
    expect(h.dofs[0]!.time).toBeCloseTo(Math.PI / 20, 3);
    expect(h.dtCr).toBeCloseTo(2 / 20, 14);
    expect(h.time.length).toBeLessThanOrEqual(2001);
  });

  it('walking: AISC DG11 Eq. 4-1 with W = g × modal mass, against the limit (from memory)', () => {
    const r = run([
      ...sdof,
      {
        id: 'w',
        kind: 'response',
        source:
          'modes: pump\nanalysis: walking\nforce: 0.41 kN\ndamping: 0.01\nlimit: 0.7 m/s^2\nname: walk',
      },
      { id: 'c', kind: 'criteria', source: 'walk.a <= walk.limit  # EN 1990 A2 §A2.4.3.2' },
    ]);
    expect(r.errors).toEqual([]);
    const w = (r.blocks[2] as ResponseBlockResult).walking!;
    const fn = 20 / (2 * Math.PI);
    const expected = (410 * Math.exp(-0.35 * fn)) / (0.01 * 2000);
    expect(rel(w.acceleration, expected)).toBeLessThan(1e-12);
    expect(w.pass).toBe(expected <= 0.7);
    expect((r.blocks[3] as CriteriaBlockResult).criteria[0]!.pass).toBe(expected <= 0.7);
  });
});

describe('response blocks: more of each analysis', () => {
  const portal: SheetBlock[] = [
    {
      id: 'model',
      kind: 'calc',
      source:
        'portal = plane_frame({nodes: [0 m, 0 m; 0 m, 3.5 m; 6 m, 3.5 m; 6 m, 0 m], members: [1, 2; 2, 3; 3, 4], E: 210 GPa, A: 5.4e-3 m^2, I: 8.4e-5 m^4, mass: 42 kg/m, fixed: [1, 4], masses: [6 t, 6 t], mass_nodes: [2, 3]})',
    },
    {
      id: 'solve',
      kind: 'modes',
      source: 'stiffness: portal.K\nmass: portal.M\ncount: 6\nname: pm',
    },
  ];

  it('EN 1998-1 type 1 spectrum in two directions, combined by SRSS and by 100 %/30 % (§4.3.3.5.1, from memory)', () => {
    const spec = (rule: string) =>
      run([
        ...portal,
        {
          id: 'rsa',
          kind: 'response',
          source: `modes: pm\nanalysis: spectrum\nspectrum: EN 1998-1 type 1\nground: C\nag: 0.25\nq: 1.5\ndamping: 0.05\ndirection: ux, uy\ndirectional: ${rule}\nname: rsa`,
        },
      ]);
    const srss = spec('srss');
    expect(srss.errors).toEqual([]);
    const s = (srss.blocks[2] as ResponseBlockResult).spectrum!;
    expect(s.directions.map((d) => d.direction)).toEqual(['ux', 'uy']);
    s.combined!.displacement.forEach((u, i) =>
      expect(u).toBeCloseTo(
        Math.hypot(s.directions[0]!.displacement[i]!, s.directions[1]!.displacement[i]!),
        15,
      ),
    );
    const pct = (spec('100-30').blocks[2] as ResponseBlockResult).spectrum!;
    pct.combined!.displacement.forEach((u, i) => {
      const a = Math.abs(pct.directions[0]!.displacement[i]!);
      const b = Math.abs(pct.directions[1]!.displacement[i]!);
      expect(u).toBeCloseTo(Math.max(a + 0.3 * b, 0.3 * a + b), 15);
    });
    // design spectrum §3.2.2.5 never below 0.2 a_g
    s.directions[0]!.modes.forEach((m) =>
      expect(m.sa).toBeGreaterThanOrEqual(0.2 * 0.25 * STANDARD_GRAVITY - 1e-12),
    );
  });

  it('harmonic force with Rayleigh damping: the ratio is the one asked at both frequencies (Chopra §11.4, from memory)', () => {
    const r = run([
      ...portal,
      {
        id: 'h',
        kind: 'response',
        source:
          'modes: pm\nanalysis: harmonic\nforce: [2 kN, 0, 0, 0, 0, 0]\nrunning speed: 600 rpm\nrange: [1 Hz, 40 Hz]\npoints: 50\nrayleigh: [2 Hz, 30 Hz]\ndamping: 0.02\ndofs: [1]\nname: ph',
      },
    ]);
    expect(r.errors).toEqual([]);
    const h = (r.blocks[2] as ResponseBlockResult).harmonic!;
    // ζ(ω) = α/(2ω) + βω/2 equals 0.02 at 2 Hz and 30 Hz: below it between them, above outside
    h.modeFrequencies.forEach((f, i) => {
      const inside = f > 2 && f < 30;
      if (inside) expect(h.damping[i]).toBeLessThan(0.02);
      else expect(h.damping[i]).toBeGreaterThan(0.02);
    });
    expect(h.frequencies).toContain(10);
    expect(h.dofs[0]!.label).toBe((r.blocks[1] as ModesBlockResult).dofLabels![0]);
  });

  it('a ground record uploaded as CSV in g: the time history names its peak and the central-difference step', () => {
    const rec = [
      't_s,a_g',
      ...Array.from(
        { length: 101 },
        (_, i) =>
          `${(i * 0.01).toFixed(2)},${(0.2 * Math.sin(2 * Math.PI * 2 * i * 0.01)).toFixed(6)}`,
      ),
    ].join('\n');
    const r = run(
      [
        ...portal,
        {
          id: 'th',
          kind: 'response',
          source:
            'modes: pm\nanalysis: history\nrecord: quake.csv\nrecord unit: g\ndirection: ux\nstep: 0.005 s\nduration: 2 s\nmethod: newmark\ndamping: 0.05\ndofs: [1]\nname: th',
        },
        { id: 'c', kind: 'calc', source: 'dt = th.dt_cr\nV_pk = th.V_peak' },
      ],
      [{ name: 'quake.csv', text: rec }],
    );
    expect(r.errors).toEqual([]);
    const h = (r.blocks[2] as ResponseBlockResult).history!;
    expect(h.steps).toBe(400);
    expect(h.load).toBe('ground');
    expect(h.baseShear!.peak).toBeGreaterThan(0);
    expect(h.dtCrDamped).toBeLessThan(h.dtCr);
  });

  it('names the line of a record row that is not two numbers', () => {
    const r = run(
      [
        ...portal,
        {
          id: 'th',
          kind: 'response',
          source: 'modes: pm\nanalysis: history\nrecord: quake.csv\nrecord unit: g\ndamping: 0.05',
        },
      ],
      [{ name: 'quake.csv', text: 't,a\n0,0\n0.01,x\n' }],
    );
    expect(r.errors).toHaveLength(1);
    expect(r.errors[0]).toMatchObject({ blockId: 'th', line: 3 });
    expect(r.errors[0]!.message).toMatch(
      /quake\.csv, line 3: expected two numbers, time \(s\) and value/,
    );
  });
});

describe('diffResults on response blocks', () => {
  it('lists the base shear of a spectrum analysis that changed between revisions, with its relative change', () => {
    const sheet = (sds: string) => ({
      blocks: [
        ...frame,
        {
          id: 'rsa',
          kind: 'response' as const,
          source: `modes: floor\nanalysis: spectrum\nspectrum: ASCE 7-16\nSDS: ${sds}\nSD1: 0.6\nTL: 8 s\ndamping: 0.05`,
        },
      ],
    });
    const a = evaluateSheet(sheet('1.0'));
    const b = evaluateSheet(sheet('1.2'));
    const { results } = diffResults(a, b);
    const shear = results.find((r) => r.blockId === 'rsa' && r.key === 'base shear x');
    // both modes on the plateau (T = 0.444 s, 0.222 s ≤ T_S = 0.5 s): V scales with S_DS
    expect(shear?.relativeChange).toBeCloseTo(0.2, 10);
  });
});
