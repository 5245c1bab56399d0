// Sheets at model scale: where time and memory go when a sheet holds a large model. Each case is
// evaluated in its own Node process with the evaluation worker's heap (MW_EVAL_MEMORY_MB, default
// 512) and the solve budget the workers pass (60 % of it), and reports the wall time of
// evaluateSheet, the peak resident set, the heap in use with the results still held, and the size
// of the results as JSON (what is stored and sent to the browser). Not part of `npm test`.
//
//   npx tsx scripts/sheet-scale.ts [--only beam,frame,upload]
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import {
  evaluateSheet,
  storeyChain,
  writeMatrixMarket,
  type Sheet,
  type SheetUpload,
} from '../core/index';

const MEMORY_MB = Number(process.env.MW_EVAL_MEMORY_MB ?? 512);

interface Case {
  sheet: Sheet;
  uploads: SheetUpload[];
}

/** A 10 000-element clamped–free beam (20 000 DOFs). */
function beamCase(): Case {
  return {
    uploads: [],
    sheet: {
      blocks: [
        {
          id: 'gen',
          kind: 'calc',
          source:
            'deck = beam({E: 210 GPa, I: 0.02 m^4, mass: 1.5 t/m, length: 120 m, elements: 10000, ends: "clamped-free"})',
        },
        {
          id: 'm',
          kind: 'modes',
          source: 'stiffness: deck.K\nmass: deck.M\ncount: 5\nname: deck_v',
        },
      ],
    },
  };
}

/** A 5 000-member plane-frame column fixed at its foot (15 000 DOFs). */
function frameCase(): Case {
  return {
    uploads: [],
    sheet: {
      blocks: [
        {
          id: 'gen',
          kind: 'calc',
          source: [
            'n_m = 5000',
            'y = (reshape(cumsum(ones(n_m + 1)), [n_m + 1, 1]) - 1) * (60 m / n_m)',
            'xy = concat(0 * y, y, 2)',
            'a = reshape(cumsum(ones(n_m)), [n_m, 1])',
            'ends = concat(a, a + 1, 2)',
            'mast = plane_frame({nodes: xy, members: ends, E: 210 GPa, A: 0.01 m^2, I: 2e-4 m^4, mass: 80 kg/m, fixed: [1]})',
          ].join('\n'),
        },
        { id: 'm', kind: 'modes', source: 'stiffness: mast.K\nmass: mast.M\ncount: 5\nname: sway' },
      ],
    },
  };
}

/** An uploaded 100 000-DOF model (a spring–mass chain as Matrix Market files). */
function uploadCase(): Case {
  const n = 100_000;
  const chain = storeyChain({
    masses: new Array<number>(n).fill(2),
    stiffnesses: new Array<number>(n).fill(5000),
  });
  return {
    uploads: [
      { name: 'K.mtx', text: writeMatrixMarket(chain.K) },
      { name: 'M.mtx', text: writeMatrixMarket(chain.M) },
    ],
    sheet: {
      blocks: [
        { id: 'k', kind: 'matrix', source: 'name: K\nunit: kN/m\nfrom: K.mtx' },
        { id: 'mm', kind: 'matrix', source: 'name: M\nunit: t\nfrom: M.mtx' },
        { id: 'm', kind: 'modes', source: 'stiffness: K\nmass: M\ncount: 5\nname: chain' },
      ],
    },
  };
}

/** The beam with `elements` elements (the largest that fit before sheets held models sparse). */
function smallBeamCase(elements: number): () => Case {
  return () => {
    const c = beamCase();
    c.sheet.blocks[0]!.source = c.sheet.blocks[0]!.source.replace('10000', String(elements));
    return c;
  };
}

const CASES: Record<string, () => Case> = {
  beam: beamCase,
  frame: frameCase,
  upload: uploadCase,
  beam250: smallBeamCase(250),
  beam1000: smallBeamCase(1000),
};

function runChild(name: string): void {
  const c = CASES[name]!();
  const heapBefore = process.memoryUsage().heapUsed;
  const t0 = performance.now();
  const results = evaluateSheet(c.sheet, {
    uploads: c.uploads,
    memoryLimitBytes: 0.6 * MEMORY_MB * 2 ** 20,
  });
  const ms = performance.now() - t0;
  const heapAfter = process.memoryUsage().heapUsed;
  const modes = results.blocks.find((b) => b.kind === 'modes');
  const json = JSON.stringify(results);
  process.stdout.write(
    JSON.stringify({
      seconds: ms / 1000,
      heapMB: (heapAfter - heapBefore) / 2 ** 20,
      peakRssMB: process.resourceUsage().maxRSS / 1024,
      resultsMB: json.length / 2 ** 20,
      f1: modes?.kind === 'modes' ? (modes.modes[0]?.frequency ?? null) : null,
      errors: results.errors.map(
        (e) => `${e.blockId}:${e.line} ${e.code} ${e.message.slice(0, 160)}`,
      ),
    }) + '\n',
  );
}

function runAll(only: string[]): void {
  const self = fileURLToPath(import.meta.url);
  console.log(`heap limit ${MEMORY_MB} MB per case (as an evaluation worker)`);
  console.log('case     seconds  peak RSS MB  heap held MB  results MB  f1 Hz       errors');
  for (const name of only) {
    const r = spawnSync(
      process.execPath,
      [`--max-old-space-size=${MEMORY_MB}`, '--import', 'tsx', self, '--child', name],
      { encoding: 'utf8', maxBuffer: 1 << 28 },
    );
    const line = r.stdout.trim().split('\n').pop() ?? '';
    if (r.status !== 0 || !line.startsWith('{')) {
      const why = /heap out of memory|Allocation failed/i.test(r.stderr)
        ? 'ran out of heap'
        : r.stderr.trim().split('\n').slice(-3).join(' | ');
      console.log(`${name.padEnd(8)} failed: ${why}`);
      continue;
    }
    const o = JSON.parse(line) as {
      seconds: number;
      heapMB: number;
      peakRssMB: number;
      resultsMB: number;
      f1: number | null;
      errors: string[];
    };
    console.log(
      `${name.padEnd(8)} ${o.seconds.toFixed(2).padStart(7)}  ${o.peakRssMB.toFixed(0).padStart(11)}  ${o.heapMB.toFixed(1).padStart(12)}  ${o.resultsMB.toFixed(2).padStart(10)}  ${String(o.f1?.toPrecision(8) ?? '—').padEnd(10)}  ${o.errors.join('; ') || '—'}`,
    );
  }
}

const args = process.argv.slice(2);
const child = args.indexOf('--child');
if (child >= 0) runChild(args[child + 1]!);
else {
  const onlyAt = args.indexOf('--only');
  runAll(onlyAt >= 0 ? args[onlyAt + 1]!.split(',') : Object.keys(CASES));
}
