import { describe, expect, it } from 'vitest';
import { AppError } from '../../api/http/errors';
import { describeMatrixFile, detectFormat } from '../../api/modules/uploads/uploads.parse';

// The upload's description of a file (shape, nonzeros, symmetry) on the engine's readers, and
// the refusals as the API gives them (422 MATRIX_FILE_INVALID with the line). File
// layouts follow the Matrix Market exchange format as published by NIST (header line, comment
// lines with %, size line, entries; symmetric files store the lower triangle; array files list
// values column by column), from memory.

const mm = (...lines: string[]) => lines.join('\n') + '\n';

function refusal(fn: () => unknown): AppError {
  try {
    fn();
  } catch (e) {
    if (e instanceof AppError) return e;
    throw e;
  }
  throw new Error('expected a refusal');
}

describe('describeMatrixFile (Matrix Market)', () => {
  it('sums duplicate coordinate entries, as triplet assembly does', () => {
    const shape = describeMatrixFile(
      mm('%%MatrixMarket matrix coordinate real general', '2 2 3', '1 1 1.5', '1 1 2.5', '2 2 4'),
      'matrix-market',
      'dup.mtx',
    );
    expect(shape).toMatchObject({ rows: 2, cols: 2, nonzeros: 2, symmetric: true });
  });

  it('reads pattern files as ones and Fortran D exponents as numbers', () => {
    const pattern = describeMatrixFile(
      mm('%%MatrixMarket matrix coordinate pattern symmetric', '3 3 3', '1 1', '2 1', '3 3'),
      'matrix-market',
      'p.mtx',
    );
    expect(pattern).toMatchObject({ nonzeros: 4, symmetric: true });
    const fortran = describeMatrixFile(
      mm('%%MatrixMarket matrix array real general', '1 2', '1.5D+03', '-2.0d-1'),
      'matrix-market',
      'f.mtx',
    );
    expect(fortran).toMatchObject({ rows: 1, cols: 2, nonzeros: 2, symmetric: false });
  });

  it('finds the worst asymmetry of a general file, also against a missing partner', () => {
    // a_12 = 3, a_21 = 0 (missing): gap 3 against max |a| = 6.
    const shape = describeMatrixFile(
      mm('%%MatrixMarket matrix coordinate real general', '2 2 3', '1 1 6', '1 2 3', '2 2 6'),
      'matrix-market',
      'g.mtx',
    );
    expect(shape.symmetric).toBe(false);
    expect(shape.worstAsymmetry).toEqual({ row: 1, col: 2, upper: 3, lower: 0, relative: 3 / 6 });
  });

  it('counts a relative asymmetry within 1e-9 as symmetric but still reports it', () => {
    const shape = describeMatrixFile('1,2.0000000001\n2,1\n', 'csv', 'near.csv');
    expect(shape.symmetric).toBe(true);
    expect(shape.worstAsymmetry?.relative).toBeCloseTo(1e-10 / 2.0000000001, 15);
  });

  it('refuses an entry above the diagonal in a symmetric file, naming its line', () => {
    const e = refusal(() =>
      describeMatrixFile(
        mm('%%MatrixMarket matrix coordinate real symmetric', '2 2 2', '1 1 4', '1 2 -1'),
        'matrix-market',
        'upper.mtx',
      ),
    );
    expect(e.code).toBe('MATRIX_FILE_INVALID');
    expect(e.details?.line).toBe(4);
    expect(e.message).toContain('above the diagonal');
  });

  it('refuses complex entries, infinite values and a missing header', () => {
    const complex = refusal(() =>
      describeMatrixFile(
        mm('%%MatrixMarket matrix coordinate complex general', '1 1 1', '1 1 1 0'),
        'matrix-market',
        'c.mtx',
      ),
    );
    expect(complex.details?.line).toBe(1);
    const inf = refusal(() =>
      describeMatrixFile(
        mm('%%MatrixMarket matrix array real general', '% comment', '1 2', '1', 'Inf'),
        'matrix-market',
        'i.mtx',
      ),
    );
    expect(inf.details?.line).toBe(5);
    expect(inf.message).toContain("'Inf'; every entry must be a finite number");
    expect(inf.code).toBe('MATRIX_FILE_INVALID');
    expect(inf.details?.reason).toBe('MATRIX_NOT_FINITE');
    const bare = refusal(() => describeMatrixFile('1 1 1\n', 'matrix-market', 'b.mtx'));
    expect(bare.details?.line).toBe(1);
  });

  it('refuses an array file with too few values, naming where they stop', () => {
    const e = refusal(() =>
      describeMatrixFile(
        mm('%%MatrixMarket matrix array real symmetric', '2 2', '4', '-1'),
        'matrix-market',
        'short.mtx',
      ),
    );
    expect(e.message).toContain('needs 3 values but the file has 2');
  });
});

describe('describeMatrixFile (CSV)', () => {
  it('refuses a ragged row, naming its line', () => {
    const e = refusal(() => describeMatrixFile('1,2\n3,4,5\n', 'csv', 'ragged.csv'));
    expect(e.details?.line).toBe(2);
    expect(e.message).toContain('row 2 has 3 entries but row 1 has 2');
  });

  it('skips blank lines and # comments, counting lines as in the file', () => {
    const e = refusal(() => describeMatrixFile('# K in N/m\n\n1,2\n2,x\n', 'csv', 'c.csv'));
    expect(e.details?.line).toBe(4);
  });

  it('refuses a dense matrix larger than the engine holds', () => {
    // 2001 columns × 2001 rows > 4 000 000 entries (the sheet engine's limit per value).
    const row = Array.from({ length: 2001 }, () => '0').join(',');
    const text = Array.from({ length: 2001 }, () => row).join('\n');
    const e = refusal(() => describeMatrixFile(text, 'csv', 'big.csv'));
    expect(e.message).toContain('2001 × 2001');
  });
});

describe('detectFormat', () => {
  it('goes by the extension, then by the Matrix Market header', () => {
    expect(detectFormat('K.MTX', '')).toBe('matrix-market');
    expect(detectFormat('k.csv', '%%MatrixMarket')).toBe('csv');
    expect(detectFormat('stiffness', '%%MatrixMarket matrix array real general')).toBe(
      'matrix-market',
    );
    expect(refusal(() => detectFormat('k.txt', '1,2')).field).toBe('file');
  });
});
