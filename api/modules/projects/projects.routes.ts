import { Router } from 'express';
import { currentUser, requireAdmin, requireSignedIn } from '../../http/auth';
import type { AppContext } from '../../http/context';
import { parse } from '../../http/validate';
import { createProjectBody, projectParams, updateProjectBody } from './projects.schemas';
import { projectsService } from './projects.service';
import type { ProjectResponse, ProjectsResponse } from '../../../core/contract/projects';

export function createProjectsRouter({ db, access }: AppContext): Router {
  const router = Router();

  router.get('/', requireSignedIn, async (req, res) => {
    res.json({
      projects: await projectsService.list(db, currentUser(req)),
    } satisfies ProjectsResponse);
  });

  router.post('/', requireAdmin, async (req, res) => {
    const input = parse(createProjectBody, req.body);
    const project = await projectsService.create(db, currentUser(req), input);
    res.status(201).json({ project } satisfies ProjectResponse);
  });

  router.get('/:projectId', access.requireProject('project.read'), async (req, res) => {
    const { projectId } = parse(projectParams, req.params, 'params');
    res.json({
      project: await projectsService.get(db, currentUser(req), projectId),
    } satisfies ProjectResponse);
  });

  router.patch('/:projectId', requireAdmin, async (req, res) => {
    const { projectId } = parse(projectParams, req.params, 'params');
    const input = parse(updateProjectBody, req.body);
    res.json({
      project: await projectsService.update(db, currentUser(req), projectId, input),
    } satisfies ProjectResponse);
  });

  return router;
}
