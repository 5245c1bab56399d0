import {
  describeMatrixText,
  evaluateSheet,
  type MatrixAnalysis,
  type Sheet,
  type SheetProgress,
  type SheetResults,
  type SheetUpload,
} from '../../core/index';
import type { JobOwner } from './queue';

export interface RunOptions {
  signal?: AbortSignal;
  onProgress?: (progress: SheetProgress) => void;
  /**
   * Who asked, for the queue's fair shares (caps per person and project; a newer evaluation of
   * the same draft replaces the older one still waiting). Evaluations without an owner (issue for
   * check, seal) are never replaced.
   */
  owner?: JobOwner;
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
