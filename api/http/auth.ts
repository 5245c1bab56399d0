import type { Request, RequestHandler } from 'express';
import type { User } from '../modules/users/users.repository';
import { ForbiddenError, UnauthenticatedError } from './errors';

/**
 * Who is signed in. Every route states who may call it with one of:
 *   requireSignedIn                      any signed-in person (else 401 UNAUTHENTICATED)
 *   requireAdmin                         the installation admin (401, else 403 FORBIDDEN)
 *   ctx.access.requireProject(action)    the one access policy (api/http/access.ts) for
 *                                        /:projectId routes; services ask it for sheets,
 *                                        revisions and remarks
 */

/** Finds the person a session names (handed in by createApp: the users service). */
export type FindUser = (userId: number) => Promise<User | undefined>;

/** Puts the signed-in person on req.user (fresh from the database, so role changes apply now). */
export function loadSessionUser(findUser: FindUser): RequestHandler {
  return async (req, _res, next) => {
    const userId = req.session?.userId;
    if (userId !== undefined) {
      const user = await findUser(userId);
      if (user) req.user = user;
      else delete req.session.userId;
    }
    next();
  };
}

/** The signed-in person, for handlers behind requireSignedIn and the others below. */
export function currentUser(req: Request): User {
  if (!req.user) throw new UnauthenticatedError();
  return req.user;
}

export const requireSignedIn: RequestHandler = (req, _res, next) => {
  currentUser(req);
  next();
};

export const requireAdmin: RequestHandler = (req, _res, next) => {
  const user = currentUser(req);
  if (!user.isAdmin) throw new ForbiddenError('Only an administrator can do this.');
  next();
};
