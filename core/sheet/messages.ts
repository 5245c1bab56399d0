/**
 * Rewrites mathjs' error messages into an engineer's words: unknown names with a suggestion,
 * units that do not match with the two units named, matrix sizes, syntax errors with the place.
 */
import type { MathNode, Unit } from 'mathjs';
import { EngineError, isEngineError } from '../errors';
import { FORBIDDEN_NAMES, type SheetMath } from './math';
import type { SheetLocation } from './types';
import { isGeneratedBlockId } from '../vocabulary';

export interface MessageContext {
  sm: SheetMath;
  scope: Map<string, unknown>;
  /** Names whose defining line failed, and where. */
  failed: Map<string, SheetLocation>;
  blockIds: readonly string[];
}

function levenshtein(a: string, b: string): number {
  const m = a.length;
  const n = b.length;
  let prev = Array.from({ length: n + 1 }, (_, j) => j);
  for (let i = 1; i <= m; i++) {
    const cur = [i];
    for (let j = 1; j <= n; j++) {
      cur[j] = Math.min(
        prev[j]! + 1,
        cur[j - 1]! + 1,
        prev[j - 1]! + (a[i - 1] === b[j - 1] ? 0 : 1),
      );
    }
    prev = cur;
  }
  return prev[n]!;
}

/** The name in scope closest to `name`, when one is close enough to be a likely typo. */
export function suggestName(name: string, names: Iterable<string>): string | null {
  const squash = (s: string) => s.replace(/_/g, '').toLowerCase();
  let best: string | null = null;
  let bestScore = Infinity;
  for (const c of [...names].sort()) {
    if (c === name) continue;
    const score = squash(c) === squash(name) ? 0 : levenshtein(c, name);
    if (score < bestScore) {
      best = c;
      bestScore = score;
    }
  }
  const limit = name.length <= 3 ? 1 : 2;
  return best !== null && bestScore <= limit ? best : null;
}

/**
 * A block as the author sees it: its place in the sheet ("block 3"), with its id only when a
 * person gave it one ("block 2 (deck-data)"); the editor's generated ids (`b` and 12 hex digits)
 * mean nothing to a reader.
 */
export function blockName(at: Pick<SheetLocation, 'blockId' | 'blockIndex'>): string {
  const place = `block ${at.blockIndex + 1}`;
  return isGeneratedBlockId(at.blockId) ? place : `${place} ("${at.blockId}")`;
}

/** Explains why `name` is not known at this point. */
export function unknownNameMessage(name: string, ctx: MessageContext): string {
  if (FORBIDDEN_NAMES.has(name)) return `${name} is not available in a sheet.`;
  const f = ctx.failed.get(name);
  if (f) {
    return `Unknown name "${name}": line ${f.line} of ${blockName(f)} would define it but has an error.`;
  }
  const s = suggestName(name, ctx.scope.keys());
  return s
    ? `Unknown name "${name}" — did you mean "${s}"?`
    : `Unknown name "${name}": it is not defined above this line and is not a unit.`;
}

const OPERATION_WORDS: Record<string, string> = {
  add: 'add',
  subtract: 'subtract',
  larger: 'compare',
  smaller: 'compare',
  largerEq: 'compare',
  smallerEq: 'compare',
  equal: 'compare',
  unequal: 'compare',
  compare: 'compare',
};

function describeUnit(sm: SheetMath, v: unknown): string | null {
  if (sm.math.isUnit(v)) return (v as Unit).formatUnits().replace(/\s*\/\s*/g, '/');
  if (typeof v === 'number') return 'a plain number';
  return null;
}

/** Finds the first add/subtract/comparison whose two sides have different dimensions. */
function findUnitMismatch(node: MathNode, ctx: MessageContext): string | null {
  const { sm } = ctx;
  const candidates = node.filter((n) => {
    const op = n as unknown as { type: string; fn?: string; args?: MathNode[] };
    return (
      op.type === 'OperatorNode' && !!op.fn && op.fn in OPERATION_WORDS && op.args?.length === 2
    );
  });
  // Innermost first: filter lists parents before children.
  for (const n of candidates.reverse()) {
    const op = n as unknown as { fn: string; args: [MathNode, MathNode] };
    let a: unknown;
    let b: unknown;
    try {
      a = op.args[0].compile().evaluate(new Map(ctx.scope));
      b = op.args[1].compile().evaluate(new Map(ctx.scope));
    } catch {
      continue;
    }
    const au = sm.math.isUnit(a) ? (a as Unit) : null;
    const bu = sm.math.isUnit(b) ? (b as Unit) : null;
    const mismatch =
      (au && bu && !au.equalBase(bu)) ||
      (au && typeof b === 'number') ||
      (bu && typeof a === 'number');
    if (mismatch) {
      const word = OPERATION_WORDS[op.fn] ?? op.fn;
      const da = describeUnit(sm, a);
      const db = describeUnit(sm, b);
      return `Units do not match: cannot ${word} ${da} and ${db}.`;
    }
  }
  return null;
}

/**
 * The value of a pure look-up (`plant_x`, `plant_x.directions.x`), or undefined for anything that
 * would have to be computed: a look-up has no cost and no effect, so it can be read for a message.
 */
function lookUp(node: MathNode, scope: Map<string, unknown>): unknown {
  if (node.type === 'SymbolNode') return scope.get((node as unknown as { name: string }).name);
  const key = dotKey(node);
  if (key === null) return undefined;
  const obj = lookUp((node as unknown as { object: MathNode }).object, scope);
  return isRecord(obj) && Object.hasOwn(obj, key) ? obj[key] : undefined;
}

/** The key of `a.key` (an accessor in dot notation), else null. */
function dotKey(node: MathNode): string | null {
  if (node.type !== 'AccessorNode') return null;
  const index = (
    node as unknown as { index: { dotNotation?: boolean; getObjectProperty(): string | null } }
  ).index;
  return index.dotNotation ? index.getObjectProperty() : null;
}

/** A result object of the sheet (a generator's model, a modes or response result). */
function isRecord(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && Object.getPrototypeOf(v) === Object.prototype;
}

/**
 * Refuses `plant_x.cumulativ` before mathjs gives "Cannot apply index: unsupported type of object"
 * (or no value at all): the key is named with the object's keys and the nearest of them.
 * @throws EngineError SHEET_EVAL "No key "cumulativ" on "plant_x"; its keys are …".
 */
export function checkKeys(node: MathNode, scope: Map<string, unknown>): void {
  node.traverse((n) => {
    const key = dotKey(n);
    if (key === null) return;
    const objectNode = (n as unknown as { object: MathNode }).object;
    const obj = lookUp(objectNode, scope);
    if (!isRecord(obj) || Object.hasOwn(obj, key)) return;
    const keys = Object.keys(obj);
    const near = key.length > 1 ? suggestName(key, keys) : null;
    throw new EngineError(
      'SHEET_EVAL',
      `No key "${key}" on "${objectNode.toString()}"; its keys are ${keys.join(', ')}` +
        `${near ? ` — did you mean "${near}"?` : '.'}`,
      { key },
    );
  });
}

/** The innermost `a[i]` of the expression whose look-up fails, with what `a` is. */
function failingIndex(
  node: MathNode | null,
  ctx: MessageContext,
): { text: string; value: unknown } | null {
  if (!node) return null;
  const accessors = node.filter((n) => n.type === 'AccessorNode' && dotKey(n) === null).reverse();
  for (const n of accessors) {
    const object = (n as unknown as { object: MathNode }).object;
    try {
      n.compile().evaluate(new Map(ctx.scope));
    } catch {
      let value: unknown;
      try {
        value = object.compile().evaluate(new Map(ctx.scope));
      } catch {
        continue;
      }
      return { text: object.toString(), value };
    }
  }
  return null;
}

function sizeWords(ctx: MessageContext, v: unknown): string | null {
  const { math } = ctx.sm;
  if (!math.isMatrix(v)) return null;
  const size = (v as { size(): number[] }).size();
  return size.length === 1 ? `${size[0]} entr${size[0] === 1 ? 'y' : 'ies'}` : size.join('×');
}

/** "plant_x.f has 3 entries: " or "", for the start of an index message. */
function indexedWords(node: MathNode | null, ctx: MessageContext): string {
  const f = failingIndex(node, ctx);
  const size = f ? sizeWords(ctx, f.value) : null;
  return f && size ? `${f.text} has ${size}: ` : '';
}

/** An index past either end, with what was indexed and its size; indices start at 1. */
function indexMessage(
  node: MathNode | null,
  ctx: MessageContext,
  asked: number,
  max: number | null,
): string {
  const f = failingIndex(node, ctx);
  const size = f ? sizeWords(ctx, f.value) : null;
  const what = f ? `${f.text}${size ? ` (${size})` : ''}` : 'the value';
  return max === null
    ? `Index out of range: ${what} has no entry ${asked}; indices start at 1.`
    : `Index out of range: ${what} has no entry ${asked}; its indices run from 1 to ${max}.`;
}

/** What a call `x(…)` / `a.x(…)` called, when it is a value in scope rather than a function. */
function calledValue(
  node: MathNode | null,
  ctx: MessageContext,
  name: string,
): { text: string; what: string; args: string } | null {
  if (!node) return null;
  for (const n of node.filter((x) => x.type === 'FunctionNode')) {
    const fn = (n as unknown as { fn: MathNode; args: MathNode[] }).fn;
    const text = fn.toString();
    if (!(text === name || text.endsWith(`.${name}`))) continue;
    const value = lookUp(fn, ctx.scope);
    if (value === undefined || typeof value === 'function') continue;
    const size = sizeWords(ctx, value);
    const args = (n as unknown as { args: MathNode[] }).args.map((a) => a.toString()).join(', ');
    return { text, what: size ? `a list of ${size}` : 'a value', args };
  }
  return null;
}

/** How many arguments the line gives the function `name`, or null when it cannot tell. */
function calledArgs(node: MathNode | null, name: string): number | null {
  if (!node) return null;
  const calls = node.filter(
    (x) => x.type === 'FunctionNode' && (x as unknown as { fn: MathNode }).fn.toString() === name,
  );
  return calls.length === 1 ? (calls[0] as unknown as { args: MathNode[] }).args.length : null;
}

/** Rewrites an evaluation error for the engineer. Keeps the code of typed engine errors. */
export function rewriteError(
  err: unknown,
  node: MathNode | null,
  ctx: MessageContext,
): EngineError {
  if (isEngineError(err)) return err;
  const msg = err instanceof Error ? err.message : String(err);
  let m = /^Undefined (?:symbol|function) (\S+)/.exec(msg);
  if (m) return new EngineError('SHEET_EVAL', unknownNameMessage(m[1]!, ctx), { name: m[1] });
  if (
    /Units do not match|Cannot compare units with different base|Unexpected type of argument in function (add|subtract|larger|smaller|equal|unequal|compare)/.test(
      msg,
    )
  ) {
    const found = node ? findUnitMismatch(node, ctx) : null;
    if (found) return new EngineError('SHEET_EVAL', found);
    return new EngineError('SHEET_EVAL', 'Units do not match.');
  }
  if (/Dimension mismatch/.test(msg)) {
    return new EngineError(
      'SHEET_EVAL',
      `Matrix sizes do not match: ${msg.replace(/^Dimension mismatch\.?\s*/, '')}`,
    );
  }
  m = /Index out of range \((-?\d+) ([<>]) (\d+)\)/.exec(msg);
  if (m) {
    const max = m[2] === '>' ? Number(m[3]) : null;
    return new EngineError('SHEET_EVAL', indexMessage(node, ctx, Number(m[1]), max));
  }
  if (/Index must be an integer/.test(msg)) {
    return new EngineError(
      'SHEET_EVAL',
      `${indexedWords(node, ctx)}an index must be a whole number from 1 (entry 1, 2, 3…).`,
    );
  }
  m = /^'(\w+)' is not a function/.exec(msg) ?? /^No access to method "(\w+)"/.exec(msg);
  if (m) {
    const called = calledValue(node, ctx, m[1]!);
    if (called) {
      return new EngineError(
        'SHEET_EVAL',
        `"${called.text}" is ${called.what}, not a function: write ${called.text}[${called.args}] ` +
          `(square brackets) to take an entry.`,
      );
    }
  }
  m = /^Too (many|few) arguments in function (\w+) \(expected: ([^,)]+)/.exec(msg);
  if (m) {
    const given = calledArgs(node, m[2]!);
    const expected = /^\d+$/.test(m[3]!) ? Number(m[3]) : null;
    return new EngineError(
      'SHEET_EVAL',
      `${m[2]} was given ${given === null ? (m[1] === 'many' ? 'too many' : 'too few') : given} ` +
        `argument${given === 1 ? '' : 's'}${expected !== null ? `; it takes ${expected}` : m[1] === 'few' ? '; it needs more' : ''}.`,
    );
  }
  if (/No access to property|No access to method/.test(msg)) {
    return new EngineError('SHEET_EVAL', `${msg.replace(/"/g, '"')}: not available in a sheet.`);
  }
  if (/Cannot convert .* to a number|Unexpected type of argument/.test(msg)) {
    return new EngineError('SHEET_EVAL', `Wrong kind of value: ${msg}`);
  }
  return new EngineError('SHEET_EVAL', msg);
}

/** Rewrites a mathjs syntax error: "Cannot read this line: unexpected end (at character 7)." */
export function syntaxMessage(err: unknown): string {
  const msg = err instanceof Error ? err.message : String(err);
  const m = /^(.*?)\s*\(char (\d+)\)$/.exec(msg);
  if (m)
    return `Cannot read this line: ${m[1]!.charAt(0).toLowerCase()}${m[1]!.slice(1)} (at character ${m[2]}).`;
  return `Cannot read this line: ${msg}`;
}
