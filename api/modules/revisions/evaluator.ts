import {
  digestSheet,
  evaluateSheet,
  type Sheet,
  type SheetResults,
  type SheetUpload,
} from '../../../core/index';

/** A sheet evaluated and frozen into the forms a revision stores. */
export interface SheetEvaluation {
  results: SheetResults;
  /** Canonical JSON of the results: the text stored and hashed. */
  resultsJson: string;
  canonicalText: string;
  digests: { canonicalText: string; results: string };
  engineVersion: string;
}

/** Evaluates a sheet with its uploads, off the request path when given the worker pool. */
export type SheetEvaluator = (sheet: Sheet, uploads: SheetUpload[]) => Promise<SheetEvaluation>;

/**
 * Runs one evaluation: the same contract as the sheets module's SheetRunner, so the worker
 * pool's runner can be handed to both.
 */
export type ResultsRunner = (
  sheet: Sheet,
  uploads: SheetUpload[],
  options: { signal?: AbortSignal },
) => Promise<SheetResults>;

/** The sheet engine in this thread: the fallback when no worker pool is handed in. */
export const inProcessResults: ResultsRunner = async (sheet, uploads) =>
  evaluateSheet(sheet, { uploads });

/** An evaluator over a runner: results from the runner, canonical forms and digests here. */
export function evaluatorFrom(run: ResultsRunner): SheetEvaluator {
  return async (sheet, uploads) => {
    const results = await run(sheet, uploads, {});
    const d = digestSheet(sheet, results);
    return {
      results,
      resultsJson: d.resultsJson,
      canonicalText: d.canonicalText,
      digests: d.digests,
      engineVersion: d.engineVersion,
    };
  };
}
