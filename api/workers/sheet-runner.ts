import {
  describeMatrixText,
  evaluateSheet,
  type MatrixAnalysis,
  type Sheet,
  type SheetProgress,
  type SheetResults,
  type SheetUpload,
} from '../../core/index';

export interface RunOptions {
  signal?: AbortSignal;
  onProgress?: (progress: SheetProgress) => void;
}

/**
 * Runs one evaluation of a sheet with its uploads: the one function type every evaluation goes
 * through (the editor's, issue for check, compare and seal). createApp hands in the worker
 * pool's `run`; `inProcessRunner` is the engine in this thread.
 */
export type SheetRunner = (
  sheet: Sheet,
  uploads: SheetUpload[],
  options: RunOptions,
) => Promise<SheetResults>;

/** Reads an uploaded matrix file: the pool's `describeMatrixFile`, or `inProcessDescriber`. */
export type MatrixFileDescriber = (
  text: string,
  format: 'matrix-market' | 'csv',
  name: string,
) => Promise<MatrixAnalysis>;

export const inProcessRunner: SheetRunner = async (sheet, uploads, options) => {
  const signal = options.signal;
  return evaluateSheet(sheet, {
    uploads,
    ...(options.onProgress ? { onProgress: options.onProgress, now: () => Date.now() } : {}),
    ...(signal ? { isCancelled: () => signal.aborted } : {}),
  });
};

export const inProcessDescriber: MatrixFileDescriber = async (text, format, name) =>
  describeMatrixText(text, format, name);
