/**
 * A small dense solve run by a helper thread when it starts, before it waits for its first step.
 *
 * A new thread runs the step functions unoptimized until V8 has compiled them, and its compiler
 * threads compete for the same cores as the solve: measured on the 2-core development machine, a
 * fresh helper took two to three times as long as the caller over the same parts of the first
 * solve, which then waited for it (the whole dense solve of a 1000-DOF plate 2.0–2.6 s cold
 * against 1.2 s warm). Warmed on a 306-DOF grid pencil first (about 0.2 s, while the caller
 * still reads its model), the helper is as fast as the caller from its first step.
 *
 * The pencil is arbitrary: a 5-point grid stiffness and a varying diagonal mass, large enough
 * that every step is cut into parts (SPLIT_MIN) and runs each part function on this thread.
 */
import { denseEigensolver } from '../dense-eigensolver';
import { massOrthogonality } from '../modal-quantities';
import type { SparseSymmetricMatrix } from '../../linalg/types';

const ROWS = 17;
const COLS = 18;

/** Runs one dense solve of a 306-DOF pencil and its orthogonality check on this thread. */
export function warmUpDenseSteps(): void {
  const n = ROWS * COLS;
  const colPtr = new Int32Array(n + 1);
  const rowIdx: number[] = [];
  const values: number[] = [];
  for (let j = 0; j < n; j++) {
    colPtr[j] = rowIdx.length;
    rowIdx.push(j);
    values.push(4.5);
    // the neighbours below and to the right in the grid (lower triangle, sorted rows)
    if ((j + 1) % COLS !== 0) {
      rowIdx.push(j + 1);
      values.push(-1);
    }
    if (j + COLS < n) {
      rowIdx.push(j + COLS);
      values.push(-1);
    }
  }
  colPtr[n] = rowIdx.length;
  const K: SparseSymmetricMatrix = {
    kind: 'sparse-symmetric',
    n,
    colPtr,
    rowIdx: Int32Array.from(rowIdx),
    values: Float64Array.from(values),
  };
  const M: SparseSymmetricMatrix = {
    kind: 'sparse-symmetric',
    n,
    colPtr: Int32Array.from({ length: n + 1 }, (_, j) => j),
    rowIdx: Int32Array.from({ length: n }, (_, j) => j),
    values: Float64Array.from({ length: n }, (_, j) => 1 + (j % 7) / 10),
  };
  const raw = denseEigensolver({
    K,
    M,
    count: n,
    tolerance: 1e-10,
    maxIterations: 0,
    shift: 0,
    seed: 1,
  });
  massOrthogonality(M, raw.vectors);
}
