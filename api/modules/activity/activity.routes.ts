import { Router } from 'express';
import { requireProjectRole } from '../../http/auth';
import type { AppContext } from '../../http/context';
import { parse } from '../../http/validate';
import { projectParams } from '../projects/projects.schemas';
import { activityService } from './activity.service';

/** Mounted at /api/projects/:projectId/activity. */
export function createActivityRouter({ db }: AppContext): Router {
  const router = Router({ mergeParams: true });

  router.get('/', requireProjectRole(db), async (req, res) => {
    const { projectId } = parse(projectParams, req.params, 'params');
    res.json({ activity: await activityService.listForProject(db, projectId) });
  });

  return router;
}
