// One benchmark case in its own process (so its peak memory is its own): builds the problem,
// writes K and M as Matrix Market, runs our engine's kernel `runs` times and `solveModes` (the
// whole engine, checks included) as often (and ml-matrix for dense n ≤ 1000), and prints one JSON
// line. With `runs` 0 it only writes the files. Run by scripts/bench/run.ts.
import { mkdirSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { join } from 'node:path';
import { CholeskyDecomposition, EigenvalueDecomposition, Matrix, solve } from 'ml-matrix';
import {
  createShiftedPencil,
  denseEigensolver,
  diagonalOf,
  lanczos,
  solveModes,
  type LanczosSturm,
  type SparseSymmetricMatrix,
} from '../../core/index';
import { createDenseTeam } from '../../api/workers/dense-team';
import { writeMatrixMarket } from './matrix-market';
import { PROBLEMS } from './problems';

const [name, runsArg, outDir = 'bench-results'] = process.argv.slice(2);
const problem = PROBLEMS.find((p) => p.name === name);
if (!problem) throw new Error(`unknown problem ${name}`);
const runs = Number(runsArg ?? 1);

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)]!;
}

function nnzFull(A: SparseSymmetricMatrix): number {
  let diag = 0;
  for (let j = 0; j < A.n; j++) {
    for (let p = A.colPtr[j]!; p < A.colPtr[j + 1]!; p++) if (A.rowIdx[p] === j) diag++;
  }
  return 2 * A.colPtr[A.n]! - diag;
}

async function main(): Promise<void> {
  const built = problem!.build();
  const { K, M } = built;
  mkdirSync(outDir, { recursive: true });
  const kPath = join(outDir, `${problem!.name}.K.mtx`);
  const mPath = join(outDir, `${problem!.name}.M.mtx`);
  await writeMatrixMarket(kPath, K, `Modewright bench ${problem!.name}: stiffness`);
  await writeMatrixMarket(mPath, M, `Modewright bench ${problem!.name}: mass`);
  if (runs === 0) {
    process.stdout.write(
      JSON.stringify({ name: problem!.name, n: K.n, nnz: nnzFull(K), kPath, mPath }) + '\n',
    );
    return;
  }
  const times: number[] = [];
  const solveTimes: number[] = [];
  let lambdas: number[] = [];
  let notes: string[] = [];
  let sturm: { shift: number; below: number; found: number };
  let lastSturm: LanczosSturm | undefined;
  let mlSeconds: number | null = null;
  let mlLambdas: number[] | null = null;
  if (problem!.kind === 'sparse') {
    for (let r = 0; r < runs; r++) {
      const t0 = performance.now();
      const raw = lanczos({
        K,
        M,
        count: problem!.modes,
        tolerance: 1e-10,
        maxIterations: 300,
        shift: 0,
        seed: 1,
      });
      times.push((performance.now() - t0) / 1000);
      lambdas = raw.lambdas;
      notes = raw.notes;
      lastSturm = raw.sturm;
    }
    for (let r = 0; r < runs; r++) {
      const t0 = performance.now();
      solveModes(K, M, { count: problem!.modes });
      solveTimes.push((performance.now() - t0) / 1000);
    }
    // Sturm proof, made inside the method: K − σM at σ = λ_p(1 + 1e-8), counted by our LDLᵀ.
    const st = lastSturm;
    sturm = st
      ? { shift: st.shift, below: st.countBelow - st.belowSigma, found: st.found }
      : { shift: NaN, below: -1, found: lambdas.length };
  } else {
    // one thread per core, as the evaluation workers run it (and as scipy's BLAS does)
    const team = await createDenseTeam(availableParallelism() - 1);
    for (let r = 0; r < runs; r++) {
      const t0 = performance.now();
      const raw = denseEigensolver({
        K,
        M,
        count: K.n,
        tolerance: 1e-10,
        maxIterations: 0,
        shift: 0,
        seed: 1,
        team,
      });
      times.push((performance.now() - t0) / 1000);
      lambdas = raw.lambdas;
      notes = raw.notes;
    }
    for (let r = 0; r < runs; r++) {
      const t0 = performance.now();
      solveModes(K, M, { method: 'dense', team });
      solveTimes.push((performance.now() - t0) / 1000);
    }
    await team.close();
    const lamP = lambdas[lambdas.length - 1]!;
    const shift = lamP * (1 + 1e-6);
    sturm = {
      shift,
      below: createShiftedPencil(K, M).factorize(shift).negativePivots,
      found: lambdas.length,
    };
    if (K.n <= 1000) {
      // ml-matrix: Cholesky of M, C = L⁻¹ K L⁻ᵀ, EigenvalueDecomposition (REFERENCES.md item 5).
      const toMl = (A: SparseSymmetricMatrix): Matrix => {
        const m = new Matrix(A.n, A.n);
        for (let j = 0; j < A.n; j++) {
          for (let p = A.colPtr[j]!; p < A.colPtr[j + 1]!; p++) {
            m.set(A.rowIdx[p]!, j, A.values[p]!);
            m.set(j, A.rowIdx[p]!, A.values[p]!);
          }
        }
        return m;
      };
      const Km = toMl(K);
      const Mm = toMl(M);
      const t0 = performance.now();
      const L = new CholeskyDecomposition(Mm).lowerTriangularMatrix;
      // C = L⁻¹ K L⁻ᵀ with ml-matrix's own solver, twice.
      const W = solve(L, Km);
      const C = solve(L, W.transpose());
      const e = new EigenvalueDecomposition(C.add(C.transpose()).mul(0.5), {
        assumeSymmetric: true,
      });
      mlSeconds = (performance.now() - t0) / 1000;
      mlLambdas = [...e.realEigenvalues].sort((a, b) => a - b);
    }
  }
  // Conditioning: λ_max ≥ max K_ii / M_ii (Rayleigh quotient of a unit vector) against λ₁.
  const dk = diagonalOf(K);
  const dm = diagonalOf(M);
  let lamMaxBound = 0;
  for (let i = 0; i < K.n; i++)
    if (dm[i]! > 0) lamMaxBound = Math.max(lamMaxBound, dk[i]! / dm[i]!);
  const conditioning = lamMaxBound / Math.abs(lambdas[0]!);
  const peakMB = process.resourceUsage().maxRSS / 1024;
  process.stdout.write(
    JSON.stringify({
      name: problem!.name,
      kind: problem!.kind,
      n: K.n,
      nnz: nnzFull(K),
      kPath,
      mPath,
      modes: problem!.modes,
      median: median(times),
      times,
      solveModesMedian: median(solveTimes),
      lambdas,
      notes,
      sturm,
      conditioning,
      handbook: built.handbook ?? null,
      mlSeconds,
      mlLambdas,
      peakMB,
    }) + '\n',
  );
}

void main();
