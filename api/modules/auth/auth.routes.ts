import { Router, type Request } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import { currentUser, requireSignedIn } from '../../http/auth';
import type { AppContext } from '../../http/context';
import { ensureCsrfToken, newCsrfToken } from '../../http/csrf';
import { RateLimitedError } from '../../http/errors';
import { parse } from '../../http/validate';
import { resetPasswordBody } from '../users/users.schemas';
import { usersService } from '../users/users.service';
import { signInBody } from './auth.schemas';
import { authService } from './auth.service';
import type { MeResponse, SignInResponse } from '../../../core/contract/people';

function regenerate(req: Request): Promise<void> {
  return new Promise((resolve, reject) =>
    req.session.regenerate((e) => (e ? reject(e) : resolve())),
  );
}

function save(req: Request): Promise<void> {
  return new Promise((resolve, reject) => req.session.save((e) => (e ? reject(e) : resolve())));
}

function destroy(req: Request): Promise<void> {
  return new Promise((resolve, reject) => req.session.destroy((e) => (e ? reject(e) : resolve())));
}

export const SESSION_COOKIE = 'modewright.sid';

export function createAuthRouter({ db, config }: AppContext): Router {
  const router = Router();

  // Failed attempts only count (a person signing in and out all day is not an attack); the key
  // is the client address together with the e-mail tried.
  const signInLimiter = rateLimit({
    windowMs: config.signinWindowMs,
    limit: config.signinLimit,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    keyGenerator: (req) => {
      const email = typeof req.body?.email === 'string' ? req.body.email.trim().toLowerCase() : '';
      return `${ipKeyGenerator(req.ip ?? 'unknown')}|${email}`;
    },
    handler: (_req, res, next) => {
      const retryAfter = Number(res.getHeader('Retry-After')) || undefined;
      const minutes = Math.max(1, Math.ceil((retryAfter ?? config.signinWindowMs / 1000) / 60));
      next(
        new RateLimitedError(
          `Too many sign-in attempts for this e-mail address. Try again in ${minutes} minute${minutes === 1 ? '' : 's'}.`,
          retryAfter,
        ),
      );
    },
  });

  router.get('/csrf', async (req, res) => {
    const csrfToken = ensureCsrfToken(req);
    // Stored before it is handed out: a token the session store never kept is worth nothing.
    await save(req);
    res.json({ csrfToken });
  });

  router.post('/sign-in', signInLimiter, async (req, res) => {
    const input = parse(signInBody, req.body);
    const user = await authService.checkCredentials(db, input);
    // A fresh session id at sign-in: a session id known before sign-in is worth nothing after.
    await regenerate(req);
    req.session.userId = user.id;
    req.session.signedInAt = new Date().toISOString();
    req.session.csrfToken = newCsrfToken();
    await save(req);
    await authService.recordSignedIn(db, user);
    res.json({ user, csrfToken: req.session.csrfToken } satisfies SignInResponse);
  });

  router.post('/sign-out', requireSignedIn, async (req, res) => {
    const user = currentUser(req);
    await authService.recordSignedOut(db, user);
    await destroy(req);
    res.clearCookie(SESSION_COOKIE, { path: '/', httpOnly: true, sameSite: 'lax' });
    res.status(204).end();
  });

  // From the one-time link an admin sent: no session needed, the token is the proof.
  router.post('/password-reset', async (req, res) => {
    const input = parse(resetPasswordBody, req.body);
    res.json(await usersService.resetPassword(db, input));
  });

  router.get('/me', requireSignedIn, (req, res) => {
    res.json({ user: currentUser(req) } satisfies MeResponse);
  });

  return router;
}
