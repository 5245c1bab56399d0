import {
  describeMatrixText,
  evaluateSheet,
  type MatrixAnalysis,
  type Sheet,
  type SheetProgress,
  type SheetResults,
  type SheetUpload,
} from '../../core/index';
import type { JobOwner, UploadRef } from './queue';

export interface RunOptions {
  signal?: AbortSignal;
  onProgress?: (progress: SheetProgress) => void;
  /**
   * Who asked, for the queue's fair shares (caps per person and project; a newer evaluation of
   * the same draft replaces the older one still waiting). Evaluations without an owner (issue for
   * check, seal) are never replaced.
   */
  owner?: JobOwner;
  /**
   * Keep the results in the results store under this key (background evaluations, whose
   * results nobody may be waiting for when they finish).
   */
  storeAs?: string;
}

/**
 * Runs one evaluation of a sheet with its uploads, named by id and digest: the one function
 * type every evaluation goes through (the editor's, issue for check, compare and seal). createApp
 * hands in the queue's; `inProcessRunner` is the engine in this thread.
 */
export type SheetRunner = (
  sheet: Sheet,
  uploads: UploadRef[],
  options: RunOptions,
) => Promise<SheetResults>;

/** Reads an upload's text from the database, checked against the digest it is named with. */
export type UploadReader = (upload: UploadRef) => Promise<SheetUpload>;

/** Reads an uploaded matrix file: the pool's `describeMatrixFile`, or `inProcessDescriber`. */
export type MatrixFileDescriber = (
  text: string,
  format: 'matrix-market' | 'csv',
  name: string,
) => Promise<MatrixAnalysis>;

/**
 * A runner over an evaluation that takes the uploads' texts (the engine in this thread, an
 * evaluation pool's `run`): each upload is read by `read` first.
 */
export function readingUploads(
  read: UploadReader,
  evaluate: (sheet: Sheet, uploads: SheetUpload[], options: RunOptions) => Promise<SheetResults>,
): SheetRunner {
  return async (sheet, refs, options) =>
    evaluate(sheet, await Promise.all(refs.map((ref) => read(ref))), options);
}

/** The engine in this thread, with the uploads read by `read` (the demo seeds). */
export const inProcessRunner = (read: UploadReader): SheetRunner =>
  readingUploads(read, async (sheet, uploads, options) => {
    const signal = options.signal;
    return evaluateSheet(sheet, {
      uploads,
      ...(options.onProgress ? { onProgress: options.onProgress, now: () => Date.now() } : {}),
      ...(signal ? { isCancelled: () => signal.aborted } : {}),
    });
  });

export const inProcessDescriber: MatrixFileDescriber = async (text, format, name) =>
  describeMatrixText(text, format, name);
