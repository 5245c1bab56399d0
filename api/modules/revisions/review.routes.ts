import { Router } from 'express';
import type { AppContext } from '../../http/context';
import { createMailer, type Mailer } from '../../mail/mailer';
import { createRemarksRouter } from '../remarks/remarks.routes';
import { createSealsRouter } from '../seals/seals.routes';
import { createVerifyRouter, type VerifyRouterOptions } from '../verify/verify.routes';
import { evaluatorFrom, inProcessResults, type ResultsRunner } from './evaluator';
import type { ReviewDeps } from './review-deps';
import { createRevisionsRouter } from './revisions.routes';

export interface ReviewRouterOptions {
  /** How evaluations run: pass the worker pool's runner (default: the engine in this thread). */
  runner?: ResultsRunner;
  /** Default: SMTP when MW_SMTP_URL is set, else the outbox table. */
  mailer?: Mailer;
  verify?: VerifyRouterOptions;
}

/**
 * Review and seal (issue 7), mounted at /api: revisions, remarks, seals and the public verify
 * route. Paths inside are full (`/sheets/:sheetId/revisions`, `/revisions/:id/…`, `/remarks/…`,
 * `/verify/:code`).
 */
export function createReviewRouter(ctx: AppContext, options: ReviewRouterOptions = {}): Router {
  const deps: ReviewDeps = {
    db: ctx.db,
    log: ctx.log,
    mailer: options.mailer ?? createMailer({ db: ctx.db }),
    evaluate: evaluatorFrom(options.runner ?? inProcessResults),
  };
  const router = Router();
  router.use(createRevisionsRouter(deps));
  router.use(createRemarksRouter(deps));
  router.use(createSealsRouter(deps));
  router.use(createVerifyRouter(deps, options.verify));
  return router;
}
