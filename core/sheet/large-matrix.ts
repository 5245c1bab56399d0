/**
 * A model-scale matrix (an uploaded analysis model's K or M, or a generator's K and M beyond
 * GENERATED_ENTRY_MAX_DOFS): kept as the engine's sparse symmetric matrix — typed arrays, the lower
 * triangle in compressed columns — in SI units with one unit for all its entries, never expanded
 * into a sheet value of n² quantities. A modes block takes it as `stiffness:` or `mass:`; the
 * sheet shows its size, unit and nonzeros.
 *
 * Memory: 12 bytes per stored nonzero plus 4 per column, against the 100–200 bytes per entry
 * (zeros included) of a matrix of unit objects. A 10 000-element beam's K is 70 000 stored
 * nonzeros, under 1 MB, where n² quantities would need about 60 GB.
 */
import type { MathNode } from 'mathjs';
import { EngineError } from '../errors';
import { toSparse } from '../linalg/factorize';
import type { SparseSymmetricMatrix, SymmetricMatrix } from '../linalg/types';

/** Coordinate (and triplet) uploads with at least this many rows stay sparse. */
export const LARGE_UPLOAD_MIN_ROWS = 500;

/**
 * Generated models with more DOFs than this give sparse K and M; smaller ones give matrices of
 * quantities a formula can index (`frame.K[1,1]`), as sheets written before always had. At 100
 * DOFs the 10 000 entries are what a result lists in full (RESULT_MATRIX_LIMIT).
 */
export const GENERATED_ENTRY_MAX_DOFS = 100;

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
    /** DOF labels of a generated model ("w3", "θ3", "N2 ux"), for the plots; null for uploads. */
    readonly dofs: readonly string[] | null = null,
  ) {}

  get n(): number {
    return this.engine.n;
  }

  /** Bytes of the typed arrays that hold the matrix (values, row indices, column pointers). */
  get bytes(): number {
    const A = this.engine;
    return A.values.byteLength + A.rowIdx.byteLength + A.colPtr.byteLength;
  }
}

/**
 * A generator's K or M as a model-scale sheet matrix (sparse, SI, one unit).
 * @example generatedMatrix('deck.K', model.K, 'N/m', model.dofs)
 */
export function generatedMatrix(
  name: string,
  A: SymmetricMatrix,
  unit: string,
  dofs: readonly string[],
): LargeMatrix {
  const engine = toSparse(A);
  return new LargeMatrix(name, engine, unit, fullNonzeros(engine), dofs);
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
    const found = largeMatrixAt(scope, n);
    if (found) {
      const [written, v] = found;
      throw new EngineError(
        'SHEET_EVAL',
        `${written} is a large sparse matrix (${v.n} × ${v.n}, ${v.nonzeros} nonzeros) kept for the eigen solver: use it as stiffness: or mass: of a modes block; a formula cannot take its entries.`,
      );
    }
  });
}

/** The large matrix a node names (`K`, or a field such as `deck.K`), with the name as written. */
function largeMatrixAt(
  scope: ReadonlyMap<string, unknown>,
  n: MathNode,
): [string, LargeMatrix] | null {
  if (n.type === 'SymbolNode') {
    const name = (n as unknown as { name: string }).name;
    const v = scope.get(name);
    return v instanceof LargeMatrix ? [name, v] : null;
  }
  if (n.type !== 'AccessorNode') return null;
  const a = n as unknown as {
    object: MathNode;
    index: { isObjectProperty(): boolean; getObjectProperty(): string };
  };
  if (a.object.type !== 'SymbolNode' || !a.index.isObjectProperty()) return null;
  const base = (a.object as unknown as { name: string }).name;
  const owner = scope.get(base);
  if (owner === null || typeof owner !== 'object') return null;
  const field = a.index.getObjectProperty();
  const v = Object.hasOwn(owner, field) ? (owner as Record<string, unknown>)[field] : undefined;
  return v instanceof LargeMatrix ? [`${base}.${field}`, v] : null;
}
