// Sheets through the worker, timed as the editor's users run them: the sheet's text and its
// uploaded Matrix Market files go through the evaluation queue on Redis to a worker process (the
// entry of `npm run worker`, started here under a queue prefix of its own) and this process waits
// for the results as an API process does (createJobQueue). The time is from adding the job to
// having its results. Beside it, in the same run and alternating with it, scipy's whole process on
// the same K and M (mmread + eigsh(σ = 0) for the same number of modes).
//
// Generated models are written out for scipy with the generators the sheet functions call
// (core/models), with the same inputs in SI units, so both solve the same matrices; uploaded ones
// are the bench's own problem files (./problems.ts, written by ./case.ts).
import type { ChildProcess } from 'node:child_process';
import { readFileSync, writeFileSync } from 'node:fs';
import { basename, join } from 'node:path';
import { loadQueueConfig } from '../../api/config/index';
import { createLogger } from '../../api/http/logger';
import { createJobQueue, type JobQueue } from '../../api/workers/job-queue';
import {
  buildPlaneFrame,
  eulerBernoulliBeam,
  toSparse,
  type Sheet,
  type SheetResults,
  type SheetUpload,
  type SymmetricMatrix,
} from '../../core/index';
import { writeMatrixMarket } from './matrix-market';
import { startWorker } from './queue';
import { spawnCase } from './spawn-case';
import { scipyProcessArgv, timed } from './users-path';

const MODES = 10;

interface Prepared {
  sheet: Sheet;
  uploads: SheetUpload[];
  kPath: string;
  mPath: string;
  n: number;
}

interface SheetCase {
  name: string;
  /** What the sheet holds, for the table. */
  what: string;
  /** Only with --large: minutes, not seconds. */
  large?: boolean;
  /**
   * Evaluated in the background (the editor's long solves: not bound to a request, with the
   * solve time limit) rather than as a request's evaluation (the interactive limit).
   */
  background: boolean;
  prepare(outDir: string): Promise<Prepared>;
}

async function writePair(
  outDir: string,
  name: string,
  K: SymmetricMatrix,
  M: SymmetricMatrix,
): Promise<{ kPath: string; mPath: string; n: number }> {
  const kPath = join(outDir, `sheet-${name}.K.mtx`);
  const mPath = join(outDir, `sheet-${name}.M.mtx`);
  const Ks = toSparse(K);
  await writeMatrixMarket(kPath, Ks, `Modewright sheet bench ${name}: stiffness`);
  await writeMatrixMarket(mPath, toSparse(M), `Modewright sheet bench ${name}: mass`);
  return { kPath, mPath, n: Ks.n };
}

const modesBlock = (stiffness: string, mass: string, name: string) => ({
  id: 'modes',
  kind: 'modes' as const,
  source: `stiffness: ${stiffness}\nmass: ${mass}\ncount: ${MODES}\nname: ${name}`,
});

/** A clamped–free steel deck of `elements` beam elements (2 DOFs per node). */
function beamCase(elements: number): SheetCase {
  return {
    name: `beam-${elements}`,
    what: `generated: beam(), ${elements} elements`,
    background: false,
    prepare: async (outDir) => {
      const beam = eulerBernoulliBeam({
        E: 210e9,
        I: 0.02,
        massPerLength: 1500,
        length: 120,
        elements,
        left: 'clamped',
        right: 'free',
      });
      const files = await writePair(outDir, `beam-${elements}`, beam.K, beam.M);
      return {
        ...files,
        uploads: [],
        sheet: {
          blocks: [
            {
              id: 'gen',
              kind: 'calc',
              source: `deck = beam({E: 210 GPa, I: 0.02 m^4, mass: 1.5 t/m, length: 120 m, elements: ${elements}, ends: "clamped-free"})`,
            },
            modesBlock('deck.K', 'deck.M', 'deck_v'),
          ],
        } as unknown as Sheet,
      };
    },
  };
}

/**
 * A plane frame of `bays` 6 m bays and `storeys` 3.5 m storeys, its nodes and members written out
 * in the sheet as a user pastes them (3 DOFs per free node, the foot fixed).
 */
function planeFrameCase(bays: number, storeys: number): SheetCase {
  const name = `plane-frame-${bays}x${storeys}`;
  return {
    name,
    what: `generated: plane_frame(), ${bays} bays × ${storeys} storeys, nodes and members in the text`,
    background: false,
    prepare: async (outDir) => {
      const columns = bays + 1;
      const node = (i: number, s: number) => s * columns + i;
      const nodes: { x: number; y: number }[] = [];
      for (let s = 0; s <= storeys; s++) {
        for (let i = 0; i < columns; i++) nodes.push({ x: 6 * i, y: 3.5 * s });
      }
      const pairs: [number, number][] = [];
      for (let s = 0; s < storeys; s++) {
        for (let i = 0; i < columns; i++) pairs.push([node(i, s), node(i, s + 1)]);
        for (let i = 0; i < bays; i++) pairs.push([node(i, s + 1), node(i + 1, s + 1)]);
      }
      const frame = buildPlaneFrame({
        nodes,
        members: pairs.map(([from, to]) => ({
          from,
          to,
          E: 210e9,
          A: 0.01,
          I: 2e-4,
          massPerLength: 80,
        })),
        supports: Array.from({ length: columns }, (_, i) => ({
          node: i,
          ux: true,
          uy: true,
          rz: true,
        })),
      });
      const files = await writePair(outDir, name, frame.K, frame.M);
      const xy = nodes.map((p) => `${p.x}, ${p.y}`).join('; ');
      const bars = pairs.map(([a, b]) => `${a + 1}, ${b + 1}`).join('; ');
      const foot = Array.from({ length: columns }, (_, i) => i + 1).join(', ');
      return {
        ...files,
        uploads: [],
        sheet: {
          blocks: [
            {
              id: 'gen',
              kind: 'calc',
              source: [
                `xy = [${xy}] * 1 m`,
                `bars = [${bars}]`,
                `frame = plane_frame({nodes: xy, members: bars, E: 210 GPa, A: 0.01 m^2, I: 2e-4 m^4, mass: 80 kg/m, fixed: [${foot}]})`,
              ].join('\n'),
            },
            modesBlock('frame.K', 'frame.M', 'sway'),
          ],
        } as unknown as Sheet,
      };
    },
  };
}

/** One of the bench's problems (./problems.ts) uploaded as its two Matrix Market files. */
function uploadCase(problem: string, what: string, large = false): SheetCase {
  return {
    name: `upload-${problem}`,
    what: `uploaded: ${what}`,
    background: true,
    ...(large ? { large } : {}),
    prepare: async (outDir) => {
      const child = spawnCase(problem, 0, outDir);
      if (child.status !== 0) throw new Error(`writing ${problem} failed: ${child.stderr}`);
      const files = JSON.parse(child.stdout.trim().split('\n').pop()!) as {
        n: number;
        kPath: string;
        mPath: string;
      };
      const kName = basename(files.kPath);
      const mName = basename(files.mPath);
      return {
        ...files,
        uploads: [
          { name: kName, text: readFileSync(files.kPath, 'utf8') },
          { name: mName, text: readFileSync(files.mPath, 'utf8') },
        ],
        sheet: {
          blocks: [
            { id: 'k', kind: 'matrix', source: `name: K\nunit: N/m\nfrom: ${kName}` },
            { id: 'mm', kind: 'matrix', source: `name: M\nunit: kg\nfrom: ${mName}` },
            modesBlock('K', 'M', 'model'),
          ],
        } as unknown as Sheet,
      };
    },
  };
}

export const SHEET_CASES: SheetCase[] = [
  beamCase(500),
  beamCase(5000),
  planeFrameCase(20, 160),
  uploadCase('plate-100x50', 'plane-stress plate 100 × 50'),
  uploadCase('plate-224x112', 'plane-stress plate 224 × 112'),
  uploadCase('building-20x20x20', '3D steel frame 20 × 20 bays × 20 storeys', true),
];

/** The worker's peak resident memory since the last reset, MB (Linux /proc), and a reset. */
function peakRss(pid: number, reset: boolean): number {
  const status = readFileSync(`/proc/${pid}/status`, 'utf8');
  const kb = Number(/VmHWM:\s+(\d+)/.exec(status)?.[1] ?? NaN);
  // "5" resets the peak (VmHWM) to the present resident set (proc(5), clear_refs).
  if (reset) writeFileSync(`/proc/${pid}/clear_refs`, '5');
  return kb / 1024;
}

/** One evaluation through the queue: the time from adding the job to its results. */
async function evaluateThrough(
  jobs: JobQueue,
  c: SheetCase,
  p: Prepared,
  sheetId: number,
): Promise<{ seconds: number; results: SheetResults }> {
  const t0 = performance.now();
  let results: SheetResults;
  if (c.background) {
    const owner = { userId: 1, projectId: 1, sheetId };
    const id = await jobs.evaluations.start(p.sheet, p.uploads, owner);
    await jobs.evaluations.follow(id, {});
    const view = await jobs.evaluations.view(id);
    if (!view || view.state !== 'done') {
      throw new Error(
        view?.state === 'failed' ? `${view.error.code}: ${view.error.message}` : 'the job is gone',
      );
    }
    results = view.results;
  } else {
    results = await jobs.runner(p.sheet, p.uploads, {});
  }
  return { seconds: (performance.now() - t0) / 1000, results };
}

const median = (xs: number[]): number =>
  xs.length === 0 ? NaN : [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
const fmt = (x: number, d = 2): string => (Number.isFinite(x) ? x.toFixed(d) : '—');

function maxRelDiff(a: number[], b: number[]): number {
  let worst = 0;
  for (let i = 0; i < Math.min(a.length, b.length); i++) {
    worst = Math.max(worst, Math.abs(a[i]! - b[i]!) / Math.abs(b[i]!));
  }
  return worst;
}

/**
 * Runs the sheets bench and answers its Markdown section: each case `runs` times through the
 * worker and as often through scipy, alternating; `large` adds the cases that take minutes and
 * `only` picks cases by name.
 */
export async function benchSheets(
  runs: number,
  options: { outDir: string; scipy: boolean; large: boolean; only: string[] | null },
): Promise<string[]> {
  const cases = SHEET_CASES.filter((c) =>
    options.only ? options.only.includes(c.name) : options.large || !c.large,
  );
  const prefix = `mw:bench-sheets-${process.pid}-${Date.now()}`;
  const worker: ChildProcess = await startWorker({ MW_QUEUE_PREFIX: prefix });
  const config = { ...loadQueueConfig('modewright_bench'), prefix };
  const jobs = createJobQueue(config, createLogger(false));
  const rows: string[] = [];
  const notes: string[] = [];
  try {
    // The worker's first job loads the engine into its evaluation thread: not part of any case.
    await jobs.runner(
      { blocks: [{ id: 'c', kind: 'calc', source: 'x = 1 m' }] } as unknown as Sheet,
      [],
      {},
    );
    for (const [index, c] of cases.entries()) {
      console.log(`… sheet ${c.name}: preparing`);
      const p = await c.prepare(options.outDir);
      const uploadMB = p.uploads.reduce((sum, u) => sum + u.text.length, 0) / 2 ** 20;
      const ours: number[] = [];
      const ref: number[] = [];
      const refPeak: number[] = [];
      let workerPeak = 0;
      let lambdas: number[] = [];
      let refLambdas: number[] = [];
      let error: string | null = null;
      let method = '';
      const runOurs = async (): Promise<void> => {
        peakRss(worker.pid!, true);
        const r = await evaluateThrough(jobs, c, p, index + 1);
        workerPeak = Math.max(workerPeak, peakRss(worker.pid!, false));
        if (r.results.errors.length > 0) {
          const e = r.results.errors[0]!;
          throw new Error(`${e.blockId}:${e.line} ${e.code} ${e.message}`);
        }
        const modes = r.results.blocks.find((b) => b.kind === 'modes');
        if (modes?.kind !== 'modes') throw new Error('no modes block in the results');
        lambdas = modes.modes.map((m) => m.lambda);
        method = modes.methodUsed ?? '';
        ours.push(r.seconds);
        console.log(`  through the worker ${fmt(r.seconds)} s; λ ${JSON.stringify(lambdas)}`);
      };
      const runScipy = (): void => {
        if (!options.scipy) return;
        const r = timed(scipyProcessArgv('sparse', p.kPath, p.mPath, MODES), process.env);
        if (r.status !== 0) throw new Error(`scipy: ${r.stderr.split('\n').slice(-3).join(' ')}`);
        ref.push(r.seconds);
        refPeak.push(r.peakMB);
        refLambdas = (JSON.parse(r.stdout) as { lambdas: number[] }).lambdas;
        console.log(`  scipy ${fmt(r.seconds)} s`);
      };
      try {
        // a case that takes minutes runs once
        for (let i = 0; i < (c.large ? 1 : runs); i++) {
          if (i % 2 === 0) {
            await runOurs();
            runScipy();
          } else {
            runScipy();
            await runOurs();
          }
        }
      } catch (e) {
        error = e instanceof Error ? e.message : String(e);
        console.log(`  failed: ${error}`);
      }
      const a = median(ours);
      const b = median(ref);
      const diff = lambdas.length && refLambdas.length ? maxRelDiff(lambdas, refLambdas) : NaN;
      rows.push(
        `| ${c.name} | ${c.what} | ${p.n} | ${MODES} | ${error && ours.length === 0 ? 'failed' : fmt(a)} | ${fmt(b)} | ${fmt(a / b)} | ${Number.isFinite(diff) ? diff.toExponential(1) : '—'} | ${fmt(workerPeak, 0)} | ${fmt(Math.max(...refPeak), 0)} |`,
      );
      console.log(rows.at(-1));
      const d: string[] = [];
      if (ours.length > 0) d.push(`through the worker ${ours.map((t) => fmt(t)).join(', ')} s`);
      if (ref.length > 0) d.push(`scipy ${ref.map((t) => fmt(t)).join(', ')} s`);
      if (uploadMB > 0) d.push(`uploads ${fmt(uploadMB, 1)} MB of text`);
      if (method) d.push(`method ${method}`);
      d.push(c.background ? 'background evaluation' : "a request's evaluation");
      if (error) d.push(`failed: ${error}`);
      notes.push(`- **${c.name}**: ${d.join('; ')}.`);
    }
  } finally {
    await jobs.queue.obliterate({ force: true }).catch(() => {});
    await jobs.close();
    worker.kill('SIGTERM');
  }
  return [
    '## Sheets through the worker',
    '',
    `One worker process (\`api/workers/job-worker.ts\`, as \`npm run worker\` runs it, with its default limits; given one small sheet before the first case, which loads the engine) on Redis ${config.redisUrl}; this process adds each sheet with its uploads as a job and waits for the results as an API process does (createJobQueue): a request's evaluation for the generated models, a background evaluation (the long-solve path) for the uploaded ones. Wall time from adding the job to having its results, against scipy's whole process (mmread + eigsh(K, ${MODES}, M, sigma=0)) on the same K and M, alternating, median of the runs (one run for the cases of --large). Worker peak is the largest resident set of the worker process during the evaluations (VmHWM, reset before each).`,
    '',
    '| sheet | model | DOF | modes | through the worker, median s | scipy, median s | ratio | max rel. λ diff | worker peak MB | scipy peak MB |',
    '|---|---|---|---|---|---|---|---|---|---|',
    ...rows,
    '',
    ...notes,
    '',
  ];
}
