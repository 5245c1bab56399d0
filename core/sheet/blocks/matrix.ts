/**
 * `matrix` blocks: a named matrix with one unit for its entries.
 *
 * ```
 * name: K              # required
 * unit: kN/m           # optional; no unit means plain numbers
 * symmetric: yes       # optional, yes (default for square matrices) or no
 * 48, -24, 0           # rows: numbers separated by spaces or commas, a trailing ';' allowed
 * -24, 48, -24
 * 0, -24, 24
 * ```
 * or `from: <upload name>` instead of rows (Matrix Market or CSV, read by the engine's readers).
 * `dofs:` labels the rows of a square matrix (../dof-labels.ts): `per node ux uy uz rx ry rz`,
 * `from <DOF map upload>` or `n1.ux, n2.ux`; a modes block builds `direction: x` from them.
 * A single column is bound as a vector. Symmetry is checked with the location and size of the
 * worst asymmetry: |a_ij − a_ji| ≤ 1e-9 · max |a| counts as symmetric (typed and exported values
 * round at about that level).
 */
import type { Matrix, Unit } from 'mathjs';
import { EngineError } from '../../errors';
import { formatContext, report, type EvalContext } from '../context';
import { formatValue, prefixName } from '../format';
import { blockLines, splitComment } from '../source';
import type { Asymmetry, MatrixBlockResult, SheetBlock } from '../types';
import { toSymmetricMatrix, type ParsedMatrix } from '../../linalg/matrix-io';
import type { SparseSymmetricMatrix } from '../../linalg/types';
import { fullNonzeros, LARGE_UPLOAD_MIN_ROWS, LargeMatrix } from '../large-matrix';
import { readUpload, uploadRows } from './upload';
import {
  checkDistinct,
  dofLabelsFromList,
  dofLabelsFromMap,
  dofLabelsFromRule,
  ruleComponents,
} from '../dof-labels';
import { MATRIX_DOFS } from '../generators';

/**
 * The labels `dofs:` gives the rows of a square matrix of size n.
 * @throws EngineError MATRIX_SIZE_MISMATCH when their number is not n; SHEET_PARSE for a bad label.
 */
function readDofLabels(ctx: EvalContext, text: string, n: number, name: string): string[] {
  const what = `${name} (${n}×${n})`;
  const rule = ruleComponents(text);
  let labels: string[];
  let source = '"dofs:"';
  if (rule) {
    labels = dofLabelsFromRule(rule, n, what);
  } else {
    const m = /^from\s+(.+)$/i.exec(text.trim());
    if (m) {
      const { file, parsed } = readUpload(ctx, m[1]!.trim());
      labels = dofLabelsFromMap(uploadRows(ctx, file, parsed), file);
      source = `The DOF map ${file}`;
    } else {
      labels = dofLabelsFromList(text);
    }
  }
  if (labels.length !== n) {
    throw new EngineError(
      'MATRIX_SIZE_MISMATCH',
      `${source} gives ${labels.length} DOF label${labels.length === 1 ? '' : 's'} but ${what} has ${n} rows: one label per row of the matrix, in its order.`,
      { labels: labels.length, n },
    );
  }
  checkDistinct(labels);
  return labels;
}

/** Relative asymmetry below which a matrix counts as symmetric. */
export const SYMMETRY_TOLERANCE = 1e-9;

const HEADER_KEYS = ['name', 'unit', 'symmetric', 'from', 'dofs'] as const;
type HeaderKey = (typeof HEADER_KEYS)[number];

const NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

/** A coordinate or triplet upload large enough to be an analysis model: kept sparse. */
function isLargeSparse(p: ParsedMatrix): boolean {
  return (
    (p.format === 'coordinate' || p.format === 'csv-triplets') && p.rows >= LARGE_UPLOAD_MIN_ROWS
  );
}

/** The worst asymmetry of a square matrix given as rows, or null when exactly symmetric. */
export function worstAsymmetry(rows: ArrayLike<number>[]): Asymmetry | null {
  const n = rows.length;
  let maxAbs = 0;
  for (const r of rows)
    for (let j = 0; j < r.length; j++) maxAbs = Math.max(maxAbs, Math.abs(r[j]!));
  let worst: Asymmetry | null = null;
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      const upper = rows[i]![j]!;
      const lower = rows[j]![i]!;
      const d = Math.abs(upper - lower);
      if (d > 0 && (!worst || d / maxAbs > worst.relative)) {
        worst = { row: i + 1, col: j + 1, upper, lower, relative: d / maxAbs };
      }
    }
  }
  return worst;
}

/** Parses a unit for a matrix block or a key; throws SHEET_PARSE naming the unit. */
export function parseUnit(ctx: EvalContext, text: string): Unit {
  try {
    const u = ctx.sm.math.unit(text);
    if (u.units.length === 0) throw new Error('no unit');
    return u;
  } catch {
    throw new EngineError(
      'SHEET_PARSE',
      `"${text}" is not a unit a sheet knows (for example kN/m, kg, t, N/mm).`,
    );
  }
}

export function evaluateMatrixBlock(
  ctx: EvalContext,
  block: SheetBlock,
  blockIndex: number,
): MatrixBlockResult {
  const at = (line: number) => ({ blockId: block.id, blockIndex, line });
  const result: MatrixBlockResult = {
    kind: 'matrix',
    blockId: block.id,
    blockIndex,
    ok: false,
    name: null,
    unit: null,
    origin: 'inline',
    rows: 0,
    cols: 0,
    mustBeSymmetric: true,
    symmetric: false,
    asymmetry: null,
    value: null,
  };
  const header: Partial<Record<HeaderKey, { value: string; line: number }>> = {};
  const rows: number[][] = [];
  const rowLines: number[] = [];
  let failed = false;
  const lines = blockLines(block.source);
  for (let i = 0; i < lines.length; i++) {
    const line = i + 1;
    const { code } = splitComment(lines[i]!);
    const text = code.trim();
    if (text === '') continue;
    const kv = /^([A-Za-z][A-Za-z ]*?)\s*:\s*(.*)$/.exec(text);
    if (kv) {
      const key = kv[1]!.toLowerCase() as HeaderKey;
      if (rows.length > 0) {
        report(
          ctx,
          at(line),
          new EngineError('SHEET_PARSE', `"${kv[1]}:" must come before the rows of numbers.`),
        );
        failed = true;
        continue;
      }
      if (!HEADER_KEYS.includes(key)) {
        report(
          ctx,
          at(line),
          new EngineError(
            'SHEET_PARSE',
            `Unknown key "${kv[1]}" in a matrix block; the keys are ${HEADER_KEYS.join(', ')}.`,
          ),
        );
        failed = true;
        continue;
      }
      if (header[key]) {
        report(
          ctx,
          at(line),
          new EngineError(
            'SHEET_PARSE',
            `"${key}:" is given twice (first on line ${header[key].line}).`,
          ),
        );
        failed = true;
        continue;
      }
      header[key] = { value: kv[2]!.trim(), line };
      continue;
    }
    const tokens = text
      .replace(/;\s*$/, '')
      .split(/[\s,]+/)
      .filter((t) => t !== '');
    const bad = tokens.find((t) => !NUMBER.test(t));
    if (bad !== undefined) {
      report(
        ctx,
        at(line),
        new EngineError(
          'SHEET_PARSE',
          `"${bad}" is not a number. A matrix row is numbers separated by spaces or commas; the unit goes in "unit:".`,
        ),
      );
      failed = true;
      continue;
    }
    if (rows.length > 0 && tokens.length !== rows[0]!.length) {
      report(
        ctx,
        at(line),
        new EngineError(
          'SHEET_PARSE',
          `This row has ${tokens.length} entries; the first row (line ${rowLines[0]}) has ${rows[0]!.length}.`,
        ),
      );
      failed = true;
      continue;
    }
    rows.push(tokens.map(Number));
    rowLines.push(line);
  }

  const name = header.name?.value ?? null;
  result.name = name;
  if (!header.name) {
    report(
      ctx,
      at(1),
      new EngineError('SHEET_PARSE', 'A matrix block needs a name: add a line "name: K".'),
    );
    return result;
  }
  if (!/^[A-Za-z][A-Za-z0-9_]*$/.test(header.name.value)) {
    report(
      ctx,
      at(header.name.line),
      new EngineError(
        'SHEET_PARSE',
        `"${header.name.value}" is not a valid name: use letters, digits and _, starting with a letter.`,
      ),
    );
    return result;
  }
  const fail = (): MatrixBlockResult => {
    ctx.failed.set(header.name!.value, at(header.name!.line));
    ctx.scope.delete(header.name!.value);
    return result;
  };
  if (failed) return fail();
  // Reported at the `dofs:` line: the labels and the matrix size must agree.
  const dofsAt = (n: number): string[] => {
    try {
      return readDofLabels(ctx, header.dofs!.value, n, name!);
    } catch (err) {
      throw new ReportedAt(header.dofs!.line, err);
    }
  };

  let unit: Unit | null = null;
  if (header.unit && header.unit.value !== '' && header.unit.value !== '1') {
    try {
      unit = parseUnit(ctx, header.unit.value);
      result.unit = header.unit.value;
    } catch (err) {
      report(ctx, at(header.unit.line), err);
      return fail();
    }
  }
  if (header.symmetric) {
    const v = header.symmetric.value.toLowerCase();
    if (v !== 'yes' && v !== 'no') {
      report(
        ctx,
        at(header.symmetric.line),
        new EngineError(
          'SHEET_PARSE',
          `"symmetric:" is yes or no (got "${header.symmetric.value}").`,
        ),
      );
      return fail();
    }
    result.mustBeSymmetric = v === 'yes';
  }

  let data: number[][] = rows;
  if (header.from) {
    if (rows.length > 0) {
      report(
        ctx,
        at(rowLines[0]!),
        new EngineError('SHEET_PARSE', 'A matrix block has either rows or "from:", not both.'),
      );
      return fail();
    }
    result.origin = 'upload';
    try {
      const { file, parsed } = readUpload(ctx, header.from.value);
      if (isLargeSparse(parsed)) {
        // An analysis model's K or M: stays sparse, in SI, for the modes blocks.
        if (header.symmetric?.value.toLowerCase() === 'no') {
          throw new EngineError(
            'SHEET_PARSE',
            `${file} is a large sparse matrix (${parsed.rows} × ${parsed.cols}); it is kept as a symmetric stiffness or mass matrix, so "symmetric: no" cannot apply.`,
          );
        }
        const A = toSymmetricMatrix(parsed, file) as SparseSymmetricMatrix;
        const factor = unit ? (ctx.sm.math.unit(1, unit.formatUnits()).value as number) : 1;
        const values = Float64Array.from(A.values, (x) => x * factor);
        const engine: SparseSymmetricMatrix = { ...A, values };
        const large = new LargeMatrix(
          name!,
          engine,
          unit ? unit.formatUnits() : null,
          fullNonzeros(A),
          header.dofs ? dofsAt(A.n) : null,
        );
        result.rows = large.n;
        result.cols = large.n;
        result.storage = 'sparse';
        result.nonzeros = large.nonzeros;
        result.symmetric = true;
        result.value = formatValue(large, formatContext(ctx, name)).value;
        ctx.scope.set(name!, large);
        ctx.failed.delete(name!);
        result.ok = true;
        return result;
      }
      data = uploadRows(ctx, file, parsed);
    } catch (err) {
      if (err instanceof ReportedAt) report(ctx, at(err.line), err.cause);
      else report(ctx, at(header.from.line), err);
      return fail();
    }
  } else if (rows.length === 0) {
    report(
      ctx,
      at(header.name.line),
      new EngineError(
        'SHEET_PARSE',
        `Matrix ${name} has no rows: add rows of numbers or "from: <uploaded file>".`,
      ),
    );
    return fail();
  }
  const nr = data.length;
  const nc = data[0]?.length ?? 0;
  result.rows = nr;
  result.cols = nc;
  if (nr * nc > ctx.maxMatrixEntries) {
    report(
      ctx,
      at(header.from?.line ?? 1),
      new EngineError(
        'SHEET_LIMIT',
        `Matrix ${name} has ${nr * nc} entries; a sheet value may hold at most ${ctx.maxMatrixEntries}.`,
      ),
    );
    return fail();
  }
  for (let i = 0; i < nr; i++) {
    for (let j = 0; j < nc; j++) {
      if (!Number.isFinite(data[i]![j]!)) {
        report(
          ctx,
          at(rowLines[i] ?? header.from?.line ?? 1),
          new EngineError(
            'MATRIX_NOT_FINITE',
            `${name}[${i + 1},${j + 1}] is not a finite number.`,
          ),
        );
        return fail();
      }
    }
  }
  if (nr === nc) {
    result.asymmetry = worstAsymmetry(data);
    result.symmetric = result.asymmetry === null || result.asymmetry.relative <= SYMMETRY_TOLERANCE;
    if (!result.symmetric && result.mustBeSymmetric) {
      const a = result.asymmetry!;
      const pct = a.relative * 100;
      report(
        ctx,
        at(rowLines[a.col - 1] ?? header.from?.line ?? header.name.line),
        new EngineError(
          'MATRIX_NOT_SYMMETRIC',
          `${name} is not symmetric: ${name}[${a.row},${a.col}] = ${a.upper} but ${name}[${a.col},${a.row}] = ${a.lower} ` +
            `(difference ${pct.toPrecision(3)} % of the largest entry; the worst place). Correct the entry, or write "symmetric: no" if it is meant to be.`,
          { row: a.row, col: a.col },
        ),
      );
      return fail();
    }
  } else if (header.symmetric?.value.toLowerCase() === 'yes') {
    report(
      ctx,
      at(header.symmetric.line),
      new EngineError(
        'MATRIX_NOT_SQUARE',
        `${name} is ${nr}×${nc}; only a square matrix can be symmetric.`,
      ),
    );
    return fail();
  } else {
    result.mustBeSymmetric = false;
  }

  let labels: string[] | null = null;
  if (header.dofs) {
    try {
      if (nr !== nc) {
        throw new ReportedAt(
          header.dofs.line,
          new EngineError(
            'MATRIX_NOT_SQUARE',
            `${name} is ${nr}×${nc}; only a square matrix has DOF labels.`,
          ),
        );
      }
      labels = dofsAt(nr);
    } catch (err) {
      const e = err as ReportedAt;
      report(ctx, at(e.line), e.cause);
      return fail();
    }
  }
  const { math } = ctx.sm;
  const plain: Matrix = nc === 1 ? math.matrix(data.map((r) => r[0]!)) : math.matrix(data);
  const value = unit ? (math.multiply(plain, math.unit(1, unit.formatUnits())) as Matrix) : plain;
  const written = new Set<string>(unit ? unit.units.map((c) => prefixName(c) + c.unit.name) : []);
  try {
    result.value = formatValue(value, formatContext(ctx, name, written)).value;
  } catch (err) {
    report(ctx, at(header.name.line), err);
    return fail();
  }
  if (labels) MATRIX_DOFS.set(value, labels);
  ctx.scope.set(name!, value);
  ctx.failed.delete(name!);
  result.ok = true;
  return result;
}

/** An error to report at a given line of the block rather than the line being read. */
class ReportedAt extends Error {
  constructor(
    readonly line: number,
    override readonly cause: unknown,
  ) {
    super('reported at a line');
  }
}
