/**
 * The state an evaluation carries from block to block: the scope (names flow top to bottom),
 * names whose line failed, the collected errors, and helpers shared by the block evaluators.
 */
import type { MathNode } from 'mathjs';
import { EngineError, isEngineError } from '../errors';
import { prefixName, type FormatContext } from './format';
import { FORBIDDEN_NAMES, type SheetMath } from './math';
import { blockName, checkKeys, rewriteError, syntaxMessage, type MessageContext } from './messages';
import type { EvaluateOptions, SheetIssue, SheetLocation, SheetUpload } from './types';

export const DEFAULT_MAX_MATRIX_ENTRIES = 4_000_000;

/**
 * Where a name's defining line or block failed. `via` is set when it failed only because it used
 * another failed name (it was not evaluated): following `via` leads to the first error.
 */
export interface FailedName extends SheetLocation {
  via?: string;
}

export interface EvalContext {
  sm: SheetMath;
  scope: Map<string, unknown>;
  failed: Map<string, FailedName>;
  errors: SheetIssue[];
  significantFigures: number;
  uploads: readonly SheetUpload[];
  maxMatrixEntries: number;
  blockIds: readonly string[];
  options: EvaluateOptions;
  /** LaTeX each name was shown with on its defining line, for the substituted forms below. */
  shown: Map<string, { value: unknown; latex: string }>;
}

export function messageContext(ctx: EvalContext): MessageContext {
  return { sm: ctx.sm, scope: ctx.scope, failed: ctx.failed, blockIds: ctx.blockIds };
}

export function formatContext(
  ctx: EvalContext,
  name: string | null,
  writtenUnits: ReadonlySet<string> = new Set(),
): FormatContext {
  return { math: ctx.sm.math, significantFigures: ctx.significantFigures, writtenUnits, name };
}

/** Records an error at a location; a NOT_EVALUATED error is recorded as a note. */
export function report(
  ctx: EvalContext,
  at: SheetLocation,
  err: unknown,
  node: MathNode | null = null,
): void {
  const e = rewriteError(err, node, messageContext(ctx));
  if (e.code === NOT_EVALUATED) {
    const dependsOn = String(e.details?.dependsOn ?? '');
    ctx.errors.push({ ...at, message: e.message, code: e.code, severity: 'note', dependsOn });
    return;
  }
  ctx.errors.push({ ...at, message: e.message, code: e.code });
}

/** The code of a line or block left unevaluated because a name it uses failed above. */
export const NOT_EVALUATED = 'NOT_EVALUATED' as const;

/** The first failure a failed name goes back to (following `via`), with its name. */
function firstFailure(ctx: EvalContext, name: string): { name: string; at: FailedName } | null {
  let at = ctx.failed.get(name);
  const seen = new Set<string>();
  while (at?.via && !seen.has(at.via)) {
    seen.add(name);
    const next = ctx.failed.get(at.via);
    if (!next) break;
    name = at.via;
    at = next;
  }
  return at ? { name, at } : null;
}

/**
 * The note for an expression that uses a name whose line failed above (and is not defined since),
 * or null. The note names the failed name and where the first error is, so the author fixes that
 * one line instead of reading a second wave of "unknown name" errors.
 */
export function dependencyNote(ctx: EvalContext, node: MathNode): EngineError | null {
  let used: string | null = null;
  node.traverse((n, _path, parent) => {
    if (used || n.type !== 'SymbolNode') return;
    const name = (n as unknown as { name: string }).name;
    if (ctx.scope.has(name) || !ctx.failed.has(name)) return;
    if (
      parent &&
      parent.type === 'AssignmentNode' &&
      (parent as unknown as { object: MathNode }).object === n
    )
      return;
    used = name;
  });
  if (used === null) return null;
  return notEvaluated(ctx, used);
}

/** The NOT_EVALUATED note for something that uses the failed name `name`. */
export function notEvaluated(ctx: EvalContext, name: string): EngineError {
  const direct = ctx.failed.get(name)!;
  const first = firstFailure(ctx, name) ?? { name, at: direct };
  const where = (at: SheetLocation) =>
    at.line > 0 ? `line ${at.line} of ${blockName(at)}` : blockName(at);
  const message =
    first.name === name
      ? `Not evaluated: depends on "${name}", which failed on ${where(direct)}.`
      : `Not evaluated: depends on "${name}", which was not evaluated either; the first error is ` +
        `"${first.name}" on ${where(first.at)}.`;
  return new EngineError(NOT_EVALUATED, message, { dependsOn: name, root: first.name });
}

/**
 * Marks `name` as failed at `at`. When every issue the failure left (`issues`) is a note, the
 * name failed only through the name those notes depend on, which `via` records.
 */
export function markFailed(
  ctx: EvalContext,
  name: string,
  at: SheetLocation,
  issues: readonly SheetIssue[],
): void {
  const via =
    issues.length > 0 && issues.every((i) => i.severity === 'note')
      ? issues[0]!.dependsOn
      : undefined;
  ctx.failed.set(name, via ? { ...at, via } : { ...at });
  ctx.scope.delete(name);
}

/** Parses one expression; throws SHEET_PARSE with an engineer's message. */
export function parseExpression(ctx: EvalContext, code: string): MathNode {
  let node: MathNode;
  try {
    node = ctx.sm.parse(code);
  } catch (err) {
    if (isEngineError(err)) throw err;
    throw new EngineError('SHEET_PARSE', syntaxMessage(err));
  }
  if (node.type === 'BlockNode') {
    throw new EngineError(
      'SHEET_PARSE',
      'Write one statement per line (found a ";" or a line break).',
    );
  }
  checkForbidden(ctx, node);
  return node;
}

/** Refuses any reference to a function a sheet may not use. */
export function checkForbidden(ctx: EvalContext, node: MathNode): void {
  node.traverse((n, _path, parent) => {
    if (n.type !== 'SymbolNode') return;
    const name = (n as unknown as { name: string }).name;
    if (ctx.scope.has(name)) return;
    // The target of an assignment is a definition, not a use.
    if (
      parent &&
      parent.type === 'AssignmentNode' &&
      (parent as unknown as { object: MathNode }).object === n
    )
      return;
    const member = (ctx.sm.math as unknown as Record<string, unknown>)[name];
    if (
      FORBIDDEN_NAMES.has(name) ||
      (/^[A-Z]/.test(name) && typeof member === 'function' && name !== 'Infinity')
    ) {
      throw new EngineError('SHEET_EVAL', `${name} is not available in a sheet.`, { name });
    }
  });
}

/** Evaluates a parsed expression against the scope, checking cancellation first. */
export function evaluateNode(
  ctx: EvalContext,
  node: MathNode,
  scope: Map<string, unknown> = ctx.scope,
): unknown {
  if (ctx.options.isCancelled?.()) {
    throw new EngineError('CANCELLED', 'The evaluation was cancelled.');
  }
  checkKeys(node, scope);
  return node.compile().evaluate(scope);
}

/** Unit names (prefix + name) written literally in an expression. */
export function writtenUnits(ctx: EvalContext, node: MathNode): Set<string> {
  const out = new Set<string>();
  const { math } = ctx.sm;
  node.traverse((n) => {
    if (n.type !== 'SymbolNode') return;
    const name = (n as unknown as { name: string }).name;
    if (ctx.scope.has(name) || !math.Unit.isValuelessUnit(name)) return;
    try {
      const u = math.Unit.parse(name);
      for (const c of u.units) out.add(prefixName(c) + c.unit.name);
    } catch {
      /* not a unit after all */
    }
  });
  return out;
}

/** True when `name` denotes a unit rather than a name in scope. */
export function isUnitName(ctx: EvalContext, name: string): boolean {
  return !ctx.scope.has(name) && ctx.sm.math.Unit.isValuelessUnit(name);
}

/** Counts entries of a matrix value; throws SHEET_LIMIT above the limit. */
export function checkSize(ctx: EvalContext, v: unknown): void {
  const { math } = ctx.sm;
  if (math.isMatrix(v)) {
    const n = (v as { size(): number[] }).size().reduce((a, b) => a * b, 1);
    if (n > ctx.maxMatrixEntries) {
      throw new EngineError(
        'SHEET_LIMIT',
        `This value has ${n} entries; a sheet value may hold at most ${ctx.maxMatrixEntries}.`,
      );
    }
  }
}

/**
 * For a block about to be read: a function that marks its name failed with the issues the block
 * reported from now on (so a block that only has notes fails through the name they depend on).
 */
export function nameFailure(
  ctx: EvalContext,
  blockId: string,
): (name: string, at: SheetLocation) => void {
  const before = ctx.errors.length;
  return (name, at) =>
    markFailed(
      ctx,
      name,
      at,
      ctx.errors.slice(before).filter((e) => e.blockId === blockId),
    );
}
