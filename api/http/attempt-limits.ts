import type { RequestHandler, Response } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import { RateLimitedError } from './errors';

export interface AttemptLimit {
  /** Failed attempts allowed within windowMs. */
  limit: number;
  windowMs: number;
}

function minutesLeft(res: Response, windowMs: number): { seconds?: number; words: string } {
  const seconds = Number(res.getHeader('Retry-After')) || undefined;
  const minutes = Math.max(1, Math.ceil((seconds ?? windowMs / 1000) / 60));
  return { ...(seconds ? { seconds } : {}), words: `${minutes} minute${minutes === 1 ? '' : 's'}` };
}

/**
 * Failed sign-ins per client address, whatever e-mail they try: guessing across many accounts
 * from one address is stopped too. Only failures count (skipSuccessfulRequests), so an office
 * behind one address signing in all day is not locked out. The per-e-mail limit of the auth
 * router stays as it is.
 */
export function signInAddressLimiter({ limit, windowMs }: AttemptLimit): RequestHandler {
  return rateLimit({
    windowMs,
    limit,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    keyGenerator: (req) => `address|${ipKeyGenerator(req.ip ?? 'unknown')}`,
    handler: (_req, res, next) => {
      const wait = minutesLeft(res, windowMs);
      next(
        new RateLimitedError(
          `Too many failed sign-ins from this address. Try again in ${wait.words}.`,
          wait.seconds,
        ),
      );
    },
  });
}

/**
 * Wrong current passwords per signed-in person (password change, seal): a stolen session cannot
 * be used to guess the password behind it. Counted per person, not per address. A 403 is what a
 * wrong password answers; other answers do not count.
 */
export function passwordCheckLimiter({ limit, windowMs }: AttemptLimit): RequestHandler {
  return rateLimit({
    windowMs,
    limit,
    skip: (req) => !req.user,
    requestWasSuccessful: (_req, res) => res.statusCode !== 403,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    keyGenerator: (req) => `person|${req.user?.id ?? 0}`,
    handler: (_req, res, next) => {
      const wait = minutesLeft(res, windowMs);
      next(
        new RateLimitedError(`Too many wrong passwords. Try again in ${wait.words}.`, wait.seconds),
      );
    },
  });
}
