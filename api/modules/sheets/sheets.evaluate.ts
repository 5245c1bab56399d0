import { digestSheet, type Sheet, type SheetDigests, type SheetResults } from '../../../core/index';
import type { DbOrTx } from '../../db/index';
import type { AppContext } from '../../http/context';
import { AppError } from '../../http/errors';
import type { RunOptions } from '../../workers/sheet-runner';
import { uploadsService } from '../uploads/uploads.service';
import type { User } from '../users/users.repository';
import type { DraftBody } from './sheets.schemas';

/**
 * A sheet evaluated with its uploads and frozen into the forms a revision stores: the one
 * evaluation path of the API (the editor, issue for check, compare with the draft and seal).
 */
export interface SheetEvaluation {
  results: SheetResults;
  /** Canonical JSON of the results: the text stored and hashed. */
  resultsJson: string;
  canonicalText: string;
  digests: SheetDigests;
  engineVersion: string;
}

export function cancelledError(): AppError {
  return new AppError(499, 'CANCELLED', 'The evaluation was cancelled.');
}

/**
 * Evaluates `sheet` with the uploads of sheet `sheetId` resolved by name, through the app's
 * runner (the worker pool), and freezes the results into canonical forms and digests.
 */
export async function evaluateWithUploads(
  ctx: Pick<AppContext, 'db' | 'runner'>,
  sheetId: number,
  sheet: Sheet,
  options: RunOptions = {},
  db: DbOrTx = ctx.db,
): Promise<SheetEvaluation> {
  const uploads = await uploadsService.textsForSheet(db, sheetId);
  const results = await ctx.runner(sheet, uploads, options);
  if (options.signal?.aborted) throw cancelledError();
  const d = digestSheet(sheet, results);
  return {
    results,
    resultsJson: d.resultsJson,
    canonicalText: d.canonicalText,
    digests: d.digests,
    engineVersion: d.engineVersion,
  };
}

/**
 * Evaluates the editor's current text of a sheet for any member of its project (the draft in
 * the database is not touched). Answers the results, digests and engine version.
 */
export async function evaluateSheetDraft(
  ctx: AppContext,
  user: User,
  sheetId: number,
  input: DraftBody,
  options: RunOptions = {},
): Promise<Pick<SheetEvaluation, 'results' | 'digests' | 'engineVersion'>> {
  const { projectId } = await ctx.access.sheet(user, sheetId, 'sheet.read');
  const sheet: Sheet = { blocks: input.blocks, settings: input.settings };
  // The editor's evaluations are the person's own: the queue's fair shares apply to them.
  const { results, digests, engineVersion } = await evaluateWithUploads(ctx, sheetId, sheet, {
    ...options,
    owner: { userId: user.id, projectId, sheetId },
  });
  return { results, digests, engineVersion };
}
