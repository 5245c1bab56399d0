/**
 * `modes` blocks: an eigen-solve K φ = λ M φ on matrices in scope, with `key: value` lines:
 *
 * ```
 * stiffness: frame.K        # an expression giving a square matrix with a stiffness unit
 * mass: frame.M             # … with a mass unit
 * method: auto              # auto | inverse | forward | shifted | subspace | lanczos | dense
 * count: 3
 * shift: 24.5 Hz            # a frequency (Hz, rpm or rad/s); λ = (2πf)²
 * tolerance: 1e-10
 * max iterations: 200
 * normalize: mass           # mass | max | dof 5
 * direction: frame.r        # an influence vector, or the name of one of the generator's (x)
 * name: floor               # the results are bound to this name (default "modes")
 * ```
 * Before solving, the unit of K divided by the unit of M must reduce to 1/s².
 */
import type { Matrix, Unit } from 'mathjs';
import { EngineError, NoConvergenceError } from '../../errors';
import { solveModes } from '../../eigen/solve-modes';
import { firstNonFinitePath, modesNotFiniteMessage } from '../not-finite';
import type {
  InfluenceVector,
  MethodName,
  ModalResult,
  ShapeNormalization,
  SolveOptions,
} from '../../eigen/types';
import { denseFromRows } from '../../linalg/sparse';
import type { SymmetricMatrix } from '../../linalg/types';
import { evaluateNode, nameFailure, parseExpression, report, type EvalContext } from '../context';
import { RESULT_MATRIX_LIMIT } from '../format';
import { ENGINE_MATRICES, MATRIX_DOFS } from '../generators';
import { LargeMatrix } from '../large-matrix';
import { labelledComponents, labelledDirections, labelledInfluence } from '../dof-labels';
import { MODAL_RESULTS } from '../modal-registry';
import { shapePreview } from '../shape-preview';
import type { ModeRow, ModesBlockResult, ModesWarning, SheetBlock, SheetLocation } from '../types';
import { checkBlockName, readKeyLines, reportDependency, type KeyLine } from './key-lines';

export const MODES_KEYS = [
  'stiffness',
  'mass',
  'method',
  'count',
  'shift',
  'tolerance',
  'max iterations',
  'normalize',
  'direction',
  'name',
] as const;
type ModesKey = (typeof MODES_KEYS)[number];

/** Shortest time between two progress reports of one solve (a newly converged mode is always sent). */
export const PROGRESS_INTERVAL_MS = 250;

const METHODS: MethodName[] = [
  'auto',
  'inverse',
  'forward',
  'shifted',
  'subspace',
  'lanczos',
  'dense',
];

interface SideMatrix {
  engine: SymmetricMatrix;
  /** A unit entry of the matrix (null when plain numbers). */
  unit: Unit | null;
  n: number;
  /** DOF labels when the matrix came from a model generator. */
  dofs: readonly string[] | null;
}

function fail(message: string, code: 'SHEET_PARSE' | 'SHEET_EVAL' = 'SHEET_EVAL'): never {
  throw new EngineError(code, message);
}

function unitText(u: Unit): string {
  return u.formatUnits().replace(/\s*\/\s*/g, '/');
}

/** Converts a mathjs matrix (of quantities or numbers) to the engine's form in SI units. */
function sideMatrix(ctx: EvalContext, v: unknown, role: 'K' | 'M', expr: string): SideMatrix {
  const { math } = ctx.sm;
  if (v instanceof LargeMatrix) {
    const dofs = v.dofs && v.dofs.length === v.n ? v.dofs : null;
    return { engine: v.engine, unit: v.unit ? math.unit(1, v.unit) : null, n: v.n, dofs };
  }
  if (!math.isMatrix(v)) {
    fail(`${role} must be a matrix; "${expr}" is not one.`);
  }
  const m = v as Matrix;
  const size = m.size();
  if (size.length !== 2 || size[0] !== size[1]) {
    fail(`${role} must be square; "${expr}" is ${size.join('×')}.`);
  }
  const n = size[0]!;
  const rows = m.toArray() as unknown[][];
  let unit: Unit | null = null;
  const data: number[][] = [];
  let plain = false;
  for (let i = 0; i < n; i++) {
    const row: number[] = [];
    for (let j = 0; j < n; j++) {
      const x = rows[i]![j];
      if (math.isUnit(x)) {
        const u = x as Unit;
        if (unit && !unit.equalBase(u)) {
          fail(
            `${role} mixes units (${unitText(unit)} and ${unitText(u)} at ${role}[${i + 1},${j + 1}]); a matrix carries one unit.`,
          );
        }
        if (!unit) unit = u;
        row.push(u.value);
      } else if (typeof x === 'number') {
        if (x !== 0) plain = true;
        row.push(x);
      } else {
        fail(`${role}[${i + 1},${j + 1}] is not a number.`);
      }
    }
    data.push(row);
  }
  if (unit && plain) {
    fail(`${role} has entries with a unit and entries without; give every entry the same unit.`);
  }
  const engine = ENGINE_MATRICES.get(m) ?? denseFromRows(data);
  const dofs = MATRIX_DOFS.get(m);
  return { engine, unit, n, dofs: dofs && dofs.length === n ? dofs : null };
}

/** The unit check: K/M must reduce to 1/s². Returns a warning for plain-number matrices. */
export function checkPencilUnits(ctx: EvalContext, K: SideMatrix, M: SideMatrix): string | null {
  const { math } = ctx.sm;
  if (!K.unit && !M.unit) {
    return 'K and M have no units: their entries are taken as consistent SI units (N/m and kg).';
  }
  if (!K.unit || !M.unit) {
    fail(
      `${K.unit ? 'M' : 'K'} has no unit but ${K.unit ? 'K' : 'M'} has one; give both matrices units (for example kN/m and t).`,
    );
  }
  const force = math.unit(1, 'N');
  if (M.unit.equalBase(force)) {
    fail(
      `M is in ${unitText(M.unit)}; a mass matrix must be in mass units — did you enter weights instead of masses? Divide by g = 9.81 m/s².`,
    );
  }
  const ratio = math.divide(
    math.unit(1, K.unit.formatUnits()),
    math.unit(1, M.unit.formatUnits()),
  ) as Unit | number;
  const ok = math.isUnit(ratio) && (ratio as Unit).equalBase(math.unit(1, 's^-2'));
  if (!ok) {
    fail(
      `K is in ${unitText(K.unit)} and M in ${unitText(M.unit)}: K/M must reduce to 1/s² (for example kN/m with t, or N/m with kg).`,
    );
  }
  return null;
}

function parseNormalize(v: string): ShapeNormalization {
  const t = v.trim().toLowerCase();
  if (t === 'mass' || t === 'max') return t;
  const m = /^dof\s+(\d+)$/.exec(t);
  if (m) return { dof: Number(m[1]) };
  return fail(`"normalize:" is mass, max or dof <number> (got "${v}").`, 'SHEET_PARSE');
}

function positiveInteger(v: string, key: string): number {
  const n = Number(v);
  if (!/^\d+$/.test(v.trim()) || !Number.isInteger(n) || n < 1) {
    fail(`"${key}:" must be a whole number of at least 1 (got "${v}").`, 'SHEET_PARSE');
  }
  return n;
}

function emptyResult(block: SheetBlock, blockIndex: number): ModesBlockResult {
  return {
    kind: 'modes',
    blockId: block.id,
    blockIndex,
    ok: false,
    name: null,
    method: null,
    methodUsed: null,
    size: null,
    modes: [],
    shapes: null,
    dofLabels: null,
    sturm: null,
    criticalTimeStep: null,
    warnings: [],
    histories: [],
    engine: null,
  };
}

/** The scope object bound under the block's name: vectors and matrices with units. */
function bindResults(ctx: EvalContext, r: ModalResult): Record<string, unknown> {
  const { math } = ctx.sm;
  const vec = (xs: number[], unit: string | null) =>
    math.matrix((unit ? xs.map((x) => math.unit(x, unit)) : xs) as number[]) as Matrix;
  const modes = r.modes;
  const phi =
    r.n * modes.length <= ctx.maxMatrixEntries
      ? math.matrix(Array.from({ length: r.n }, (_, i) => modes.map((m) => m.shape[i]!)))
      : null;
  const out: Record<string, unknown> = {
    lambda: vec(
      modes.map((m) => m.lambda),
      's^-2',
    ),
    omega: vec(
      modes.map((m) => m.omega),
      'rad/s',
    ),
    f: vec(
      modes.map((m) => m.frequencyHz),
      'Hz',
    ),
    T: vec(
      modes.map((m) => m.periodS),
      's',
    ),
    n: r.n,
    count: modes.length,
  };
  if (phi) out.phi = phi;
  const p = r.participation[0];
  if (p) {
    out.gamma = vec(p.gamma, null);
    out.meff = vec(p.effectiveMass, 'kg');
    out.ratio = vec(p.ratio, null);
    out.cumulative = vec(p.cumulative, null);
    out.total_mass = math.unit(p.totalMass, 'kg');
  }
  if (r.participation.length > 1) {
    const dirs: Record<string, unknown> = {};
    for (const d of r.participation) {
      dirs[d.name] = {
        gamma: vec(d.gamma, null),
        meff: vec(d.effectiveMass, 'kg'),
        ratio: vec(d.ratio, null),
        cumulative: vec(d.cumulative, null),
      };
    }
    out.directions = dirs;
  }
  if (r.sturm) out.sturm = { count: r.sturm.countBelow, found: r.sturm.found, ok: r.sturm.ok };
  if (r.criticalTimeStep) out.dt_cr = math.unit(r.criticalTimeStep.dtCr, 's');
  return out;
}

function mb(bytes: number): string {
  if (bytes < 2 ** 20) return `${Math.round(bytes / 2 ** 10)} kB`;
  return `${(bytes / 2 ** 20).toFixed(bytes < 10 * 2 ** 20 ? 1 : 0)} MB`;
}

/** The refusal of a solve above the memory limit, with the estimate, the limit and what to do. */
function memoryRefusal(e: EngineError, advice: string | undefined): string {
  const d = e.details ?? {};
  const n = typeof d.n === 'number' ? d.n : null;
  const method = typeof d.method === 'string' ? d.method : null;
  const estimate = typeof d.estimateBytes === 'number' ? mb(d.estimateBytes) : 'more';
  const limit = mb(d.limitBytes as number);
  const others =
    method === 'dense'
      ? 'lanczos or subspace, which find the lowest modes without n × n arrays'
      : method === 'lanczos'
        ? 'subspace, or fewer modes in "count:"'
        : 'lanczos, which needs the least memory for the lowest modes of a sparse model';
  return (
    `The model is too large for the memory this evaluation may use: ` +
    `${method ? `the ${method} solve` : 'the solve'}${n !== null ? ` of ${n} DOFs` : ''} needs ` +
    `about ${estimate}, more than the limit of ${limit}. Use fewer DOFs (a coarser mesh), a ` +
    `different method (${others}), or ${advice ?? 'ask for a larger memory limit'}.`
  );
}

type ModesKeys = Partial<Record<ModesKey, KeyLine>>;

/** What the keys give the solve: the pencil, the options and the influence directions. */
interface SolveSetup {
  K: SideMatrix;
  M: SideMatrix;
  options: SolveOptions;
  influence: InfluenceVector[];
  /** Why participation is empty, when it is. */
  participationReason: string | null;
  warnings: ModesWarning[];
}

/** One evaluation of a modes block: where its messages go and how its name is failed. */
interface ModesRun {
  ctx: EvalContext;
  block: SheetBlock;
  blockIndex: number;
  keys: ModesKeys;
  name: string;
  at: (line: number) => SheetLocation;
}

/** Step 1 is the name (checkBlockName); step 2: `stiffness:` and `mass:` must be given; false after reporting. */
function checkRequired(run: ModesRun): boolean {
  const { ctx, keys, at } = run;
  let ok = true;
  for (const req of ['stiffness', 'mass'] as const) {
    if (!keys[req]) {
      report(
        ctx,
        at(0),
        new EngineError(
          'SHEET_PARSE',
          `A modes block needs "${req}:" (for example "${req}: ${req === 'stiffness' ? 'K' : 'M'}").`,
        ),
      );
      ok = false;
    }
  }
  return ok;
}

/** The generator's result a `stiffness: name.K` came from, for its influence directions. */
function generatorBase(ctx: EvalContext, keys: ModesKeys): Record<string, unknown> | null {
  const baseName = /^([A-Za-z][A-Za-z0-9_]*)\.K$/.exec(keys.stiffness!.value)?.[1];
  if (!baseName) return null;
  const b = ctx.scope.get(baseName);
  return b && typeof b === 'object' && Object.getPrototypeOf(b) === Object.prototype
    ? (b as Record<string, unknown>)
    : null;
}

/** A name in a `direction:` line is a word (`x`), never evaluated, unless it names a value. */
const DIRECTION_WORD = /^[A-Za-z][A-Za-z0-9_]*$/;

/** The influence directions, and why participation is empty when there are none. */
interface Directions {
  influence: InfluenceVector[];
  /** Why Γ, effective mass and cumulative are empty; null when a direction is there. */
  reason: string | null;
}

function vectorOf(ctx: EvalContext, v: unknown): Float64Array | null {
  const { math } = ctx.sm;
  const arr = math.isMatrix(v) ? ((v as Matrix).toArray() as unknown[]).flat(2) : null;
  return arr && arr.every((x) => typeof x === 'number') ? Float64Array.from(arr as number[]) : null;
}

/** The directions of labelled DOFs (`dofs:` of the matrix blocks of K and M). */
function labelledDirectionsOf(labels: readonly string[], asked: string | null): Directions {
  const names = asked ? [asked] : labelledDirections(labels);
  const influence: InfluenceVector[] = [];
  for (const d of names) {
    const vector = labelledInfluence(labels, d);
    if (vector.some((x) => x !== 0)) influence.push({ name: d, vector });
  }
  if (influence.length > 0) return { influence, reason: null };
  const comps = labelledComponents(labels).join(', ');
  return {
    influence,
    reason: asked
      ? `direction ${asked} has no DOFs in this model (its DOF labels have the components ${comps}).`
      : `no direction given, and the DOF labels have no translation (ux, uy, uz) to take one from (their components are ${comps}).`,
  };
}

/**
 * The influence directions: `direction:` (a vector, or a direction name of the generator or of
 * the DOF labels) or, without it, every direction of the generator or of the labels.
 */
function readDirections(
  run: ModesRun,
  base: Record<string, unknown> | null,
  labels: readonly string[] | null,
  evalAt: (key: ModesKey) => unknown,
  n: number,
): Directions {
  const { ctx, keys } = run;
  const inf = base?.influence as Record<string, unknown> | undefined;
  const d = keys.direction?.value ?? null;
  if (d !== null && DIRECTION_WORD.test(d) && !ctx.scope.has(d)) {
    if (inf) {
      if (!(d in inf)) {
        fail(
          `"${d}" is not a direction of this model; its directions are ${Object.keys(inf).join(', ')}.`,
        );
      }
      return { influence: [{ name: d, vector: vectorOf(ctx, inf[d])! }], reason: null };
    }
    if (labels) return labelledDirectionsOf(labels, d);
    fail(
      `"${d}" is not a direction of this model: K and M have no DOF labels to build it from. ` +
        `Label the DOFs of K's matrix block (for example "dofs: per node ux uy uz rx ry rz"), or ` +
        `give "direction:" an influence vector with one entry per DOF (for example [1, 1, 1]).`,
    );
  }
  if (d !== null) {
    const vector = vectorOf(ctx, evalAt('direction'));
    if (!vector) {
      fail(
        `"direction:" must be an influence vector of plain numbers (for example [1, 1, 1]) or the name of one of the model's directions.`,
      );
    }
    if (vector.every((x) => x === 0)) {
      return {
        influence: [],
        reason: `direction ${d} is all zeros: no DOF moves with the ground.`,
      };
    }
    return { influence: [{ name: d, vector }], reason: null };
  }
  if (inf) {
    const influence: InfluenceVector[] = [];
    for (const [nm, v] of Object.entries(inf)) {
      const vector = vectorOf(ctx, v);
      if (vector) influence.push({ name: nm, vector });
    }
    return { influence, reason: influence.length > 0 ? null : 'the model has no directions.' };
  }
  if (labels) return labelledDirectionsOf(labels, null);
  return {
    influence: [],
    reason:
      `no direction given: write "direction:" with an influence vector, one entry per DOF ` +
      `(ones(${n}) when every DOF moves with the ground), or label the DOFs ("dofs:" of the ` +
      `matrix block) and write "direction: x".`,
  };
}

/** The DOF labels of K and M (the same when both have them); refuses two that differ. */
function pencilLabels(K: SideMatrix, M: SideMatrix): readonly string[] | null {
  if (K.dofs && M.dofs && K.dofs.length === M.dofs.length) {
    const i = K.dofs.findIndex((l, j) => l !== M.dofs![j]);
    if (i >= 0) {
      fail(
        `K and M label their DOFs differently: DOF ${i + 1} is ${K.dofs[i]} in K but ${M.dofs[i]} in M. Give both matrix blocks the same "dofs:".`,
      );
    }
  }
  return K.dofs ?? M.dofs;
}

/** Step 3: each key read at its own line (errors point there); null after reporting. */
function readSolveSetup(run: ModesRun): SolveSetup | null {
  const { ctx, keys, at } = run;
  const options: SolveOptions = {};
  let bad = false;
  const evalAt = (key: ModesKey) =>
    evaluateNode(ctx, parseExpression(ctx, keys[key]!.value), new Map(ctx.scope));
  const step = <T>(key: ModesKey, fn: () => T): T | undefined => {
    try {
      return fn();
    } catch (err) {
      if (err instanceof EngineError && err.code === 'CANCELLED') throw err;
      report(ctx, at(keys[key]?.line ?? 0), err);
      bad = true;
      return undefined;
    }
  };
  const K = step('stiffness', () =>
    sideMatrix(ctx, evalAt('stiffness'), 'K', keys.stiffness!.value),
  );
  const M = step('mass', () => sideMatrix(ctx, evalAt('mass'), 'M', keys.mass!.value));
  const base = generatorBase(ctx, keys);
  if (keys.method) {
    step('method', () => {
      const m = keys.method!.value.toLowerCase() as MethodName;
      if (!METHODS.includes(m))
        fail(
          `Unknown method "${keys.method!.value}"; the methods are ${METHODS.join(', ')}.`,
          'SHEET_PARSE',
        );
      options.method = m;
    });
  }
  if (keys.count)
    step('count', () => (options.count = positiveInteger(keys.count!.value, 'count')));
  if (keys['max iterations']) {
    step(
      'max iterations',
      () =>
        (options.maxIterations = positiveInteger(keys['max iterations']!.value, 'max iterations')),
    );
  }
  if (keys.tolerance) {
    step('tolerance', () => {
      const t = Number(keys.tolerance!.value);
      if (!(t > 0 && t < 1))
        fail(
          `"tolerance:" must be a number between 0 and 1, such as 1e-10 (got "${keys.tolerance!.value}").`,
          'SHEET_PARSE',
        );
      options.tolerance = t;
    });
  }
  if (keys.normalize)
    step('normalize', () => (options.normalize = parseNormalize(keys.normalize!.value)));
  if (keys.shift) step('shift', () => (options.shift = readShift(ctx, evalAt('shift'))));
  const labels = K && M ? step('mass', () => pencilLabels(K, M)) : undefined;
  // Without K, M and their labels there is nothing a direction could be checked against: no
  // second error.
  const directions =
    labels !== undefined
      ? step('direction', () => readDirections(run, base, labels, evalAt, K!.n))
      : undefined;
  if (bad || !K || !M || !directions) return null;

  const warnings: ModesWarning[] = [];
  const unitsOk = step(K.unit ? 'mass' : 'stiffness', () => checkPencilUnits(ctx, K, M));
  if (unitsOk === undefined && bad) return null;
  if (unitsOk) warnings.push({ code: 'UNITS_ASSUMED_SI', message: unitsOk });
  return {
    K,
    M,
    options,
    influence: directions.influence,
    participationReason: directions.reason,
    warnings,
  };
}

/** λ = (2πf)² from `shift:` in Hz, rpm or rad/s. */
function readShift(ctx: EvalContext, v: unknown): number {
  const { math } = ctx.sm;
  if (!math.isUnit(v))
    fail('"shift:" must be a frequency with its unit, such as 24.5 Hz, 1480 rpm or 150 rad/s.');
  const u = v as Unit;
  if (u.equalBase(math.unit(1, 'Hz'))) return (2 * Math.PI * u.toNumber('Hz')) ** 2;
  if (u.equalBase(math.unit(1, 'rad/s'))) return u.toNumber('rad/s') ** 2;
  return fail(`"shift:" must be a frequency (Hz, rpm or rad/s); got ${u.toString()}.`);
}

/** Step 4: K and M of one size, and each direction as long; false after reporting. */
function checkSizes(run: ModesRun, setup: SolveSetup): boolean {
  const { ctx, keys, at } = run;
  const { K, M } = setup;
  if (K.n !== M.n) {
    report(
      ctx,
      at(keys.mass!.line),
      new EngineError(
        'MATRIX_SIZE_MISMATCH',
        `K is ${K.n}×${K.n} but M is ${M.n}×${M.n}; they must be the same size.`,
      ),
    );
    return false;
  }
  const count = setup.options.count;
  if (count !== undefined && count > K.n) {
    // Refused rather than clamped: the count is part of what the sheet states it computed, and a
    // checker reading "count: 12" beside a table of 8 modes cannot tell a typo from a limit.
    report(
      ctx,
      at(keys.count!.line),
      new EngineError(
        'INVALID_OPTION',
        `"count: ${count}" asks for more modes than the model has: K is ${K.n}×${K.n}, so it has ${K.n} modes. Write "count: ${K.n}" for all of them, or fewer.`,
        { count, dofs: K.n },
      ),
    );
    return false;
  }
  for (const inf of setup.influence) {
    if (inf.vector.length !== K.n) {
      report(
        ctx,
        at(keys.direction?.line ?? 0),
        new EngineError(
          'MATRIX_SIZE_MISMATCH',
          `The direction "${inf.name}" has ${inf.vector.length} entries but the model has ${K.n} DOFs.`,
        ),
      );
      return false;
    }
  }
  return true;
}

/** Step 5: the run's options: directions, cancellation, throttled progress, memory, threads. */
function attachRunOptions(run: ModesRun, setup: SolveSetup): void {
  const { ctx, block, blockIndex, name } = run;
  const { options } = setup;
  if (setup.influence.length > 0) options.influence = setup.influence;
  options.signal = {
    get aborted() {
      return ctx.options.isCancelled?.() ?? false;
    },
  };
  const sendProgress = ctx.options.onProgress;
  if (sendProgress) {
    // The solver reports every iteration; pass on at most one report per interval (and every
    // newly converged mode), so a long solve streams without flooding the connection.
    const clock = ctx.options.now;
    let last = -Infinity;
    let converged = -1;
    options.onProgress = (p) => {
      if (clock) {
        const now = clock();
        if (now - last < PROGRESS_INTERVAL_MS && p.modesConverged === converged) return;
        last = now;
      }
      converged = p.modesConverged;
      sendProgress({
        blockIndex,
        blockId: block.id,
        blockCount: ctx.blockIds.length,
        kind: 'modes',
        message: `Solving ${name} (block ${blockIndex + 1} of ${ctx.blockIds.length}): ${p.stage}, ${p.modesConverged} of ${p.modesWanted} modes converged`,
        stage: p.stage,
        iteration: p.iteration,
        modesConverged: p.modesConverged,
        modesWanted: p.modesWanted,
      });
    };
  }
  if (ctx.options.memoryLimitBytes !== undefined) {
    options.memoryLimitBytes = ctx.options.memoryLimitBytes;
  }
  if (ctx.options.denseTeam) options.team = ctx.options.denseTeam;
}

/** Step 6: the solve; a refusal is reported at the line it concerns and null returned. */
function runSolve(run: ModesRun, setup: SolveSetup): ModalResult | null {
  const { ctx, keys, at } = run;
  try {
    return solveModes(setup.K.engine, setup.M.engine, setup.options);
  } catch (err) {
    if (err instanceof EngineError && err.code === 'CANCELLED') throw err;
    const e =
      err instanceof EngineError
        ? err
        : new EngineError('SHEET_EVAL', String((err as Error)?.message ?? err));
    const tooLarge = e.code === 'MODEL_TOO_LARGE' && typeof e.details?.limitBytes === 'number';
    const msg =
      e instanceof NoConvergenceError
        ? `${e.message} Raise "max iterations:" or loosen "tolerance:".`
        : tooLarge
          ? memoryRefusal(e, ctx.options.memoryLimitAdvice)
          : e.message;
    const line =
      e.code === 'INVALID_OPTION'
        ? (keys.method?.line ?? 0)
        : tooLarge
          ? (keys.method?.line ?? keys.stiffness!.line)
          : 0;
    ctx.errors.push({ ...at(line), message: msg, code: e.code });
    return null;
  }
}

/**
 * Step 8: a zero or non-finite K or M can give NaN modes without a solver error; nothing that is
 * not a finite number may be stored, so say which matrix and entry is at fault.
 */
function checkFinite(run: ModesRun, setup: SolveSetup, result: ModesBlockResult): boolean {
  const notFinite =
    firstNonFinitePath({ modes: result.modes, shapes: result.shapes }) ??
    firstNonFinitePath(result);
  if (!notFinite) return true;
  const { ctx, keys, at } = run;
  const why = modesNotFiniteMessage(
    notFinite.path,
    notFinite.value,
    setup.K.engine,
    setup.M.engine,
  );
  const line = why.matrix === 'M' ? keys.mass!.line : keys.stiffness!.line;
  ctx.errors.push({ ...at(line), message: why.message, code: 'SHEET_EVAL' });
  return false;
}

/** Step 7: the block's result (the table, shapes, Sturm check, warnings, engine details). */
function fillResult(result: ModesBlockResult, setup: SolveSetup, r: ModalResult): void {
  const p = r.participation[0];
  const { K, M, options } = setup;
  result.method = options.method ?? 'auto';
  result.methodUsed = r.method;
  result.size = r.n;
  result.modes = r.modes.map((m, i): ModeRow => ({
    mode: m.index,
    lambda: m.lambda,
    omega: m.omega,
    frequency: m.frequencyHz,
    period: Number.isFinite(m.periodS) ? m.periodS : null,
    gamma: p ? p.gamma[i]! : null,
    effectiveMass: p ? p.effectiveMass[i]! : null,
    ratio: p ? p.ratio[i]! : null,
    cumulative: p ? p.cumulative[i]! : null,
    backwardError: m.residual,
    iterations: m.iterations,
  }));
  result.shapes =
    r.n * r.modes.length <= RESULT_MATRIX_LIMIT
      ? Array.from({ length: r.n }, (_, i) => r.modes.map((m) => m.shape[i]!))
      : null;
  result.dofLabels = result.shapes ? [...(K.dofs ?? M.dofs ?? [])] : null;
  if (result.dofLabels?.length === 0) result.dofLabels = null;
  if (!result.shapes && r.modes.length > 0) {
    result.shapePreview = shapePreview(
      r.modes.map((m) => m.shape),
      r.n,
      K.dofs ?? M.dofs,
    );
  }
  result.histories = r.modes.map((m) => m.history);
  result.sturm = r.sturm
    ? { shift: r.sturm.shift, count: r.sturm.countBelow, found: r.sturm.found, missed: !r.sturm.ok }
    : null;
  result.participation = p ? { direction: p.name, mass: p.totalMass } : null;
  result.participationReason = p ? null : setup.participationReason;
  result.criticalTimeStep = r.criticalTimeStep?.dtCr ?? null;
  result.warnings = [
    ...setup.warnings,
    ...r.warnings.map((w) => ({ code: w.code, message: w.message })),
  ];
  result.engine = {
    methodNote: r.methodNote,
    options: { ...r.options, shift: r.options.shift },
    orthogonality: r.orthogonality,
    rigidBodyModes: r.rigidBodyModes,
    closelySpaced: r.closelySpaced,
    conditioning: r.conditioning,
    participation: r.participation,
    ...(r.criticalTimeStep ? { criticalTimeStep: r.criticalTimeStep } : {}),
  };
}

/**
 * Evaluates a modes block: read the keys, check the name, read K, M and the options at their
 * lines, check sizes, solve, then fill the result and bind it under the block's name (with the
 * engine's basis registered for response blocks below).
 */
export function evaluateModesBlock(
  ctx: EvalContext,
  block: SheetBlock,
  blockIndex: number,
): ModesBlockResult {
  const at = (line: number) => ({ blockId: block.id, blockIndex, line });
  const result = emptyResult(block, blockIndex);
  const { keys, bad } = readKeyLines(ctx, block, at, MODES_KEYS, 'a modes block', 'stiffness: K');
  const name = keys.name?.value ?? 'modes';
  result.name = name;
  const run: ModesRun = { ctx, block, blockIndex, keys, name, at };
  const failName = nameFailure(ctx, block.id);
  const markFailed = () => {
    failName(name, at(keys.name?.line ?? 0));
    return result;
  };
  if (!checkBlockName(ctx, keys.name, at)) return result;
  if (bad || !checkRequired(run)) return markFailed();
  if (reportDependency(ctx, keys, ['stiffness', 'mass', 'shift', 'direction'], at)) {
    return markFailed();
  }
  const setup = readSolveSetup(run);
  if (!setup || !checkSizes(run, setup)) return markFailed();
  attachRunOptions(run, setup);
  const r = runSolve(run, setup);
  if (!r) return markFailed();
  fillResult(result, setup, r);
  if (!checkFinite(run, setup, result)) {
    Object.assign(result, emptyResult(block, blockIndex));
    return markFailed();
  }
  const bound = bindResults(ctx, r);
  ctx.scope.set(name, bound);
  MODAL_RESULTS.set(bound, {
    basis: {
      omega: r.modes.map((m) => m.omega),
      shapes: r.modes.map((m) => m.shape),
      M: setup.M.engine,
    },
    influence: setup.influence,
    dofLabels: result.dofLabels ?? (setup.K.dofs?.length === r.n ? [...setup.K.dofs] : null),
    blockId: block.id,
  });
  ctx.failed.delete(name);
  result.ok = true;
  return result;
}
