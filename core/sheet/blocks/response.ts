/**
 * `response` blocks: an analysis of a modes result above, as `key: value` lines.
 *
 * ```
 * modes: frame                 # the name of a modes block above (required)
 * analysis: spectrum           # spectrum | harmonic | history | walking (required)
 * damping: 0.05                # a ratio, or one per mode: [0.05, 0.05, 0.02]
 * name: rsa                    # the results are bound to this name (default "response")
 * ```
 * and the keys of each analysis (see core/sheet/README.md). The mathematics is core/response.
 */
import type { Matrix, Unit } from 'mathjs';
import { EngineError } from '../../errors';
import {
  asceSpectrum,
  combineDirections,
  eurocodeSpectrum,
  frequencyGrid,
  harmonicResponse,
  modalTimeHistory,
  rayleighCoefficients,
  rayleighRatio,
  readTwoColumns,
  spectrumAnalysis,
  STANDARD_GRAVITY,
  tableSpectrum,
  walkingResponse,
  WALKING_FORCE,
  type DirectionalCombination,
  type GroundType,
  type ModalCombination,
  type Spectrum,
  type SpectrumAnalysisResult,
} from '../../response/index';
import { evaluateNode, nameFailure, parseExpression, report, type EvalContext } from '../context';
import { blockName } from '../messages';
import { MODAL_RESULTS, type RegisteredModes } from '../modal-registry';
import type {
  HarmonicResponseData,
  HistoryResponseData,
  ResponseAnalysis,
  ResponseBlockResult,
  SheetBlock,
  SpectrumDirectionResult,
  SpectrumResponseData,
  WalkingResponseData,
} from '../types';
import { refuseHiddenUnits } from './calc';
import {
  RESPONSE_ANALYSIS_KEYS,
  RESPONSE_COMMON_KEYS,
  RESPONSE_KEYS,
  type ResponseKey,
} from '../../vocabulary';
import { checkBlockName, readKeyLines, reportDependency, type KeyLine } from './key-lines';

/** Keys whose values are words or names of things (not expressions a failed name could be in). */
const WORD_KEYS: ReadonlySet<ResponseKey> = new Set<ResponseKey>([
  'analysis',
  'spectrum',
  'ground',
  'table unit',
  'record unit',
  'combine',
  'direction',
  'directional',
  'method',
  'name',
]);

const COMMON = RESPONSE_COMMON_KEYS;

/** The keys of each analysis, besides the common ones (the list is in core/vocabulary.ts). */
const ANALYSIS_KEYS = RESPONSE_ANALYSIS_KEYS satisfies Record<ResponseAnalysis, readonly string[]>;

type Key = ResponseKey;

/** The caution every response result carries (DESIGN §12). */
export const RESPONSE_CAUTION =
  'Code checks remain the engineer’s responsibility: these results follow the published methods named here (several clauses from memory) and do not replace the code adopted by the authority having jurisdiction, its National Annex, or licensed professional judgement.';

/** Most DOFs a harmonic or history analysis reports (each is a curve of up to 5 000 points). */
const MAX_OUTPUT_DOFS = 12;

/** Largest number of points a history keeps for display. */
const HISTORY_POINTS = 2000;

function fail(message: string, code: 'SHEET_PARSE' | 'SHEET_EVAL' = 'SHEET_EVAL'): never {
  throw new EngineError(code, message);
}

function emptyResult(block: SheetBlock, blockIndex: number): ResponseBlockResult {
  return {
    kind: 'response',
    blockId: block.id,
    blockIndex,
    ok: false,
    name: null,
    analysis: null,
    modes: null,
    method: null,
    notes: [],
    caution: RESPONSE_CAUTION,
  };
}

/** Reads the block's keys and evaluates each value at its own line. */
class Reader {
  constructor(
    readonly ctx: EvalContext,
    readonly keys: Partial<Record<Key, KeyLine>>,
    readonly at: (line: number) => { blockId: string; blockIndex: number; line: number },
  ) {}

  line(key: Key): number {
    return this.keys[key]?.line ?? 0;
  }

  has(key: Key): boolean {
    return this.keys[key] !== undefined;
  }

  text(key: Key): string {
    return this.keys[key]!.value;
  }

  /** Runs `fn` for a key, turning its errors into errors at the key's line (rethrown marked). */
  at_<T>(key: Key, fn: () => T): T {
    try {
      return fn();
    } catch (err) {
      if (err instanceof EngineError && err.code === 'CANCELLED') throw err;
      if (err instanceof Reported) throw err;
      report(this.ctx, this.at(this.line(key)), err);
      throw new Reported();
    }
  }

  value(key: Key): unknown {
    const node = parseExpression(this.ctx, this.text(key));
    refuseHiddenUnits(this.ctx, node);
    return evaluateNode(this.ctx, node, new Map(this.ctx.scope));
  }

  /** A plain number (or a quantity without dimension). */
  number(key: Key, check?: (x: number) => boolean, words = 'a number'): number {
    return this.at_(key, () => {
      const v = this.value(key);
      const x =
        typeof v === 'number'
          ? v
          : this.ctx.sm.math.isUnit(v) && (v as Unit).dimensions.every((d) => d === 0)
            ? (v as Unit).toNumber()
            : NaN;
      if (!Number.isFinite(x) || (check && !check(x)))
        fail(`"${key}:" must be ${words} (got "${this.text(key)}").`);
      return x;
    });
  }

  /** A quantity in SI, checked against the unit's dimension ('N', 'm', 's', 'm/s^2', 'kg m'). */
  quantity(key: Key, unit: string, words: string): number {
    return this.at_(key, () => toSi(this.ctx, this.value(key), unit, `"${key}:" must be ${words}`));
  }

  /** The factor to m/s² of an acceleration unit written as a word: `g` (standard gravity) or a unit. */
  accelerationUnit(key: Key): number {
    return this.at_(key, () => {
      const u = this.text(key).trim();
      if (u === 'g') return STANDARD_GRAVITY;
      return toSi(
        this.ctx,
        unitOf(this.ctx.sm.math, 1, u),
        'm/s^2',
        `"${key}:" must be g or an acceleration unit such as m/s^2`,
      );
    });
  }

  /** A frequency in Hz from Hz, rpm or rad/s. */
  frequency(key: Key): number {
    return this.at_(key, () => frequencyHz(this.ctx, this.value(key), `"${key}:"`));
  }

  /** A list of 1-based DOF numbers, returned 0-based, each within n. */
  dofList(key: Key, n: number): number[] {
    return this.at_(key, () => {
      const xs = flatNumbers(this.ctx, this.value(key));
      if (!xs || xs.length === 0 || xs.some((x) => !Number.isInteger(x) || x < 1 || x > n)) {
        fail(
          `"${key}:" must list DOF numbers from 1 to ${n}, such as [1, 3] (got "${this.text(key)}").`,
        );
      }
      if (xs.length > MAX_OUTPUT_DOFS) {
        fail(
          `"${key}:" lists ${xs.length} DOFs; a response block reports at most ${MAX_OUTPUT_DOFS}.`,
        );
      }
      return xs.map((x) => x - 1);
    });
  }
}

/** A quantity bound for the blocks below, shown in the unit that reads best (kN, mm, …). */
function unitOf(math: EvalContext['sm']['math'], x: number, unit: string): Unit {
  const u = math.unit(x, unit);
  (u as { skipAutomaticSimplification: boolean }).skipAutomaticSimplification = false;
  return u;
}

/** Thrown once an error has been reported at its line: the block stops there. */
class Reported extends Error {}

function flatNumbers(ctx: EvalContext, v: unknown): number[] | null {
  const { math } = ctx.sm;
  if (typeof v === 'number') return [v];
  if (!math.isMatrix(v) && !Array.isArray(v)) return null;
  const arr = (math.isMatrix(v) ? (v as Matrix).toArray() : (v as unknown[])).flat(2) as unknown[];
  return arr.every((x) => typeof x === 'number') ? (arr as number[]) : null;
}

function toSi(ctx: EvalContext, v: unknown, unit: string, words: string): number {
  const { math } = ctx.sm;
  const base = unitOf(math, 1, unit);
  if (!math.isUnit(v) || !(v as Unit).equalBase(base))
    fail(`${words} with its unit (got ${String(v)}).`);
  const x = (v as Unit).toNumber(unit);
  if (!Number.isFinite(x)) fail(`${words}; got a value that is not finite.`);
  return x;
}

function frequencyHz(ctx: EvalContext, v: unknown, what: string): number {
  const { math } = ctx.sm;
  if (math.isUnit(v)) {
    const u = v as Unit;
    if (u.equalBase(unitOf(math, 1, 'Hz'))) return u.toNumber('Hz');
    if (u.equalBase(unitOf(math, 1, 'rad/s'))) return u.toNumber('rad/s') / (2 * Math.PI);
  }
  return fail(`${what} must be a frequency with its unit, such as 24.5 Hz, 1480 rpm or 150 rad/s.`);
}

/** A vector of quantities (or one quantity) in SI, one entry per DOF. */
function vectorSi(
  ctx: EvalContext,
  v: unknown,
  unit: string,
  n: number,
  words: string,
): Float64Array {
  const { math } = ctx.sm;
  const arr = math.isMatrix(v) ? ((v as Matrix).toArray() as unknown[]).flat(2) : null;
  if (!arr) fail(`${words} must be a vector with ${n} entries, such as [0, 0, 5 kN].`);
  if (arr.length !== n) fail(`${words} has ${arr.length} entries but the model has ${n} DOFs.`);
  return Float64Array.from(arr, (x, i) =>
    x === 0
      ? 0
      : toSi(
          ctx,
          x,
          unit,
          `${words}[${i + 1}] must be in ${unit === 'N' ? 'force units (N, kN)' : unit}`,
        ),
  );
}

/** A two-column table from an upload's name or a matrix in scope (plain numbers). */
function twoColumns(ctx: EvalContext, r: Reader, key: Key, columns: string): [number, number][] {
  return r.at_(key, () => {
    const name = r.text(key);
    const upload = ctx.uploads.find((u) => u.name === name);
    if (upload) return readTwoColumns(upload.text, name, columns);
    const v = r.value(key);
    const { math } = ctx.sm;
    if (!math.isMatrix(v))
      fail(`"${key}:" must name an uploaded CSV file or a two-column matrix above (${columns}).`);
    const rows = (v as Matrix).toArray() as unknown[][];
    if (
      !rows.every(
        (row) => Array.isArray(row) && row.length === 2 && row.every((x) => typeof x === 'number'),
      )
    ) {
      fail(`"${key}:" must be a matrix of two columns of plain numbers (${columns}).`);
    }
    return rows as [number, number][];
  });
}

function lookupModes(ctx: EvalContext, r: Reader): RegisteredModes {
  return r.at_('modes', () => {
    const name = r.text('modes');
    if (!/^[A-Za-z][A-Za-z0-9_]*$/.test(name))
      fail(`"modes:" must be the name of a modes block above (got "${name}").`, 'SHEET_PARSE');
    const failed = ctx.failed.get(name);
    if (failed && !ctx.scope.has(name)) {
      fail(
        `"${name}" is not available: line ${failed.line} of ${blockName(failed)} would define it but has an error.`,
      );
    }
    const v = ctx.scope.get(name);
    const reg = v && typeof v === 'object' ? MODAL_RESULTS.get(v) : undefined;
    if (!reg)
      fail(
        `"${name}" is not the name of a modes block above; a response block analyses the results of one ("modes: frame").`,
      );
    return reg;
  });
}

function dampingList(ctx: EvalContext, r: Reader, reg: RegisteredModes, notes: string[]): number[] {
  const count = reg.basis.omega.length;
  if (r.has('rayleigh')) {
    const zeta = r.has('damping')
      ? r.number('damping', (x) => x > 0 && x < 1, 'a ratio above 0 and below 1, such as 0.02')
      : fail('Rayleigh damping needs "damping:" (the ratio at both frequencies).');
    const [f1, f2] = r.at_('rayleigh', () => {
      const v = r.value('rayleigh');
      const arr = ctx.sm.math.isMatrix(v) ? ((v as Matrix).toArray() as unknown[]).flat() : [];
      if (arr.length !== 2) fail('"rayleigh:" takes two frequencies, such as [8 Hz, 40 Hz].');
      return arr.map((x) => frequencyHz(ctx, x, '"rayleigh:"')) as [number, number];
    });
    const c = r.at_('rayleigh', () =>
      rayleighCoefficients(2 * Math.PI * f1, zeta, 2 * Math.PI * f2, zeta),
    );
    notes.push(
      `Rayleigh damping C = αM + βK with ζ = ${zeta} at ${f1.toPrecision(4)} Hz and ${f2.toPrecision(4)} Hz: α = ${c.alpha.toPrecision(4)} 1/s, β = ${c.beta.toPrecision(4)} s.`,
    );
    return reg.basis.omega.map((w) => rayleighRatio(c, w));
  }
  if (!r.has('damping'))
    fail('A response block needs "damping:" (a ratio such as 0.05, or one per mode).');
  return r.at_('damping', () => {
    const xs = flatNumbers(ctx, r.value('damping'));
    if (!xs) fail('"damping:" must be a ratio (0.05 for 5 %) or a list of ratios, one per mode.');
    const list = xs.length === 1 ? new Array<number>(count).fill(xs[0]!) : xs;
    if (list.length !== count)
      fail(
        `"damping:" gives ${list.length} ratios for ${count} modes; give one ratio, or one per mode.`,
      );
    list.forEach((z, i) => {
      if (!(z >= 0 && z < 1))
        fail(
          `"damping:" ratio of mode ${i + 1} is ${z}; a ratio is at least 0 and below 1 (5 % is 0.05).`,
        );
    });
    return list;
  });
}

function influenceOf(
  ctx: EvalContext,
  r: Reader,
  reg: RegisteredModes,
  name: string | null,
  notes: string[],
): { name: string; vector: Float64Array } {
  const n = reg.basis.shapes[0]!.length;
  if (name === null) {
    const first = reg.influence[0];
    if (first) return first;
    notes.push(
      'The modes block has no direction: the influence vector is 1 at every DOF (a storey model).',
    );
    return { name: 'x', vector: new Float64Array(n).fill(1) };
  }
  const found = reg.influence.find((d) => d.name === name);
  if (found) return found;
  return r.at_('direction', () =>
    fail(
      reg.influence.length > 0
        ? `"${name}" is not a direction of the modes block; its directions are ${reg.influence.map((d) => d.name).join(', ')}.`
        : `The modes block has no directions; give "direction:" in the modes block (for example [1, 1, 1]).`,
    ),
  );
}

function labelOf(reg: RegisteredModes, dof: number): string {
  return reg.dofLabels?.[dof] ?? `DOF ${dof + 1}`;
}

function spectrumOf(ctx: EvalContext, r: Reader, zeta: number): Spectrum {
  if (!r.has('spectrum'))
    fail(
      'A spectrum analysis needs "spectrum:" (ASCE 7-16, EN 1998-1 type 1, EN 1998-1 type 2 or table).',
      'SHEET_PARSE',
    );
  const kind = r.text('spectrum').toLowerCase().replace(/\s+/g, ' ');
  const need = (key: Key, what: string) => {
    if (!r.has(key))
      r.at_('spectrum', () =>
        fail(`The ${r.text('spectrum')} spectrum needs "${key}:" (${what}).`, 'SHEET_PARSE'),
      );
  };
  if (kind === 'asce 7-16') {
    need('sds', 'S_DS in g');
    need('sd1', 'S_D1 in g');
    need('tl', 'T_L with its unit, such as 8 s');
    const sds = r.number('sds', (x) => x > 0, 'S_DS in g, a positive number');
    const sd1 = r.number('sd1', (x) => x > 0, 'S_D1 in g, a positive number');
    const tl = r.quantity('tl', 's', 'a time such as 8 s');
    const R = r.has('r') ? r.number('r', (x) => x > 0, 'a positive number') : 1;
    const ie = r.has('ie') ? r.number('ie', (x) => x > 0, 'a positive number') : 1;
    return r.at_('spectrum', () => asceSpectrum({ sds, sd1, tl, r: R, ie }));
  }
  const en = /^en 1998-1 type ([12])$/.exec(kind);
  if (en) {
    need('ground', 'A, B, C, D or E');
    need('ag', 'the design ground acceleration, such as 2.5 m/s^2 or 0.25 (× g)');
    const ground = r.text('ground').toUpperCase();
    if (!['A', 'B', 'C', 'D', 'E'].includes(ground))
      r.at_('ground', () =>
        fail(
          `"ground:" is A, B, C, D or E (EN 1998-1 Table 3.1); got "${r.text('ground')}".`,
          'SHEET_PARSE',
        ),
      );
    const ag = r.at_('ag', () => {
      const v = r.value('ag');
      if (typeof v === 'number') return v * STANDARD_GRAVITY;
      return toSi(
        ctx,
        v,
        'm/s^2',
        '"ag:" must be an acceleration (2.5 m/s^2) or a fraction of g (0.25)',
      );
    });
    const q = r.has('q')
      ? r.number('q', (x) => x >= 1, 'a behaviour factor of at least 1')
      : undefined;
    return r.at_('spectrum', () =>
      eurocodeSpectrum({
        type: Number(en[1]) as 1 | 2,
        ground: ground as GroundType,
        ag,
        damping: zeta,
        ...(q !== undefined ? { q } : {}),
      }),
    );
  }
  if (kind === 'table') {
    need('table', 'an uploaded CSV or a two-column matrix: period (s), pseudo-acceleration');
    const rows = twoColumns(ctx, r, 'table', 'period (s) and pseudo-acceleration');
    const scale = r.has('table unit') ? r.accelerationUnit('table unit') : 1;
    return r.at_('table', () => tableSpectrum(rows.map(([T, a]) => [T, a * scale])));
  }
  return r.at_('spectrum', () =>
    fail(
      `Unknown spectrum "${r.text('spectrum')}"; use ASCE 7-16, EN 1998-1 type 1, EN 1998-1 type 2 or table.`,
      'SHEET_PARSE',
    ),
  );
}

function runSpectrum(
  ctx: EvalContext,
  r: Reader,
  reg: RegisteredModes,
  zeta: number[],
  notes: string[],
) {
  const spectrum = spectrumOf(ctx, r, zeta[0]!);
  const combination = (
    r.has('combine') ? r.text('combine').toLowerCase() : 'cqc'
  ) as ModalCombination;
  if (combination !== 'srss' && combination !== 'cqc')
    r.at_('combine', () => fail('"combine:" is srss or cqc.', 'SHEET_PARSE'));
  const dirNames = r.has('direction')
    ? r
        .text('direction')
        .split(',')
        .map((s) => s.trim())
        .filter(Boolean)
    : [null];
  const directional = (
    r.has('directional') ? r.text('directional').toLowerCase().replace(/\s/g, '') : 'srss'
  ) as DirectionalCombination;
  if (directional !== 'srss' && directional !== '100-30')
    r.at_('directional', () => fail('"directional:" is srss or 100-30.', 'SHEET_PARSE'));
  const n = reg.basis.shapes[0]!.length;
  let heights: number[] | undefined;
  if (r.has('heights')) {
    heights = r.at_('heights', () => {
      const v = r.value('heights');
      if (ctx.sm.math.isUnit(v))
        return new Array<number>(n).fill(toSi(ctx, v, 'm', '"heights:" must be a length'));
      return Array.from(vectorSi(ctx, v, 'm', n, '"heights:"'));
    });
  }
  const elf = r.has('elf base shear')
    ? r.quantity('elf base shear', 'N', 'a force such as 1200 kN')
    : undefined;
  const share = r.has('elf share')
    ? r.number('elf share', (x) => x > 0 && x <= 1, 'a share from 0 to 1, such as 1.0 or 0.85')
    : undefined;
  const results: { dir: string; res: SpectrumAnalysisResult }[] = dirNames.map((d) => {
    const inf = influenceOf(ctx, r, reg, d, notes);
    const res = r.at_(r.has('table') ? 'table' : 'spectrum', () =>
      spectrumAnalysis({
        basis: reg.basis,
        influence: inf.vector,
        spectrum,
        damping: zeta,
        combination,
        ...(heights ? { storeyHeights: heights } : {}),
        ...(elf !== undefined ? { elfBaseShear: elf } : {}),
        ...(share !== undefined ? { elfShare: share } : {}),
      }),
    );
    return { dir: inf.name, res };
  });
  const directions: SpectrumDirectionResult[] = results.map(({ dir, res }) => ({
    direction: dir,
    description: res.spectrum.description,
    combination: res.combination,
    modes: res.modes.map((m) => ({
      mode: m.mode,
      period: m.period,
      damping: m.damping,
      sa: m.sa,
      gamma: m.gamma,
      effectiveMass: m.effectiveMass,
      baseShear: m.baseShear,
    })),
    baseShear: res.baseShear,
    scaledBaseShear: res.scaledBaseShear,
    scaling: res.scaling,
    displacement: res.displacement,
    storeys: res.storeys,
    closeModes: res.closeModes,
    massRatio: res.massRatio,
  }));
  const first = results[0]!.res;
  if (first.closeModes.length > 0) {
    notes.push(
      `Modes ${first.closeModes.map(([a, b]) => `${a} and ${b}`).join(', ')} are closer than T_j ≤ 0.9 T_i (EN 1998-1 §4.3.3.3.2): ${combination === 'cqc' ? 'CQC accounts for their correlation' : 'use CQC, as SRSS is not conservative for them'}.`,
    );
  }
  if (first.scaling) {
    notes.push(
      first.scaling.factor > 1
        ? `Modal forces scaled by ${first.scaling.factor.toPrecision(4)} to ${first.scaling.share * 100} % of the ELF base shear (ASCE 7-16 §12.9.1.4.1); displacements and drifts are not scaled by it.`
        : `The modal base shear reaches ${first.scaling.share * 100} % of the ELF base shear: no scaling (ASCE 7-16 §12.9.1.4.1).`,
    );
  }
  if (first.massRatio < 0.9) {
    notes.push(
      `The modes used carry ${(first.massRatio * 100).toFixed(1)} % of the mass; ASCE 7-16 §12.9.1.1 and EN 1998-1 §4.3.3.3.1 ask for at least 90 %.`,
    );
  }
  const combined =
    results.length > 1
      ? {
          rule: directional,
          displacement: Array.from({ length: n }, (_, d) =>
            combineDirections(
              results.map((x) => x.res.displacement[d]!),
              directional,
            ),
          ),
          drift: first.storeys
            ? Array.from({ length: n }, (_, d) =>
                combineDirections(
                  results.map((x) => x.res.storeys!.drift[d]!),
                  directional,
                ),
              )
            : null,
        }
      : null;
  const maxT = Math.max(...first.modes.map((m) => m.period));
  const data: SpectrumResponseData = {
    directions,
    combined,
    curve: spectrum.points(Math.max(4, Math.ceil(maxT * 1.25))).filter(([T]) => {
      try {
        spectrum.sa(T);
        return true;
      } catch {
        return false;
      }
    }),
    periods: first.modes.map((m) => m.period),
  };
  const method = `${spectrum.source}; modal combination ${combination.toUpperCase()}${combination === 'cqc' ? ' (Der Kiureghian 1981)' : ''}; modal peaks per Chopra, Dynamics of Structures, ch. 13${results.length > 1 ? `; directions by ${directional === 'srss' ? 'SRSS' : 'the 100 %/30 % rule'} (EN 1998-1 §4.3.3.5.1)` : ''}`;
  return { data, method, bind: bindSpectrum(ctx, results, combined) };
}

function bindSpectrum(
  ctx: EvalContext,
  results: { dir: string; res: SpectrumAnalysisResult }[],
  combined: SpectrumResponseData['combined'],
): Record<string, unknown> {
  const { math } = ctx.sm;
  const vec = (xs: number[], unit: string | null) =>
    math.matrix((unit ? xs.map((x) => unitOf(math, x, unit)) : xs) as number[]) as Matrix;
  const one = (res: SpectrumAnalysisResult): Record<string, unknown> => {
    const out: Record<string, unknown> = {
      V: unitOf(math, res.scaledBaseShear, 'N'),
      V_modal: unitOf(math, res.baseShear, 'N'),
      scale: res.scaling?.factor ?? 1,
      u: vec(res.displacement, 'm'),
      T: vec(
        res.modes.map((m) => m.period),
        's',
      ),
      Sa: vec(
        res.modes.map((m) => m.sa),
        'm/s^2',
      ),
      V_n: vec(
        res.modes.map((m) => m.baseShear),
        'N',
      ),
      mass_ratio: res.massRatio,
    };
    if (res.scaling) out.V_elf = unitOf(math, res.scaling.elfBaseShear, 'N');
    if (res.storeys) {
      out.storey_force = vec(res.storeys.force, 'N');
      out.storey_shear = vec(res.storeys.shear, 'N');
      out.overturning = vec(res.storeys.overturning, 'N m');
      out.drift = vec(res.storeys.drift, 'm');
      out.drift_ratio = vec(res.storeys.driftRatio, null);
    }
    return out;
  };
  const top = one(results[0]!.res);
  if (combined) {
    top.u = vec(combined.displacement, 'm');
    if (combined.drift) top.drift = vec(combined.drift, 'm');
    const by: Record<string, unknown> = {};
    for (const { dir, res } of results) by[dir] = one(res);
    top.by_direction = by;
  }
  return top;
}

function runHarmonic(
  ctx: EvalContext,
  r: Reader,
  reg: RegisteredModes,
  zeta: number[],
  notes: string[],
) {
  const n = reg.basis.shapes[0]!.length;
  let load:
    | { kind: 'force'; pattern: Float64Array }
    | { kind: 'unbalance'; pattern: Float64Array; unbalance: number };
  let loadText: string;
  if (r.has('force') === r.has('unbalance')) {
    return fail(
      'A harmonic analysis needs either "force:" (amplitude per DOF, such as [0, 0, 5 kN]) or "unbalance:" with "at:" (such as 12 kg m at DOF 3).',
      'SHEET_PARSE',
    );
  }
  if (r.has('force')) {
    const pattern = r.at_('force', () => vectorSi(ctx, r.value('force'), 'N', n, '"force:"'));
    load = { kind: 'force', pattern };
    loadText = `a harmonic force of amplitude ${r.text('force')}`;
  } else {
    const me = r.quantity('unbalance', 'kg m', 'a mass times an eccentricity, such as 12 kg m');
    if (!r.has('at'))
      r.at_('unbalance', () =>
        fail('"unbalance:" needs "at:" (the DOF where it acts).', 'SHEET_PARSE'),
      );
    const [dof] = r.dofList('at', n);
    const pattern = new Float64Array(n);
    pattern[dof!] = 1;
    load = { kind: 'unbalance', pattern, unbalance: me };
    loadText = `a rotating unbalance m·e = ${r.text('unbalance')} at ${labelOf(reg, dof!)} (force m·e·Ω²)`;
  }
  const running = r.has('running speed') ? r.frequency('running speed') : null;
  const modeHz = reg.basis.omega.map((w) => w / (2 * Math.PI));
  let f1 = 0;
  let f2 = 1.5 * Math.max(running ?? 0, ...modeHz);
  if (r.has('range')) {
    [f1, f2] = r.at_('range', () => {
      const v = r.value('range');
      const arr = ctx.sm.math.isMatrix(v) ? ((v as Matrix).toArray() as unknown[]).flat() : [];
      if (arr.length !== 2) fail('"range:" takes two frequencies, such as [2 Hz, 60 Hz].');
      const xs = arr.map((x) => frequencyHz(ctx, x, '"range:"'));
      if (!(xs[1]! > xs[0]! && xs[0]! >= 0))
        fail('"range:" must run upwards from a frequency ≥ 0.');
      return xs as [number, number];
    });
  }
  const points = r.has('points')
    ? r.number(
        'points',
        (x) => Number.isInteger(x) && x >= 10 && x <= 5000,
        'a whole number from 10 to 5000',
      )
    : 400;
  const dofs = r.has('dofs')
    ? r.dofList('dofs', n)
    : Array.from(load.pattern.keys())
        .filter((i) => load.pattern[i] !== 0)
        .slice(0, MAX_OUTPUT_DOFS);
  if (dofs.length === 0) {
    r.at_('force', () =>
      fail('"force:" is zero at every DOF; give the force amplitude where it acts.'),
    );
  }
  const grid = frequencyGrid(f1, f2, points, [
    ...(running !== null ? [running, 0.8 * running, 1.2 * running] : []),
    ...modeHz,
  ]);
  const res = r.at_(r.has('force') ? 'force' : 'unbalance', () =>
    harmonicResponse({ basis: reg.basis, load, damping: zeta, frequencies: grid, dofs }),
  );
  const hz = res.frequencies.map((w) => w / (2 * Math.PI));
  const k =
    running !== null
      ? hz.findIndex((f) => Math.abs(f - running) < 1e-12 * Math.max(1, running))
      : -1;
  const atRunning =
    k >= 0
      ? res.dofs.map((d) => ({
          dof: d.dof + 1,
          amplitude: d.amplitude[k]!,
          velocity: d.velocity[k]!,
          phase: d.phase[k]!,
        }))
      : null;
  const separation =
    running !== null && running > 0
      ? Math.min(...modeHz.map((f) => Math.abs(f - running) / running))
      : null;
  notes.push(
    'Steady state by superposition of the modes found; modes above the range add a static part this leaves out.',
  );
  const data: HarmonicResponseData = {
    load: loadText,
    frequencies: hz,
    damping: zeta,
    dofs: res.dofs.map((d) => ({
      dof: d.dof + 1,
      label: labelOf(reg, d.dof),
      amplitude: d.amplitude,
      phase: d.phase,
      velocity: d.velocity,
    })),
    runningSpeed: running,
    atRunning,
    modeFrequencies: modeHz,
    separation,
  };
  const { math } = ctx.sm;
  const vec = (xs: number[], unit: string) =>
    math.matrix(xs.map((x) => unitOf(math, x, unit)) as unknown as number[]) as Matrix;
  const bind: Record<string, unknown> = {
    u_max: vec(
      res.dofs.map((d) => Math.max(...d.amplitude)),
      'm',
    ),
    f_peak: vec(
      res.dofs.map((d) => hz[d.amplitude.indexOf(Math.max(...d.amplitude))]!),
      'Hz',
    ),
  };
  if (atRunning) {
    bind.u_run = vec(
      atRunning.map((a) => a.amplitude),
      'm',
    );
    bind.v_run = vec(
      atRunning.map((a) => a.velocity),
      'm/s',
    );
  }
  if (running !== null) bind.f_run = unitOf(math, running, 'Hz');
  if (separation !== null) bind.separation = separation;
  return {
    data,
    method:
      'Steady-state harmonic response by modal superposition with modal damping (Chopra, Dynamics of Structures, §3.2, §12.4); running speed ±20 % band (common practice, ACI 351.3R, from memory)',
    bind,
  };
}

function runHistory(
  ctx: EvalContext,
  r: Reader,
  reg: RegisteredModes,
  zeta: number[],
  notes: string[],
) {
  const n = reg.basis.shapes[0]!.length;
  if (!r.has('record'))
    fail(
      'A time history needs "record:" (an uploaded CSV or a two-column matrix of time (s) and value).',
      'SHEET_PARSE',
    );
  const rows = twoColumns(ctx, r, 'record', 'time (s) and value');
  let load: Parameters<typeof modalTimeHistory>[0]['load'];
  if (r.has('force')) {
    const pattern = r.at_('force', () => vectorSi(ctx, r.value('force'), 'N', n, '"force:"'));
    load = {
      kind: 'force',
      pattern,
      record: { time: rows.map((x) => x[0]), value: rows.map((x) => x[1]) },
    };
    notes.push(`Load: the force pattern ${r.text('force')} times the record's factor.`);
  } else {
    const scale = r.has('record unit')
      ? r.accelerationUnit('record unit')
      : r.at_('record', () =>
          fail(
            'A ground record needs "record unit:" (g or m/s^2), or give "force:" for a force history.',
            'SHEET_PARSE',
          ),
        );
    const inf = influenceOf(ctx, r, reg, r.has('direction') ? r.text('direction') : null, notes);
    load = {
      kind: 'ground',
      influence: inf.vector,
      record: { time: rows.map((x) => x[0]), value: rows.map((x) => x[1] * scale) },
    };
    notes.push(
      `Ground acceleration in direction ${inf.name}; displacements relative to the ground.`,
    );
  }
  let minStep = Infinity;
  for (let i = 1; i < rows.length; i++) minStep = Math.min(minStep, rows[i]![0] - rows[i - 1]![0]);
  const step = r.has('step') ? r.quantity('step', 's', 'a time such as 0.005 s') : minStep;
  const duration = r.has('duration')
    ? r.quantity('duration', 's', 'a time such as 20 s')
    : undefined;
  const method = (r.has('method') ? r.text('method').toLowerCase() : 'exact') as
    'exact' | 'newmark';
  if (method !== 'exact' && method !== 'newmark')
    r.at_('method', () =>
      fail(
        '"method:" is exact (piecewise-linear load) or newmark (average acceleration).',
        'SHEET_PARSE',
      ),
    );
  const dofs = r.has('dofs') ? r.dofList('dofs', n) : [n - 1];
  const res = r.at_(r.has('step') ? 'step' : 'record', () =>
    modalTimeHistory({
      basis: reg.basis,
      load,
      damping: zeta,
      step,
      ...(duration !== undefined ? { duration } : {}),
      method,
      dofs,
      // the modal coordinates are modes × steps numbers: bounded by the sheet's value limit
      maxSteps: Math.min(200_000, Math.floor(ctx.maxMatrixEntries / reg.basis.omega.length)),
    }),
  );
  const stride = Math.max(1, Math.ceil(res.time.length / HISTORY_POINTS));
  const thin = (xs: number[]) => xs.filter((_, i) => i % stride === 0);
  const data: HistoryResponseData = {
    method,
    load: load.kind,
    step,
    steps: res.time.length - 1,
    time: thin(res.time),
    stride,
    dofs: res.dofs.map((d) => ({
      dof: d.dof + 1,
      label: labelOf(reg, d.dof),
      displacement: thin(d.displacement),
      peak: d.peak.peak,
      time: d.peak.time,
    })),
    baseShear: res.baseShear
      ? {
          values: thin(res.baseShear.values),
          peak: res.baseShear.peak.peak,
          time: res.baseShear.peak.time,
        }
      : null,
    dtCr: res.centralDifference.dtCr,
    dtCrDamped: res.centralDifference.dtCrDamped,
  };
  const { math } = ctx.sm;
  const vec = (xs: number[], unit: string) =>
    math.matrix(xs.map((x) => unitOf(math, x, unit)) as unknown as number[]) as Matrix;
  const bind: Record<string, unknown> = {
    peak: vec(
      res.dofs.map((d) => d.peak.peak),
      'm',
    ),
    t_peak: vec(
      res.dofs.map((d) => d.peak.time),
      's',
    ),
    dt_cr: unitOf(math, res.centralDifference.dtCr, 's'),
  };
  if (res.baseShear) bind.V_peak = unitOf(math, res.baseShear.peak.peak, 'N');
  return {
    data,
    method:
      method === 'exact'
        ? 'Modal superposition; each modal equation solved exactly for a load linear between steps (Nigam & Jennings 1969; Chopra, Dynamics of Structures, §5.2)'
        : 'Modal superposition; each modal equation stepped by Newmark average acceleration, γ = ½, β = ¼ (Newmark 1959)',
    bind,
  };
}

function runWalking(ctx: EvalContext, r: Reader, reg: RegisteredModes, zeta: number[]) {
  const n = reg.basis.shapes[0]!.length;
  const count = reg.basis.omega.length;
  const mode = r.has('mode')
    ? r.number(
        'mode',
        (x) => Number.isInteger(x) && x >= 1 && x <= count,
        `a mode number from 1 to ${count}`,
      ) - 1
    : 0;
  const dof = r.has('at') ? r.dofList('at', n)[0] : undefined;
  const force = r.has('force')
    ? r.quantity('force', 'N', 'a force such as 0.29 kN (floors) or 0.41 kN (footbridges)')
    : WALKING_FORCE.floor;
  const limit = r.has('limit')
    ? r.quantity('limit', 'm/s^2', 'an acceleration such as 0.7 m/s^2')
    : null;
  const res = r.at_(r.has('at') ? 'at' : r.has('mode') ? 'mode' : 'damping', () =>
    walkingResponse({
      basis: reg.basis,
      mode,
      ...(dof !== undefined ? { dof } : {}),
      damping: zeta[mode]!,
      force,
    }),
  );
  const data: WalkingResponseData = {
    mode: res.mode,
    dof: res.dof,
    label: labelOf(reg, res.dof - 1),
    frequency: res.frequency,
    modalMass: res.modalMass,
    weight: res.weight,
    force: res.force,
    damping: res.damping,
    acceleration: res.acceleration,
    ratio: res.ratio,
    limit,
    pass: limit === null ? null : res.acceleration <= limit,
  };
  const { math } = ctx.sm;
  const bind: Record<string, unknown> = {
    a: unitOf(math, res.acceleration, 'm/s^2'),
    a_g: res.ratio,
    W: unitOf(math, res.weight, 'N'),
    f: unitOf(math, res.frequency, 'Hz'),
  };
  if (limit !== null) bind.limit = unitOf(math, limit, 'm/s^2');
  return {
    data,
    method: `${res.method}; limits: AISC DG11 Table 4.1 (0.5 % g offices, 1.5 % g indoor footbridges, 5 % g outdoor footbridges) and EN 1990 A2 §A2.4.3.2 (0.7 m/s² vertical, 0.2 m/s² horizontal), from memory`,
    bind,
  };
}

/**
 * Evaluates a response block (see the module comment); errors are reported at the key's line.
 * @example evaluateResponseBlock(ctx, { id: 'r1', kind: 'response', source: 'modes: frame\nanalysis: walking\ndamping: 0.01' }, 3)
 */
export function evaluateResponseBlock(
  ctx: EvalContext,
  block: SheetBlock,
  blockIndex: number,
): ResponseBlockResult {
  const at = (line: number) => ({ blockId: block.id, blockIndex, line });
  const result = emptyResult(block, blockIndex);
  const { keys, bad } = readKeyLines(
    ctx,
    block,
    at,
    RESPONSE_KEYS,
    'a response block',
    'analysis: spectrum',
  );
  const name = keys.name?.value ?? 'response';
  result.name = name;
  const failName = nameFailure(ctx, block.id);
  const markFailed = () => {
    failName(name, at(keys.name?.line ?? 0));
    return result;
  };
  if (!checkBlockName(ctx, keys.name, at)) return result;
  if (bad) return markFailed();
  const expressionKeys = RESPONSE_KEYS.filter((k) => !WORD_KEYS.has(k));
  if (reportDependency(ctx, keys, expressionKeys, at)) return markFailed();
  for (const req of ['modes', 'analysis'] as const) {
    if (!keys[req]) {
      report(
        ctx,
        at(0),
        new EngineError(
          'SHEET_PARSE',
          `A response block needs "${req}:" (for example "${req === 'modes' ? 'modes: frame' : 'analysis: spectrum'}").`,
        ),
      );
      return markFailed();
    }
  }
  const analysis = keys.analysis!.value.toLowerCase() as ResponseAnalysis;
  if (!(analysis in ANALYSIS_KEYS)) {
    report(
      ctx,
      at(keys.analysis!.line),
      new EngineError(
        'SHEET_PARSE',
        `Unknown analysis "${keys.analysis!.value}"; the analyses are spectrum, harmonic, history and walking.`,
      ),
    );
    return markFailed();
  }
  result.analysis = analysis;
  result.modes = keys.modes!.value;
  const allowed = new Set<Key>([...COMMON, ...ANALYSIS_KEYS[analysis]]);
  let misplaced = false;
  for (const [k, v] of Object.entries(keys) as [Key, KeyLine][]) {
    if (!allowed.has(k)) {
      report(
        ctx,
        at(v.line),
        new EngineError(
          'SHEET_PARSE',
          `"${k}:" is not a key of a ${analysis} analysis; its keys are ${[...COMMON, ...ANALYSIS_KEYS[analysis]].join(', ')}.`,
        ),
      );
      misplaced = true;
    }
  }
  if (misplaced) return markFailed();
  const r = new Reader(ctx, keys, at);
  const notes: string[] = [];
  try {
    const reg = lookupModes(ctx, r);
    const zeta = dampingList(ctx, r, reg, notes);
    if (analysis === 'spectrum') {
      const out = runSpectrum(ctx, r, reg, zeta, notes);
      result.spectrum = out.data;
      result.method = out.method;
      ctx.scope.set(name, out.bind);
    } else if (analysis === 'harmonic') {
      const out = runHarmonic(ctx, r, reg, zeta, notes);
      result.harmonic = out.data;
      result.method = out.method;
      ctx.scope.set(name, out.bind);
    } else if (analysis === 'history') {
      const out = runHistory(ctx, r, reg, zeta, notes);
      result.history = out.data;
      result.method = out.method;
      ctx.scope.set(name, out.bind);
    } else {
      const out = runWalking(ctx, r, reg, zeta);
      result.walking = out.data;
      result.method = out.method;
      ctx.scope.set(name, out.bind);
    }
  } catch (err) {
    if (err instanceof Reported) return markFailed();
    if (err instanceof EngineError && err.code === 'CANCELLED') throw err;
    report(ctx, at(0), err);
    return markFailed();
  }
  result.notes = notes;
  ctx.failed.delete(name);
  result.ok = true;
  return result;
}
