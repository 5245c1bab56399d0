import { describe, expect, it } from 'vitest';
import { EngineError } from '../../../core/errors';
import {
  denseFromRows,
  matrixSize,
  sparseSymmetricFromTriplets,
  symmetricMultiply,
} from '../../../core/linalg/sparse';

describe('sparseSymmetricFromTriplets', () => {
  it('mirrors upper entries, sums duplicates, sorts rows', () => {
    // 3×3 matrix [[4,-1,0],[-1,4,-2],[0,-2,5]] given as a mix of upper/lower and split duplicates.
    const A = sparseSymmetricFromTriplets(
      3,
      [2, 0, 1, 0, 1, 2, 1],
      [2, 1, 1, 0, 2, 2, 1],
      [5, -1, 3, 4, -2, 0, 1],
    );
    expect(Array.from(A.colPtr)).toEqual([0, 2, 4, 5]);
    expect(Array.from(A.rowIdx)).toEqual([0, 1, 1, 2, 2]);
    expect(Array.from(A.values)).toEqual([4, -1, 4, -2, 5]);
    expect(matrixSize(A)).toBe(3);
    // Product against the dense form computed by hand: A·[1,2,3] = [2, 1, 11].
    expect(Array.from(symmetricMultiply(A, Float64Array.from([1, 2, 3])))).toEqual([2, 1, 11]);
    const D = denseFromRows([
      [4, -1, 0],
      [-1, 4, -2],
      [0, -2, 5],
    ]);
    expect(Array.from(symmetricMultiply(D, Float64Array.from([1, 2, 3])))).toEqual([2, 1, 11]);
  });

  it('refuses an index out of range with the entry number', () => {
    try {
      sparseSymmetricFromTriplets(2, [0, 2], [0, 0], [1, 1]);
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(EngineError);
      expect((e as EngineError).code).toBe('MATRIX_FILE_INVALID');
      expect((e as EngineError).message).toContain('Entry 2');
    }
  });

  it('refuses NaN values', () => {
    expect(() => sparseSymmetricFromTriplets(1, [0], [0], [NaN])).toThrow(/finite/);
  });
});
