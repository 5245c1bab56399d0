/**
 * The threads a dense solve may share its heavy steps with.
 *
 * `core/` starts no threads itself: the host hands a `DenseTeam` in (the API's evaluation
 * workers and the benchmark use `api/workers/dense-team`, worker threads over SharedArrayBuffer).
 * Without one, `SERIAL_TEAM` runs every part on the caller.
 *
 * A step is cut into a fixed number of parts that depends only on the problem, never on the
 * team's size, and each part does the same arithmetic in the same order wherever it runs. The
 * results are therefore bitwise the same with any number of threads, which a sealed revision's
 * reproduction relies on.
 */

/**
 * The parts a large step is cut into: the cores of the machines this runs on. More parts than
 * threads cost a little redundant work per part and gain nothing.
 */
export const DENSE_PARTS = 2;

/** Below this many rows (or columns) a step stays one part: waking a thread would cost more. */
export const SPLIT_MIN = 128;

/** One part of a step: `arrays` are the step's shared arrays, `scalars` its integers (sizes,
 * offsets, bounds; 32-bit). */
export type DenseTask = (
  part: number,
  arrays: readonly Float64Array[],
  scalars: readonly number[],
) => void;

export interface DenseTeam {
  /** Threads that run parts, the caller's included. */
  readonly size: number;
  /** A zeroed array every thread of the team can read and write. */
  shared(length: number): Float64Array;
  /**
   * Runs `task` for every part 0 … parts − 1 and returns when all are done. `name` is the task's
   * key in `DENSE_TASKS` (`./tasks`), by which the other threads find the same function. Arrays
   * not made by `shared` make the step run on the caller alone.
   */
  run(
    name: string,
    task: DenseTask,
    parts: number,
    arrays: readonly Float64Array[],
    scalars: readonly number[],
  ): void;
  /** The solve is over: the other threads drop their views of its arrays. */
  release(): void;
}

/** Every part on the caller, in order. */
export const SERIAL_TEAM: DenseTeam = {
  size: 1,
  shared: (length) => new Float64Array(length),
  run(_name, task, parts, arrays, scalars) {
    for (let part = 0; part < parts; part++) task(part, arrays, scalars);
  },
  release() {},
};

/**
 * Splits rows [r0, r1) of an upper triangle (row r spans columns r … n − 1) into `parts` runs of
 * about equal work, each boundary a multiple of `align` rows from r0: a row costs its length plus
 * `rowCost` (the fixed work per row). Returns parts + 1 bounds.
 * @example triangleSplit(0, 1000, 1000, 2, 4) // [0, 292, 1000]
 */
export function triangleSplit(
  r0: number,
  r1: number,
  n: number,
  parts: number,
  align: number,
  rowCost = 0,
): number[] {
  const bounds = [r0];
  const area = (a: number): number => {
    // rows r0 … a − 1: Σ (n − r + rowCost)
    const rows = a - r0;
    return rows * (n - r0 + rowCost) - (rows * (rows - 1)) / 2;
  };
  const total = area(r1);
  let at = r0;
  for (let p = 1; p < parts; p++) {
    const want = (total * p) / parts;
    while (at < r1 && area(Math.min(r1, at + align)) <= want) at = Math.min(r1, at + align);
    bounds.push(at);
  }
  bounds.push(r1);
  return bounds;
}

/**
 * Splits [c0, c1) into `parts` runs of about equal length, each boundary a multiple of `align`
 * from c0. Returns parts + 1 bounds.
 * @example evenSplit(0, 1000, 2, 4) // [0, 500, 1000]
 */
export function evenSplit(c0: number, c1: number, parts: number, align: number): number[] {
  const bounds = [c0];
  for (let p = 1; p < parts; p++) {
    const at = c0 + Math.round(((c1 - c0) * p) / parts / align) * align;
    bounds.push(Math.min(c1, Math.max(bounds[p - 1] as number, at)));
  }
  bounds.push(c1);
  return bounds;
}

/**
 * Rows [bounds[part], bounds[part + 1]) of dst = srcᵀ (n × n, row-major): dst(i, k) = src(row(k), i)
 * with row(k) = rows[k] when a third array `rows` is given, else k; with `upper` = 1 only k ≥ i.
 * Copied in 32 × 32 tiles: a column walk of a row-major matrix misses the cache on every entry.
 */
export const transposePart: DenseTask = (part, [src, dst, rows], [n, upper, ...bounds]) => {
  const a = src as Float64Array;
  const out = dst as Float64Array;
  const size = n as number;
  const i0 = bounds[part] as number;
  const i1 = bounds[part + 1] as number;
  const TILE = 32;
  for (let t0 = i0; t0 < i1; t0 += TILE) {
    const t1 = Math.min(i1, t0 + TILE);
    for (let k0 = upper ? t0 : 0; k0 < size; k0 += TILE) {
      const k1 = Math.min(size, k0 + TILE);
      for (let k = k0; k < k1; k++) {
        const from = (rows ? (rows[k] as number) : k) * size;
        const stop = upper ? Math.min(t1, k + 1) : t1;
        for (let i = t0; i < stop; i++) out[i * size + k] = a[from + i] as number;
      }
    }
  }
};
