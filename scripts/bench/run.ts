// npm run bench [-- --quick] [-- --only <name>[,<name>…]] [-- --runs <n>]
// (every problem by default; --quick: the small ones only)
//
// Builds each problem of issue 4, writes K and M as Matrix Market into bench-results/, runs our
// engine (each case in its own process, for its own peak memory) and the references on the same
// files in the same run — scipy's eigsh(K, k, M, sigma=0) / eigh(K, M) through reference.py when
// `python3 -c "import scipy"` works, ml-matrix for dense n ≤ 1000 — and prints a Markdown table,
// also written to bench-results/bench.md. Not part of npm test.
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdirSync, writeFileSync } from 'node:fs';
import { loadavg, cpus } from 'node:os';
import { join } from 'node:path';
import { PROBLEMS } from './problems';

const args = process.argv.slice(2);
const quick = args.includes('--quick');
const onlyAt = args.indexOf('--only');
const only = onlyAt >= 0 ? (args[onlyAt + 1] ?? '').split(',') : null;
const runsAt = args.indexOf('--runs');
const runsOverride = runsAt >= 0 ? Number(args[runsAt + 1]) : null;
const outDir = 'bench-results';
mkdirSync(outDir, { recursive: true });

const scipyOk = spawnSync('python3', ['-c', 'import scipy'], { stdio: 'ignore' }).status === 0;

interface CaseResult {
  name: string;
  kind: 'sparse' | 'dense';
  n: number;
  nnz: number;
  kPath: string;
  mPath: string;
  modes: number;
  median: number;
  times: number[];
  lambdas: number[];
  notes: string[];
  sturm: { shift: number; below: number; found: number } | null;
  conditioning: number;
  handbook: number[] | null;
  mlSeconds: number | null;
  mlLambdas: number[] | null;
  peakMB: number;
}

function maxRelDiff(a: number[], b: number[]): number {
  let worst = 0;
  for (let i = 0; i < Math.min(a.length, b.length); i++) {
    worst = Math.max(worst, Math.abs(a[i]! - b[i]!) / Math.abs(b[i]!));
  }
  return worst;
}

const fmt = (x: number | null | undefined, d = 2): string =>
  x === null || x === undefined || !Number.isFinite(x) ? '—' : x.toFixed(d);
const sci = (x: number | null | undefined): string =>
  x === null || x === undefined || !Number.isFinite(x) ? '—' : x.toExponential(1);

// The default run is every problem (the small ones take seconds); --quick only the small ones.
const selected = PROBLEMS.filter((p) => (only ? only.includes(p.name) : quick ? p.quick : true));
const rows: string[] = [];
const details: string[] = [];
const load0 = loadavg();
console.log(
  `bench: ${selected.length} problems; scipy ${scipyOk ? 'found' : 'not found (reference skipped)'}; load ${load0.map((l) => l.toFixed(2)).join(' ')}`,
);
for (const p of selected) {
  const big = p.kind === 'sparse' && !p.quick;
  // dense: five runs, as our first solve in a fresh process includes the JIT's warm-up (reported
  // beside the median); scipy gets the same count
  const runs = runsOverride ?? (big ? 1 : p.kind === 'dense' ? 5 : 3);
  console.log(`… ${p.name} (${runs} run${runs === 1 ? '' : 's'})`);
  const child = spawnSync(
    process.execPath,
    [
      '--import',
      'tsx',
      '--max-old-space-size=8192',
      join('scripts', 'bench', 'case.ts'),
      p.name,
      String(runs),
      outDir,
    ],
    { encoding: 'utf8', maxBuffer: 1 << 30 },
  );
  if (child.status !== 0) {
    console.log(`  our engine failed: ${child.stderr.split('\n').slice(0, 8).join('\n')}`);
    rows.push(`| ${p.name} | — | — | failed | — | — | — | — | — |`);
    continue;
  }
  const r = JSON.parse(child.stdout.trim().split('\n').pop()!) as CaseResult;
  interface RefResult {
    median: number;
    lambdas: number[];
    tool: string;
    peakMB: number;
  }
  let ref: RefResult | null = null;
  let refNote = '';
  if (scipyOk) {
    try {
      const out = execFileSync(
        'python3',
        [
          join('scripts', 'bench', 'reference.py'),
          p.kind,
          r.kPath,
          r.mPath,
          String(p.modes),
          String(runs),
        ],
        { encoding: 'utf8', maxBuffer: 1 << 30 },
      );
      ref = JSON.parse(out) as RefResult;
    } catch (e) {
      refNote = `scipy failed: ${String(e).slice(0, 200)}`;
    }
  } else {
    refNote = 'scipy not installed: reference skipped';
  }
  const refName = p.kind === 'sparse' ? 'eigsh σ=0' : 'eigh';
  const ratio = ref ? r.median / ref.median : null;
  const diff = ref ? maxRelDiff(r.lambdas, ref.lambdas.slice(0, r.lambdas.length)) : null;
  const sturm = r.sturm
    ? `${r.sturm.below} below σ / ${r.sturm.found} found ${r.sturm.below === r.sturm.found ? '✓' : '✗ MISMATCH'}`
    : '—';
  rows.push(
    `| ${p.name} | ${r.n} | ${r.nnz} | ${fmt(r.median)} | ${ref ? `${fmt(ref.median)} (${refName})` : '—'} | ${fmt(ratio)} | ${sci(diff)} | ${sturm} | ${fmt(r.peakMB, 0)} |`,
  );
  const extra: string[] = [];
  if (r.mlSeconds !== null && r.mlLambdas) {
    extra.push(
      `ml-matrix ${fmt(r.mlSeconds)} s (ours ${fmt(r.mlSeconds / r.median, 1)}× faster), max rel. diff ${sci(maxRelDiff(r.lambdas, r.mlLambdas))}`,
    );
  }
  if (r.handbook) {
    const hb = r.handbook.slice(0, r.lambdas.length);
    extra.push(
      `largest relative difference from the closed form/handbook values: ours ${sci(maxRelDiff(r.lambdas, hb))}` +
        (ref ? `, scipy ${sci(maxRelDiff(ref.lambdas.slice(0, hb.length), hb))}` : ''),
    );
    extra.push(
      `λ₁: ours ${r.lambdas[0]!.toPrecision(10)}, ${ref ? `scipy ${ref.lambdas[0]!.toPrecision(10)}, ` : ''}handbook ${hb[0]!.toPrecision(10)}`,
    );
  }
  const digits = Math.log10(r.conditioning);
  extra.push(
    `conditioning λ_max/λ₁ ≥ ${sci(r.conditioning)}` +
      (digits > 14
        ? ` — about ${digits.toFixed(0)} of 16 digits lost: the lowest eigenvalues cannot be resolved in double precision, their digits are not meaningful`
        : ''),
  );
  if (r.times.length > 1)
    extra.push(
      `our runs ${r.times.map((t) => fmt(t)).join(', ')} s (the first includes the JIT warm-up)`,
    );
  if (ref) extra.push(`reference peak ${fmt(ref.peakMB, 0)} MB, ${ref.tool}`);
  if (refNote) extra.push(refNote);
  details.push(`- **${p.name}**: ${extra.join('; ')}. Engine notes: ${r.notes.join(' ')}`);
  console.log(rows[rows.length - 1]);
}
const load1 = loadavg();
const table = [
  `Machine: ${cpus().length} × ${cpus()[0]?.model ?? 'cpu'}, Node ${process.version}; load average at start ${load0.map((l) => l.toFixed(2)).join(' ')}, at end ${load1.map((l) => l.toFixed(2)).join(' ')}.`,
  '',
  'Every solve returns the mode shapes as well as the eigenvalues, ours and the references alike (eigsh with vectors, eigh(K, M) with its default driver). Times are the solve only, not building or reading the matrices.',
  '',
  `Threads: the dense solves run on ${cpus().length} thread${cpus().length === 1 ? '' : 's'} (the caller and a DenseTeam of worker threads, as in the evaluation workers), scipy's eigh on its BLAS's default threads; the sparse solves and ml-matrix are single-threaded, as is scipy's eigsh apart from its BLAS calls.`,
  '',
  '| problem | DOF | nonzeros of K | ours, median s | reference, median s | ratio | max rel. λ diff | Sturm | our peak MB |',
  '|---|---|---|---|---|---|---|---|---|',
  ...rows,
  '',
  ...details,
  '',
].join('\n');
writeFileSync(join(outDir, 'bench.md'), table);
console.log('\n' + table);
