import { Router, type Request } from 'express';
import { z } from 'zod';
import { currentUser, requireAdmin } from '../../http/auth';
import type { AppContext } from '../../http/context';
import { idParam, parse } from '../../http/validate';
import { createUserBody, updateUserBody } from './users.schemas';
import { usersService } from './users.service';
import type { UsersResponse } from '../../../core/contract/people';

const userParams = z.object({ userId: idParam('person id') });

/** Where the reset link points: the address the admin reached this server at. */
function originOf(req: Request): string {
  return `${req.protocol}://${req.get('host') ?? '127.0.0.1'}`;
}

export function createUsersRouter({ db, mailer, log }: AppContext): Router {
  const router = Router();

  router.get('/', requireAdmin, async (_req, res) => {
    res.json({ users: await usersService.list(db) } satisfies UsersResponse);
  });

  router.post('/', requireAdmin, async (req, res) => {
    const input = parse(createUserBody, req.body);
    const user = await usersService.create(db, currentUser(req), input);
    res.status(201).json({ user });
  });

  router.patch('/:userId', requireAdmin, async (req, res) => {
    const { userId } = parse(userParams, req.params, 'params');
    const input = parse(updateUserBody, req.body);
    res.json({ user: await usersService.update(db, currentUser(req), userId, input) });
  });

  router.post('/:userId/deactivate', requireAdmin, async (req, res) => {
    const { userId } = parse(userParams, req.params, 'params');
    res.json(await usersService.deactivate(db, currentUser(req), userId));
  });

  router.post('/:userId/reactivate', requireAdmin, async (req, res) => {
    const { userId } = parse(userParams, req.params, 'params');
    res.json({ user: await usersService.reactivate(db, currentUser(req), userId) });
  });

  router.post('/:userId/password-reset', requireAdmin, async (req, res) => {
    const { userId } = parse(userParams, req.params, 'params');
    const sent = await usersService.sendPasswordReset(
      db,
      { mailer, log },
      currentUser(req),
      userId,
      originOf(req),
    );
    res.status(202).json(sent);
  });

  return router;
}
