import { Router } from 'express';
import { currentUser, requireSignedIn } from '../../http/auth';
import { parse } from '../../http/validate';
import { checkSheetAccess } from '../sheets/sheets.access';
import { reviewRepository } from './review.repository';
import type { ReviewDeps } from './review-deps';
import { comparePrintService } from './compare-print.service';
import { compareQuery, issueBody, revisionParams, sheetParams } from './revisions.schemas';
import { revisionsService } from './revisions.service';

/** Revisions of a sheet: issue, list, read, return, sign off, and the sheet's history. */
export function createRevisionsRouter(deps: ReviewDeps): Router {
  const router = Router();

  router.get('/sheets/:sheetId/revisions', requireSignedIn, async (req, res) => {
    const { sheetId } = parse(sheetParams, req.params, 'params');
    res.json({ revisions: await revisionsService.list(deps, currentUser(req), sheetId) });
  });

  router.post('/sheets/:sheetId/revisions', requireSignedIn, async (req, res) => {
    const { sheetId } = parse(sheetParams, req.params, 'params');
    const { purpose } = parse(issueBody, req.body);
    const revision = await revisionsService.issue(deps, currentUser(req), sheetId, purpose);
    res.status(201).json({ revision });
  });

  router.get('/sheets/:sheetId/activity', requireSignedIn, async (req, res) => {
    const { sheetId } = parse(sheetParams, req.params, 'params');
    const access = await checkSheetAccess(deps.db, currentUser(req), sheetId);
    res.json({
      activity: await reviewRepository.sheetActivity(deps.db, access.projectId, sheetId),
    });
  });

  router.get('/revisions/:revisionId', requireSignedIn, async (req, res) => {
    const { revisionId } = parse(revisionParams, req.params, 'params');
    res.json({ revision: await revisionsService.get(deps, currentUser(req), revisionId) });
  });

  router.post('/revisions/:revisionId/return', requireSignedIn, async (req, res) => {
    const { revisionId } = parse(revisionParams, req.params, 'params');
    res.json({
      revision: await revisionsService.returnRevision(deps, currentUser(req), revisionId),
    });
  });

  router.post('/revisions/:revisionId/sign-off', requireSignedIn, async (req, res) => {
    const { revisionId } = parse(revisionParams, req.params, 'params');
    res.json({ revision: await revisionsService.signOff(deps, currentUser(req), revisionId) });
  });

  router.get('/sheets/:sheetId/compare', requireSignedIn, async (req, res) => {
    const { sheetId } = parse(sheetParams, req.params, 'params');
    const q = parse(compareQuery, req.query, 'query');
    res.json(await comparePrintService.compare(deps, currentUser(req), sheetId, q.from, q.to));
  });

  router.get('/revisions/:revisionId/print', requireSignedIn, async (req, res) => {
    const { revisionId } = parse(revisionParams, req.params, 'params');
    res.json(await comparePrintService.print(deps, currentUser(req), revisionId));
  });

  return router;
}
