import {
  digestSheet,
  evaluateSheet,
  type Sheet,
  type SheetDigests,
  type SheetProgress,
  type SheetResults,
  type SheetUpload,
} from '../../../core/index';
import type { Db } from '../../db/index';
import { AppError } from '../../http/errors';
import type { User } from '../users/users.repository';
import { listUploadTexts } from '../uploads/uploads.repository';
import { checkSheetAccess } from './sheets.access';
import type { DraftBody } from './sheets.schemas';

/** What POST /api/sheets/:sheetId/evaluate answers (the sheet engine's result shape). */
export interface SheetEvaluation {
  results: SheetResults;
  digests: SheetDigests;
  engineVersion: string;
}

export interface RunOptions {
  signal?: AbortSignal;
  onProgress?: (progress: SheetProgress) => void;
}

/**
 * Runs one evaluation. The default runs the sheet engine in this thread; createApp can hand in
 * the worker pool's runner instead (same contract) so long solves never block the event loop.
 */
export type SheetRunner = (
  sheet: Sheet,
  uploads: SheetUpload[],
  options: RunOptions,
) => Promise<SheetResults>;

export const inProcessRunner: SheetRunner = async (sheet, uploads, options) => {
  const signal = options.signal;
  return evaluateSheet(sheet, {
    uploads,
    ...(options.onProgress ? { onProgress: options.onProgress, now: () => Date.now() } : {}),
    ...(signal ? { isCancelled: () => signal.aborted } : {}),
  });
};

export function cancelledError(): AppError {
  return new AppError(499, 'CANCELLED', 'The evaluation was cancelled.');
}

/**
 * Evaluates the editor's current text of a sheet with the sheet's uploads resolved by name, for
 * any member of its project (the draft in the database is not touched).
 */
export async function evaluateSheetDraft(
  db: Db,
  user: User,
  sheetId: number,
  input: DraftBody,
  options: RunOptions & { runner?: SheetRunner } = {},
): Promise<SheetEvaluation> {
  await checkSheetAccess(db, user, sheetId);
  const uploads = await listUploadTexts(db, sheetId);
  const sheet: Sheet = { blocks: input.blocks, settings: input.settings };
  const run = options.runner ?? inProcessRunner;
  const results = await run(sheet, uploads, options);
  if (options.signal?.aborted) throw cancelledError();
  const { digests, engineVersion } = digestSheet(sheet, results);
  return { results, digests, engineVersion };
}
