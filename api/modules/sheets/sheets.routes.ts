import { Router, type Response } from 'express';
import { currentUser, requireSignedIn } from '../../http/auth';
import type { AppContext } from '../../http/context';
import { normaliseError } from '../../http/error-middleware';
import { AppError } from '../../http/errors';
import { parse } from '../../http/validate';
import { z } from 'zod';
import type { SheetProgress } from '../../../core/index';
import {
  cancelDetachedEvaluation,
  evaluateSheetDraft,
  followDetachedEvaluation,
  latestDetachedEvaluation,
  startDetachedEvaluation,
} from './sheets.evaluate';
import {
  createSheetBody,
  draftBody,
  parseIfMatch,
  projectParams,
  sheetParams,
  updateSheetBody,
} from './sheets.schemas';
import { missingIfMatch, sheetsService } from './sheets.service';
import type {
  DraftSaved,
  ErrorEvent,
  EvaluationJob,
  EvaluationResponse,
  EvaluationStarted,
  LatestEvaluationResponse,
  ProgressEvent,
  SheetResponse,
  SheetsResponse,
  SheetTemplatesResponse,
} from '../../../core/contract/sheets';

/** A full evaluation queue (429) says when to try again. */
function setRetryAfter(res: Response, err: unknown): void {
  if (err instanceof AppError && err.status === 429) {
    const seconds = err.details?.retryAfterSeconds;
    if (typeof seconds === 'number') res.set('Retry-After', String(seconds));
  }
}

/** Fires when the client goes away before the answer is complete. */
function disconnectSignal(res: Response): AbortSignal {
  const controller = new AbortController();
  res.on('close', () => {
    if (!res.writableFinished) controller.abort();
  });
  return controller.signal;
}

const jobParams = sheetParams.extend({
  jobId: z.string().regex(/^[0-9a-f-]{36}$/, 'must be an evaluation id'),
});

/** A solver's progress as the editor shows it, with the share of the sheet done. */
function progressEvent(p: SheetProgress): ProgressEvent {
  return {
    ...p,
    // within a solving modes block, the share of its modes converged so far
    fraction:
      p.blockCount > 0
        ? (p.blockIndex + (p.modesWanted ? (p.modesConverged ?? 0) / p.modesWanted : 0)) /
          p.blockCount
        : null,
  };
}

/** Server-sent events on `res`: the headers go with the first event. */
function eventStream(res: Response) {
  let started = false;
  const send = (
    ...[event, data]:
      | ['progress', ProgressEvent]
      | ['result', EvaluationResponse | EvaluationJob]
      | ['error', ErrorEvent]
  ) => {
    if (!started) {
      started = true;
      res.status(200).set({
        'Content-Type': 'text/event-stream; charset=utf-8',
        'Cache-Control': 'no-cache, no-transform',
        'X-Accel-Buffering': 'no',
      });
      res.flushHeaders();
    }
    if (!res.writableEnded) res.write(`event: ${event}\ndata: ${JSON.stringify(data)}\n\n`);
  };
  return {
    send,
    started: () => started,
    sendError: (err: AppError) =>
      send('error', {
        error: {
          code: err.code,
          message: err.message,
          ...(err.field ? { field: err.field } : {}),
          ...(err.details ? { details: err.details } : {}),
        },
      }),
  };
}

/**
 * Sheets in a project (DESIGN §4): list, create (empty or from a template), read, rename, save
 * the draft with optimistic concurrency, delete a never-issued draft, evaluate the editor's text
 * (plain or as server-sent events). Mounted at /api.
 */
export function createSheetsRouter(ctx: AppContext): Router {
  const { log } = ctx;
  const router = Router();

  router.get('/sheet-templates', requireSignedIn, (_req, res) => {
    res.json({ templates: sheetsService.templates() } satisfies SheetTemplatesResponse);
  });

  router.get('/projects/:projectId/sheets', requireSignedIn, async (req, res) => {
    const { projectId } = parse(projectParams, req.params, 'params');
    res.json({
      sheets: await sheetsService.list(ctx, currentUser(req), projectId),
    } satisfies SheetsResponse);
  });

  router.post('/projects/:projectId/sheets', requireSignedIn, async (req, res) => {
    const { projectId } = parse(projectParams, req.params, 'params');
    const input = parse(createSheetBody, req.body);
    const sheet = await sheetsService.create(ctx, currentUser(req), projectId, input);
    res
      .status(201)
      .location(`/api/sheets/${sheet.id}`)
      .json({ sheet } satisfies SheetResponse);
  });

  router.get('/sheets/:sheetId', requireSignedIn, async (req, res) => {
    const { sheetId } = parse(sheetParams, req.params, 'params');
    const sheet = await sheetsService.get(ctx, currentUser(req), sheetId);
    res.set('ETag', `"${sheet.draftVersion}"`).json({ sheet } satisfies SheetResponse);
  });

  router.patch('/sheets/:sheetId', requireSignedIn, async (req, res) => {
    const { sheetId } = parse(sheetParams, req.params, 'params');
    const input = parse(updateSheetBody, req.body);
    res.json({
      sheet: await sheetsService.update(ctx, currentUser(req), sheetId, input),
    } satisfies SheetResponse);
  });

  router.put('/sheets/:sheetId/draft', requireSignedIn, async (req, res) => {
    const { sheetId } = parse(sheetParams, req.params, 'params');
    const version = parseIfMatch(req.get('if-match'));
    if (version === null) throw missingIfMatch();
    const input = parse(draftBody, req.body);
    const saved = await sheetsService.saveDraft(ctx, currentUser(req), sheetId, version, input);
    res.set('ETag', `"${saved.draftVersion}"`).json(saved satisfies DraftSaved);
  });

  router.delete('/sheets/:sheetId', requireSignedIn, async (req, res) => {
    const { sheetId } = parse(sheetParams, req.params, 'params');
    await sheetsService.remove(ctx, currentUser(req), sheetId);
    res.status(204).end();
  });

  router.post('/sheets/:sheetId/evaluate', requireSignedIn, async (req, res) => {
    const { sheetId } = parse(sheetParams, req.params, 'params');
    const input = parse(draftBody, req.body);
    try {
      const out = await evaluateSheetDraft(ctx, currentUser(req), sheetId, input, {
        signal: disconnectSignal(res),
      });
      res.json(out satisfies EvaluationResponse);
    } catch (err) {
      setRetryAfter(res, err);
      throw err;
    }
  });

  // Server-sent events: `progress` (one per block, with `fraction` done), then `result` or
  // `error`. A client that disconnects cancels the evaluation. Refusals before the first event
  // (sign-in, role, input, a full queue) answer as ordinary JSON errors with their status.
  router.post('/sheets/:sheetId/evaluate/stream', requireSignedIn, async (req, res) => {
    const { sheetId } = parse(sheetParams, req.params, 'params');
    const input = parse(draftBody, req.body);
    const user = currentUser(req);
    await ctx.access.sheet(user, sheetId, 'sheet.evaluate');

    const signal = disconnectSignal(res);
    const stream = eventStream(res);
    try {
      const out = await evaluateSheetDraft(ctx, user, sheetId, input, {
        signal,
        onProgress: (p) => stream.send('progress', progressEvent(p)),
      });
      stream.send('result', out);
    } catch (e) {
      if (signal.aborted) {
        res.end();
        return;
      }
      if (!stream.started()) {
        setRetryAfter(res, e);
        throw e;
      }
      stream.sendError(normaliseError(e, log, `POST ${req.originalUrl}`));
    }
    res.end();
  });

  // Evaluations not bound to a request (long solves): started, followed by server-sent events
  // from any page, cancelled; closing the page does not stop them.
  router.post('/sheets/:sheetId/evaluations', requireSignedIn, async (req, res) => {
    const { sheetId } = parse(sheetParams, req.params, 'params');
    const input = parse(draftBody, req.body);
    try {
      const started = await startDetachedEvaluation(ctx, currentUser(req), sheetId, input);
      // An unchanged text: the stored results at once (200), no job. Otherwise 202 and a job.
      if ('stored' in started)
        res.status(200).json({ job: started.stored } satisfies EvaluationStarted);
      else {
        res
          .status(202)
          .json({ job: { id: started.queued, state: 'waiting' } } satisfies EvaluationStarted);
      }
    } catch (err) {
      setRetryAfter(res, err);
      throw err;
    }
  });

  router.get('/sheets/:sheetId/evaluations/latest', requireSignedIn, async (req, res) => {
    const { sheetId } = parse(sheetParams, req.params, 'params');
    res.json({
      job: await latestDetachedEvaluation(ctx, currentUser(req), sheetId),
    } satisfies LatestEvaluationResponse);
  });

  // `progress` events while it runs, then `result` (the job with its results and digests) or
  // `error`. A client that disconnects stops following; the evaluation goes on.
  router.get('/sheets/:sheetId/evaluations/:jobId/events', requireSignedIn, async (req, res) => {
    const { sheetId, jobId } = parse(jobParams, req.params, 'params');
    const signal = disconnectSignal(res);
    const stream = eventStream(res);
    try {
      const job = await followDetachedEvaluation(ctx, currentUser(req), sheetId, jobId, {
        signal,
        onProgress: (p) => stream.send('progress', progressEvent(p)),
      });
      if (job.state === 'failed' && job.error) stream.send('error', { error: job.error });
      else stream.send('result', job);
    } catch (e) {
      if (signal.aborted) {
        res.end();
        return;
      }
      if (!stream.started()) throw e;
      stream.sendError(normaliseError(e, log, `GET ${req.originalUrl}`));
    }
    res.end();
  });

  router.delete('/sheets/:sheetId/evaluations/:jobId', requireSignedIn, async (req, res) => {
    const { sheetId, jobId } = parse(jobParams, req.params, 'params');
    await cancelDetachedEvaluation(ctx, currentUser(req), sheetId, jobId);
    res.status(204).end();
  });

  return router;
}
