import { describe, expect, it } from 'vitest';
import { evaluateSheet, type MatrixBlockResult, type ModesBlockResult } from '../../../core/index';
import { chainMatrixMarket, chainOmega } from '../../support/chain-files';

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

describe('large uploaded models stay sparse', () => {
  // The fixed–free chain of test/support/chain-files.ts (REFERENCES.md item 2), as uploads.
  function chainFiles(n: number, k: number, m: number) {
    const files = chainMatrixMarket(n, k, m);
    return [
      { name: 'chain-K.mtx', text: files.K },
      { name: 'chain-M.mtx', text: files.M },
    ];
  }

  it('solves a 20 000-DOF chain from Matrix Market files that no sheet value could hold', () => {
    const n = 20_000;
    const r = evaluateSheet(
      {
        blocks: [
          { id: 'k', kind: 'matrix', source: 'name: K\nunit: kN/m\nfrom: chain-K.mtx' },
          { id: 'm', kind: 'matrix', source: 'name: M\nunit: t\nfrom: chain-M.mtx' },
          { id: 's', kind: 'modes', source: 'name: chain\nstiffness: K\nmass: M\ncount: 3' },
        ],
      },
      { uploads: chainFiles(n, 1000, 1) },
    );
    expect(r.errors).toEqual([]);
    const K = r.blocks[0] as MatrixBlockResult;
    expect(K).toMatchObject({ rows: n, cols: n, storage: 'sparse', nonzeros: 3 * n - 2 });
    expect(K.value).toMatchObject({ type: 'matrix', rows: n, values: null, unit: 'kN / m' });
    const modes = (r.blocks[2] as ModesBlockResult).modes;
    // kN/m and t in SI: k = 1e6 N/m, m = 1e3 kg.
    const w = (j: number) => chainOmega(n, 1e6, 1e3, j);
    // The lowest modes of a long chain are ill-conditioned (λ_max/λ₁ ≈ 6e8): relative 1e-6.
    modes.forEach((mode, i) =>
      expect(Math.abs(mode.omega - w(i + 1)) / w(i + 1)).toBeLessThan(1e-6),
    );
  });

  it('refuses a large matrix in a calculation line, and a large general file that is not symmetric', () => {
    const files = chainFiles(600, 1000, 1);
    const bad =
      '%%MatrixMarket matrix coordinate real general\n600 600 3\n1 1 2\n2 1 -1\n1 2 -0.5\n';
    const r = evaluateSheet(
      {
        blocks: [
          { id: 'k', kind: 'matrix', source: 'name: K\nfrom: chain-K.mtx' },
          { id: 'c', kind: 'calc', source: 'x = K[1, 1]' },
          { id: 'b', kind: 'matrix', source: 'name: B\nfrom: bad.mtx' },
        ],
      },
      { uploads: [...files, { name: 'bad.mtx', text: bad }] },
    );
    const at = (id: string) => r.errors.find((e) => e.blockId === id);
    expect(at('c')).toMatchObject({ line: 1 });
    expect(at('c')!.message).toMatch(
      /K is a large sparse matrix .*stiffness: or mass: of a modes block/,
    );
    expect(at('b')).toMatchObject({ line: 2, code: 'MATRIX_NOT_SYMMETRIC' });
    expect(at('b')!.message).toMatch(/bad\.mtx is not symmetric: entry \(2, 1\) = -1 on line 4/);
  });
});
