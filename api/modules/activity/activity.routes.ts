import { Router } from 'express';
import { permits } from '../../http/access';
import { currentUser, requireSignedIn } from '../../http/auth';
import type { AppContext } from '../../http/context';
import { parse } from '../../http/validate';
import { projectParams } from '../projects/projects.schemas';
import { activityService } from './activity.service';
import type { ActivityResponse } from '../../../core/contract/activity';

/** Mounted at /api/projects/:projectId/activity. */
export function createActivityRouter({ db, access }: AppContext): Router {
  const router = Router({ mergeParams: true });

  router.get('/', requireSignedIn, async (req, res) => {
    const { projectId } = parse(projectParams, req.params, 'params');
    const user = currentUser(req);
    const { myRoles } = await access.project(user, projectId, 'project.read');
    const activity = await activityService.listForProject(db, projectId);
    res.json({
      activity: permits('sheet.read_internal', user, myRoles)
        ? activity
        : activityService.clientFacing(activity),
    } satisfies ActivityResponse);
  });

  return router;
}
