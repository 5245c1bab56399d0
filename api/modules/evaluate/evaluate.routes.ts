/**
 * POST /api/evaluate           a sheet's blocks → { results, digests, engineVersion, canonicalText }
 * POST /api/evaluate/stream    the same, as server-sent events: `progress` events, then one
 *                              `result` (or `error`) event; cancelled when the client disconnects
 * POST /api/evaluate/diff      { old, new } sheets → { diff, old, new, engineVersion }
 * All signed in. A full queue answers 429 with Retry-After.
 */
import { Router, type Response } from 'express';
import { requireSignedIn } from '../../http/auth';
import type { AppContext } from '../../http/context';
import { AppError } from '../../http/errors';
import { parse } from '../../http/validate';
import { diffBodySchema, evaluateBodySchema } from './evaluate.schemas';
import { diffBodies, evaluateBody, type EvaluationRunner } from './evaluate.service';

export interface EvaluateRouterOptions {
  /** The worker pool's `run` (api/workers/evaluation-pool.ts). */
  run: EvaluationRunner;
}

function setRetryAfter(res: Response, err: unknown): void {
  if (err instanceof AppError && err.status === 429) {
    const s = err.details?.retryAfterSeconds;
    if (typeof s === 'number') res.set('Retry-After', String(s));
  }
}

/** An AbortSignal that fires when the client goes away before the answer is sent. */
function disconnectSignal(res: Response): AbortSignal {
  const controller = new AbortController();
  res.on('close', () => {
    if (!res.writableFinished) controller.abort();
  });
  return controller.signal;
}

export function createEvaluateRouter(_ctx: AppContext, options: EvaluateRouterOptions): Router {
  const router = Router();
  const { run } = options;

  router.post('/evaluate', requireSignedIn, async (req, res) => {
    const body = parse(evaluateBodySchema, req.body);
    try {
      res.json(await evaluateBody(run, body, { signal: disconnectSignal(res) }));
    } catch (err) {
      setRetryAfter(res, err);
      throw err;
    }
  });

  router.post('/evaluate/stream', requireSignedIn, async (req, res) => {
    const body = parse(evaluateBodySchema, req.body);
    const signal = disconnectSignal(res);
    let started = false;
    const start = () => {
      if (started) return;
      started = true;
      res.status(200).set({
        'Content-Type': 'text/event-stream; charset=utf-8',
        'Cache-Control': 'no-cache, no-transform',
        Connection: 'keep-alive',
        'X-Accel-Buffering': 'no',
      });
      res.flushHeaders();
    };
    const send = (event: string, data: unknown) => {
      start();
      res.write(`event: ${event}\ndata: ${JSON.stringify(data)}\n\n`);
    };
    try {
      const out = await evaluateBody(run, body, {
        signal,
        onProgress: (progress) => send('progress', progress),
      });
      send('result', out);
      res.end();
    } catch (err) {
      if (signal.aborted) {
        res.end();
        return;
      }
      if (!started) {
        // Nothing streamed yet: answer with the normal error response and status.
        setRetryAfter(res, err);
        throw err;
      }
      const e =
        err instanceof AppError
          ? {
              code: err.code,
              message: err.message,
              ...(err.details ? { details: err.details } : {}),
            }
          : { code: 'INTERNAL', message: 'The evaluation failed.' };
      send('error', { error: e });
      res.end();
    }
  });

  router.post('/evaluate/diff', requireSignedIn, async (req, res) => {
    const body = parse(diffBodySchema, req.body);
    try {
      res.json(await diffBodies(run, body.old, body.new, { signal: disconnectSignal(res) }));
    } catch (err) {
      setRetryAfter(res, err);
      throw err;
    }
  });

  return router;
}
