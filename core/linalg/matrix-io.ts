/**
 * Text formats for matrices: Matrix Market (NIST, "The Matrix Market Exchange Formats: Initial
 * Design", Boisvert, Pozo & Remington, 1996) in coordinate and array form, fields real, integer
 * and pattern, symmetry general and symmetric; and CSV, either dense rows or `i,j,value` triplets
 * (1-based) under a header line `i,j,value`.
 *
 * Readers refuse bad files with the line number and the reason. Core does no I/O: these work on
 * strings; the command line and the API read the files.
 */
import { EngineError } from '../errors';
import { assertDenseSymmetric } from './dense';
import { sparseSymmetricFromTriplets } from './sparse';
import type { DenseMatrix, SymmetricMatrix } from './types';

/** A matrix as read from a file, every entry with the line it came from (1-based indices). */
export interface ParsedMatrix {
  rows: number;
  cols: number;
  format: 'coordinate' | 'array' | 'csv-dense' | 'csv-triplets';
  /** True when the file stores only the lower triangle of a symmetric matrix. */
  symmetricStorage: boolean;
  /** 0-based row and column of each entry, its value and its file line. */
  rowIdx: Int32Array;
  colIdx: Int32Array;
  values: Float64Array;
  lines: Int32Array;
}

/**
 * Largest order a matrix file may declare: a size line is read before any entry, and the readers
 * allocate per row, so a lying size line is refused before it allocates. Ten million rows is far
 * past any model a sheet solves (common practice: bound untrusted sizes before allocating).
 */
export const MAX_MATRIX_ORDER = 10_000_000;

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eEdD][+-]?\d+)?$/;
const NON_FINITE = /^[+-]?(nan|inf|infinity)$/i;

function fileError(
  name: string,
  line: number,
  reason: string,
  details: Record<string, unknown> = {},
): EngineError {
  return new EngineError('MATRIX_FILE_INVALID', `${name}, line ${line}: ${reason}`, {
    line,
    ...details,
  });
}

function parseNumber(
  tok: string,
  name: string,
  line: number,
  what: string,
  integer = false,
): number {
  if (NON_FINITE.test(tok)) {
    throw new EngineError(
      'MATRIX_NOT_FINITE',
      `${name}, line ${line}: ${what} is '${tok}'; every entry must be a finite number.`,
      {
        line,
      },
    );
  }
  if (!NUMBER.test(tok)) {
    throw fileError(name, line, `${what} '${tok}' is not a number.`);
  }
  const v = Number(tok.replace(/[dD]/, 'e'));
  if (!Number.isFinite(v)) {
    throw new EngineError(
      'MATRIX_NOT_FINITE',
      `${name}, line ${line}: ${what} '${tok}' overflows to ${v}.`,
      { line },
    );
  }
  if (integer && !Number.isInteger(v)) {
    throw fileError(
      name,
      line,
      `${what} '${tok}' is not a whole number, as the header's 'integer' field requires.`,
    );
  }
  return v;
}

function parseIndex(
  tok: string | undefined,
  name: string,
  line: number,
  what: string,
  max: number,
): number {
  if (tok === undefined || !/^\d+$/.test(tok)) {
    throw fileError(name, line, `the ${what} index '${tok ?? ''}' is not a whole number ≥ 1.`);
  }
  const v = Number(tok);
  if (v < 1) {
    throw fileError(name, line, `${what} index ${v} is out of range: indices start at 1.`, {
      index: v,
    });
  }
  if (v > max) {
    throw fileError(
      name,
      line,
      `${what} index ${v} is out of range 1…${max} given by the size line.`,
      { index: v },
    );
  }
  return v - 1;
}

/**
 * Reads a Matrix Market file.
 * @param name how the file is called in messages (e.g. 'K.mtx').
 * @throws EngineError MATRIX_FILE_INVALID (line and reason: bad header, unsupported field or
 *   symmetry, non-numeric entry, index out of range, missing or surplus entries, an upper-triangle
 *   entry in a symmetric file), MATRIX_NOT_FINITE (NaN/Inf, with the line).
 * @example parseMatrixMarket('%%MatrixMarket matrix coordinate real symmetric\n2 2 3\n1 1 2\n2 1 -1\n2 2 2\n', 'K.mtx')
 */
export function parseMatrixMarket(text: string, name = 'matrix file'): ParsedMatrix {
  const lines = text.split(/\r?\n/);
  const header = (lines[0] ?? '').trim();
  const h = header.split(/\s+/).map((t) => t.toLowerCase());
  if (h[0] !== '%%matrixmarket' || h[1] !== 'matrix' || h.length < 5) {
    throw fileError(
      name,
      1,
      "the first line must be '%%MatrixMarket matrix <coordinate|array> <real|integer|pattern> <general|symmetric>'.",
    );
  }
  const format = h[2];
  const field = h[3];
  const symmetry = h[4];
  if (format !== 'coordinate' && format !== 'array') {
    throw fileError(name, 1, `the format '${format}' is not supported; use coordinate or array.`);
  }
  if (field !== 'real' && field !== 'integer' && field !== 'pattern' && field !== 'double') {
    throw fileError(
      name,
      1,
      `the field '${field}' is not supported; a stiffness or mass matrix is real, integer or pattern.`,
    );
  }
  if (field === 'pattern' && format === 'array') {
    throw fileError(name, 1, "the field 'pattern' only goes with the coordinate format.");
  }
  if (symmetry !== 'general' && symmetry !== 'symmetric') {
    throw fileError(
      name,
      1,
      `the symmetry '${symmetry}' is not supported; use general or symmetric.`,
    );
  }
  const integer = field === 'integer';
  let li = 1;
  const nextDataLine = (): { toks: string[]; line: number } | null => {
    while (li < lines.length) {
      const raw = (lines[li] as string).trim();
      li++;
      if (raw === '' || raw.startsWith('%')) continue;
      return { toks: raw.split(/\s+/), line: li };
    }
    return null;
  };
  const sizeLine = nextDataLine();
  if (!sizeLine) throw fileError(name, lines.length, 'the size line is missing.');
  const need = format === 'coordinate' ? 3 : 2;
  if (sizeLine.toks.length !== need || !sizeLine.toks.every((t) => /^\d+$/.test(t))) {
    throw fileError(
      name,
      sizeLine.line,
      format === 'coordinate'
        ? `the size line must be 'rows columns entries' (three whole numbers), got '${sizeLine.toks.join(' ')}'.`
        : `the size line must be 'rows columns' (two whole numbers), got '${sizeLine.toks.join(' ')}'.`,
    );
  }
  const rows = Number(sizeLine.toks[0]);
  const cols = Number(sizeLine.toks[1]);
  if (rows > MAX_MATRIX_ORDER || cols > MAX_MATRIX_ORDER) {
    throw fileError(
      name,
      sizeLine.line,
      `the size line says ${sizeLine.toks[0]} × ${sizeLine.toks[1]}; a matrix file may have at most ${MAX_MATRIX_ORDER.toLocaleString('en')} rows and columns.`,
      { rows, cols },
    );
  }
  const symmetric = symmetry === 'symmetric';
  if (symmetric && rows !== cols) {
    throw new EngineError(
      'MATRIX_NOT_SQUARE',
      `${name}, line ${sizeLine.line}: a symmetric matrix must be square, the size line says ${rows} × ${cols}.`,
      {
        line: sizeLine.line,
      },
    );
  }
  const rI: number[] = [];
  const cI: number[] = [];
  const vals: number[] = [];
  const lns: number[] = [];
  if (format === 'coordinate') {
    const nnz = Number(sizeLine.toks[2]);
    for (;;) {
      const d = nextDataLine();
      if (!d) break;
      if (vals.length >= nnz) {
        throw fileError(
          name,
          d.line,
          `the size line announces ${nnz} entries but there are more; the size header disagrees with the data.`,
          {
            expected: nnz,
          },
        );
      }
      const want = field === 'pattern' ? 2 : 3;
      if (d.toks.length !== want) {
        throw fileError(
          name,
          d.line,
          `an entry must be '${field === 'pattern' ? 'row column' : 'row column value'}', got '${d.toks.join(' ')}'.`,
        );
      }
      const i = parseIndex(d.toks[0], name, d.line, 'row', rows);
      const j = parseIndex(d.toks[1], name, d.line, 'column', cols);
      const v =
        field === 'pattern'
          ? 1
          : parseNumber(d.toks[2] as string, name, d.line, 'the value', integer);
      if (symmetric && i < j) {
        throw fileError(
          name,
          d.line,
          `entry (${i + 1}, ${j + 1}) lies above the diagonal; a symmetric file lists the lower triangle only (row ≥ column).`,
        );
      }
      rI.push(i);
      cI.push(j);
      vals.push(v);
      lns.push(d.line);
    }
    if (vals.length < nnz) {
      throw fileError(
        name,
        lines.length,
        `missing entries: the size line announces ${nnz} but the file has ${vals.length}.`,
        {
          expected: nnz,
          found: vals.length,
        },
      );
    }
  } else {
    // column-major; symmetric: lower triangle column by column
    const cells: [number, number][] = [];
    for (let j = 0; j < cols; j++)
      for (let i = symmetric ? j : 0; i < rows; i++) cells.push([i, j]);
    let k = 0;
    for (;;) {
      const d = nextDataLine();
      if (!d) break;
      for (const tok of d.toks) {
        if (k >= cells.length) {
          throw fileError(
            name,
            d.line,
            `a ${rows} × ${cols} ${symmetric ? 'symmetric ' : ''}array has ${cells.length} values but there are more; the size header disagrees with the data.`,
          );
        }
        const [i, j] = cells[k] as [number, number];
        rI.push(i);
        cI.push(j);
        vals.push(parseNumber(tok, name, d.line, `entry (${i + 1}, ${j + 1})`, integer));
        lns.push(d.line);
        k++;
      }
    }
    if (k < cells.length) {
      throw fileError(
        name,
        lines.length,
        `missing entries: a ${rows} × ${cols} ${symmetric ? 'symmetric ' : ''}array needs ${cells.length} values but the file has ${k}.`,
        {
          expected: cells.length,
          found: k,
        },
      );
    }
  }
  return {
    rows,
    cols,
    format,
    symmetricStorage: symmetric,
    rowIdx: Int32Array.from(rI),
    colIdx: Int32Array.from(cI),
    values: Float64Array.from(vals),
    lines: Int32Array.from(lns),
  };
}

/**
 * Reads a CSV matrix: dense rows of numbers, or triplets under a header line `i,j,value`
 * (1-based indices; the size is the largest index). Blank lines and lines starting with '#' are
 * skipped.
 * @throws EngineError MATRIX_FILE_INVALID (line and reason), MATRIX_NOT_FINITE.
 * @example parseCsvMatrix('2,-1\n-1,2\n', 'K.csv')
 */
export function parseCsvMatrix(text: string, name = 'CSV file'): ParsedMatrix {
  const lines = text.split(/\r?\n/);
  const data: { toks: string[]; line: number }[] = [];
  lines.forEach((raw, k) => {
    const t = raw.trim();
    if (t === '' || t.startsWith('#')) return;
    data.push({ toks: t.split(',').map((s) => s.trim()), line: k + 1 });
  });
  if (data.length === 0) throw fileError(name, 1, 'the file holds no numbers.');
  const first = data[0] as { toks: string[]; line: number };
  const isTriplet =
    first.toks.length === 3 &&
    /^(i|row)$/i.test(first.toks[0] as string) &&
    /^(j|col|column)$/i.test(first.toks[1] as string) &&
    /^(value|v)$/i.test(first.toks[2] as string);
  const rI: number[] = [];
  const cI: number[] = [];
  const vals: number[] = [];
  const lns: number[] = [];
  if (isTriplet) {
    let n = 0;
    for (const d of data.slice(1)) {
      if (d.toks.length !== 3) {
        throw fileError(
          name,
          d.line,
          `a triplet line must be 'i,j,value', got ${d.toks.length} field${d.toks.length === 1 ? '' : 's'}.`,
        );
      }
      const i = parseIndex(d.toks[0], name, d.line, 'row', Number.MAX_SAFE_INTEGER);
      const j = parseIndex(d.toks[1], name, d.line, 'column', Number.MAX_SAFE_INTEGER);
      rI.push(i);
      cI.push(j);
      vals.push(parseNumber(d.toks[2] as string, name, d.line, 'the value'));
      lns.push(d.line);
      n = Math.max(n, i + 1, j + 1);
    }
    if (vals.length === 0)
      throw fileError(name, first.line, 'the header is followed by no triplets.');
    return {
      rows: n,
      cols: n,
      format: 'csv-triplets',
      symmetricStorage: false,
      rowIdx: Int32Array.from(rI),
      colIdx: Int32Array.from(cI),
      values: Float64Array.from(vals),
      lines: Int32Array.from(lns),
    };
  }
  const cols = first.toks.length;
  data.forEach((d, i) => {
    if (d.toks.length !== cols) {
      throw fileError(
        name,
        d.line,
        `row ${i + 1} has ${d.toks.length} entries but row 1 has ${cols}.`,
        { row: i + 1 },
      );
    }
    d.toks.forEach((tok, j) => {
      rI.push(i);
      cI.push(j);
      vals.push(parseNumber(tok, name, d.line, `entry (${i + 1}, ${j + 1})`));
      lns.push(d.line);
    });
  });
  return {
    rows: data.length,
    cols,
    format: 'csv-dense',
    symmetricStorage: false,
    rowIdx: Int32Array.from(rI),
    colIdx: Int32Array.from(cI),
    values: Float64Array.from(vals),
    lines: Int32Array.from(lns),
  };
}

/**
 * Turns a parsed file into a symmetric matrix: coordinate and triplet files → sparse, array and
 * dense CSV → dense. General files must be symmetric (|a_ij − a_ji| ≤ 1e-9 max(|a_ij|, |a_ji|));
 * duplicate coordinate entries are summed.
 * @throws EngineError MATRIX_NOT_SQUARE, MATRIX_NOT_SYMMETRIC naming both entries and their lines.
 * @example toSymmetricMatrix(parseMatrixMarket(text, 'K.mtx'), 'K.mtx')
 */
export function toSymmetricMatrix(p: ParsedMatrix, name = 'matrix file'): SymmetricMatrix {
  if (p.rows !== p.cols) {
    throw new EngineError(
      'MATRIX_NOT_SQUARE',
      `${name} is ${p.rows} × ${p.cols}; a stiffness or mass matrix must be square.`,
      {
        rows: p.rows,
        cols: p.cols,
      },
    );
  }
  const n = p.rows;
  if (p.format === 'array' || p.format === 'csv-dense') {
    const data = new Float64Array(n * n);
    for (let k = 0; k < p.values.length; k++) {
      const i = p.rowIdx[k] as number;
      const j = p.colIdx[k] as number;
      data[i * n + j] = p.values[k] as number;
      if (p.symmetricStorage) data[j * n + i] = p.values[k] as number;
    }
    const A: DenseMatrix = { kind: 'dense', rows: n, cols: n, data };
    try {
      assertDenseSymmetric(A, name);
    } catch (e) {
      if (e instanceof EngineError && e.code === 'MATRIX_NOT_SYMMETRIC' && e.details) {
        const r = e.details.row as number;
        const c = e.details.col as number;
        const lineOf = (i: number, j: number) => {
          for (let k = 0; k < p.values.length; k++)
            if (p.rowIdx[k] === i && p.colIdx[k] === j) return p.lines[k];
          return undefined;
        };
        throw new EngineError(
          'MATRIX_NOT_SYMMETRIC',
          `${e.message} (lines ${lineOf(r - 1, c - 1)} and ${lineOf(c - 1, r - 1)})`,
          e.details,
        );
      }
      throw e;
    }
    return A;
  }
  if (p.symmetricStorage) return sparseSymmetricFromTriplets(n, p.rowIdx, p.colIdx, p.values);
  // general coordinate: sum duplicates, check each entry against its mirror, keep the lower triangle
  const map = new Map<number, { v: number; line: number }>();
  for (let k = 0; k < p.values.length; k++) {
    const key = (p.rowIdx[k] as number) * n + (p.colIdx[k] as number);
    const prev = map.get(key);
    if (prev) prev.v += p.values[k] as number;
    else map.set(key, { v: p.values[k] as number, line: p.lines[k] as number });
  }
  const rI: number[] = [];
  const cI: number[] = [];
  const vals: number[] = [];
  for (const [key, e] of map) {
    const i = Math.floor(key / n);
    const j = key % n;
    if (i < j) continue;
    if (i !== j) {
      const mirror = map.get(j * n + i);
      const mv = mirror?.v ?? 0;
      const diff = Math.abs(e.v - mv);
      if (diff > 1e-9 * Math.max(Math.abs(e.v), Math.abs(mv))) {
        throw new EngineError(
          'MATRIX_NOT_SYMMETRIC',
          `${name} is not symmetric: entry (${i + 1}, ${j + 1}) = ${e.v} on line ${e.line} but (${j + 1}, ${i + 1}) = ${mv}${mirror ? ` on line ${mirror.line}` : ' (not given)'}; difference ${diff.toPrecision(3)}.`,
          { row: i + 1, col: j + 1, line: e.line, difference: diff },
        );
      }
    }
    rI.push(i);
    cI.push(j);
    vals.push(e.v);
  }
  for (const [key, e] of map) {
    const i = Math.floor(key / n);
    const j = key % n;
    if (i < j && !map.has(j * n + i) && e.v !== 0) {
      throw new EngineError(
        'MATRIX_NOT_SYMMETRIC',
        `${name} is not symmetric: entry (${i + 1}, ${j + 1}) = ${e.v} on line ${e.line} but (${j + 1}, ${i + 1}) is not given.`,
        { row: i + 1, col: j + 1, line: e.line },
      );
    }
  }
  return sparseSymmetricFromTriplets(n, rI, cI, vals);
}

/**
 * Reads a symmetric matrix from Matrix Market or CSV text ('auto': Matrix Market when the text
 * starts with '%%MatrixMarket', CSV otherwise).
 * @throws as `parseMatrixMarket`, `parseCsvMatrix` and `toSymmetricMatrix`.
 * @example readSymmetricMatrix(fileText, { name: 'K.mtx' })
 */
export function readSymmetricMatrix(
  text: string,
  options: { name?: string; format?: 'auto' | 'matrix-market' | 'csv' } = {},
): SymmetricMatrix {
  const name = options.name ?? 'matrix file';
  const format = options.format ?? 'auto';
  const mm = format === 'matrix-market' || (format === 'auto' && /^\s*%%MatrixMarket/i.test(text));
  return toSymmetricMatrix(mm ? parseMatrixMarket(text, name) : parseCsvMatrix(text, name), name);
}

/**
 * Writes a symmetric matrix as Matrix Market: sparse → 'coordinate real symmetric' (lower
 * triangle), dense → 'array real symmetric' (lower triangle, column by column). Values are written
 * with the shortest text that reads back to the same double.
 * @example writeMatrixMarket(K, { comment: 'storey chain, N/m' })
 */
export function writeMatrixMarket(A: SymmetricMatrix, options: { comment?: string } = {}): string {
  const out: string[] = [];
  const comment = options.comment ? options.comment.split(/\r?\n/).map((l) => `% ${l}`) : [];
  if (A.kind === 'sparse-symmetric') {
    out.push('%%MatrixMarket matrix coordinate real symmetric', ...comment);
    out.push(`${A.n} ${A.n} ${A.values.length}`);
    for (let j = 0; j < A.n; j++)
      for (let p = A.colPtr[j] as number; p < (A.colPtr[j + 1] as number); p++)
        out.push(`${(A.rowIdx[p] as number) + 1} ${j + 1} ${String(A.values[p])}`);
  } else {
    const n = A.rows;
    out.push('%%MatrixMarket matrix array real symmetric', ...comment);
    out.push(`${n} ${n}`);
    for (let j = 0; j < n; j++) for (let i = j; i < n; i++) out.push(String(A.data[i * n + j]));
  }
  return out.join('\n') + '\n';
}

/**
 * Writes a symmetric matrix as CSV: dense rows, or with `triplets` the header `i,j,value` and both
 * triangles' nonzeros (1-based).
 * @example writeCsvMatrix(M, { triplets: true })
 */
export function writeCsvMatrix(A: SymmetricMatrix, options: { triplets?: boolean } = {}): string {
  const out: string[] = [];
  if (options.triplets) {
    out.push('i,j,value');
    if (A.kind === 'sparse-symmetric') {
      for (let j = 0; j < A.n; j++)
        for (let p = A.colPtr[j] as number; p < (A.colPtr[j + 1] as number); p++) {
          const i = A.rowIdx[p] as number;
          out.push(`${i + 1},${j + 1},${String(A.values[p])}`);
          if (i !== j) out.push(`${j + 1},${i + 1},${String(A.values[p])}`);
        }
    } else {
      const n = A.rows;
      for (let i = 0; i < n; i++)
        for (let j = 0; j < n; j++) {
          const v = A.data[i * n + j] as number;
          if (v !== 0) out.push(`${i + 1},${j + 1},${String(v)}`);
        }
    }
  } else {
    const n = A.kind === 'dense' ? A.rows : A.n;
    const rows: number[][] = Array.from({ length: n }, () => new Array<number>(n).fill(0));
    if (A.kind === 'dense') {
      for (let i = 0; i < n; i++)
        for (let j = 0; j < n; j++) (rows[i] as number[])[j] = A.data[i * n + j] as number;
    } else {
      for (let j = 0; j < n; j++)
        for (let p = A.colPtr[j] as number; p < (A.colPtr[j + 1] as number); p++) {
          const i = A.rowIdx[p] as number;
          (rows[i] as number[])[j] = A.values[p] as number;
          (rows[j] as number[])[i] = A.values[p] as number;
        }
    }
    for (const r of rows) out.push(r.map((v) => String(v)).join(','));
  }
  return out.join('\n') + '\n';
}
