import { Router } from 'express';
import { currentUser, requireAdmin } from '../../http/auth';
import type { AppContext } from '../../http/context';
import { parse } from '../../http/validate';
import { projectParams } from '../projects/projects.schemas';
import { addMemberBody, changeRolesBody, memberParams } from './members.schemas';
import { membersService } from './members.service';
import type { MemberResponse, MembersResponse } from '../../../core/contract/projects';

/** Mounted at /api/projects/:projectId/members. */
export function createMembersRouter({ db, access }: AppContext): Router {
  const router = Router({ mergeParams: true });

  router.get('/', access.requireProject('project.read'), async (req, res) => {
    const { projectId } = parse(projectParams, req.params, 'params');
    res.json({ members: await membersService.list(db, projectId) } satisfies MembersResponse);
  });

  router.post('/', requireAdmin, async (req, res) => {
    const { projectId } = parse(projectParams, req.params, 'params');
    const input = parse(addMemberBody, req.body);
    const member = await membersService.add(db, currentUser(req), projectId, input);
    res.status(201).json({ member } satisfies MemberResponse);
  });

  router.patch('/:userId', requireAdmin, async (req, res) => {
    const { projectId, userId } = parse(memberParams, req.params, 'params');
    const { roles } = parse(changeRolesBody, req.body);
    const member = await membersService.changeRoles(db, currentUser(req), projectId, userId, roles);
    res.json({ member } satisfies MemberResponse);
  });

  router.delete('/:userId', requireAdmin, async (req, res) => {
    const { projectId, userId } = parse(memberParams, req.params, 'params');
    await membersService.remove(db, currentUser(req), projectId, userId);
    res.status(204).end();
  });

  return router;
}
