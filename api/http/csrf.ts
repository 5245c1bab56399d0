import { randomBytes, timingSafeEqual } from 'node:crypto';
import type { Request, RequestHandler } from 'express';
import { ForbiddenError } from './errors';

// The synchronizer-token pattern: the token lives in the session and every state-changing
// request repeats it in the X-CSRF-Token header, which a cross-site form cannot set.
const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

export function newCsrfToken(): string {
  return randomBytes(32).toString('base64url');
}

/** The session's token, made (and the session with it) when there is none yet. */
export function ensureCsrfToken(req: Request): string {
  req.session.csrfToken ??= newCsrfToken();
  return req.session.csrfToken;
}

function sameToken(a: string, b: string): boolean {
  const x = Buffer.from(a);
  const y = Buffer.from(b);
  return x.length === y.length && timingSafeEqual(x, y);
}

export const csrfProtection: RequestHandler = (req, _res, next) => {
  if (SAFE_METHODS.has(req.method)) return next();
  const sent = req.get('x-csrf-token');
  const expected = req.session?.csrfToken;
  if (!sent || !expected || !sameToken(sent, expected)) {
    return next(
      new ForbiddenError(
        'The form has expired or did not come from this site. Reload the page and try again.',
        'CSRF_INVALID',
      ),
    );
  }
  next();
};
