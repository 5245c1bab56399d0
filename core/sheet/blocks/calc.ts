/**
 * `calc` blocks: one mathjs statement per line, `#` comments, blank lines allowed. Each line gives
 * the formula as LaTeX, the formula with values substituted, and the result in a display unit.
 */
import type { MathNode } from 'mathjs';
import {
  checkSize,
  evaluateNode,
  formatContext,
  isUnitName,
  parseExpression,
  writtenUnits,
  type EvalContext,
} from '../context';
import { EngineError, isEngineError } from '../../errors';
import { formatValue } from '../format';
import { refuseLargeMatrices } from '../large-matrix';
import { nonFiniteMessage } from '../not-finite';
import { expressionTex, latexName, substitutionTex } from '../latex';
import { evaluateStatements } from './statements';
import type { CalcBlockResult, CalcLineResult, SheetBlock } from '../types';

/**
 * Unit symbols that a value of the same name hides. mathjs looks a name up before the unit of the
 * same spelling, so after `m = 5 t` the line `g = 9.81 m/s^2` would silently multiply by the mass:
 * a wrong number that looks right. A number followed by such a name (`9.81 m`) is written as a
 * unit, so when the name is also a value in scope the line is refused, naming both readings.
 */
const UNIT_NAMES: Record<string, string> = {
  m: 'the metre',
  mm: 'the millimetre',
  cm: 'the centimetre',
  km: 'the kilometre',
  s: 'the second',
  ms: 'the millisecond',
  min: 'the minute',
  h: 'the hour',
  kg: 'the kilogram',
  t: 'the tonne',
  g: 'the gram',
  N: 'the newton',
  kN: 'the kilonewton',
  MN: 'the meganewton',
  Pa: 'the pascal',
  kPa: 'the kilopascal',
  MPa: 'the megapascal',
  GPa: 'the gigapascal',
  Hz: 'the hertz',
  rad: 'the radian',
  deg: 'the degree',
  rpm: 'revolutions per minute',
};

/** Does the expression write a unit (a unit symbol that no value hides)? */
function writesUnit(ctx: EvalContext, node: MathNode): boolean {
  let found = false;
  node.traverse((n) => {
    if (n.type !== 'SymbolNode') return;
    const name = (n as unknown as { name: string }).name;
    if (!ctx.scope.has(name) && isUnitName(ctx, name)) found = true;
  });
  return found;
}

/**
 * Refuses `9.81 m/s^2` or `2000 kN/m` while `m` names a value: a number or a unit followed by the
 * name is unit notation, and the engineer meant the unit.
 */
export function refuseHiddenUnits(ctx: EvalContext, node: MathNode): void {
  node.traverse((n) => {
    const op = n as unknown as { type: string; implicit?: boolean; fn?: string; args?: MathNode[] };
    if (op.type !== 'OperatorNode' || (op.fn !== 'multiply' && op.fn !== 'divide')) return;
    const [a, b] = op.args ?? [];
    if (!a || b?.type !== 'SymbolNode') return;
    const name = (b as unknown as { name: string }).name;
    const unit = Object.hasOwn(UNIT_NAMES, name) ? UNIT_NAMES[name] : undefined;
    if (!unit || !ctx.scope.has(name)) return;
    const unitNotation = (op.implicit === true && a.type === 'ConstantNode') || writesUnit(ctx, a);
    if (unitNotation) {
      throw new EngineError(
        'SHEET_EVAL',
        `"${name}" here reads as ${unit}, but a value named ${name} is defined above and would ` +
          `be used instead. Rename that value (for example ${name}_1) so ${name} means ${unit}.`,
        { name },
      );
    }
  });
}

/** The name an assignment defines (`k = …`, `K[1,1] = …`, `f(x) = …`), or null. */
export function assignedName(node: MathNode): string | null {
  if (node.type === 'AssignmentNode') {
    const target = (node as unknown as { object: MathNode }).object;
    if (target.type === 'SymbolNode') return (target as unknown as { name: string }).name;
    return null;
  }
  if (node.type === 'FunctionAssignmentNode') return (node as unknown as { name: string }).name;
  return null;
}

function texTools(ctx: EvalContext, node: MathNode, name: string | null, substitute: boolean) {
  const substituted = { any: false };
  return {
    substituted,
    tex: {
      scope: ctx.scope,
      format: formatContext(ctx, name, writtenUnits(ctx, node)),
      substitute,
      substituted,
      isUnitName: (n: string) => isUnitName(ctx, n),
      evaluate: (n: MathNode) => evaluateNode(ctx, n, new Map(ctx.scope)),
      shown: ctx.shown,
    },
  };
}

/** Evaluates one calc line, updating the scope. Throws (rewritten by the caller) on error. */
export function evaluateCalcLine(
  ctx: EvalContext,
  code: string,
  line: number,
  comment: string | null,
): CalcLineResult {
  const node = parseExpression(ctx, code);
  const name = assignedName(node);
  refuseHiddenUnits(ctx, node);
  refuseLargeMatrices(ctx.scope, node);
  const rhs: MathNode =
    node.type === 'AssignmentNode' ? (node as unknown as { value: MathNode }).value : node;
  // LaTeX before evaluating, so substituted values are the ones this line used.
  const formulaTex = texTools(ctx, node, name, false);
  const formula =
    node.type === 'AssignmentNode' && name
      ? `${latexName(name)}=${expressionTex(rhs, formulaTex.tex)}`
      : expressionTex(node, formulaTex.tex);
  let substituted: string | null = null;
  // A plain reference (`T_1 = sway.T[1]`) has nothing to substitute: its value is the result.
  const reference = rhs.type === 'SymbolNode' || rhs.type === 'AccessorNode';
  if (node.type !== 'FunctionAssignmentNode' && !reference) {
    const sub = texTools(ctx, rhs, name, true);
    const t = expressionTex(rhs, sub.tex);
    substituted = sub.substituted.any ? t : null;
  }
  const value = evaluateNode(ctx, node);
  try {
    checkSize(ctx, value);
    const f = formatValue(value, formatContext(ctx, name, writtenUnits(ctx, node)));
    if (name && node.type === 'AssignmentNode') {
      ctx.shown.set(name, {
        value,
        latex: substitutionTex(value, f.latex, { format: formatContext(ctx, name) }),
      });
    }
    return {
      line,
      source: code,
      comment,
      name,
      latex: { formula, substituted, result: f.latex },
      value: f.value,
      display: f.display,
    };
  } catch (err) {
    // The assignment happened; a line that fails must not leave its name behind.
    if (name) ctx.scope.delete(name);
    // A scalar that is not finite: say which operation made it (a matrix names its entry).
    const notFinite = isEngineError(err) ? err.details?.notFinite : undefined;
    if (typeof notFinite === 'number' && (typeof value === 'number' || ctx.sm.math.isUnit(value))) {
      const scope = new Map(ctx.scope);
      const words = nonFiniteMessage(rhs, notFinite, (n) => evaluateNode(ctx, n, scope));
      throw new EngineError('SHEET_EVAL', words, { notFinite });
    }
    throw err;
  }
}

export function evaluateCalcBlock(
  ctx: EvalContext,
  block: SheetBlock,
  blockIndex: number,
): CalcBlockResult {
  const lines: CalcLineResult[] = [];
  const ok = evaluateStatements(ctx, block, blockIndex, {
    evaluate(node, code, line, comment) {
      const name = assignedName(node);
      try {
        lines.push(evaluateCalcLine(ctx, code, line, comment));
        if (name) ctx.failed.delete(name);
      } catch (err) {
        if (name) ctx.failed.set(name, { blockId: block.id, blockIndex, line });
        throw err;
      }
    },
    skipped(node, line, dependsOn) {
      const name = assignedName(node);
      if (name) ctx.failed.set(name, { blockId: block.id, blockIndex, line, via: dependsOn });
    },
    unparsed(code, line) {
      // Unparsable: a line that looks like `name = …` still defines (a failed) name.
      const m = /^\s*([A-Za-z_][A-Za-z0-9_]*)\s*=[^=]/.exec(code);
      if (m) ctx.failed.set(m[1]!, { blockId: block.id, blockIndex, line });
    },
  });
  return { kind: 'calc', blockId: block.id, blockIndex, ok, lines };
}
