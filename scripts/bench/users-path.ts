// The users' path, timed as a user runs it: our command line as a whole process (read the Matrix
// Market files → solveModes → JSON) against scipy as a whole process (mmread + eigsh(σ = 0) for
// the lowest modes, eigh for every mode), on the same files, alternating the two and taking the
// median. Peak memory is the resident set GNU time reports for each process tree.
import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { delimiter, join, resolve } from 'node:path';

/** One side's runs: wall seconds, peak MB, and the eigenvalues of the last run. */
export interface ProcessRuns {
  times: number[];
  peakMB: number[];
  lambdas: number[];
  /** Warning codes our command line printed (empty for scipy). */
  warnings: string[];
  error: string | null;
}

export interface UsersPathResult {
  ours: ProcessRuns;
  scipy: ProcessRuns | null;
  /** The same command line from another checkout (--baseline), timed in the same alternation. */
  baseline: ProcessRuns | null;
}

const TIME = '/usr/bin/time';
const hasTime = existsSync(TIME);

/** The command `npm run solve` runs (from package.json, so a change of it is what is timed). */
function solveCommand(root: string): string {
  const pkg = JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')) as {
    scripts: Record<string, string>;
  };
  const cmd = pkg.scripts.solve;
  if (!cmd) throw new Error('package.json has no "solve" script');
  return cmd;
}

/** Runs one whole process under GNU time: wall seconds, peak resident MB, its output. */
export function timed(
  argv: string[],
  env: NodeJS.ProcessEnv,
): { seconds: number; peakMB: number; stdout: string; stderr: string; status: number | null } {
  const memFile = join(tmpdir(), `mw-bench-${process.pid}.time`);
  const full = hasTime ? [TIME, '-f', '%M', '-o', memFile, ...argv] : argv;
  const t0 = performance.now();
  const r = spawnSync(full[0]!, full.slice(1), { encoding: 'utf8', maxBuffer: 1 << 30, env });
  const seconds = (performance.now() - t0) / 1000;
  let peakMB = NaN;
  if (hasTime && existsSync(memFile)) {
    const kb = Number(readFileSync(memFile, 'utf8').trim().split('\n').pop());
    peakMB = kb / 1024;
    rmSync(memFile, { force: true });
  }
  return { seconds, peakMB, stdout: r.stdout, stderr: r.stderr, status: r.status };
}

function emptyRuns(): ProcessRuns {
  return { times: [], peakMB: [], lambdas: [], warnings: [], error: null };
}

/** scipy's whole process on two Matrix Market files (./reference.py `process`). */
export function scipyProcessArgv(
  kind: 'sparse' | 'dense',
  kPath: string,
  mPath: string,
  modes: number,
): string[] {
  return [
    'python3',
    join('scripts', 'bench', 'reference.py'),
    'process',
    kind,
    kPath,
    mPath,
    String(modes),
  ];
}

/**
 * Runs both whole processes `runs` times, alternating which goes first, and returns every time.
 * `modes` is the count asked of both (sparse); dense problems ask for every mode.
 */
export function benchUsersPath(
  kind: 'sparse' | 'dense',
  kPath: string,
  mPath: string,
  modes: number,
  runs: number,
  withScipy: boolean,
  baselineRoot: string | null = null,
): UsersPathResult {
  const cli = (root: string): { argv: string[]; env: NodeJS.ProcessEnv } => ({
    argv: [
      'sh',
      '-c',
      `cd "$0" && ${solveCommand(root)} "$@"`,
      resolve(root),
      '--stiffness',
      resolve(kPath),
      '--mass',
      resolve(mPath),
      '--json',
      ...(kind === 'dense' ? ['--method', 'dense'] : ['--count', String(modes)]),
    ],
    env: {
      ...process.env,
      PATH: `${resolve(root, 'node_modules', '.bin')}${delimiter}${process.env.PATH ?? ''}`,
    },
  });
  const env = process.env;
  const refArgv = scipyProcessArgv(kind, kPath, mPath, modes);
  const ours = emptyRuns();
  const scipy = withScipy ? emptyRuns() : null;
  const baseline = baselineRoot ? emptyRuns() : null;
  const runCli = (root: string, into: ProcessRuns): void => {
    const { argv, env: cliEnv } = cli(root);
    const r = timed(argv, cliEnv);
    if (r.status !== 0) {
      into.error = r.stderr.split('\n').slice(0, 4).join(' ');
      return;
    }
    const out = JSON.parse(r.stdout) as {
      modes: { lambda: number }[];
      warnings: { code: string }[];
    };
    into.times.push(r.seconds);
    into.peakMB.push(r.peakMB);
    into.lambdas = out.modes.map((m) => m.lambda);
    into.warnings = out.warnings.map((w) => w.code);
  };
  const runOurs = (): void => {
    runCli('.', ours);
    if (baselineRoot && baseline) runCli(baselineRoot, baseline);
  };
  const runScipy = (): void => {
    if (!scipy) return;
    const r = timed(refArgv, env);
    if (r.status !== 0) {
      scipy.error = r.stderr.split('\n').slice(-3).join(' ');
      return;
    }
    scipy.times.push(r.seconds);
    scipy.peakMB.push(r.peakMB);
    scipy.lambdas = (JSON.parse(r.stdout) as { lambdas: number[] }).lambdas;
  };
  for (let i = 0; i < runs; i++) {
    if (i % 2 === 0) {
      runOurs();
      runScipy();
    } else {
      runScipy();
      runOurs();
    }
    if (ours.error || scipy?.error || baseline?.error) break;
  }
  return { ours, scipy, baseline };
}
