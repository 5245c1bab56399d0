/**
 * A large uploaded matrix (an analysis model's K or M): kept as the engine's sparse symmetric
 * matrix in SI units, never expanded into a sheet value of n² quantities. A modes block takes it as
 * `stiffness:` or `mass:`; the sheet shows its size, unit and nonzeros.
 */
import type { MathNode } from 'mathjs';
import { EngineError } from '../errors';
import type { SparseSymmetricMatrix } from '../linalg/types';

/** Coordinate (and triplet) uploads with at least this many rows stay sparse. */
export const LARGE_UPLOAD_MIN_ROWS = 500;

export class LargeMatrix {
  constructor(
    /** The matrix block's name. */
    readonly name: string,
    /** The entries in SI units (the block's unit applied), lower triangle. */
    readonly engine: SparseSymmetricMatrix,
    /** The unit the file's entries were declared in (`unit:`), or null for plain numbers. */
    readonly unit: string | null,
    /** Nonzeros of the whole matrix (both triangles). */
    readonly nonzeros: number,
  ) {}

  get n(): number {
    return this.engine.n;
  }
}

/** Nonzeros of the whole symmetric matrix from its stored lower triangle. */
export function fullNonzeros(A: SparseSymmetricMatrix): number {
  let diagonal = 0;
  for (let j = 0; j < A.n; j++) {
    for (let p = A.colPtr[j]!; p < A.colPtr[j + 1]!; p++) if (A.rowIdx[p] === j) diagonal++;
  }
  return 2 * A.values.length - diagonal;
}

/**
 * Refuses a formula that names a large matrix: it has no entries a formula could use, only a
 * place in a modes block.
 * @throws EngineError SHEET_EVAL naming the matrix, its size and where it can be used.
 */
export function refuseLargeMatrices(scope: ReadonlyMap<string, unknown>, node: MathNode): void {
  node.traverse((n) => {
    if (n.type !== 'SymbolNode') return;
    const v = scope.get((n as unknown as { name: string }).name);
    if (v instanceof LargeMatrix) {
      throw new EngineError(
        'SHEET_EVAL',
        `${v.name} is a large sparse matrix (${v.n} × ${v.n}, ${v.nonzeros} nonzeros) kept for the eigen solver: use it as stiffness: or mass: of a modes block; a formula cannot take its entries.`,
      );
    }
  });
}
