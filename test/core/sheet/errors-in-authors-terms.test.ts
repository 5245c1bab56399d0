import { describe, expect, it } from 'vitest';
import { evaluateSheet, type SheetBlock } from '../../../core/index';

// The messages a sheet's author reads: one error where the slip is, a note (not a second wave of
// errors) on what it left unevaluated, and the library's internal messages said in the sheet's
// terms. The expected texts are ours; the facts in them (sizes, keys) are the sheet's.

const run = (blocks: SheetBlock[]) => evaluateSheet({ blocks });

describe('a failed line and what depends on it', () => {
  // A unit slip in the storey stiffnesses (kN instead of kN/mm) of a three-storey frame.
  const cascade: SheetBlock[] = [
    {
      id: 'b0a1b2c3d4e5f',
      kind: 'calc',
      source:
        'm_f = 20 t\nk_storey = 30 kN\nframe = storey_chain([m_f, m_f, m_f], [k_storey, k_storey, k_storey])\nn_dof = frame.n',
    },
    {
      id: 'b0a1b2c3d4e50',
      kind: 'modes',
      source: 'name: plant_x\nstiffness: frame.K\nmass: frame.M\ncount: 3\ndirection: x',
    },
    {
      id: 'b0a1b2c3d4e51',
      kind: 'response',
      source:
        'modes: plant_x\nanalysis: spectrum\nspectrum: ASCE 7-16\nSDS: 1.0\nSD1: 0.6\nTL: 8 s\nR: 8\ndamping: 0.05',
    },
    { id: 'b0a1b2c3d4e52', kind: 'criteria', source: 'plant_x.cumulative[3] >= 0.9  # 90 %' },
  ];

  it('reports one error and a note on each dependant, naming the first error', () => {
    const r = run(cascade);
    const errors = r.errors.filter((e) => e.severity !== 'note');
    expect(errors).toEqual([
      expect.objectContaining({
        blockIndex: 0,
        line: 3,
        message: 'storey_chain: stiffness 1 must be a stiffness (for example N/m); got 30 kN.',
      }),
    ]);
    expect(r.summary.errors).toBe(1);
    const notes = r.errors.filter((e) => e.severity === 'note');
    expect(notes.map((n) => [n.blockIndex, n.line, n.code])).toEqual([
      [0, 4, 'NOT_EVALUATED'],
      [1, 2, 'NOT_EVALUATED'],
      [2, 1, 'NOT_EVALUATED'],
      [3, 1, 'NOT_EVALUATED'],
    ]);
    expect(notes[1]!.message).toBe(
      'Not evaluated: depends on "frame", which failed on line 3 of block 1.',
    );
    expect(notes[3]!.message).toBe(
      'Not evaluated: depends on "plant_x", which was not evaluated either; the first error is "frame" on line 3 of block 1.',
    );
  });

  it('never reports the direction word of a modes block as an unknown name', () => {
    const r = run(cascade);
    expect(r.errors.some((e) => /Unknown name/.test(e.message))).toBe(false);
    expect(r.errors.some((e) => /"x"/.test(e.message))).toBe(false);
  });

  it('evaluates everything once the slip is corrected', () => {
    const fixed = cascade.map((b, i) =>
      i === 0 ? { ...b, source: b.source.replace('30 kN\n', '30 kN/mm\n') } : b,
    );
    const r = run(fixed);
    expect(r.errors).toEqual([]);
  });
});

describe("the library's messages in the sheet's terms", () => {
  const base: SheetBlock[] = [
    {
      id: 'data',
      kind: 'calc',
      source: 'frame = storey_chain([20 t, 20 t], [30 kN/mm, 30 kN/mm])',
    },
    {
      id: 'modes',
      kind: 'modes',
      source: 'name: plant_x\nstiffness: frame.K\nmass: frame.M\ncount: 2\ndirection: x',
    },
  ];
  const lineError = (source: string) => {
    const r = run([...base, { id: 'c', kind: 'calc', source }]);
    expect(r.errors).toHaveLength(1);
    expect(r.errors[0]).toMatchObject({ blockId: 'c', blockIndex: 2, line: 1 });
    return r.errors[0]!.message;
  };

  it('names a misspelt key of a result, its keys and the nearest', () => {
    expect(lineError('a = plant_x.cumulativ[1]')).toBe(
      'No key "cumulativ" on "plant_x"; its keys are lambda, omega, f, T, n, count, phi, gamma, meff, ratio, cumulative, total_mass, sturm, dt_cr — did you mean "cumulative"?',
    );
    expect(lineError('b = frame.Q')).toBe(
      'No key "Q" on "frame"; its keys are K, M, n, r, influence.',
    );
  });

  it('says an index past the end with what was indexed and its range', () => {
    expect(lineError('a = plant_x.f[5]')).toBe(
      'Index out of range: plant_x.f (2 entries) has no entry 5; its indices run from 1 to 2.',
    );
    expect(lineError('a = frame.K[3, 1]')).toBe(
      'Index out of range: frame.K (2×2) has no entry 3; its indices run from 1 to 2.',
    );
    expect(lineError('a = plant_x.f[0]')).toBe(
      'Index out of range: plant_x.f (2 entries) has no entry 0; indices start at 1.',
    );
  });

  it('says a list called like a function should be indexed', () => {
    expect(lineError('a = plant_x.f(2)')).toBe(
      '"plant_x.f" is a list of 2 entries, not a function: write plant_x.f[2] (square brackets) to take an entry.',
    );
  });

  it("names a generator's signature when it is given the wrong number of arguments", () => {
    expect(lineError('a = storey_chain([20 t, 20 t])')).toBe(
      'storey_chain takes 2 arguments, storey_chain(masses, stiffnesses); this line gives 1.',
    );
    expect(lineError('a = sqrt(4, 2)')).toBe('sqrt was given 2 arguments; it takes 1.');
  });

  it('names both units of an addition of different dimensions', () => {
    expect(lineError('a = plant_x.f[1] + 2 m')).toBe('Units do not match: cannot add Hz and m.');
  });
});

describe('modes blocks: count', () => {
  it('refuses more modes than DOFs at the count line, naming both', () => {
    const r = run([
      {
        id: 'data',
        kind: 'calc',
        source: 'frame = storey_chain([20 t, 20 t], [30 kN/mm, 30 kN/mm])',
      },
      { id: 'm', kind: 'modes', source: 'name: p\nstiffness: frame.K\nmass: frame.M\ncount: 5' },
    ]);
    expect(r.errors).toEqual([
      {
        blockId: 'm',
        blockIndex: 1,
        line: 4,
        code: 'INVALID_OPTION',
        message:
          '"count: 5" asks for more modes than the model has: K is 2×2, so it has 2 modes. Write "count: 2" for all of them, or fewer.',
      },
    ]);
  });
});
