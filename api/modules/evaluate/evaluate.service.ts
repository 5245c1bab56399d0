/**
 * Evaluation for the API: run a sheet in the worker pool, then its canonical forms and digests
 * (cheap, done here); diffs of two sheets with both evaluations.
 */
import {
  diffSheets,
  digestSheet,
  type Sheet,
  type SheetDiff,
  type SheetDigests,
  type SheetProgress,
  type SheetResults,
  type SheetUpload,
} from '../../../core/index';
import type { EvaluateBody } from './evaluate.schemas';

/** Runs one evaluation (the worker pool's `run`, or the engine in-process in tests). */
export type EvaluationRunner = (
  sheet: Sheet,
  uploads: SheetUpload[],
  options: { signal?: AbortSignal; onProgress?: (p: SheetProgress) => void },
) => Promise<SheetResults>;

/** What POST /api/evaluate answers. */
export interface EvaluateResponse {
  results: SheetResults;
  digests: SheetDigests;
  engineVersion: string;
  canonicalText: string;
}

function sheetOf(body: EvaluateBody): Sheet {
  return { blocks: body.blocks, ...(body.settings ? { settings: body.settings } : {}) };
}

export async function evaluateBody(
  run: EvaluationRunner,
  body: EvaluateBody,
  options: { signal?: AbortSignal; onProgress?: (p: SheetProgress) => void } = {},
): Promise<EvaluateResponse> {
  const sheet = sheetOf(body);
  const results = await run(sheet, body.uploads ?? [], options);
  const d = digestSheet(sheet, results);
  return {
    results,
    digests: d.digests,
    engineVersion: d.engineVersion,
    canonicalText: d.canonicalText,
  };
}

/** What POST /api/evaluate/diff answers. */
export interface DiffResponse {
  diff: SheetDiff;
  old: { digests: SheetDigests; summary: SheetResults['summary'] };
  new: { digests: SheetDigests; summary: SheetResults['summary'] };
  engineVersion: string;
}

export async function diffBodies(
  run: EvaluationRunner,
  oldBody: EvaluateBody,
  newBody: EvaluateBody,
  options: { signal?: AbortSignal } = {},
): Promise<DiffResponse> {
  const a = await evaluateBody(run, oldBody, options);
  const b = await evaluateBody(run, newBody, options);
  return {
    diff: diffSheets(sheetOf(oldBody), sheetOf(newBody), a.results, b.results),
    old: { digests: a.digests, summary: a.results.summary },
    new: { digests: b.digests, summary: b.results.summary },
    engineVersion: b.engineVersion,
  };
}
