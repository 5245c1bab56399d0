import { Router } from 'express';
import { currentUser, requireSignedIn } from '../../http/auth';
import type { AppContext } from '../../http/context';
import { parse } from '../../http/validate';
import { remarkRevisionAccess, revisionAccess } from '../revisions/revisions.service';
import {
  createRemarkBody,
  remarkParams,
  remarkStateBody,
  replyBody,
  replyParams,
  revisionParams,
} from './remarks.schemas';
import { remarksService } from './remarks.service';
import type { RemarkResponse, RemarksResponse } from '../../../core/contract/remarks';

/** Remarks on a revision and their threads. Mounted at /api. */
export function createRemarksRouter(ctx: AppContext): Router {
  const router = Router();

  router.get('/revisions/:revisionId/remarks', requireSignedIn, async (req, res) => {
    const { revisionId } = parse(revisionParams, req.params, 'params');
    const scope = await revisionAccess(ctx, currentUser(req), revisionId, 'sheet.read');
    res.json({ remarks: await remarksService.list(ctx, scope) } satisfies RemarksResponse);
  });

  router.post('/revisions/:revisionId/remarks', requireSignedIn, async (req, res) => {
    const { revisionId } = parse(revisionParams, req.params, 'params');
    const input = parse(createRemarkBody, req.body);
    const user = currentUser(req);
    const scope = await revisionAccess(ctx, user, revisionId, 'remark.add');
    const remark = await remarksService.create(ctx, user, scope, input);
    res.status(201).json({ remark } satisfies RemarkResponse);
  });

  router.post('/remarks/:remarkId/replies', requireSignedIn, async (req, res) => {
    const { remarkId } = parse(remarkParams, req.params, 'params');
    const { text } = parse(replyBody, req.body);
    const user = currentUser(req);
    const scope = await remarkRevisionAccess(ctx, user, remarkId, 'remark.reply');
    const remark = await remarksService.reply(ctx, user, scope, remarkId, text);
    res.status(201).json({ remark } satisfies RemarkResponse);
  });

  router.patch('/remarks/:remarkId/replies/:replyId', requireSignedIn, async (req, res) => {
    const { remarkId, replyId } = parse(replyParams, req.params, 'params');
    const { text } = parse(replyBody, req.body);
    const user = currentUser(req);
    const scope = await remarkRevisionAccess(ctx, user, remarkId, 'remark.reply');
    res.json({
      remark: await remarksService.editReply(ctx, user, scope, remarkId, replyId, text),
    } satisfies RemarkResponse);
  });

  router.delete('/remarks/:remarkId/replies/:replyId', requireSignedIn, async (req, res) => {
    const { remarkId, replyId } = parse(replyParams, req.params, 'params');
    const user = currentUser(req);
    const scope = await remarkRevisionAccess(ctx, user, remarkId, 'remark.reply');
    res.json({
      remark: await remarksService.withdrawReply(ctx, user, scope, remarkId, replyId),
    } satisfies RemarkResponse);
  });

  router.patch('/remarks/:remarkId', requireSignedIn, async (req, res) => {
    const { remarkId } = parse(remarkParams, req.params, 'params');
    const { state } = parse(remarkStateBody, req.body);
    const user = currentUser(req);
    const scope = await remarkRevisionAccess(ctx, user, remarkId, 'remark.set_state');
    res.json({
      remark: await remarksService.setState(ctx, user, scope, remarkId, state),
    } satisfies RemarkResponse);
  });

  return router;
}
