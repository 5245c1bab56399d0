/**
 * Evaluates a sheet: blocks in order, one scope flowing from top to bottom. Errors are collected
 * with their block and line; evaluation goes on with the lines and blocks after an error, and
 * names a failed line would have defined are reported as such where they are used.
 */
import { EngineError } from '../errors';
import { evaluateCalcBlock } from './blocks/calc';
import { evaluateCriteriaBlock } from './blocks/criteria';
import { evaluateMatrixBlock } from './blocks/matrix';
import { evaluateModesBlock } from './blocks/modes';
import { evaluateResponseBlock } from './blocks/response';
import { DEFAULT_MAX_MATRIX_ENTRIES, type EvalContext } from './context';
import './generators';
import { setMatrixEntryLimit, sheetMath } from './math';
import { validateSheet } from './source';
import type { BlockResult, EvaluateOptions, Sheet, SheetResults } from './types';
import { ENGINE_VERSION } from './version';

export const DEFAULT_SIGNIFICANT_FIGURES = 4;

function significantFigures(sheet: Sheet): number {
  const s = sheet.settings?.significantFigures;
  if (s === undefined) return DEFAULT_SIGNIFICANT_FIGURES;
  if (!Number.isInteger(s) || s < 1 || s > 15) {
    throw new EngineError(
      'INVALID_OPTION',
      `Significant figures must be a whole number from 1 to 15 (got ${String(s)}).`,
      { field: 'settings.significantFigures' },
    );
  }
  return s;
}

/**
 * Evaluates every block of a sheet.
 *
 * @throws EngineError SHEET_PARSE when the sheet's shape is invalid (ids, kinds), INVALID_OPTION
 *   for bad settings, CANCELLED when `isCancelled` returns true. Errors in lines are not thrown:
 *   they are returned in `errors` with their block and line.
 * @example
 * const r = evaluateSheet({ blocks: [{ id: 'b1', kind: 'calc', source: 'k = 24 kN/mm\nm = 18 t\nf = sqrt(k/m)/(2 pi)' }] });
 * r.blocks[0] // { kind: 'calc', lines: [..., { name: 'f', display: '5.812 Hz', ... }] }
 */
export function evaluateSheet(sheet: Sheet, options: EvaluateOptions = {}): SheetResults {
  validateSheet(sheet);
  const sig = significantFigures(sheet);
  const sm = sheetMath();
  const maxMatrixEntries = options.maxMatrixEntries ?? DEFAULT_MAX_MATRIX_ENTRIES;
  setMatrixEntryLimit(maxMatrixEntries);
  const ctx: EvalContext = {
    sm,
    scope: new Map(),
    failed: new Map(),
    errors: [],
    significantFigures: sig,
    uploads: options.uploads ?? [],
    maxMatrixEntries,
    blockIds: sheet.blocks.map((b) => b.id),
    options,
    shown: new Map(),
  };
  const blocks: BlockResult[] = [];
  sheet.blocks.forEach((block, blockIndex) => {
    if (options.isCancelled?.())
      throw new EngineError('CANCELLED', 'The evaluation was cancelled.');
    options.onProgress?.({
      blockIndex,
      blockId: block.id,
      blockCount: sheet.blocks.length,
      kind: block.kind,
      message: `Evaluating block ${blockIndex + 1} of ${sheet.blocks.length} (${block.kind})`,
    });
    switch (block.kind) {
      case 'text':
        blocks.push({ kind: 'text', blockId: block.id, blockIndex, ok: true });
        break;
      case 'calc':
        blocks.push(evaluateCalcBlock(ctx, block, blockIndex));
        break;
      case 'criteria':
        blocks.push(evaluateCriteriaBlock(ctx, block, blockIndex));
        break;
      case 'matrix':
        blocks.push(evaluateMatrixBlock(ctx, block, blockIndex));
        break;
      case 'modes':
        blocks.push(evaluateModesBlock(ctx, block, blockIndex));
        break;
      case 'response':
        blocks.push(evaluateResponseBlock(ctx, block, blockIndex));
        break;
    }
  });
  let passed = 0;
  let failed = 0;
  for (const b of blocks) {
    if (b.kind !== 'criteria') continue;
    for (const c of b.criteria) {
      if (c.pass) passed++;
      else failed++;
    }
  }
  return {
    engineVersion: ENGINE_VERSION,
    significantFigures: sig,
    blocks,
    errors: ctx.errors,
    summary: { passed, failed, errors: ctx.errors.filter((e) => e.severity !== 'note').length },
  };
}
