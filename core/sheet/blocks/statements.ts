/**
 * The line loop shared by calc and criteria blocks: each non-blank line (comments split off) is
 * parsed and handed to the block's evaluator; a failure is reported at its line and the loop
 * goes on, except a cancellation, which stops the sheet. A line that uses a name whose line failed
 * above is not evaluated: it gets a note naming that name, not a second error.
 */
import type { MathNode } from 'mathjs';
import { EngineError } from '../../errors';
import { dependencyNote, parseExpression, report, type EvalContext } from '../context';
import { blockLines, splitComment } from '../source';
import type { SheetBlock } from '../types';

export interface StatementHandlers {
  /** Evaluates one parsed line; throws to report an error at it. */
  evaluate(node: MathNode, code: string, line: number, comment: string | null): void;
  /** Called for a line that does not parse, before the error is reported. */
  unparsed?(code: string, line: number): void;
  /** Called for a line not evaluated because it uses `dependsOn`, a name that failed above. */
  skipped?(node: MathNode, line: number, dependsOn: string): void;
}

/**
 * Runs `handlers.evaluate` on every statement of the block.
 * @returns false when any line was reported as an error.
 * @throws EngineError CANCELLED, passed on from the evaluator.
 */
export function evaluateStatements(
  ctx: EvalContext,
  block: SheetBlock,
  blockIndex: number,
  handlers: StatementHandlers,
): boolean {
  let ok = true;
  blockLines(block.source).forEach((raw, i) => {
    const line = i + 1;
    const { code, comment } = splitComment(raw);
    if (code.trim() === '') return;
    let node: MathNode | null = null;
    try {
      node = parseExpression(ctx, code);
      const note = dependencyNote(ctx, node);
      if (note) {
        handlers.skipped?.(node, line, String(note.details?.dependsOn));
        throw note;
      }
      handlers.evaluate(node, code, line, comment);
    } catch (err) {
      if (err instanceof EngineError && err.code === 'CANCELLED') throw err;
      ok = false;
      if (!node) handlers.unparsed?.(code, line);
      report(ctx, { blockId: block.id, blockIndex, line }, err, node);
    }
  });
  return ok;
}
