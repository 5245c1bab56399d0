import { Router } from 'express';
import { currentUser, requireSignedIn } from '../../http/auth';
import { parse } from '../../http/validate';
import type { ReviewDeps } from '../revisions/review-deps';
import { remarkParams, revisionParams } from '../revisions/revisions.schemas';
import { createRemarkBody, remarkStateBody, replyBody } from './remarks.schemas';
import { remarksService } from './remarks.service';

export function createRemarksRouter(deps: ReviewDeps): Router {
  const router = Router();

  router.get('/revisions/:revisionId/remarks', requireSignedIn, async (req, res) => {
    const { revisionId } = parse(revisionParams, req.params, 'params');
    res.json({ remarks: await remarksService.list(deps, currentUser(req), revisionId) });
  });

  router.post('/revisions/:revisionId/remarks', requireSignedIn, async (req, res) => {
    const { revisionId } = parse(revisionParams, req.params, 'params');
    const input = parse(createRemarkBody, req.body);
    const remark = await remarksService.create(deps, currentUser(req), revisionId, input);
    res.status(201).json({ remark });
  });

  router.post('/remarks/:remarkId/replies', requireSignedIn, async (req, res) => {
    const { remarkId } = parse(remarkParams, req.params, 'params');
    const { text } = parse(replyBody, req.body);
    const remark = await remarksService.reply(deps, currentUser(req), remarkId, text);
    res.status(201).json({ remark });
  });

  router.patch('/remarks/:remarkId', requireSignedIn, async (req, res) => {
    const { remarkId } = parse(remarkParams, req.params, 'params');
    const { state } = parse(remarkStateBody, req.body);
    res.json({ remark: await remarksService.setState(deps, currentUser(req), remarkId, state) });
  });

  return router;
}
