import { Router } from 'express';
import { currentUser, requireSignedIn } from '../../http/auth';
import type { AppContext } from '../../http/context';
import { parse } from '../../http/validate';
import { changePasswordBody } from './account.schemas';
import { accountService } from './account.service';

/** Mounted at /api/auth: POST /password. */
export function createAccountRouter({ db }: AppContext): Router {
  const router = Router();
  router.post('/password', requireSignedIn, async (req, res) => {
    const input = parse(changePasswordBody, req.body);
    res.json(await accountService.changePassword(db, currentUser(req), input, req.sessionID));
  });
  return router;
}
