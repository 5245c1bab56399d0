/**
 * `modes` blocks: an eigen-solve on matrices in scope.
 */
import { EngineError } from '../../errors';
import { report, type EvalContext } from '../context';
import type { ModesBlockResult, SheetBlock } from '../types';

export function evaluateModesBlock(
  ctx: EvalContext,
  block: SheetBlock,
  blockIndex: number,
): ModesBlockResult {
  report(
    ctx,
    { blockId: block.id, blockIndex, line: 0 },
    new EngineError('SHEET_EVAL', 'Modes blocks are not available yet.'),
  );
  return {
    kind: 'modes',
    blockId: block.id,
    blockIndex,
    ok: false,
    name: null,
    method: null,
    methodUsed: null,
    size: null,
    modes: [],
    shapes: null,
    sturm: null,
    criticalTimeStep: null,
    warnings: [],
    histories: [],
    engine: null,
  };
}
