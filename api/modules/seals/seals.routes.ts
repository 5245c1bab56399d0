import { Router } from 'express';
import { currentUser, requireSignedIn } from '../../http/auth';
import { parse } from '../../http/validate';
import type { ReviewDeps } from '../revisions/review-deps';
import { revisionParams } from '../revisions/revisions.schemas';
import { sealBody } from './seals.schemas';
import { sealsService } from './seals.service';

export function createSealsRouter(deps: ReviewDeps): Router {
  const router = Router();
  router.post('/revisions/:revisionId/seal', requireSignedIn, async (req, res) => {
    const { revisionId } = parse(revisionParams, req.params, 'params');
    const { password } = parse(sealBody, req.body);
    res.json(await sealsService.seal(deps, currentUser(req), revisionId, password));
  });
  return router;
}
