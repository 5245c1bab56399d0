import { createHash } from 'node:crypto';
import {
  canonicalJson,
  canonicalText,
  digestSheet,
  ENGINE_VERSION,
  type Sheet,
  type SheetDigests,
  type SheetResults,
} from '../../../core/index';
import type { EvaluationJob } from '../../../core/contract/sheets';
import type { DbOrTx } from '../../db/index';
import type { AppContext } from '../../http/context';
import { AppError } from '../../http/errors';
import type { DetachedEvaluations, EvaluationJobView } from '../../workers/job-queue';
import type { UploadRef } from '../../workers/queue';
import type { RunOptions } from '../../workers/sheet-runner';
import { uploadsService } from '../uploads/uploads.service';
import type { User } from '../users/users.repository';
import { sheetsResultsRepository } from './sheets-results.repository';
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
  const uploads = await uploadsService.refsForSheet(db, sheetId);
  return evaluateLoaded(ctx, sheet, uploads, options);
}

async function evaluateLoaded(
  ctx: Pick<AppContext, 'runner'>,
  sheet: Sheet,
  uploads: UploadRef[],
  options: RunOptions,
): Promise<SheetEvaluation> {
  const results = await ctx.runner(sheet, uploads, options);
  if (options.signal?.aborted) throw cancelledError();
  return frozen(sheet, results);
}

function frozen(sheet: Sheet, results: SheetResults): SheetEvaluation {
  const d = digestSheet(sheet, results);
  return {
    results,
    resultsJson: d.resultsJson,
    canonicalText: d.canonicalText,
    digests: d.digests,
    engineVersion: d.engineVersion,
  };
}

const sha256 = (text: string) => createHash('sha256').update(text, 'utf8').digest('hex');

/**
 * The key results are stored under: the SHA-256 of the canonical JSON of the sheet's canonical
 * text, its settings, the name and SHA-256 (of the bytes as uploaded) of each upload, and the
 * engine version (`engine`, default this build's). Anything that changes the results changes
 * one of these.
 */
export function resultsDigest(
  sheet: Sheet,
  uploads: Pick<UploadRef, 'name' | 'sha256'>[],
  engine: string = ENGINE_VERSION,
): string {
  return sha256(
    canonicalJson({
      text: canonicalText(sheet),
      settings: sheet.settings,
      uploads: uploads
        .map((u) => ({ name: u.name, sha256: u.sha256 }))
        .sort((a, b) => (a.name < b.name ? -1 : a.name > b.name ? 1 : 0)),
      engine,
    }),
  );
}

/** The largest results kept in the store (characters of canonical JSON); larger are recomputed. */
const MAX_STORED_CHARS = 8 * 2 ** 20;

/**
 * Keeps an evaluation in the results store under `digest` when the store takes it: results free
 * of sheet errors (an error may hang on a worker's limits, which are not in the key) and no
 * larger than MAX_STORED_CHARS. The request-bound evaluations and the workers' background ones
 * (api/worker-context.ts) both come here.
 */
export async function keepResults(
  db: DbOrTx,
  digest: string,
  evaluation: Pick<SheetEvaluation, 'results' | 'resultsJson' | 'engineVersion'>,
): Promise<void> {
  if (evaluation.results.errors.length > 0 || evaluation.resultsJson.length > MAX_STORED_CHARS) {
    return;
  }
  await sheetsResultsRepository.save(db, digest, evaluation.engineVersion, evaluation.resultsJson);
}

/** A sheet's results frozen for the store (the worker's side of keepResults). */
export function keepSheetResults(
  db: DbOrTx,
  digest: string,
  sheet: Sheet,
  results: SheetResults,
): Promise<void> {
  return keepResults(db, digest, frozen(sheet, results));
}

/** The stored results of `sheet` with `uploads`, frozen, or null when the store has none. */
async function fromStore(
  db: DbOrTx,
  digest: string,
  sheet: Sheet,
): Promise<SheetEvaluation | null> {
  const stored = await sheetsResultsRepository.find(db, digest);
  return stored === null ? null : frozen(sheet, JSON.parse(stored) as SheetResults);
}

/**
 * Evaluates through the results store: a sheet evaluated before, unchanged with the same uploads
 * and engine, is answered from the store and not recomputed; otherwise evaluated and stored
 * when its results are free of sheet errors (an error may hang on a worker's limits, which are
 * not in the key).
 * The editor and issue for check come here; seals and comparisons do not: they always re-run
 * afresh (evaluateWithUploads), and a seal compares its fresh results with the revision's.
 */
export async function evaluateStored(
  ctx: Pick<AppContext, 'db' | 'runner'>,
  sheetId: number,
  sheet: Sheet,
  options: RunOptions = {},
): Promise<SheetEvaluation & { fromStore: boolean }> {
  const uploads = await uploadsService.refsForSheet(ctx.db, sheetId);
  const digest = resultsDigest(sheet, uploads);
  const stored = await fromStore(ctx.db, digest, sheet);
  if (stored !== null) return { ...stored, fromStore: true };
  const evaluation = await evaluateLoaded(ctx, sheet, uploads, options);
  await keepResults(ctx.db, digest, evaluation);
  return { ...evaluation, fromStore: false };
}

/**
 * Evaluates the editor's current text of a sheet for a member who edits or checks it (the draft
 * in the database is not touched). Answers the results, digests and engine version, and whether
 * they came from the results store.
 */
export async function evaluateSheetDraft(
  ctx: AppContext,
  user: User,
  sheetId: number,
  input: DraftBody,
  options: RunOptions = {},
): Promise<
  Pick<SheetEvaluation, 'results' | 'digests' | 'engineVersion'> & { fromStore: boolean }
> {
  const { projectId } = await ctx.access.sheet(user, sheetId, 'sheet.evaluate');
  const sheet: Sheet = { blocks: input.blocks, settings: input.settings };
  // The editor's evaluations are the person's own: the queue's fair shares apply to them.
  const { results, digests, engineVersion, fromStore } = await evaluateStored(ctx, sheetId, sheet, {
    ...options,
    owner: { userId: user.id, projectId, sheetId },
  });
  return { results, digests, engineVersion, fromStore };
}

/** The queue's detached evaluations, or 503 where there is none (an in-process context). */
function detached(ctx: AppContext): DetachedEvaluations {
  if (!ctx.evaluations) {
    throw new AppError(503, 'NO_QUEUE', 'Evaluations in the background need the evaluation queue.');
  }
  return ctx.evaluations;
}

export type { EvaluationJob };

/**
 * A detached evaluation as the editor gets it (the contract's EvaluationJob): its state, and its
 * results once done.
 */
function jobOf(view: EvaluationJobView): EvaluationJob {
  const base = { id: view.id, state: view.state, draft: view.sheet, progress: view.progress };
  if (view.state === 'done') {
    const d = digestSheet(view.sheet, view.results);
    return {
      ...base,
      results: view.results,
      digests: d.digests,
      engineVersion: d.engineVersion,
      fromStore: false,
    };
  }
  if (view.state === 'failed') {
    const { code, message, details } = view.error;
    return { ...base, error: { code, message, ...(details ? { details } : {}) } };
  }
  return base;
}

/**
 * Starts an evaluation of the editor's text that is not bound to the request (a long solve):
 * closing the page does not stop it; the person follows it, comes back to it or cancels it. Its
 * worker keeps the results in the results store. An unchanged text (the same digest: canonical
 * text, settings, uploads, engine version) is answered from the store at once, with no job.
 */
export async function startDetachedEvaluation(
  ctx: AppContext,
  user: User,
  sheetId: number,
  input: DraftBody,
): Promise<{ queued: string } | { stored: EvaluationJob }> {
  const { projectId } = await ctx.access.sheet(user, sheetId, 'sheet.evaluate');
  const evaluations = detached(ctx);
  const uploads = await uploadsService.refsForSheet(ctx.db, sheetId);
  const sheet: Sheet = { blocks: input.blocks, settings: input.settings };
  const digest = resultsDigest(sheet, uploads);
  const stored = await fromStore(ctx.db, digest, sheet);
  if (stored !== null) {
    const { results, digests, engineVersion } = stored;
    const job: EvaluationJob = { id: null, state: 'done', draft: sheet, progress: null };
    return { stored: { ...job, results, digests, engineVersion, fromStore: true } };
  }
  const owner = { userId: user.id, projectId, sheetId };
  return { queued: await evaluations.start(sheet, uploads, owner, digest) };
}

/** The person's latest detached evaluation of the sheet (a day at most), or null. */
export async function latestDetachedEvaluation(
  ctx: AppContext,
  user: User,
  sheetId: number,
): Promise<EvaluationJob | null> {
  const { projectId } = await ctx.access.sheet(user, sheetId, 'sheet.evaluate');
  const view = await detached(ctx).latest({ userId: user.id, projectId, sheetId });
  return view ? jobOf(view) : null;
}

/** The person's own detached evaluation `jobId` of the sheet, else 404. */
async function ownJob(ctx: AppContext, user: User, sheetId: number, jobId: string) {
  const { projectId } = await ctx.access.sheet(user, sheetId, 'sheet.evaluate');
  const evaluations = detached(ctx);
  if (!(await evaluations.ownedBy(jobId, { userId: user.id, projectId, sheetId }))) {
    throw new AppError(404, 'NOT_FOUND', `There is no evaluation ${jobId} of yours on this sheet.`);
  }
  return evaluations;
}

/** Follows the person's detached evaluation to its results; the signal stops following only. */
export async function followDetachedEvaluation(
  ctx: AppContext,
  user: User,
  sheetId: number,
  jobId: string,
  options: RunOptions,
): Promise<EvaluationJob> {
  const evaluations = await ownJob(ctx, user, sheetId, jobId);
  await evaluations.follow(jobId, options);
  const view = await evaluations.view(jobId);
  if (!view) throw cancelledError();
  return jobOf(view);
}

export async function cancelDetachedEvaluation(
  ctx: AppContext,
  user: User,
  sheetId: number,
  jobId: string,
): Promise<void> {
  const evaluations = await ownJob(ctx, user, sheetId, jobId);
  await evaluations.cancel(jobId);
}
