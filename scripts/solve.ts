/**
 * Command line for the eigen engine:
 *
 *   npm run --silent solve -- --stiffness K.mtx --mass M.mtx [--count N]
 *     [--method auto|inverse|forward|shifted|dense|subspace|lanczos] [--shift-hz F]
 *     [--tolerance T] [--max-iterations I] [--seed S] [--json]
 *     [--spectrum S.csv --damping 0.05 --combine srss|cqc [--influence r.mtx]]
 *
 * With --spectrum, a response-spectrum analysis of the modes found (core/response): S.csv has an
 * optional header row, then period (s), pseudo-acceleration (m/s²), linear in period; the
 * influence vector defaults to ones. The JSON gains `response` in SI (N, m).
 *
 * Files are Matrix Market (.mtx) or CSV (dense rows, or `i,j,value` triplets). Prints a table, or
 * with --json one object (`threads`: the threads the dense method shared its heavy steps with,
 * one per core up to its parts). Errors go to stderr with exit code 1 (2 for a wrong command line).
 */
import { readFileSync, statSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { basename } from 'node:path';
import { parseArgs } from 'node:util';
import v8 from 'node:v8';
import { createDenseTeam, type ThreadTeam } from '../api/workers/dense-team';
import { engineThread } from '../api/workers/engine-thread';
import type { ReadMatrixReply, ReadMatrixRequest } from '../api/workers/read-matrix.worker';
import {
  DENSE_PARTS,
  matrixSize,
  SPLIT_MIN,
  EngineError,
  isEngineError,
  parseMatrixMarket,
  readSpectrumTable,
  readSymmetricMatrix,
  solveModes,
  spectrumAnalysis,
  tableSpectrum,
} from '../core/engine';
import type {
  EngineErrorCode,
  MethodName,
  ModalResult,
  SolveOptions,
  SymmetricMatrix,
} from '../core/engine';

const USAGE =
  'usage: solve --stiffness K.mtx --mass M.mtx [--count N] [--method auto|inverse|forward|shifted|dense|subspace|lanczos] [--shift-hz F] [--tolerance T] [--max-iterations I] [--seed S] [--json] [--spectrum S.csv --damping 0.05 --combine srss|cqc [--influence r.mtx]]';

class UsageError extends Error {}

function numberArg(value: string | undefined, flag: string, integer: boolean): number | undefined {
  if (value === undefined) return undefined;
  const v = Number(value);
  if (value.trim() === '' || !Number.isFinite(v) || (integer && !Number.isInteger(v))) {
    throw new UsageError(
      `--${flag} needs ${integer ? 'a whole number' : 'a number'}, got '${value}'.`,
    );
  }
  return v;
}

function readText(path: string, what: string): string {
  try {
    return readFileSync(path, 'utf8');
  } catch (e) {
    throw new UsageError(`cannot read the ${what} file '${path}': ${(e as Error).message}`);
  }
}

function readMatrix(path: string, what: string): SymmetricMatrix {
  const text = readText(path, what);
  return readSymmetricMatrix(text, {
    name: basename(path),
    format: /\.csv$/i.test(path) ? 'csv' : 'auto',
  });
}

/** Files from this size on are read in a thread beside the caller's own reading. */
const THREAD_READ_BYTES = 4 * 1024 * 1024;

/**
 * Reads a matrix file in a thread of its own (api/workers/read-matrix.worker.ts) when it is
 * large, so that it is parsed while this thread parses the other; otherwise here, when awaited.
 * Errors are the same as `readMatrix`'s.
 */
function readMatrixBeside(path: string, what: string): () => Promise<SymmetricMatrix> {
  let size = 0;
  try {
    size = statSync(path).size;
  } catch {
    // unreadable: readMatrix says so, in its words
  }
  if (size < THREAD_READ_BYTES) return async () => readMatrix(path, what);
  const request: ReadMatrixRequest = {
    path,
    name: basename(path),
    format: /\.csv$/i.test(path) ? 'csv' : 'auto',
  };
  const thread = engineThread('read-matrix', { workerData: request });
  // an error of the other file ends the command without waiting for this one
  thread.unref();
  const reply = new Promise<ReadMatrixReply>((resolve, reject) => {
    thread.once('message', resolve);
    thread.once('error', reject);
  });
  return async () => {
    const r = await reply;
    if (r.ok) return r.matrix;
    if (r.kind === 'file')
      throw new UsageError(`cannot read the ${what} file '${path}': ${r.message}`);
    if (r.kind === 'engine') throw new EngineError(r.code as EngineErrorCode, r.message, r.details);
    throw new Error(r.message);
  };
}

/** An influence vector from a Matrix Market or CSV file with one column (or one row). */
function readInfluence(path: string, n: number): Float64Array {
  const text = readText(path, 'influence');
  const p = /\.csv$/i.test(path)
    ? {
        values: Float64Array.from(
          text
            .split(/[\s,;]+/)
            .filter((x) => x !== '')
            .map(Number),
        ),
      }
    : (() => {
        const m = parseMatrixMarket(text, basename(path));
        if (Math.min(m.rows, m.cols) !== 1) {
          throw new UsageError(
            `--influence needs a vector (one column); '${path}' is ${m.rows}×${m.cols}.`,
          );
        }
        const v = new Float64Array(Math.max(m.rows, m.cols));
        m.values.forEach((x, k) => (v[Math.max(m.rowIdx[k]!, m.colIdx[k]!)] = x));
        return { values: v };
      })();
  if (p.values.length !== n || p.values.some((x) => !Number.isFinite(x))) {
    throw new UsageError(
      `--influence needs ${n} finite numbers, one per DOF; '${path}' has ${p.values.length}.`,
    );
  }
  return p.values;
}

interface ResponseFlags {
  spectrum: string;
  damping: number;
  combine: 'srss' | 'cqc';
  influence?: string;
}

function responseFlags(values: Record<string, string | boolean | undefined>): ResponseFlags | null {
  const spectrum = values.spectrum as string | undefined;
  const others = ['damping', 'combine', 'influence'].filter((k) => values[k] !== undefined);
  if (!spectrum) {
    if (others.length > 0) throw new UsageError(`--${others[0]} needs --spectrum.`);
    return null;
  }
  const damping = numberArg(values.damping as string | undefined, 'damping', false) ?? 0.05;
  if (!(damping >= 0 && damping < 1)) {
    throw new UsageError(`--damping is a ratio from 0 to below 1 (0.05 for 5 %), got ${damping}.`);
  }
  const combine = (values.combine as string | undefined) ?? 'cqc';
  if (combine !== 'srss' && combine !== 'cqc') {
    throw new UsageError(`--combine is srss or cqc, got '${combine}'.`);
  }
  return {
    spectrum,
    damping,
    combine,
    ...(values.influence ? { influence: values.influence as string } : {}),
  };
}

function runResponse(flags: ResponseFlags, r: ModalResult, M: ReturnType<typeof readMatrix>) {
  const table = readSpectrumTable(readText(flags.spectrum, 'spectrum'), basename(flags.spectrum));
  const influence = flags.influence
    ? readInfluence(flags.influence, r.n)
    : new Float64Array(r.n).fill(1);
  const modes = r.modes.filter((m) => m.omega > 0);
  const res = spectrumAnalysis({
    basis: { omega: modes.map((m) => m.omega), shapes: modes.map((m) => m.shape), M },
    influence,
    spectrum: tableSpectrum(table),
    damping: flags.damping,
    combination: flags.combine,
  });
  return {
    combination: res.combination,
    damping: flags.damping,
    modes: res.modes.map((m, i) => ({
      mode: modes[i]!.index,
      period: m.period,
      Sa: m.sa,
      gamma: m.gamma,
      effectiveMass: m.effectiveMass,
      baseShear: m.baseShear,
    })),
    baseShear: res.baseShear,
    displacement: res.displacement,
  };
}

function fmt(x: number, digits = 6): string {
  if (!Number.isFinite(x)) return x > 0 ? '∞' : String(x);
  if (x === 0) return '0';
  const a = Math.abs(x);
  return a >= 1e-3 && a < 1e7 ? x.toPrecision(digits) : x.toExponential(digits - 1);
}

/**
 * Threads for the dense method's heavy steps, one per core up to its parts, as the evaluation
 * workers have them (api/workers/dense-team.ts); started once K is read, while M is. Only for
 * `--method dense` on models large enough that its steps are cut into parts (2 · SPLIT_MIN DOFs):
 * below that, and under `auto` (dense only up to AUTO_DENSE_LIMIT = 400 DOFs), the solve takes
 * less time than a thread takes to start and warm up. Null when they cannot start: the solve then
 * runs on this thread alone, with the same result.
 */
function startTeam(method: string | undefined, n: number): Promise<ThreadTeam | null> | null {
  const helpers = Math.min(availableParallelism(), DENSE_PARTS) - 1;
  if (method !== 'dense' || n < 2 * SPLIT_MIN || helpers < 1) return null;
  // With every core solving, V8's background compiler waits for a free core while the solve runs
  // unoptimized code; compiling on the thread that needs the code is faster here (measured on the
  // 2-core development machine: a 1000-DOF plate 2.5 s to 1.8 s, a 2000-DOF one 6.5 s to 6.0 s;
  // single-threaded methods gain nothing, their compiles take the idle core).
  v8.setFlagsFromString('--no-concurrent-recompilation');
  return createDenseTeam(helpers).catch(() => null);
}

async function main(argv: string[]): Promise<number> {
  const { values } = parseArgs({
    args: argv,
    options: {
      stiffness: { type: 'string' },
      mass: { type: 'string' },
      count: { type: 'string' },
      method: { type: 'string' },
      'shift-hz': { type: 'string' },
      tolerance: { type: 'string' },
      'max-iterations': { type: 'string' },
      seed: { type: 'string' },
      json: { type: 'boolean', default: false },
      spectrum: { type: 'string' },
      damping: { type: 'string' },
      combine: { type: 'string' },
      influence: { type: 'string' },
      help: { type: 'boolean', default: false },
    },
    strict: true,
  });
  if (values.help) {
    process.stdout.write(`${USAGE}\n`);
    return 0;
  }
  if (!values.stiffness || !values.mass)
    throw new UsageError('both --stiffness and --mass are required.');
  const response = responseFlags(values);
  const started = performance.now();
  const mass = readMatrixBeside(values.mass, 'mass');
  const K = readMatrix(values.stiffness, 'stiffness');
  const starting = startTeam(values.method, matrixSize(K));
  const M = await mass();
  const options: SolveOptions = {};
  const count = numberArg(values.count, 'count', true);
  if (count !== undefined) options.count = count;
  if (values.method !== undefined) options.method = values.method as MethodName;
  const shiftHz = numberArg(values['shift-hz'], 'shift-hz', false);
  if (shiftHz !== undefined) options.shift = (2 * Math.PI * shiftHz) ** 2;
  const tol = numberArg(values.tolerance, 'tolerance', false);
  if (tol !== undefined) options.tolerance = tol;
  const maxIt = numberArg(values['max-iterations'], 'max-iterations', true);
  if (maxIt !== undefined) options.maxIterations = maxIt;
  const seed = numberArg(values.seed, 'seed', true);
  if (seed !== undefined) options.seed = seed;
  if (response) options.normalize = 'mass';
  const team = starting ? await starting : null;
  if (team) options.team = team;
  let r: ModalResult;
  try {
    r = solveModes(K, M, options);
  } finally {
    await team?.close();
  }
  const spectrumResult = response ? runResponse(response, r, M) : null;
  const seconds = (performance.now() - started) / 1000;
  if (values.json) {
    const out = {
      method: r.method,
      methodNote: r.methodNote,
      n: r.n,
      modes: r.modes.map((m) => ({
        index: m.index,
        lambda: m.lambda,
        omega: m.omega,
        frequencyHz: m.frequencyHz,
        periodS: Number.isFinite(m.periodS) ? m.periodS : null,
        residual: m.residual,
        iterations: m.iterations,
      })),
      orthogonality: r.orthogonality,
      rigidBodyModes: r.rigidBodyModes,
      closelySpaced: r.closelySpaced,
      sturm: r.sturm ?? null,
      criticalTimeStep: r.criticalTimeStep ?? null,
      conditioning: r.conditioning,
      options: r.options,
      warnings: r.warnings,
      ...(spectrumResult ? { response: spectrumResult } : {}),
      threads: team?.size ?? 1,
      seconds,
    };
    process.stdout.write(`${JSON.stringify(out, null, 2)}\n`);
    return 0;
  }
  const lines: string[] = [];
  lines.push(`${r.n} DOFs, method ${r.method}: ${r.methodNote}`);
  lines.push('');
  const head = [
    'mode',
    'λ (rad²/s²)',
    'ω (rad/s)',
    'f (Hz)',
    'T (s)',
    'backward error',
    'iterations',
  ];
  const rows = r.modes.map((m) => [
    String(m.index),
    fmt(m.lambda, 10),
    fmt(m.omega),
    fmt(m.frequencyHz),
    fmt(m.periodS),
    m.residual.toExponential(1),
    String(m.iterations),
  ]);
  const widths = head.map((h, c) =>
    Math.max(h.length, ...rows.map((row) => (row[c] as string).length)),
  );
  const line = (cells: string[]) => cells.map((s, c) => s.padStart(widths[c] as number)).join('  ');
  lines.push(line(head));
  lines.push(widths.map((w) => '─'.repeat(w)).join('  '));
  for (const row of rows) lines.push(line(row));
  lines.push('');
  lines.push(`max |ΦᵀMΦ − I| = ${r.orthogonality.toExponential(1)}`);
  if (r.sturm) {
    lines.push(
      `Sturm check at σ = ${fmt(r.sturm.shift)}: ${r.sturm.countBelow} below, ${r.sturm.found} found — ${r.sturm.ok ? 'consistent' : 'MISMATCH'}`,
    );
  }
  if (r.rigidBodyModes > 0) lines.push(`rigid-body modes: ${r.rigidBodyModes}`);
  if (r.criticalTimeStep)
    lines.push(`critical time step 2/ω_max = ${fmt(r.criticalTimeStep.dtCr)} s`);
  for (const w of r.warnings) lines.push(`warning (${w.code}): ${w.message}`);
  if (spectrumResult) {
    lines.push('');
    lines.push(
      `response spectrum (${spectrumResult.combination.toUpperCase()}, ζ = ${spectrumResult.damping}): base shear ${fmt(spectrumResult.baseShear)} N`,
    );
    for (const m of spectrumResult.modes) {
      lines.push(
        `  mode ${m.mode}: T ${fmt(m.period)} s, Sa ${fmt(m.Sa)} m/s², Γ ${fmt(m.gamma)}, M* ${fmt(m.effectiveMass)} kg, V ${fmt(m.baseShear)} N`,
      );
    }
    lines.push(
      `  peak displacement (m): ${spectrumResult.displacement.map((x) => fmt(x)).join(', ')}`,
    );
    lines.push("  Code checks remain the engineer's responsibility.");
  }
  lines.push(`${seconds.toFixed(2)} s`);
  process.stdout.write(`${lines.join('\n')}\n`);
  return 0;
}

try {
  process.exitCode = await main(process.argv.slice(2));
} catch (e) {
  if (
    e instanceof UsageError ||
    (e instanceof TypeError && 'code' in e && String(e.code).startsWith('ERR_PARSE_ARGS'))
  ) {
    process.stderr.write(`solve: ${e.message}\n${USAGE}\n`);
    process.exitCode = 2;
  } else if (isEngineError(e)) {
    process.stderr.write(`solve: ${e.code}: ${e.message}\n`);
    process.exitCode = 1;
  } else {
    process.stderr.write(`solve: unexpected error: ${(e as Error).stack ?? String(e)}\n`);
    process.exitCode = 1;
  }
}
