import type { Request, RequestHandler } from 'express';
import type { Db } from '../db/index';
import { membersService } from '../modules/members/members.service';
import type { ProjectRole } from '../modules/members/roles';
import { projectsService } from '../modules/projects/projects.service';
import type { User } from '../modules/users/users.repository';
import { usersService } from '../modules/users/users.service';
import { ForbiddenError, NotFoundError, UnauthenticatedError } from './errors';
import { parse } from './validate';
import { projectParams } from '../modules/projects/projects.schemas';

/**
 * The one authorization helper. Every route states who may call it with one of:
 *   requireSignedIn            any signed-in person (else 401 UNAUTHENTICATED)
 *   requireAdmin               the installation admin (401, else 403 FORBIDDEN)
 *   requireProjectRole(db, r)  a member of :projectId holding one of roles r (any role when r is
 *                              omitted), or an admin; 401, 422 for a bad id, 404, else 403
 */

/** Puts the signed-in person on req.user (fresh from the database, so role changes apply now). */
export function loadSessionUser(db: Db): RequestHandler {
  return async (req, _res, next) => {
    const userId = req.session?.userId;
    if (userId !== undefined) {
      const user = await usersService.findById(db, userId);
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

const roleList = (roles: readonly ProjectRole[]) =>
  roles.length === 1 ? `the ${roles[0]}` : `a ${roles.slice(0, -1).join(', ')} or ${roles.at(-1)}`;

export function requireProjectRole(db: Db, roles?: readonly ProjectRole[]): RequestHandler {
  return async (req, _res, next) => {
    const user = currentUser(req);
    const { projectId } = parse(projectParams, req.params, 'params');
    if (!(await projectsService.exists(db, projectId))) {
      throw new NotFoundError(`There is no project with id ${projectId}.`);
    }
    if (user.isAdmin) return next();
    const held = await membersService.rolesOf(db, projectId, user.id);
    if (held.length === 0) {
      throw new ForbiddenError('You are not a member of this project.');
    }
    if (roles && !roles.some((r) => held.includes(r))) {
      throw new ForbiddenError(`Only ${roleList(roles)} of this project can do this.`);
    }
    next();
  };
}
