import { Router } from 'express';
import { currentUser, requireAdmin } from '../../http/auth';
import type { AppContext } from '../../http/context';
import { parse } from '../../http/validate';
import { createUserBody } from './users.schemas';
import { usersService } from './users.service';

export function createUsersRouter({ db }: AppContext): Router {
  const router = Router();

  router.get('/', requireAdmin, async (_req, res) => {
    res.json({ users: await usersService.list(db) });
  });

  router.post('/', requireAdmin, async (req, res) => {
    const input = parse(createUserBody, req.body);
    const user = await usersService.create(db, currentUser(req), input);
    res.status(201).json({ user });
  });

  return router;
}
