import { describe, expect, it } from 'vitest';
import { EngineError } from '../../../core/errors';
import { toDense } from '../../../core/linalg/factorize';
import {
  readSymmetricMatrix,
  writeCsvMatrix,
  writeMatrixMarket,
} from '../../../core/linalg/matrix-io';
import { sparseSymmetricFromTriplets } from '../../../core/linalg/sparse';

function refusal(text: string, format?: 'csv'): EngineError {
  try {
    readSymmetricMatrix(text, { name: 'K.mtx', ...(format ? { format } : {}) });
  } catch (e) {
    if (e instanceof EngineError) return e;
    throw e;
  }
  throw new Error('expected a refusal');
}

const K = sparseSymmetricFromTriplets(3, [0, 1, 1, 2, 2], [0, 0, 1, 1, 2], [4, -1, 4.25, -2, 1e-7]);
const full = Array.from(toDense(K).data);

describe('Matrix Market and CSV', () => {
  it('round-trips coordinate, array and both CSV forms exactly', () => {
    const mm = writeMatrixMarket(K, { comment: 'test matrix' });
    expect(
      mm.startsWith('%%MatrixMarket matrix coordinate real symmetric\n% test matrix\n3 3 5\n'),
    ).toBe(true);
    expect(Array.from(toDense(readSymmetricMatrix(mm)).data)).toEqual(full);
    expect(Array.from(toDense(readSymmetricMatrix(writeMatrixMarket(toDense(K)))).data)).toEqual(
      full,
    );
    expect(
      Array.from(toDense(readSymmetricMatrix(writeCsvMatrix(K), { format: 'csv' })).data),
    ).toEqual(full);
    expect(
      Array.from(toDense(readSymmetricMatrix(writeCsvMatrix(K, { triplets: true }))).data),
    ).toEqual(full);
  });

  it('reads integer, pattern and general files', () => {
    const general =
      '%%MatrixMarket matrix coordinate integer general\n% c\n2 2 4\n1 1 2\n1 2 -1\n2 1 -1\n2 2 2\n';
    expect(Array.from(toDense(readSymmetricMatrix(general)).data)).toEqual([2, -1, -1, 2]);
    const pattern = '%%MatrixMarket matrix coordinate pattern symmetric\n2 2 2\n1 1\n2 2\n';
    expect(Array.from(toDense(readSymmetricMatrix(pattern)).data)).toEqual([1, 0, 0, 1]);
    const array = '%%MatrixMarket matrix array real general\n2 2\n1\n0.5\n0.5\n3\n';
    expect(Array.from(toDense(readSymmetricMatrix(array)).data)).toEqual([1, 0.5, 0.5, 3]);
    expect(
      Array.from(toDense(readSymmetricMatrix('1.5D0,0\n0,2E0\n', { format: 'csv' })).data),
    ).toEqual([1.5, 0, 0, 2]);
  });

  it('refuses every kind of bad file with the line and the reason', () => {
    const h = '%%MatrixMarket matrix coordinate real symmetric\n';
    const cases: [string, string, RegExp, number?][] = [
      ['%%MatrixMarket tensor\n', 'MATRIX_FILE_INVALID', /line 1: the first line must be/],
      [
        '%%MatrixMarket matrix coordinate complex general\n1 1 1\n1 1 1 0\n',
        'MATRIX_FILE_INVALID',
        /field 'complex' is not supported/,
      ],
      [h + '2 3 1\n1 1 1\n', 'MATRIX_NOT_SQUARE', /line 2: a symmetric matrix must be square/],
      [
        '%%MatrixMarket matrix coordinate real general\n2 3 1\n1 1 1\n',
        'MATRIX_NOT_SQUARE',
        /2 × 3; a stiffness or mass matrix must be square/,
      ],
      [
        h + '2 2 2\n1 1 1\n3 1 1\n',
        'MATRIX_FILE_INVALID',
        /line 4: row index 3 is out of range 1…2/,
        4,
      ],
      [
        h + '2 2 2\n1 1 1\n2 2 abc\n',
        'MATRIX_FILE_INVALID',
        /line 4: the value 'abc' is not a number/,
        4,
      ],
      [h + '2 2 2\n1 1 NaN\n2 2 1\n', 'MATRIX_NOT_FINITE', /line 3: the value is 'NaN'/, 3],
      [h + '2 2 2\n1 1 inf\n2 2 1\n', 'MATRIX_NOT_FINITE', /finite/],
      [
        h + '2 2 3\n1 1 1\n2 2 1\n',
        'MATRIX_FILE_INVALID',
        /missing entries: the size line announces 3 but the file has 2/,
      ],
      [
        h + '2 2 1\n1 1 1\n2 2 1\n',
        'MATRIX_FILE_INVALID',
        /line 4: the size line announces 1 entries but there are more/,
        4,
      ],
      [
        h + '2 2 2\n1 2 1\n2 2 1\n',
        'MATRIX_FILE_INVALID',
        /line 3: entry \(1, 2\) lies above the diagonal/,
      ],
      [h + '2 2\n', 'MATRIX_FILE_INVALID', /line 2: the size line must be 'rows columns entries'/],
      [
        '%%MatrixMarket matrix array real general\n2 2\n1\n2\n3\n',
        'MATRIX_FILE_INVALID',
        /missing entries: a 2 × 2 array needs 4 values but the file has 3/,
      ],
      [
        '%%MatrixMarket matrix coordinate integer symmetric\n1 1 1\n1 1 1.5\n',
        'MATRIX_FILE_INVALID',
        /not a whole number/,
      ],
      [
        '%%MatrixMarket matrix coordinate real general\n2 2 3\n1 1 1\n2 1 5\n2 2 1\n',
        'MATRIX_NOT_SYMMETRIC',
        /entry \(2, 1\) = 5 on line 4 but \(1, 2\) = 0 \(not given\)/,
      ],
      [
        '%%MatrixMarket matrix array real general\n2 2\n1\n2\n3\n4\n',
        'MATRIX_NOT_SYMMETRIC',
        /K.mtx\[2,1\] = 2 but K.mtx\[1,2\] = 3 .*lines 4 and 5/,
      ],
    ];
    for (const [text, code, message, line] of cases) {
      const e = refusal(text);
      expect(e.code, text).toBe(code);
      expect(e.message, text).toMatch(message);
      if (line !== undefined) expect(e.details?.line).toBe(line);
    }
  });

  it('refuses bad CSV files with the line', () => {
    expect(refusal('1,2\n2,1,4\n', 'csv').message).toMatch(
      /line 2: row 2 has 3 entries but row 1 has 2/,
    );
    expect(refusal('1,2,3\n4,5,6\n', 'csv').code).toBe('MATRIX_NOT_SQUARE');
    expect(refusal('1,x\nx,1\n', 'csv').message).toMatch(
      /line 1: entry \(1, 2\) 'x' is not a number/,
    );
    expect(refusal('i,j,value\n1,1,2\n0,1,3\n').message).toMatch(
      /line 3: row index 0 is out of range: indices start at 1/,
    );
    expect(refusal('i,j,value\n1,1\n').message).toMatch(
      /line 2: a triplet line must be 'i,j,value'/,
    );
  });
});
