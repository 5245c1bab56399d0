// The benchmark problems, built with the model generators of core/models.
import {
  buildBuildingFrame,
  buildPlaneStressPlate,
  eulerBernoulliBeam,
  STEEL_BUILDING_DEFAULTS,
  toSparse,
  type SparseSymmetricMatrix,
} from '../../core/index';

export interface BenchProblem {
  name: string;
  kind: 'sparse' | 'dense';
  /** Modes wanted (sparse); dense problems compute all of them. */
  modes: number;
  /** Included in --quick runs. */
  quick: boolean;
  /** Minutes rather than seconds: only with --large (or --only). */
  large?: boolean;
  build(): { K: SparseSymmetricMatrix; M: SparseSymmetricMatrix; handbook?: number[] };
}

// The plate: 2 m × 1 m × 10 mm steel, E = 210 GPa, ν = 0.3, ρ = 7850 kg/m³, x = 0 clamped.
const plate = (nx: number, ny: number) => () => {
  const p = buildPlaneStressPlate({
    lengthX: 2,
    lengthY: 1,
    thickness: 0.01,
    E: 210e9,
    nu: 0.3,
    density: 7850,
    nx,
    ny,
  });
  return { K: p.K, M: p.M };
};

function chain(N: number): {
  K: SparseSymmetricMatrix;
  M: SparseSymmetricMatrix;
  handbook: number[];
} {
  // Fixed–free chain, unit masses and springs; λ_n = 4 sin²((2n−1)π/(2(2N+1))) (REFERENCES.md 2).
  const colPtr = new Int32Array(N + 1);
  const rowIdx = new Int32Array(2 * N - 1);
  const values = new Float64Array(2 * N - 1);
  let q = 0;
  for (let j = 0; j < N; j++) {
    rowIdx[q] = j;
    values[q++] = j === N - 1 ? 1 : 2;
    if (j + 1 < N) {
      rowIdx[q] = j + 1;
      values[q++] = -1;
    }
    colPtr[j + 1] = q;
  }
  const K: SparseSymmetricMatrix = { kind: 'sparse-symmetric', n: N, colPtr, rowIdx, values };
  const M: SparseSymmetricMatrix = {
    kind: 'sparse-symmetric',
    n: N,
    colPtr: Int32Array.from({ length: N + 1 }, (_, i) => i),
    rowIdx: Int32Array.from({ length: N }, (_, i) => i),
    values: new Float64Array(N).fill(1),
  };
  const handbook = Array.from(
    { length: 10 },
    (_, k) => 4 * Math.sin(((2 * (k + 1) - 1) * Math.PI) / (2 * (2 * N + 1))) ** 2,
  );
  return { K, M, handbook };
}

function cantilever(elements: number) {
  // Steel cantilever 10 m, EI = 210e9 · 8e-6, 40 kg/m; clamped–free β_nL from REFERENCES.md item 1.
  const E = 210e9;
  const I = 8e-6;
  const m = 40;
  const L = 10;
  const beam = eulerBernoulliBeam({
    E,
    I,
    massPerLength: m,
    length: L,
    elements,
    left: 'clamped',
    right: 'free',
  });
  const betaL = [1.87510407, 4.69409113, 7.85475744, 10.99554073, 14.13716839];
  // β_nL ≈ (2n − 1)π/2 beyond the fifth root (the roots of cos βL cosh βL = −1 approach it).
  for (let k = 6; k <= 10; k++) betaL.push(((2 * k - 1) * Math.PI) / 2);
  const handbook = betaL.map((b) => b ** 4 * ((E * I) / (m * L ** 4)));
  return { K: toSparse(beam.K), M: toSparse(beam.M), handbook };
}

export const PROBLEMS: BenchProblem[] = [
  { name: 'chain-100k', kind: 'sparse', modes: 10, quick: false, build: () => chain(100_000) },
  { name: 'chain-10k', kind: 'sparse', modes: 10, quick: true, build: () => chain(10_000) },
  {
    name: 'cantilever-25k',
    kind: 'sparse',
    modes: 10,
    quick: false,
    build: () => cantilever(25_000),
  },
  { name: 'cantilever-2k', kind: 'sparse', modes: 10, quick: true, build: () => cantilever(2_000) },
  { name: 'plate-100x50', kind: 'sparse', modes: 10, quick: true, build: plate(100, 50) },
  { name: 'plate-224x112', kind: 'sparse', modes: 10, quick: false, build: plate(224, 112) },
  {
    name: 'plate-224x112-p50',
    kind: 'sparse',
    modes: 50,
    quick: false,
    large: true,
    build: plate(224, 112),
  },
  {
    name: 'plate-316x158',
    kind: 'sparse',
    modes: 10,
    quick: false,
    large: true,
    build: plate(316, 158),
  },
  {
    name: 'plate-448x224',
    kind: 'sparse',
    modes: 10,
    quick: false,
    large: true,
    build: plate(448, 224),
  },
  {
    name: 'building-20x20x20',
    kind: 'sparse',
    modes: 10,
    quick: false,
    large: true,
    build: () => {
      const b = buildBuildingFrame(STEEL_BUILDING_DEFAULTS);
      return { K: b.K, M: b.M };
    },
  },
  {
    name: 'building-4x4x5',
    kind: 'sparse',
    modes: 10,
    quick: true,
    build: () => {
      const b = buildBuildingFrame({ ...STEEL_BUILDING_DEFAULTS, baysX: 4, baysY: 4, storeys: 5 });
      return { K: b.K, M: b.M };
    },
  },
  // Dense, every mode: the same plate with n = 2·nx·(ny + 1) DOFs.
  { name: 'dense-plate-200', kind: 'dense', modes: 0, quick: true, build: plate(10, 9) },
  { name: 'dense-plate-500', kind: 'dense', modes: 0, quick: true, build: plate(25, 9) },
  { name: 'dense-plate-1000', kind: 'dense', modes: 0, quick: false, build: plate(25, 19) },
  {
    name: 'dense-plate-2000',
    kind: 'dense',
    modes: 0,
    quick: false,
    large: true,
    build: plate(50, 19),
  },
];
