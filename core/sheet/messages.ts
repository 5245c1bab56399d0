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
  m = /Index out of range \((\d+) > (\d+)\)/.exec(msg);
  if (m) {
    return new EngineError(
      'SHEET_EVAL',
      `Index out of range: asked for entry ${Number(m[1]) + 1}, but there are only ${Number(m[2]) + 1}. Indices start at 1.`,
    );
  }
  if (/Index out of range \((-?\d+) < 0\)|Index.*must be.*positive/i.test(msg)) {
    return new EngineError('SHEET_EVAL', 'Index out of range: indices start at 1.');
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
