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
import { statSync, readFileSync, writeFileSync } from 'node:fs';
import { basename, join } from 'node:path';
import {
  buildPlaneFrame,
  eulerBernoulliBeam,
  toSparse,
  type SheetResults,
  type SymmetricMatrix,
} from '../../core/index';
import { ApiSession, startApiStack, type ApiStack } from './api-stack';
import { writeMatrixMarket } from './matrix-market';
import { spawnCase } from './spawn-case';
import { scipyProcessArgv, timed } from './users-path';

const MODES = 10;

/** A draft block as PUT /api/sheets/:id/draft takes it. */
interface DraftBlock {
  id: string;
  kind: string;
  source: string;
}

interface Prepared {
  blocks: DraftBlock[];
  /** Matrix Market files uploaded to the sheet before its draft is saved. */
  uploads: string[];
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
        blocks: [
          {
            id: 'gen',
            kind: 'calc',
            source: `deck = beam({E: 210 GPa, I: 0.02 m^4, mass: 1.5 t/m, length: 120 m, elements: ${elements}, ends: "clamped-free"})`,
          },
          modesBlock('deck.K', 'deck.M', 'deck_v'),
        ],
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
        uploads: [files.kPath, files.mPath],
        blocks: [
          { id: 'k', kind: 'matrix', source: `name: K\nunit: N/m\nfrom: ${kName}` },
          { id: 'mm', kind: 'matrix', source: `name: M\nunit: kg\nfrom: ${mName}` },
          modesBlock('K', 'M', 'model'),
        ],
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

const SETTINGS = { significantFigures: 4 };

/** The last event of a server-sent event stream: its name and its data, parsed. */
function lastEvent(text: string): { event: string; data: unknown } {
  const events = text
    .split(/\n\n+/)
    .map((chunk) => {
      let event = 'message';
      const data: string[] = [];
      for (const line of chunk.split('\n')) {
        if (line.startsWith('event:')) event = line.slice(6).trim();
        else if (line.startsWith('data:')) data.push(line.slice(5).trimStart());
      }
      return { event, data: data.join('\n') };
    })
    .filter((e) => e.data !== '');
  const last = events.at(-1);
  if (!last) throw new Error('the event stream ended with no event');
  return { event: last.event, data: JSON.parse(last.data) as unknown };
}

/** A sheet of the bench's project with the case's files uploaded; answers its id and version. */
async function createSheet(
  session: ApiSession,
  projectId: number,
  c: SheetCase,
  p: Prepared,
  limit: number,
): Promise<{ id: number; version: number }> {
  const created = await session.json<{ sheet: { id: number; draftVersion: number } }>(
    'POST',
    `/api/projects/${projectId}/sheets`,
    [201],
    { number: `BENCH-${c.name}`, title: `Bench ${c.name}` },
  );
  const id = created.body.sheet.id;
  for (const path of p.uploads) {
    const size = statSync(path).size;
    if (size > limit) {
      throw new Error(`${basename(path)} is ${size} bytes, over the upload limit of ${limit}`);
    }
    const form = new FormData();
    form.append('file', new Blob([readFileSync(path)]), basename(path));
    await session.text('POST', `/api/sheets/${id}/uploads`, [200, 201], form);
  }
  return { id, version: created.body.sheet.draftVersion };
}

/**
 * One timed evaluation as the editor asks for it, after saving the draft with a text block of
 * its own (`run`), so the results store has nothing for it and the worker solves.
 */
async function evaluateOnce(
  session: ApiSession,
  c: SheetCase,
  p: Prepared,
  sheet: { id: number; version: number },
  run: string,
): Promise<{ seconds: number; results: SheetResults }> {
  const draft = {
    blocks: [{ id: 'run', kind: 'text', source: `Bench run ${run}.` }, ...p.blocks],
    settings: SETTINGS,
  };
  const saved = await session.json<{ draftVersion: number }>(
    'PUT',
    `/api/sheets/${sheet.id}/draft`,
    [200],
    draft,
    { 'if-match': `"${sheet.version}"` },
  );
  sheet.version = saved.body.draftVersion;
  const t0 = performance.now();
  let results: SheetResults;
  if (c.background) {
    const start = await session.json<{ job: { id: string; state: string } }>(
      'POST',
      `/api/sheets/${sheet.id}/evaluations`,
      [200, 202],
      draft,
    );
    if (start.status !== 202) {
      throw new Error('answered from the results store: the draft did not change between runs');
    }
    const stream = await session.text(
      'GET',
      `/api/sheets/${sheet.id}/evaluations/${start.body.job.id}/events`,
      [200],
    );
    const last = lastEvent(stream.text);
    if (last.event !== 'result') {
      const e = (last.data as { error?: { code: string; message: string } }).error;
      throw new Error(e ? `${e.code}: ${e.message}` : `the stream ended with "${last.event}"`);
    }
    const job = last.data as { state: string; fromStore?: boolean; results: SheetResults };
    if (job.state !== 'done') throw new Error(`the job ended ${job.state}`);
    results = job.results;
  } else {
    const r = await session.json<{ results: SheetResults }>(
      'POST',
      `/api/sheets/${sheet.id}/evaluate`,
      [200],
      draft,
    );
    results = r.body.results;
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

/** The upload limit the bench's server gets: 64 MB, or more when a file of the bench is larger. */
function uploadLimitFor(prepared: Prepared[]): number {
  const largest = Math.max(0, ...prepared.flatMap((p) => p.uploads.map((f) => statSync(f).size)));
  return Math.max(64 * 2 ** 20, largest + 2 ** 20);
}

/**
 * Runs the sheets bench and answers its Markdown section: each case `runs` times through the
 * API and its worker and as often through scipy, alternating; `large` adds the cases that take
 * minutes and `only` picks cases by name.
 */
export async function benchSheets(
  runs: number,
  options: { outDir: string; scipy: boolean; large: boolean; only: string[] | null },
): Promise<string[]> {
  const cases = SHEET_CASES.filter((c) =>
    options.only ? options.only.includes(c.name) : options.large || !c.large,
  );
  if (cases.length === 0) return [];
  const prepared: Prepared[] = [];
  for (const c of cases) {
    console.log(`… sheet ${c.name}: preparing`);
    prepared.push(await c.prepare(options.outDir));
  }
  const limit = uploadLimitFor(prepared);
  const stack: ApiStack = await startApiStack(limit);
  const workerPid = stack.worker.pid!;
  const rows: string[] = [];
  const notes: string[] = [];
  const tag = `${process.pid}-${Date.now()}`;
  try {
    const session = new ApiSession(stack.baseUrl);
    await session.signIn(stack.email, stack.password);
    // The worker's first job loads the engine into its evaluation thread: not part of any case.
    const warm = await session.json<{ sheet: { id: number } }>(
      'POST',
      `/api/projects/${stack.projectId}/sheets`,
      [201],
      { number: 'BENCH-warm-up', title: 'Bench warm-up' },
    );
    await session.json('POST', `/api/sheets/${warm.body.sheet.id}/evaluate`, [200], {
      blocks: [{ id: 'c', kind: 'calc', source: 'x = 1 m' }],
      settings: SETTINGS,
    });
    for (const [index, c] of cases.entries()) {
      const p = prepared[index]!;
      const uploadMB = p.uploads.reduce((sum, f) => sum + statSync(f).size, 0) / 2 ** 20;
      const ours: number[] = [];
      const ref: number[] = [];
      const refPeak: number[] = [];
      let workerPeak = 0;
      let lambdas: number[] = [];
      let refLambdas: number[] = [];
      let error: string | null = null;
      let method = '';
      let uploadSeconds = NaN;
      try {
        const t0 = performance.now();
        const sheet = await createSheet(session, stack.projectId, c, p, limit);
        uploadSeconds = (performance.now() - t0) / 1000;
        let run = 0;
        const runOurs = async (): Promise<void> => {
          peakRss(workerPid, true);
          const r = await evaluateOnce(session, c, p, sheet, `${tag}-${++run}`);
          workerPeak = Math.max(workerPeak, peakRss(workerPid, false));
          if (r.results.errors.length > 0) {
            const e = r.results.errors[0]!;
            throw new Error(`${e.blockId}:${e.line} ${e.code} ${e.message}`);
          }
          const modes = r.results.blocks.find((b) => b.kind === 'modes');
          if (modes?.kind !== 'modes') throw new Error('no modes block in the results');
          lambdas = modes.modes.map((m) => m.lambda);
          method = modes.methodUsed ?? '';
          ours.push(r.seconds);
          console.log(`  through the API ${fmt(r.seconds)} s; λ ${JSON.stringify(lambdas)}`);
        };
        const runScipy = (): void => {
          if (!options.scipy) return;
          const r = timed(scipyProcessArgv('sparse', p.kPath, p.mPath, MODES), process.env);
          if (r.status !== 0) {
            throw new Error(`scipy: ${r.stderr.split('\n').slice(-3).join(' ')}`);
          }
          ref.push(r.seconds);
          refPeak.push(r.peakMB);
          refLambdas = (JSON.parse(r.stdout) as { lambdas: number[] }).lambdas;
          console.log(`  scipy ${fmt(r.seconds)} s`);
        };
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
      if (ours.length > 0) d.push(`through the API ${ours.map((t) => fmt(t)).join(', ')} s`);
      if (ref.length > 0) d.push(`scipy ${ref.map((t) => fmt(t)).join(', ')} s`);
      if (uploadMB > 0) {
        d.push(
          `uploads ${fmt(uploadMB, 1)} MB of text, sent and parsed in ${fmt(uploadSeconds)} s`,
        );
      }
      if (method) d.push(`method ${method}`);
      d.push(c.background ? 'background evaluation' : "a request's evaluation");
      if (error) d.push(`failed: ${error}`);
      notes.push(`- **${c.name}**: ${d.join('; ')}.`);
    }
  } finally {
    await stack.close();
  }
  return [
    '## Sheets through the API and a worker',
    '',
    `The compiled API server (\`dist/server/server.js\`, as \`npm start\` runs it, with no workers of its own) and one worker process (\`dist/server/job-worker.js\`, as \`npm run worker\` runs it, with its default limits) on the project's MariaDB (a database of the bench's own, \`modewright_bench\`, re-created and migrated each run) and Redis (a queue prefix of the bench's own); the server's upload limit (MW_UPLOAD_LIMIT_BYTES) is ${fmt(limit / 2 ** 20, 0)} MB, set to cover the largest file. A person signs in over HTTP, creates a sheet, uploads its Matrix Market files through the upload route (multipart, as the browser does; not timed) and saves the draft before each run. Each run adds a text block with its own number to the draft, so the results store cannot answer it and the worker really solves. Wall time from the request to having the results: \`POST /api/sheets/:id/evaluate\` for the generated models (a request's evaluation), \`POST /api/sheets/:id/evaluations\` followed through its server-sent events to the result for the uploaded ones (a background evaluation, the long-solve path; the worker reads the uploads from MariaDB). Against scipy's whole process (mmread + eigsh(K, ${MODES}, M, sigma=0)) on the same K and M, alternating, median of the runs (one run for the cases of --large). One small sheet is evaluated before the first case, which loads the engine into the worker. Worker peak is the largest resident set of the worker process during the evaluations (VmHWM, reset before each).`,
    '',
    '| sheet | model | DOF | modes | through the API, median s | scipy, median s | ratio | max rel. λ diff | worker peak MB | scipy peak MB |',
    '|---|---|---|---|---|---|---|---|---|---|',
    ...rows,
    '',
    ...notes,
    '',
  ];
}
