/**
 * max |ΦᵀMΦ − I| over many mass-normalized vectors (every mode of a dense solve: p² n / 2
 * multiply–adds), as parts a `DenseTeam` (./team) may share.
 *
 * G = ΦᵀMΦ is symmetric, so only its upper triangle is formed, a band of rows at a time, and
 * never kept: each band is compared with I as soon as it is complete. A part takes a run of bands
 * of about equal work (`triangleSplit`) and writes its worst entry into its slot of `worst`.
 * Each entry is summed in the same order wherever its part runs, so the figure is bitwise the
 * same with any number of threads.
 */
import { multiplyAdd } from '../../linalg/dense-kernels';
import {
  DENSE_PARTS,
  type DenseTask,
  type DenseTeam,
  SERIAL_TEAM,
  SPLIT_MIN,
  triangleSplit,
} from './team';

/** Rows of G per band: a band (BAND × p) stays in the second-level cache beside a slice. */
const BAND = 32;
/** DOFs per slice of the product (a multiple of 8, the kernel's group of terms). */
const SLICE = 128;

/**
 * The worst |G(i, j) − δij| over G = ΦᵀMΦ, from the vectors φ_i and `product`, which gives Mφ.
 * Holds two p × n arrays (Φ and MΦ) while it runs, and gives them back to the team after.
 * @example orthogonalityWorst(vectors, (v) => symmetricMultiply(M, v), team)
 */
export function orthogonalityWorst(
  vectors: readonly Float64Array[],
  product: (v: Float64Array) => Float64Array,
  threads: DenseTeam = SERIAL_TEAM,
): number {
  const p = vectors.length;
  if (p === 0) return 0;
  const n = (vectors[0] as Float64Array).length;
  const parts = p >= 2 * SPLIT_MIN ? DENSE_PARTS : 1;
  // One part (a few dozen modes of a large model, from Lanczos) runs here: its arrays need not be
  // shared with, and held by, the team's other threads.
  const team = parts > 1 ? threads : SERIAL_TEAM;
  // Φ row by row (row i = φ_i) and MΦ column by column (row k = component k of every Mφ_j)
  try {
    const A = team.shared(p * n);
    const Bt = team.shared(n * p);
    for (let i = 0; i < p; i++) {
      const v = vectors[i] as Float64Array;
      A.set(v, i * n);
      const b = product(v);
      for (let k = 0; k < n; k++) Bt[k * p + i] = b[k] as number;
    }
    const worst = team.shared(parts);
    team.run(
      'orthogonality',
      orthogonalityPart,
      parts,
      [A, Bt, worst],
      [p, n, ...triangleSplit(0, p, p, parts, BAND)],
    );
    let w = 0;
    for (let k = 0; k < parts; k++) w = Math.max(w, worst[k] as number);
    return w;
  } finally {
    team.release();
  }
}

/** Bands of rows [bounds[part], bounds[part + 1]) of the upper triangle of ΦᵀMΦ. */
export const orthogonalityPart: DenseTask = (part, [A, Bt, worst], [p, n, ...bounds]) => {
  const a = A as Float64Array;
  const bt = Bt as Float64Array;
  const size = p as number;
  const dofs = n as number;
  const r0 = bounds[part] as number;
  const r1 = bounds[part + 1] as number;
  const G = new Float64Array(BAND * size);
  let w = 0;
  for (let i0 = r0; i0 < r1; i0 += BAND) {
    const rows = Math.min(BAND, r1 - i0);
    G.fill(0);
    // columns i0 … p − 1 of the band: its triangle and everything right of it
    for (let k0 = 0; k0 < dofs; k0 += SLICE) {
      multiplyAdd(
        { data: G, offset: 0, stride: size },
        { data: a, offset: i0 * dofs + k0, stride: dofs },
        { data: bt, offset: k0 * size, stride: size },
        rows,
        Math.min(SLICE, dofs - k0),
        i0,
        size,
        1,
      );
    }
    w = Math.max(w, bandWorst(G, size, i0, rows));
  }
  (worst as Float64Array)[part] = w;
};

/** The worst |G(i, j) − δij| for j ≥ i over the band's rows i0 … i0 + rows − 1. */
function bandWorst(G: Float64Array, p: number, i0: number, rows: number): number {
  let w = 0;
  for (let r = 0; r < rows; r++) {
    const i = i0 + r;
    const o = r * p;
    w = Math.max(w, Math.abs((G[o + i] as number) - 1));
    for (let j = i + 1; j < p; j++) w = Math.max(w, Math.abs(G[o + j] as number));
  }
  return w;
}
