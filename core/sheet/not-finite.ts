/**
 * Words for a result that is not a finite number. IEEE 754 double precision (IEEE Std 754-2019,
 * binary64) holds magnitudes up to about 1.8e308 (2^1024 − 2^971); past that a result is infinite,
 * and an undefined operation (0/0, ∞ − ∞, 0 · ∞) gives NaN. A sheet cannot store either, so the
 * engineer is told which operation produced it: a division by zero, a logarithm of zero, an
 * overflow, or a NaN typed in; and, in a modes block, which matrix and which entry.
 */
import type { MathNode } from 'mathjs';
import type { SymmetricMatrix } from '../linalg/types';

/** The largest finite double, written as engineers quote it. */
const LARGEST = 'about 1.8e308';

/** "larger than about 1.8e308" or "below about −1.8e308". */
export function beyond(value: number): string {
  return value > 0 ? `larger than ${LARGEST}` : `below about −1.8e308`;
}

const DIVISIONS = new Set(['divide', 'dotDivide', 'mod']);
const LOGARITHMS = new Set(['log', 'log10', 'log2', 'log1p']);

/** Past this many nodes an expression gets the short message without a search (bounded work). */
const MAX_DIAGNOSED_NODES = 400;

function magnitude(v: unknown): number | null {
  if (typeof v === 'number') return v;
  if (typeof v === 'object' && v !== null && typeof (v as { value?: unknown }).value === 'number') {
    // a mathjs Unit: its SI value
    return (v as { value: number }).value;
  }
  return null;
}

function childrenOf(node: MathNode): MathNode[] {
  // A function's arguments, not the name it is called by.
  if (node.type === 'FunctionNode') return [...(node as unknown as { args: MathNode[] }).args];
  const out: MathNode[] = [];
  node.forEach((child) => {
    out.push(child);
  });
  return out;
}

function countNodes(node: MathNode, limit: number): number {
  let n = 0;
  const walk = (x: MathNode) => {
    if (n > limit) return;
    n++;
    childrenOf(x).forEach(walk);
  };
  walk(node);
  return n;
}

function fnName(node: MathNode): string | null {
  const n = node as unknown as { fn?: unknown; name?: unknown; type: string };
  if (node.type === 'OperatorNode' && typeof n.fn === 'string') return n.fn;
  if (node.type === 'FunctionNode') {
    const fn = n.fn as { name?: unknown } | undefined;
    return typeof fn?.name === 'string' ? fn.name : null;
  }
  return null;
}

function words(node: MathNode, value: number): string {
  const text = node.toString();
  const shown = text.length > 60 ? `${text.slice(0, 57)}…` : text;
  if (Number.isNaN(value)) return `${shown} is not a number (NaN)`;
  return `${shown} is ${beyond(value)}`;
}

/** The message for the first node, innermost first, whose value is not finite from finite parts. */
function explain(node: MathNode, value: number, parts: unknown[]): string {
  const name = fnName(node);
  const symbol = (node as unknown as { name?: unknown }).name;
  if (node.type === 'SymbolNode' && (symbol === 'NaN' || symbol === 'Infinity')) {
    return `${symbol} is not a value a sheet can calculate with; give a number.`;
  }
  if (
    node.type === 'ConstantNode' &&
    !Number.isFinite(value) &&
    /NaN|Infinity/.test(node.toString())
  ) {
    return `${node.toString()} is not a value a sheet can calculate with; give a number.`;
  }
  if (node.type === 'ConstantNode') {
    return `The number ${node.toString()} is ${beyond(value)}, past the largest a calculation can hold.`;
  }
  if (name && DIVISIONS.has(name) && parts.length === 2 && magnitude(parts[1]) === 0) {
    return magnitude(parts[0]) === 0
      ? `Division of zero by zero: ${node.toString()} is undefined (0/0).`
      : `Division by zero: the divisor in ${node.toString()} is zero.`;
  }
  if (name && LOGARITHMS.has(name) && magnitude(parts[0]) === 0) {
    return `The logarithm of zero is minus infinity: ${node.toString()}.`;
  }
  if (Number.isNaN(value)) {
    return `${words(node, value)}: an undefined operation such as ∞ − ∞ or 0 · ∞ in between.`;
  }
  return `Overflow: ${words(node, value)}, past the largest number a calculation can hold. Check the exponent and the units.`;
}

/**
 * Explains why a calc line's value is not finite. `evaluate` evaluates a part of the expression in
 * the line's scope; the search goes innermost first and stops at the first part whose value is not
 * finite while its own parts are. Falls back to the value's own words when a part cannot be
 * evaluated or the expression is very large.
 *
 * @param node the line's expression (the right-hand side of an assignment)
 * @param value the non-finite number found (the result, or one entry of it)
 * @param evaluate evaluates a sub-expression; may throw
 * @returns one sentence an engineer can act on
 * @example nonFiniteMessage(parse('2^1e6'), Infinity, evaluate)
 *   // 'Overflow: 2 ^ 1e6 is larger than about 1.8e308, …'
 */
export function nonFiniteMessage(
  node: MathNode,
  value: number,
  evaluate: (n: MathNode) => unknown,
): string {
  const fallback = Number.isNaN(value)
    ? 'The result is not a number (NaN): an undefined operation such as 0/0 or ∞ − ∞.'
    : `The result is ${beyond(value)}, past the largest number a calculation can hold (an overflow, or a division by zero).`;
  if (countNodes(node, MAX_DIAGNOSED_NODES) > MAX_DIAGNOSED_NODES) return fallback;
  const search = (x: MathNode): string | null => {
    const kids = childrenOf(x);
    const parts: unknown[] = [];
    for (const k of kids) {
      const inner = search(k);
      if (inner) return inner;
      parts.push(evaluate(k));
    }
    const m = magnitude(evaluate(x));
    if (m !== null && !Number.isFinite(m)) return explain(x, m, parts);
    return null;
  };
  try {
    return search(node) ?? fallback;
  } catch {
    return fallback;
  }
}

/** The path of the first number in a plain result that is not finite, as `modes[0].frequency`. */
export function firstNonFinitePath(
  value: unknown,
  skip: (key: string) => boolean = () => false,
  path = '',
  depth = 0,
): { path: string; value: number } | null {
  if (typeof value === 'number') return Number.isFinite(value) ? null : { path, value };
  if (depth > 12 || value === null || typeof value !== 'object') return null;
  if (Array.isArray(value) || ArrayBuffer.isView(value)) {
    const arr = value as ArrayLike<unknown>;
    for (let i = 0; i < arr.length; i++) {
      const found = firstNonFinitePath(arr[i], skip, `${path}[${i}]`, depth + 1);
      if (found) return found;
    }
    return null;
  }
  for (const [k, v] of Object.entries(value)) {
    if (skip(k)) continue;
    const found = firstNonFinitePath(v, skip, path ? `${path}.${k}` : k, depth + 1);
    if (found) return found;
  }
  return null;
}

interface EntryFault {
  row: number;
  col: number;
  value: number;
  kind: 'not-finite' | 'zero-diagonal';
}

function diagonalOf(A: SymmetricMatrix): (i: number) => number {
  if (A.kind === 'dense') return (i) => A.data[i * A.cols + i]!;
  return (j) => {
    for (let p = A.colPtr[j]!; p < A.colPtr[j + 1]!; p++) {
      if (A.rowIdx[p] === j) return A.values[p]!;
    }
    return 0;
  };
}

/** The first entry of a matrix that is not finite, else the first zero on its diagonal. */
export function matrixFault(A: SymmetricMatrix): EntryFault | null {
  if (A.kind === 'dense') {
    for (let k = 0; k < A.data.length; k++) {
      const x = A.data[k]!;
      if (!Number.isFinite(x)) {
        return {
          row: Math.floor(k / A.cols) + 1,
          col: (k % A.cols) + 1,
          value: x,
          kind: 'not-finite',
        };
      }
    }
  } else {
    for (let j = 0; j < A.n; j++) {
      for (let p = A.colPtr[j]!; p < A.colPtr[j + 1]!; p++) {
        const x = A.values[p]!;
        if (!Number.isFinite(x)) {
          return { row: A.rowIdx[p]! + 1, col: j + 1, value: x, kind: 'not-finite' };
        }
      }
    }
  }
  const n = A.kind === 'dense' ? A.rows : A.n;
  const diag = diagonalOf(A);
  for (let i = 0; i < n; i++) {
    if (diag(i) === 0) return { row: i + 1, col: i + 1, value: 0, kind: 'zero-diagonal' };
  }
  return null;
}

const RESULT_WORDS: Record<string, string> = {
  lambda: 'eigenvalue',
  omega: 'circular frequency',
  frequency: 'frequency',
  gamma: 'participation factor',
  effectiveMass: 'effective mass',
  ratio: 'mass ratio',
  cumulative: 'cumulative mass ratio',
  backwardError: 'backward error',
};

function describeResultPath(path: string): string {
  const mode = /^modes\[(\d+)\]\.(\w+)$/.exec(path);
  if (mode) return `the ${RESULT_WORDS[mode[2]!] ?? mode[2]} of mode ${Number(mode[1]) + 1}`;
  const shape = /^shapes\[(\d+)\]\[(\d+)\]$/.exec(path);
  if (shape) return `entry ${Number(shape[1]) + 1} of mode shape ${Number(shape[2]) + 1}`;
  return path.replace(/\[(\d+)\]/g, (_m, i: string) => `[${Number(i) + 1}]`);
}

/**
 * Explains a modes block whose solution holds a number that is not finite, naming the matrix and
 * the entry that causes it where one does: an entry of K or M that is not finite, else a zero on
 * the diagonal of M (a degree of freedom without mass) or of K (one without stiffness).
 *
 * @returns the message and which matrix it names ('K', 'M' or null when neither is at fault)
 * @example modesNotFiniteMessage('modes[0].frequency', NaN, K, M)
 *   // { matrix: 'M', message: 'The modes are not finite numbers (…): M is zero at entry (1, 1) …' }
 */
export function modesNotFiniteMessage(
  path: string,
  value: number,
  K: SymmetricMatrix,
  M: SymmetricMatrix,
): { matrix: 'K' | 'M' | null; message: string } {
  const what = `${describeResultPath(path)} is ${Number.isNaN(value) ? 'not a number (NaN)' : 'infinite'}`;
  const head = `The modes cannot be stored: ${what}.`;
  for (const [matrix, A] of [
    ['K', K],
    ['M', M],
  ] as const) {
    const f = matrixFault(A);
    if (f?.kind === 'not-finite') {
      return {
        matrix,
        message: `${head} ${matrix} entry (${f.row}, ${f.col}) is ${Number.isNaN(f.value) ? 'not a number' : 'infinite'}.`,
      };
    }
  }
  const m = matrixFault(M);
  if (m) {
    return {
      matrix: 'M',
      message: `${head} M is zero on its diagonal at entry (${m.row}, ${m.row}): every degree of freedom needs a mass (is M in mass units, and filled in?).`,
    };
  }
  const k = matrixFault(K);
  if (k) {
    return {
      matrix: 'K',
      message: `${head} K is zero on its diagonal at entry (${k.row}, ${k.row}): that degree of freedom has no stiffness.`,
    };
  }
  return {
    matrix: null,
    message: `${head} K or M is singular or badly scaled; check their entries and units.`,
  };
}
