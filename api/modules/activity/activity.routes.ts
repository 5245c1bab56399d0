import { Router } from 'express';
import type { AppContext } from '../../http/context';
import { parse } from '../../http/validate';
import { projectParams } from '../projects/projects.schemas';
import { activityService } from './activity.service';

/** Mounted at /api/projects/:projectId/activity. */
export function createActivityRouter({ db, access }: AppContext): Router {
  const router = Router({ mergeParams: true });

  router.get('/', access.requireProject('project.read'), async (req, res) => {
    const { projectId } = parse(projectParams, req.params, 'params');
    res.json({ activity: await activityService.listForProject(db, projectId) });
  });

  return router;
}
