/**
 * `criteria` blocks: one expression per line that is true or false; the line's comment is its
 * label. A criterion never assigns and never gives a number.
 */
import type { MathNode } from 'mathjs';
import { EngineError } from '../../errors';
import {
  evaluateNode,
  formatContext,
  isUnitName,
  parseExpression,
  writtenUnits,
  type EvalContext,
} from '../context';
import { formatValue } from '../format';
import { refuseLargeMatrices } from '../large-matrix';
import { expressionTex } from '../latex';
import { evaluateStatements } from './statements';
import type { CriteriaBlockResult, CriterionResult, CriterionSide, SheetBlock } from '../types';

/** One side of a comparison as shown (display text and value), or null when it cannot be. */
function side(ctx: EvalContext, node: MathNode): CriterionSide | null {
  try {
    const v = evaluateNode(ctx, node, new Map(ctx.scope));
    const f = formatValue(v, formatContext(ctx, null, writtenUnits(ctx, node)));
    return { display: f.display, value: f.value };
  } catch {
    return null;
  }
}

type Shown = (string | CriterionSide)[];

/** The text of shown parts, as the engine writes it (SI and the units written). */
const shownText = (parts: Shown): string =>
  parts.map((p) => (typeof p === 'string' ? p : p.display)).join('');

/** The comparisons a criterion may make (mathjs operator names) and how they are written. */
const SYMBOLS = new Map([
  ['larger', '>'],
  ['smaller', '<'],
  ['largerEq', '>='],
  ['smallerEq', '<='],
  ['equal', '=='],
  ['unequal', '!='],
]);
const LOGICAL = new Set(['and', 'or', 'xor']);

/**
 * A compound criterion with every comparison's sides as values, in parts, or null when a part
 * cannot be shown (then the label and pass/fail stand alone).
 */
function compoundParts(ctx: EvalContext, node: MathNode): Shown | null {
  const op = node as unknown as {
    type: string;
    fn?: string;
    args?: MathNode[];
    content?: MathNode;
  };
  if (op.type === 'ParenthesisNode' && op.content) {
    const inner = compoundParts(ctx, op.content);
    return inner === null ? null : ['(', ...inner, ')'];
  }
  if (op.type === 'OperatorNode' && op.fn && op.args) {
    if (SYMBOLS.has(op.fn) && op.args.length === 2) {
      const a = side(ctx, op.args[0]!);
      const b = side(ctx, op.args[1]!);
      return a === null || b === null ? null : [a, ` ${SYMBOLS.get(op.fn)} `, b];
    }
    if (LOGICAL.has(op.fn) && op.args.length === 2) {
      const a = compoundParts(ctx, op.args[0]!);
      const b = compoundParts(ctx, op.args[1]!);
      return a === null || b === null ? null : [...a, ` ${op.fn} `, ...b];
    }
    if (op.fn === 'not' && op.args.length === 1) {
      const a = compoundParts(ctx, op.args[0]!);
      return a === null ? null : ['not ', ...a];
    }
  }
  const s = side(ctx, node);
  return s === null ? null : [s];
}

export function evaluateCriterion(
  ctx: EvalContext,
  code: string,
  line: number,
  comment: string | null,
): CriterionResult {
  const node = parseExpression(ctx, code);
  if (node.type === 'AssignmentNode' || node.type === 'FunctionAssignmentNode') {
    throw new EngineError(
      'SHEET_EVAL',
      'A criterion compares values; it cannot define a name. Move the assignment to a calc block.',
    );
  }
  refuseLargeMatrices(ctx.scope, node);
  const value = evaluateNode(ctx, node, new Map(ctx.scope));
  if (typeof value !== 'boolean') {
    let shown: string;
    try {
      shown = ` it gives ${formatValue(value, formatContext(ctx, null, writtenUnits(ctx, node))).display}`;
    } catch {
      shown = ' it gives a value that is not true or false';
    }
    throw new EngineError(
      'SHEET_EVAL',
      `This criterion is not true or false:${shown}. Write a comparison such as "f_1 >= 3 Hz".`,
    );
  }
  const op = node as unknown as { type: string; fn?: string; args?: MathNode[] };
  let lhs: CriterionSide | null = null;
  let rhs: CriterionSide | null = null;
  if (op.type === 'OperatorNode' && op.fn && SYMBOLS.has(op.fn) && op.args?.length === 2) {
    lhs = side(ctx, op.args[0]!);
    rhs = side(ctx, op.args[1]!);
  }
  const compound =
    op.type === 'ParenthesisNode' ||
    (op.type === 'OperatorNode' && !!op.fn && (LOGICAL.has(op.fn) || op.fn === 'not'));
  const parts = compound ? compoundParts(ctx, node) : null;
  const shown = lhs !== null && rhs !== null ? [lhs, ' vs ', rhs] : parts;
  const latex = expressionTex(node, {
    scope: ctx.scope,
    format: formatContext(ctx, null, writtenUnits(ctx, node)),
    substitute: false,
    substituted: { any: false },
    isUnitName: (n) => isUnitName(ctx, n),
    evaluate: (n) => evaluateNode(ctx, n, new Map(ctx.scope)),
  });
  return {
    line,
    source: code,
    label: comment && comment !== '' ? comment : code.trim(),
    pass: value,
    lhs: lhs?.display ?? null,
    rhs: rhs?.display ?? null,
    values: parts === null ? null : shownText(parts),
    shown,
    latex,
  };
}

export function evaluateCriteriaBlock(
  ctx: EvalContext,
  block: SheetBlock,
  blockIndex: number,
): CriteriaBlockResult {
  const criteria: CriterionResult[] = [];
  const ok = evaluateStatements(ctx, block, blockIndex, {
    evaluate(_node, code, line, comment) {
      criteria.push(evaluateCriterion(ctx, code, line, comment));
    },
  });
  return { kind: 'criteria', blockId: block.id, blockIndex, ok, criteria };
}
