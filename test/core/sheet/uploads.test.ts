import { describe, expect, it } from 'vitest';
import { evaluateSheet, type MatrixBlockResult, type ModesBlockResult } from '../../../core/index';

// The two-storey frame of REFERENCES.md item 3 with k = 50 kN/mm and m = 100 t:
// K = [[3k, −k], [−k, k]] (stiffnesses 2k and k), M = diag(2m, m); ω₁ = √(k/2m).
const kMtx =
  '%%MatrixMarket matrix coordinate real symmetric\n% storey stiffness, kN/mm\n2 2 3\n1 1 150\n2 1 -50\n2 2 50\n';
const mCsv = '# floor masses, t\n200, 0\n0, 100\n';

describe('matrix blocks from uploads', () => {
  it('reads Matrix Market and CSV files and solves with them', () => {
    const r = evaluateSheet(
      {
        blocks: [
          { id: 'k', kind: 'matrix', source: 'name: K\nunit: kN/mm\nfrom: frame-k.mtx' },
          { id: 'm', kind: 'matrix', source: 'name: M\nunit: t\nfrom: frame-m.csv' },
          { id: 's', kind: 'modes', source: 'stiffness: K\nmass: M\ndirection: [1, 1]\nname: fr' },
        ],
      },
      {
        uploads: [
          { name: 'frame-k.mtx', text: kMtx },
          { name: 'frame-m.csv', text: mCsv },
        ],
      },
    );
    expect(r.errors).toEqual([]);
    const K = r.blocks[0] as MatrixBlockResult;
    expect(K.origin).toBe('upload');
    expect(K.value).toMatchObject({
      values: [
        [150, -50],
        [-50, 50],
      ],
      unit: 'kN/mm',
    });
    const w1 = (r.blocks[2] as ModesBlockResult).modes[0]!.omega;
    // Relative 1e-10 against the closed form (dense 2×2 solve).
    expect(Math.abs(w1 - Math.sqrt(50e6 / 200e3)) / Math.sqrt(50e6 / 200e3)).toBeLessThan(1e-10);
    // Effective mass of mode 1: 8/9 of the total (Chopra ch. 10, from memory).
    expect(Math.abs((r.blocks[2] as ModesBlockResult).modes[0]!.ratio! - 8 / 9)).toBeLessThan(
      1e-10,
    );
  });

  it('reads a Matrix Market array file (column-major, lower triangle when symmetric)', () => {
    const text = '%%MatrixMarket matrix array real symmetric\n3 3\n4\n-2\n0\n4\n-2\n2\n';
    const r = evaluateSheet(
      { blocks: [{ id: 'k', kind: 'matrix', source: 'name: K\nfrom: a.mtx' }] },
      { uploads: [{ name: 'a.mtx', text }] },
    );
    expect(r.errors).toEqual([]);
    expect((r.blocks[0] as MatrixBlockResult).value).toMatchObject({
      values: [
        [4, -2, 0],
        [-2, 4, -2],
        [0, -2, 2],
      ],
    });
  });

  it('refuses an upload that is not a matrix, naming the file line, at the from: line', () => {
    const r = evaluateSheet(
      { blocks: [{ id: 'k', kind: 'matrix', source: 'name: K\nunit: kN/m\nfrom: notes.txt' }] },
      {
        uploads: [
          {
            name: 'notes.txt',
            text: 'Storey stiffnesses from the frame model\nsee drawing S-201\n',
          },
        ],
      },
    );
    expect(r.errors).toHaveLength(1);
    expect(r.errors[0]).toMatchObject({ blockId: 'k', line: 3, code: 'MATRIX_FILE_INVALID' });
    expect(r.errors[0]!.message).toBe(
      "notes.txt, line 1: entry (1, 1) 'Storey stiffnesses from the frame model' is not a number.",
    );
  });

  it('refuses a Matrix Market file with an entry outside the matrix', () => {
    const text = '%%MatrixMarket matrix coordinate real general\n2 2 1\n3 1 5\n';
    const r = evaluateSheet(
      { blocks: [{ id: 'k', kind: 'matrix', source: 'name: K\nfrom: k.mtx' }] },
      { uploads: [{ name: 'k.mtx', text }] },
    );
    expect(r.errors[0]!.message).toBe(
      'k.mtx, line 3: row index 3 is out of range 1…2 given by the size line.',
    );
  });
});
