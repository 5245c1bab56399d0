// The CSV the client offers for a modes block (web/src/lib/csv.ts, components/results/modes-csv.ts):
// pure functions, run without a browser on a real evaluation of the engine.
import { describe, expect, it } from 'vitest';
import { evaluateSheet, type ModesBlockResult } from '../../core/index';
import { modesCsv, shapesCsv } from '../../web/src/components/results/modes-csv';
import { csvText } from '../../web/src/lib/csv';

/** A small reader for what csvText writes (RFC 4180 quoting), to read the files back. */
function readCsv(text: string): string[][] {
  const rows: string[][] = [];
  let row: string[] = [];
  let field = '';
  let quoted = false;
  for (let i = 0; i < text.length; i += 1) {
    const c = text[i]!;
    if (quoted && c === '"' && text[i + 1] === '"') {
      field += '"';
      i += 1;
    } else if (quoted && c === '"') {
      quoted = false;
    } else if (quoted) {
      field += c;
    } else if (c === '"') {
      quoted = true;
    } else if (c === ',') {
      row.push(field);
      field = '';
    } else if (c === '\r' && text[i + 1] === '\n') {
      row.push(field);
      rows.push(row);
      row = [];
      field = '';
      i += 1;
    } else {
      field += c;
    }
  }
  return rows;
}

describe('CSV text (RFC 4180)', () => {
  it('quotes a field with a comma, a quote or a line break, and ends each line with CRLF', () => {
    const text = csvText([
      ['plain', 'a,b', 'say "hi"', 'two\nlines'],
      [1, null, Number.NaN, -0.5],
    ]);
    expect(text).toBe('plain,"a,b","say ""hi""","two\nlines"\r\n1,,,-0.5\r\n');
    expect(readCsv(text)).toEqual([
      ['plain', 'a,b', 'say "hi"', 'two\nlines'],
      ['1', '', '', '-0.5'],
    ]);
  });

  it('writes numbers so they read back exactly', () => {
    const values = [Math.PI, 1 / 3, 1.2e-11, 6.02214076e23, -2.5];
    const [row] = readCsv(csvText([values]));
    expect(row!.map(Number)).toEqual(values);
  });
});

describe('the CSV of a modes block', () => {
  // Three equal floors of 20 t on storeys of 30 kN/mm: the uniform fixed–free chain of
  // REFERENCES.md item 2, λ_n = (4k/m) sin²((2n−1)π/(2(2N+1))) (classical closed form).
  const results = evaluateSheet({
    blocks: [
      {
        id: 'data',
        kind: 'calc',
        source: 'frame = storey_chain([20 t, 20 t, 20 t], [30 kN/mm, 30 kN/mm, 30 kN/mm])',
      },
      {
        id: 'solve',
        kind: 'modes',
        source: 'name: sway\nstiffness: frame.K\nmass: frame.M\ncount: 3\ndirection: x',
      },
    ],
  });
  const modes = results.blocks[1] as ModesBlockResult;

  it('gives one row per mode, in SI and in full, matching the closed form', () => {
    expect(results.errors).toEqual([]);
    const rows = readCsv(modesCsv(modes));
    expect(rows[0]).toEqual([
      'mode',
      'f (Hz)',
      'T (s)',
      'omega (rad/s)',
      'lambda (rad^2/s^2)',
      'Gamma (kg^0.5)',
      'effective mass (kg)',
      'effective mass ratio',
      'cumulative ratio',
      'backward error',
      'iterations',
    ]);
    expect(rows).toHaveLength(4);
    const k = 30e6;
    const m = 20e3;
    rows.slice(1).forEach((row, i) => {
      const n = i + 1;
      const lambda = ((4 * k) / m) * Math.sin(((2 * n - 1) * Math.PI) / (2 * 7)) ** 2;
      expect(Number(row[0])).toBe(n);
      expect(Math.abs(Number(row[4]) - lambda) / lambda).toBeLessThan(1e-12);
      expect(Math.abs(Number(row[1]) - Math.sqrt(lambda) / (2 * Math.PI))).toBeLessThan(1e-12);
      // Exactly the engine's numbers, not the figures on screen.
      expect(Number(row[1])).toBe(modes.modes[i]!.frequency);
      expect(Number(row[6])).toBe(modes.modes[i]!.effectiveMass);
    });
    // The effective masses add up to the 60 t that moves with the ground.
    const total = rows.slice(1).reduce((sum, row) => sum + Number(row[6]), 0);
    expect(Math.abs(total - 60e3) / 60e3).toBeLessThan(1e-12);
    // A direct solve counts no iterations: the field is empty.
    expect(rows.slice(1).map((row) => row[10])).toEqual(['', '', '']);
  });

  it('gives the shapes one row per degree of freedom, named by the model', () => {
    const rows = readCsv(shapesCsv(modes)!);
    expect(rows[0]).toEqual(['dof', 'mode 1', 'mode 2', 'mode 3']);
    expect(rows.slice(1).map((row) => row[0])).toEqual(modes.dofLabels);
    rows.slice(1).forEach((row, i) => {
      expect(row.slice(1).map(Number)).toEqual(modes.shapes![i]);
    });
    // φ_n(j) ∝ sin(j (2n−1)π/(2N+1)), N = 3: mode 1 at the floors in the ratio of the closed form.
    const phi = rows.slice(1).map((row) => Number(row[1]));
    const closed = [1, 2, 3].map((j) => Math.sin((j * Math.PI) / 7));
    phi.forEach((v, j) =>
      expect(Math.abs(v / phi[2]! - closed[j]! / closed[2]!)).toBeLessThan(1e-12),
    );
  });

  it('has no shapes file when the result holds no shapes', () => {
    expect(shapesCsv({ ...modes, shapes: null })).toBeNull();
  });
});
