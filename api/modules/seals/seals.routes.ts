import { Router } from 'express';
import { currentUser, requireSignedIn } from '../../http/auth';
import type { AppContext } from '../../http/context';
import { parse } from '../../http/validate';
import { revisionParams } from '../revisions/revisions.schemas';
import { revisionAccess } from '../revisions/revisions.service';
import { sealBody } from './seals.schemas';
import { sealsService } from './seals.service';

/** POST /revisions/:revisionId/seal (principal). Mounted at /api. */
export function createSealsRouter(ctx: AppContext): Router {
  const router = Router();
  router.post('/revisions/:revisionId/seal', requireSignedIn, async (req, res) => {
    const { revisionId } = parse(revisionParams, req.params, 'params');
    const { password, purpose } = parse(sealBody, req.body);
    const user = currentUser(req);
    const scope = await revisionAccess(ctx, user, revisionId, 'revision.seal');
    res.json(await sealsService.seal(ctx, user, scope, { password, purpose }));
  });
  return router;
}
