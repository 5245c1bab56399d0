import { Router } from 'express';
import { currentUser, requireSignedIn } from '../../http/auth';
import type { AppContext } from '../../http/context';
import { parse } from '../../http/validate';
import { sealsService } from '../seals/seals.service';
import { comparePrintService } from './compare-print.service';
import {
  compareQuery,
  issueBody,
  returnBody,
  revisionParams,
  sheetParams,
  signOffBody,
} from './revisions.schemas';
import { revisionsService } from './revisions.service';
import type { ActivityResponse } from '../../../core/contract/activity';
import type { CompareResponse } from '../../../core/contract/compare';
import type { PrintResponse } from '../../../core/contract/print';
import type {
  RevisionDetailResponse,
  RevisionResponse,
  RevisionsResponse,
} from '../../../core/contract/revisions';

/**
 * Revisions of a sheet: issue, list, read, return, sign off, compare, print, and the sheet's
 * history. Mounted at /api.
 */
export function createRevisionsRouter(ctx: AppContext): Router {
  const router = Router();

  router.get('/sheets/:sheetId/revisions', requireSignedIn, async (req, res) => {
    const { sheetId } = parse(sheetParams, req.params, 'params');
    res.json({
      revisions: await revisionsService.list(ctx, currentUser(req), sheetId),
    } satisfies RevisionsResponse);
  });

  router.post('/sheets/:sheetId/revisions', requireSignedIn, async (req, res) => {
    const { sheetId } = parse(sheetParams, req.params, 'params');
    const { purpose } = parse(issueBody, req.body);
    const revision = await revisionsService.issue(ctx, currentUser(req), sheetId, purpose);
    res.status(201).json({ revision } satisfies RevisionResponse);
  });

  router.get('/sheets/:sheetId/activity', requireSignedIn, async (req, res) => {
    const { sheetId } = parse(sheetParams, req.params, 'params');
    res.json({
      activity: await revisionsService.history(ctx, currentUser(req), sheetId),
    } satisfies ActivityResponse);
  });

  router.get('/revisions/:revisionId', requireSignedIn, async (req, res) => {
    const { revisionId } = parse(revisionParams, req.params, 'params');
    const revision = await revisionsService.get(ctx, currentUser(req), revisionId);
    res.json({
      revision: { ...revision, seal: await sealsService.viewOf(ctx.db, revisionId) },
    } satisfies RevisionDetailResponse);
  });

  router.post('/revisions/:revisionId/return', requireSignedIn, async (req, res) => {
    const { revisionId } = parse(revisionParams, req.params, 'params');
    const { note } = parse(returnBody, req.body ?? {});
    res.json({
      revision: await revisionsService.returnRevision(ctx, currentUser(req), revisionId, note),
    } satisfies RevisionResponse);
  });

  router.post('/revisions/:revisionId/sign-off', requireSignedIn, async (req, res) => {
    const { revisionId } = parse(revisionParams, req.params, 'params');
    const input = parse(signOffBody, req.body ?? {});
    res.json({
      revision: await revisionsService.signOff(ctx, currentUser(req), revisionId, input),
    } satisfies RevisionResponse);
  });

  router.get('/sheets/:sheetId/compare', requireSignedIn, async (req, res) => {
    const { sheetId } = parse(sheetParams, req.params, 'params');
    const q = parse(compareQuery, req.query, 'query');
    res.json(
      (await comparePrintService.compare(
        ctx,
        currentUser(req),
        sheetId,
        q.from,
        q.to,
      )) satisfies CompareResponse,
    );
  });

  router.get('/revisions/:revisionId/print', requireSignedIn, async (req, res) => {
    const { revisionId } = parse(revisionParams, req.params, 'params');
    res.json(
      (await comparePrintService.print(ctx, currentUser(req), revisionId)) satisfies PrintResponse,
    );
  });

  router.get('/revisions/:revisionId/spreadsheet', requireSignedIn, async (req, res) => {
    const { revisionId } = parse(revisionParams, req.params, 'params');
    const file = await comparePrintService.spreadsheet(ctx, currentUser(req), revisionId);
    res
      .type('application/vnd.openxmlformats-officedocument.spreadsheetml.sheet')
      .attachment(file.fileName)
      .send(file.bytes);
  });

  return router;
}
