// npm run bench [-- --quick] [-- --large] [-- --only <name>[,<name>…]] [-- --runs <n>]
//   [-- --users-only | --kernel-only] [-- --baseline <checkout>]
// (by default the problems that take seconds; --large adds the 100k and 200k plates, the 3D frame,
// 50 modes of the 50k plate and dense n = 2000; --quick: the small ones only)
//
// Builds each problem, writes K and M as Matrix Market into bench-results/, and times two things
// in the same run, printed as two Markdown tables (also written to bench-results/bench.md):
// 1. the users' path: our command line as a whole process (read the files → solveModes → JSON)
//    against scipy as a whole process (mmread + eigsh(σ = 0) / eigh), alternating, median of
//    `runs` pairs (3 by default), ratios;
// 2. the kernels: lanczos() / denseEigensolver() and solveModes() inside one process (each case
//    in its own process, for its own peak memory) against scipy's solve alone, and ml-matrix for
//    dense n ≤ 1000.
// --baseline times the command line of another checkout (with its own node_modules) in the same
// alternation, as a before/after column of the first table. --queue adds the evaluation queue's
// table (./queue.ts; needs Redis: `npm run redis:start`), --queue-only prints it alone. --sheets
// adds sheets evaluated through the compiled API server and a worker process, signed in over
// HTTP with uploaded files, against scipy on the same K and M (./sheets.ts; it starts MariaDB,
// Redis, the server and the worker itself; --large adds the 3D frame), --sheets-only prints that
// table alone. Not part of npm test.
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdirSync, writeFileSync } from 'node:fs';
import { loadavg, cpus } from 'node:os';
import { join } from 'node:path';
import { PROBLEMS } from './problems';
import { benchQueue } from './queue';
import { benchSheets } from './sheets';
import { spawnCase } from './spawn-case';
import { benchUsersPath, type UsersPathResult } from './users-path';

const args = process.argv.slice(2);
const quick = args.includes('--quick');
const onlyAt = args.indexOf('--only');
const only = onlyAt >= 0 ? (args[onlyAt + 1] ?? '').split(',') : null;
const runsAt = args.indexOf('--runs');
const runsOverride = runsAt >= 0 ? Number(args[runsAt + 1]) : null;
const large = args.includes('--large');
const usersOnly = args.includes('--users-only');
const kernelOnly = args.includes('--kernel-only');
const baselineAt = args.indexOf('--baseline');
const baselineRoot = baselineAt >= 0 ? (args[baselineAt + 1] ?? null) : null;
const queueOnly = args.includes('--queue-only');
const withQueue = queueOnly || args.includes('--queue');
const sheetsOnly = args.includes('--sheets-only');
const withSheets = sheetsOnly || args.includes('--sheets');
const tableOnly = queueOnly || sheetsOnly;
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
  solveModesMedian: number;
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

function median(xs: number[]): number {
  if (xs.length === 0) return NaN;
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)]!;
}

const selected = tableOnly
  ? []
  : PROBLEMS.filter((p) =>
      only ? only.includes(p.name) : quick ? p.quick : large ? true : !p.large,
    );
const rows: string[] = [];
const userRows: string[] = [];
const userDetails: string[] = [];
const details: string[] = [];
const load0 = loadavg();
console.log(
  `bench: ${selected.length} problems; scipy ${scipyOk ? 'found' : 'not found (reference skipped)'}; load ${load0.map((l) => l.toFixed(2)).join(' ')}`,
);
for (const p of selected) {
  const big = p.kind === 'sparse' && !p.quick;
  // dense: five runs, as our first solve in a fresh process includes the JIT's warm-up (reported
  // beside the median); scipy gets the same count
  const runs = usersOnly ? 0 : (runsOverride ?? (big ? 1 : p.kind === 'dense' ? 5 : 3));
  console.log(
    `… ${p.name} (${usersOnly ? 'files' : `kernel, ${runs} run${runs === 1 ? '' : 's'}`})`,
  );
  const child = spawnCase(p.name, runs, outDir);
  if (child.status !== 0) {
    console.log(`  our engine failed: ${child.stderr.split('\n').slice(0, 8).join('\n')}`);
    rows.push(`| ${p.name} | — | — | failed | — | — | — | — | — | — |`);
    continue;
  }
  const r = JSON.parse(child.stdout.trim().split('\n').pop()!) as CaseResult;
  if (!kernelOnly) {
    const pairs = Math.max(3, runsOverride ?? 3);
    console.log(`  users' path, ${pairs} alternating pairs`);
    const u = benchUsersPath(p.kind, r.kPath, r.mPath, p.modes, pairs, scipyOk, baselineRoot);
    userRows.push(userRow(p.name, r.n, p.kind, u));
    console.log(userRows[userRows.length - 1]);
    const d: string[] = [];
    d.push(`ours ${u.ours.times.map((t) => fmt(t)).join(', ')} s`);
    if (u.scipy) d.push(`scipy ${u.scipy.times.map((t) => fmt(t)).join(', ')} s`);
    if (u.baseline) {
      d.push(`baseline ${u.baseline.times.map((t) => fmt(t)).join(', ')} s`);
      if (u.baseline.warnings.length > 0)
        d.push(`baseline warnings: ${u.baseline.warnings.join(', ')}`);
      if (u.baseline.error) d.push(`baseline failed: ${u.baseline.error}`);
    }
    if (u.ours.warnings.length > 0) d.push(`our warnings: ${u.ours.warnings.join(', ')}`);
    if (u.ours.error) d.push(`ours failed: ${u.ours.error}`);
    if (u.scipy?.error) d.push(`scipy failed: ${u.scipy.error}`);
    userDetails.push(`- **${p.name}**: ${d.join('; ')}.`);
  }
  if (usersOnly) continue;
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
          'kernel',
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
    `| ${p.name} | ${r.n} | ${r.nnz} | ${fmt(r.median)} | ${fmt(r.solveModesMedian)} | ${ref ? `${fmt(ref.median)} (${refName})` : '—'} | ${fmt(ratio)} | ${sci(diff)} | ${sturm} | ${fmt(r.peakMB, 0)} |`,
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
const queueLines = withQueue ? await benchQueue(runsOverride ?? 20) : [];
const sheetLines = withSheets
  ? await benchSheets(Math.max(3, runsOverride ?? 3), { outDir, scipy: scipyOk, large, only })
  : [];
const load1 = loadavg();
const table = [
  `Machine: ${cpus().length} × ${cpus()[0]?.model ?? 'cpu'}, Node ${process.version}; load average at start ${load0.map((l) => l.toFixed(2)).join(' ')}, at end ${load1.map((l) => l.toFixed(2)).join(' ')}.`,
  '',
  ...(kernelOnly || tableOnly
    ? []
    : [
        "## The users' path: whole processes",
        '',
        "Ours: the `npm run solve` command (package.json) with `--json`, reading both Matrix Market files, solving with `solveModes` (method auto: Lanczos for these sparse models, `--method dense` for the dense ones; checks, Sturm proof and modal quantities included) and printing JSON. scipy: `python3 reference.py process`, i.e. interpreter start, `mmread` of both files, `eigsh(K, k, M, sigma=0)` or `eigh(K, M)` with vectors, JSON out. Wall time of each whole process, alternating ours and scipy's, median of the pairs; peak is the largest resident set of the process tree (GNU time).",
        '',
        ...(baselineRoot
          ? [
              `Baseline: the same command line from \`${baselineRoot}\`, run right after ours in each pair.`,
              '',
            ]
          : []),
        `| problem | DOF | modes | ours, median s | ${baselineRoot ? 'baseline, median s | ' : ''}scipy, median s | ratio | ${baselineRoot ? 'baseline ratio | ' : ''}max rel. λ diff | our peak MB | scipy peak MB |`,
        `|---|---|---|---|---|---|---|---|---|${baselineRoot ? '---|---|' : ''}`,
        ...userRows,
        '',
        ...userDetails,
        '',
      ]),
  ...(usersOnly || tableOnly
    ? []
    : [
        '## Kernels inside one process',
        '',
        'Every solve returns the mode shapes as well as the eigenvalues, ours and the references alike (eigsh with vectors, eigh(K, M) with its default driver). Times are the solve only, not building or reading the matrices: the kernel (`lanczos` or `denseEigensolver`) and `solveModes` (the kernel plus the checks, the Sturm proof and the modal quantities).',
        '',
        `Threads: the dense solves run on ${cpus().length} thread${cpus().length === 1 ? '' : 's'} (the caller and a DenseTeam of worker threads, as in the evaluation workers), scipy's eigh on its BLAS's default threads; the sparse solves and ml-matrix are single-threaded, as is scipy's eigsh apart from its BLAS calls.`,
        '',
        '| problem | DOF | nonzeros of K | ours kernel, median s | ours solveModes, median s | reference, median s | ratio (kernel) | max rel. λ diff | Sturm | our peak MB |',
        '|---|---|---|---|---|---|---|---|---|---|',
        ...rows,
        '',
        ...details,
        '',
      ]),
  ...sheetLines,
  ...queueLines,
].join('\n');
writeFileSync(join(outDir, sheetsOnly ? 'sheets.md' : queueOnly ? 'queue.md' : 'bench.md'), table);
console.log('\n' + table);

function userRow(name: string, n: number, kind: 'sparse' | 'dense', u: UsersPathResult): string {
  const ours = median(u.ours.times);
  const ref = u.scipy ? median(u.scipy.times) : NaN;
  const diff =
    u.scipy && u.scipy.lambdas.length > 0
      ? maxRelDiff(u.ours.lambdas, u.scipy.lambdas.slice(0, u.ours.lambdas.length))
      : null;
  const modes = kind === 'dense' ? `all ${n}` : String(u.ours.lambdas.length);
  const base = u.baseline ? median(u.baseline.times) : NaN;
  const b1 = u.baseline ? `${fmt(base)} | ` : '';
  const b2 = u.baseline ? `${fmt(base / ref)} | ` : '';
  return `| ${name} | ${n} | ${modes} | ${fmt(ours)} | ${b1}${fmt(ref)} | ${fmt(ours / ref)} | ${b2}${sci(diff)} | ${fmt(Math.max(...u.ours.peakMB), 0)} | ${u.scipy ? fmt(Math.max(...u.scipy.peakMB), 0) : '—'} |`;
}
