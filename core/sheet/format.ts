/**
 * Turning mathjs values into what a sheet shows: a display unit an engineer would choose, a number
 * to the sheet's significant figures, LaTeX, and a JSON-safe `SheetValue`.
 *
 * Display unit rules, in order:
 * 1. A unit the engineer fixed — a literal such as `3000 rpm` or a conversion `k to N/m` — is kept.
 * 2. A compound unit made only of units written on the line, each of a different kind
 *    (`24 kN/mm`), is kept.
 * 3. Otherwise the dimension picks a named SI unit (N, Pa, Hz, N/m, N m, W, kg, …) and its
 *    prefix is chosen so the number reads between 1 and 1000 where the list allows
 *    (kN, MPa, kN/m, …). 1/s is shown in Hz, or in rad/s for names starting with `omega`.
 * 4. Any other dimension is shown in SI base units.
 */
import type { MathJsInstance, Matrix, Unit } from 'mathjs';
import { beyond } from './not-finite';
import { EngineError } from '../errors';
import { LargeMatrix } from './large-matrix';
import { denseEntries, sparseEntries } from './matrix-entries';
import type { SheetValue } from './types';

/** Entries above which a matrix value is summarized instead of listed in the results. */
export const RESULT_MATRIX_LIMIT = 10_000;
/** Entries above which the display string and LaTeX summarize a matrix. */
const DISPLAY_MATRIX_LIMIT = 36;

export interface FormatContext {
  math: MathJsInstance;
  significantFigures: number;
  /** Unit names (prefix + name) written literally on the line. */
  writtenUnits: ReadonlySet<string>;
  /** The name being assigned, for the ω hint. */
  name: string | null;
}

export interface Formatted {
  value: SheetValue;
  display: string;
  latex: string;
}

// Candidate display units per dimension (mass, length, time, current, temperature, luminous
// intensity, amount, angle, bit), smallest first. The first is the coherent SI unit.
const DISPLAY_UNITS: Record<string, string[]> = {
  '1,0,0,0,0,0,0,0,0': ['kg', 't'],
  '0,1,0,0,0,0,0,0,0': ['mm', 'm', 'km'],
  '0,0,1,0,0,0,0,0,0': ['s'],
  '0,0,-1,0,0,0,0,0,0': ['Hz'],
  '0,0,-1,0,0,0,0,1,0': ['rad/s'],
  '0,0,-2,0,0,0,0,0,0': ['1/s^2'],
  '0,1,-1,0,0,0,0,0,0': ['mm/s', 'm/s'],
  '0,1,-2,0,0,0,0,0,0': ['mm/s^2', 'm/s^2'],
  '1,1,-2,0,0,0,0,0,0': ['N', 'kN', 'MN', 'GN'],
  '1,-1,-2,0,0,0,0,0,0': ['Pa', 'kPa', 'MPa', 'GPa'],
  '1,0,-2,0,0,0,0,0,0': ['N/m', 'kN/m', 'MN/m', 'GN/m'],
  '1,2,-2,0,0,0,0,0,0': ['N m', 'kN m', 'MN m'],
  '1,3,-2,0,0,0,0,0,0': ['N m^2', 'kN m^2', 'MN m^2', 'GN m^2'],
  '1,2,-3,0,0,0,0,0,0': ['W', 'kW', 'MW'],
  '1,0,-1,0,0,0,0,0,0': ['N s/m', 'kN s/m', 'MN s/m'],
  '1,-1,0,0,0,0,0,0,0': ['kg/m', 't/m'],
  '1,-2,0,0,0,0,0,0,0': ['kg/m^2', 't/m^2'],
  '1,-3,0,0,0,0,0,0,0': ['kg/m^3', 't/m^3'],
  '1,2,0,0,0,0,0,0,0': ['kg m^2', 't m^2'],
  '0,2,0,0,0,0,0,0,0': ['mm^2', 'm^2'],
  '0,3,0,0,0,0,0,0,0': ['mm^3', 'm^3'],
  '0,4,0,0,0,0,0,0,0': ['mm^4', 'm^4'],
};
// The coherent SI member of each list (the one used for zero and for tiny values).
const COHERENT: Record<string, string> = {
  kg: 'kg',
  mm: 'm',
  ms: 's',
  'mm/s': 'm/s',
  'mm/s^2': 'm/s^2',
  'mm^2': 'm^2',
  'mm^3': 'm^3',
  'mm^4': 'm^4',
};

/** Formats a number to `sig` significant figures: `5.812`, `24`, `2.4e+7`, `1.2e-4`. */
export function formatNumber(x: number, sig: number): string {
  if (Number.isNaN(x)) return 'NaN';
  if (!Number.isFinite(x)) return x > 0 ? '∞' : '−∞';
  if (x === 0) return '0';
  const a = Math.abs(x);
  if (a >= 1e6 || a < 1e-3) {
    const [m, e] = x.toExponential(sig - 1).split('e');
    return `${String(Number(m))}e${e}`;
  }
  return String(Number(x.toPrecision(sig)));
}

/** LaTeX of a formatted number: `2.4 \times 10^{7}`. */
export function numberLatex(x: number, sig: number): string {
  const s = formatNumber(x, sig);
  const m = /^(-?[\d.]+)e([+-]\d+)$/.exec(s);
  if (m) return `${m[1]} \\times 10^{${Number(m[2])}}`;
  if (s === '∞') return '\\infty';
  if (s === '−∞') return '-\\infty';
  return s;
}

/** LaTeX of a unit string such as `kN / mm`, `kg m^2` or `1/s^2`. */
export function unitLatex(unit: string): string {
  const tokens = unit
    .replace(/\s*\/\s*/g, ' / ')
    .trim()
    .split(/\s+/);
  let out = '';
  let prevUnit = false;
  for (const t of tokens) {
    if (t === '/') {
      out += '/';
      prevUnit = false;
      continue;
    }
    const m = /^([^^]+)(?:\^(-?[\d.]+))?$/.exec(t);
    const base = m?.[1] ?? t;
    const body = /^\d+$/.test(base) ? base : `\\mathrm{${base}}`;
    out += (prevUnit ? '\\,' : '') + body + (m?.[2] ? `^{${m[2]}}` : '');
    prevUnit = true;
  }
  return out;
}

/** `kN / mm` → `kN/mm`. */
function compactUnit(u: string): string {
  return u.replace(/\s*\/\s*/g, '/').trim();
}

/** The prefix of a unit component (mathjs' types call it a string; at run time it is an object). */
export function prefixName(c: { prefix: unknown }): string {
  const p = c.prefix as { name?: string } | string;
  return typeof p === 'string' ? p : (p.name ?? '');
}

function dimensionKey(u: Unit): string {
  return u.dimensions.map((d) => (Math.abs(d) < 1e-12 ? 0 : d)).join(',');
}

function isDimensionless(u: Unit): boolean {
  return u.dimensions.every((d) => Math.abs(d) < 1e-12);
}

/** The unit string a quantity is displayed in, by the rules of the module comment. */
export function chooseDisplayUnit(u: Unit, ctx: FormatContext, magnitude?: number): string {
  const comps = u.units;
  const integerPowers = comps.every((c) => Number.isInteger(c.power));
  if (comps.length > 0 && integerPowers && u.skipAutomaticSimplification) {
    return compactUnit(u.formatUnits());
  }
  const bases = new Set(comps.map((c) => c.unit.base.key));
  const allWritten = comps.every((c) => ctx.writtenUnits.has(prefixName(c) + c.unit.name));
  if (comps.length > 0 && integerPowers && allWritten && bases.size === comps.length) {
    return compactUnit(u.formatUnits());
  }
  const key = dimensionKey(u);
  let candidates = DISPLAY_UNITS[key];
  if (key === '0,0,-1,0,0,0,0,0,0' && ctx.name && /^(omega|ω)/.test(ctx.name)) {
    candidates = ['rad/s'];
  }
  if (candidates) {
    const si = Math.abs(magnitude ?? u.value);
    if (!(si > 0) || !Number.isFinite(si)) {
      return (
        candidates.find((c) => COHERENT[c] === c) ?? COHERENT[candidates[0]!] ?? candidates[0]!
      );
    }
    let chosen = candidates[0]!;
    for (const c of candidates) {
      const factor = ctx.math.unit(1, c).value;
      if (si / factor >= 1) chosen = c;
    }
    return chosen;
  }
  return compactUnit(u.toSI().formatUnits());
}

function unitNumber(u: Unit, unit: string): number {
  if (unit === 'rad/s') return u.value; // 1/s and rad/s differ only by the angle dimension
  return u.toNumber(unit);
}

function isUnit(math: MathJsInstance, v: unknown): v is Unit {
  return math.isUnit(v);
}

/**
 * Refuses a value that is not finite. `details.notFinite` carries it, so the calc line can put
 * the operation that produced it into words (./not-finite.ts).
 */
function checkFinite(x: number, where: string): void {
  if (!Number.isFinite(x)) {
    const what = Number.isNaN(x)
      ? 'is not a number (NaN): an undefined operation such as 0/0 or ∞ − ∞'
      : `is ${beyond(x)}, past the largest number a calculation can hold (an overflow, or a division by zero)`;
    throw new EngineError('SHEET_EVAL', `${capitalise(where)} ${what}.`, { notFinite: x });
  }
}

function capitalise(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}

function quantity(u: Unit, unit: string): { value: number; si: number } {
  return { value: unitNumber(u, unit), si: u.value };
}

/** Formats a scalar (number or quantity) for display; throws on non-finite values. */
function formatScalar(v: number | Unit, ctx: FormatContext): Formatted {
  const { math, significantFigures: sig } = ctx;
  if (typeof v === 'number') {
    checkFinite(v, 'the result');
    return {
      value: { type: 'number', value: v },
      display: formatNumber(v, sig),
      latex: numberLatex(v, sig),
    };
  }
  checkFinite(v.value, 'the result');
  if (isDimensionless(v) && !v.units.some((c) => c.unit.base.key === 'ANGLE')) {
    return formatScalar(v.value, ctx);
  }
  const unit = chooseDisplayUnit(v, ctx);
  const q = quantity(v, unit);
  const siUnit = compactUnit(v.toSI().formatUnits());
  void math;
  return {
    value: { type: 'quantity', value: q.value, unit, si: q.si, siUnit },
    display: `${formatNumber(q.value, sig)} ${unit}`,
    latex: `${numberLatex(q.value, sig)}\\,${unitLatex(unit)}`,
  };
}

/** Flattens a 1-D or 2-D mathjs matrix into rows of entries. */
function matrixRows(m: Matrix): { rows: unknown[][]; vector: boolean } {
  const size = m.size();
  const data = m.toArray() as unknown[];
  if (size.length === 1) return { rows: data.map((x) => [x]), vector: true };
  if (size.length === 2) return { rows: data as unknown[][], vector: false };
  throw new EngineError(
    'SHEET_EVAL',
    `Arrays with ${size.length} dimensions are not supported; use vectors and matrices.`,
  );
}

/** Formats a vector or matrix; all entries must share one dimension. */
function formatMatrix(m: Matrix, ctx: FormatContext): Formatted {
  const { math, significantFigures: sig } = ctx;
  const { rows, vector } = matrixRows(m);
  const nr = rows.length;
  const nc = rows[0]?.length ?? 0;
  let ref: Unit | null = null;
  let maxSi = 0;
  for (let i = 0; i < nr; i++) {
    for (let j = 0; j < nc; j++) {
      const x = rows[i]![j];
      if (isUnit(math, x)) {
        checkFinite(x.value, `entry (${i + 1}, ${j + 1})`);
        if (ref && !ref.equalBase(x)) {
          throw new EngineError(
            'SHEET_EVAL',
            `The entries of this matrix have different units (${compactUnit(ref.formatUnits())} at one place, ${compactUnit(x.formatUnits())} at (${i + 1}, ${j + 1})); a matrix carries one unit.`,
          );
        }
        if (!ref) ref = x;
        maxSi = Math.max(maxSi, Math.abs(x.value));
      } else if (typeof x === 'number') {
        checkFinite(x, `entry (${i + 1}, ${j + 1})`);
      } else {
        throw new EngineError(
          'SHEET_EVAL',
          `Entry (${i + 1}, ${j + 1}) of this matrix is not a number or a quantity.`,
        );
      }
    }
  }
  const dimensionless =
    !ref || (isDimensionless(ref) && !ref.units.some((c) => c.unit.base.key === 'ANGLE'));
  let unit: string | null = null;
  if (!dimensionless && ref) {
    unit = chooseDisplayUnit(ref, ctx, maxSi);
  }
  const values: number[][] = rows.map((r, i) =>
    r.map((x, j) => {
      if (isUnit(math, x)) return unit ? unitNumber(x, unit) : x.value;
      const n = x as number;
      if (unit && n !== 0) {
        throw new EngineError(
          'SHEET_EVAL',
          `Entry (${i + 1}, ${j + 1}) of this matrix has no unit while others are in ${unit}; a matrix carries one unit.`,
        );
      }
      return n;
    }),
  );
  const count = nr * nc;
  const unitText = unit ? ` ${unit}` : '';
  const unitTex = unit ? `\\,${unitLatex(unit)}` : '';
  let display: string;
  let latex: string;
  if (count > DISPLAY_MATRIX_LIMIT) {
    display = vector ? `[vector of ${nr}]${unitText}` : `[${nr}×${nc} matrix]${unitText}`;
    latex = vector
      ? `\\text{vector of ${nr}}${unitTex}`
      : `\\text{${nr}\\times ${nc} matrix}${unitTex}`;
  } else if (vector) {
    display = `[${values.map((r) => formatNumber(r[0]!, sig)).join(', ')}]${unitText}`;
    latex = `\\begin{bmatrix}${values.map((r) => numberLatex(r[0]!, sig)).join('\\\\')}\\end{bmatrix}${unitTex}`;
  } else {
    display = `[${values.map((r) => `[${r.map((x) => formatNumber(x, sig)).join(', ')}]`).join(', ')}]${unitText}`;
    latex = `\\begin{bmatrix}${values.map((r) => r.map((x) => numberLatex(x, sig)).join('&')).join('\\\\')}\\end{bmatrix}${unitTex}`;
  }
  const keep = count <= RESULT_MATRIX_LIMIT;
  const value: SheetValue = vector
    ? { type: 'vector', length: nr, values: keep ? values.map((r) => r[0]!) : null, unit }
    : {
        type: 'matrix',
        rows: nr,
        cols: nc,
        values: keep ? values : null,
        unit,
        ...(keep ? {} : { entries: denseEntries(values) }),
      };
  return { value, display, latex };
}

/** Text for LaTeX's \\text{…}: the characters LaTeX would read as commands blanked. */
const plainText = (s: string): string => s.replace(/[\\{}$&#^_%~]/g, ' ');

/** LaTeX of a quoted word as written: upright, in quotes, a hyphen staying a hyphen. */
export const quotedTex = (s: string): string => `\\text{“${plainText(s)}”}`;

/** LaTeX of an object's key: upright, with characters LaTeX would read as commands blanked. */
export const texKey = (key: string): string =>
  `\\mathrm{${key.replace(/[^A-Za-z0-9_]/g, ' ').replace(/_/g, '\\_')}}`;

/**
 * LaTeX of an object value as a short summary, not its contents: each field by name, with the
 * size of a matrix or vector, the value of a number, the field names of a nested object.
 *
 * @example
 * // a beam model: {K [32 × 32], M [32 × 32], influence {w}, n = 32, r [32]}
 */
function objectSummaryTex(fields: Record<string, SheetValue>): string {
  const parts = Object.entries(fields).map(([key, f]) => {
    switch (f.type) {
      case 'matrix':
        return `${texKey(key)}\\;[${f.rows}\\times${f.cols}]`;
      case 'vector':
        return `${texKey(key)}\\;[${f.length}]`;
      case 'number':
        return `${texKey(key)}=${f.value}`;
      case 'object':
        return `${texKey(key)}\\;\\{${Object.keys(f.fields).map(texKey).join(',')}\\}`;
      default:
        return texKey(key);
    }
  });
  return `\\left\\{${parts.join(',\\ ')}\\right\\}`;
}

/**
 * Formats any value a sheet line can produce.
 *
 * @throws EngineError SHEET_EVAL for non-finite numbers (division by zero), complex results,
 *   matrices mixing units, or values a sheet cannot show.
 */
export function formatValue(v: unknown, ctx: FormatContext, depth = 0): Formatted {
  const { math } = ctx;
  if (typeof v === 'number' || isUnit(math, v)) return formatScalar(v, ctx);
  if (typeof v === 'boolean') {
    return {
      value: { type: 'boolean', value: v },
      display: v ? 'true' : 'false',
      latex: `\\text{${v ? 'true' : 'false'}}`,
    };
  }
  if (typeof v === 'string') {
    return {
      value: { type: 'string', value: v },
      display: JSON.stringify(v),
      latex: quotedTex(v),
    };
  }
  if (v instanceof LargeMatrix) {
    return {
      value: {
        type: 'matrix',
        rows: v.n,
        cols: v.n,
        values: null,
        unit: v.unit,
        sparse: { nonzeros: v.nonzeros, bytes: v.bytes },
        entries: sparseEntries(v.engine, v.unit ? (math.unit(1, v.unit).value as number) : 1),
      },
      display: `${v.n}×${v.n} sparse matrix, ${v.nonzeros} nonzeros${v.unit ? ` in ${compactUnit(v.unit)}` : ''}`,
      latex: `\\left[${v.n}\\times${v.n},\\ \\text{sparse, ${v.nonzeros} nonzeros}\\right]`,
    };
  }
  if (math.isMatrix(v)) return formatMatrix(v as Matrix, ctx);
  if (Array.isArray(v)) return formatMatrix(math.matrix(v as number[]), ctx);
  if (math.isComplex(v)) {
    throw new EngineError(
      'SHEET_EVAL',
      'The result is a complex number (the square root of a negative value?); a sheet works with real values.',
    );
  }
  if (typeof v === 'function') {
    const sig = (v as { syntax?: string }).syntax ?? (v as { name?: string }).name ?? 'function';
    return {
      value: { type: 'function', signature: sig },
      display: sig,
      latex: `\\text{${plainText(sig)}}`,
    };
  }
  if (v !== null && typeof v === 'object' && Object.getPrototypeOf(v) === Object.prototype) {
    if (depth > 4)
      throw new EngineError('SHEET_EVAL', 'Objects nested more than four deep cannot be shown.');
    const fields: Record<string, SheetValue> = {};
    const parts: string[] = [];
    for (const key of Object.keys(v).sort()) {
      const f = formatValue((v as Record<string, unknown>)[key], { ...ctx, name: key }, depth + 1);
      fields[key] = f.value;
      parts.push(`${key}: ${f.display}`);
    }
    return {
      value: { type: 'object', fields },
      display: `{${parts.join(', ')}}`,
      latex: objectSummaryTex(fields),
    };
  }
  if (v === undefined || v === null) {
    throw new EngineError('SHEET_EVAL', 'This line gives no value.');
  }
  throw new EngineError('SHEET_EVAL', `A sheet cannot show a value of type ${math.typeOf(v)}.`);
}
