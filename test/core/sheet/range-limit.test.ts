import { describe, expect, it } from 'vitest';
import {
  evaluateSheet,
  MAX_MATRIX_ORDER,
  parseMatrixMarket,
  type CalcBlockResult,
} from '../../../core/index';

// Sizes that hostile input states up front are refused before anything of that size is made:
// a range's entry count follows from its bounds (count = floor((end − start)/step) + 1), and a
// Matrix Market size line is read before any entry (NIST Matrix Market format, 1996).

function calc(source: string) {
  const r = evaluateSheet({ blocks: [{ id: 'r', kind: 'calc', source }] });
  return { errors: r.errors, block: r.blocks[0] as CalcBlockResult };
}

describe('ranges past the entry limit of a sheet value', () => {
  it.each(['x = 1:1e8', 'x = range(1, 1e9)', 'x = range("1:1e9")', 'x = 1:Infinity'])(
    'refuses %s with SHEET_LIMIT on its line',
    (source) => {
      const { errors } = calc(source);
      expect(errors).toHaveLength(1);
      expect(errors[0]).toMatchObject({ blockId: 'r', line: 1, code: 'SHEET_LIMIT' });
      expect(errors[0]!.message).toMatch(/a sheet value may hold at most 4000000/);
    },
  );

  it('keeps the end of a range in formulas, a:b and range(a, b) alike', () => {
    // mathjs documentation (expression syntax): in the parser a range includes its end, for the
    // a:b operator and the range function alike (one-based, as matrix indices are).
    const { errors, block } = calc('a = 0:3\nb = [1:3]\nc = 0:2:6\nd = range(0, 3)\ne = 3:-1:1');
    expect(errors).toEqual([]);
    expect(block.lines.map((l) => l.display)).toEqual([
      '[0, 1, 2, 3]',
      '[[1, 2, 3]]',
      '[0, 2, 4, 6]',
      '[0, 1, 2, 3]',
      '[3, 2, 1]',
    ]);
  });

  it('refuses a formula range past the limit before making it', () => {
    const { errors } = calc('x = 1:1e9');
    expect(errors[0]!.message).toMatch(/a sheet value may hold at most 4000000/);
  });

  it('still makes small ranges, string forms included', () => {
    const { errors, block } = calc('a = range(0, 1, 0.25)\nb = range("1:2:7")');
    expect(errors).toEqual([]);
    expect(block.lines.map((l) => l.display)).toEqual(['[0, 0.25, 0.5, 0.75, 1]', '[1, 3, 5, 7]']);
  });
});

describe('parseMatrixMarket size line', () => {
  it('refuses a size line past the largest order, naming the line, before reading entries', () => {
    const text =
      '%%MatrixMarket matrix coordinate real symmetric\n% K\n4294967296 4294967296 1\n1 1 2\n';
    expect(() => parseMatrixMarket(text, 'K.mtx')).toThrow(
      `K.mtx, line 3: the size line says 4294967296 × 4294967296; a matrix file may have at most ${MAX_MATRIX_ORDER.toLocaleString('en')} rows and columns.`,
    );
  });
});
