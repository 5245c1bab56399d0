import { Router } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import { z } from 'zod';
import { RateLimitedError } from '../../http/errors';
import { parse } from '../../http/validate';
import type { AppContext } from '../../http/context';
import { verifyService } from './verify.service';
import type { VerifyResult } from '../../../core/contract/verify';

const verifyParams = z.object({
  code: z
    .string()
    .min(1, { error: 'Give the seal code.' })
    .max(64, { error: 'A seal code is 11 characters.' }),
});

export interface VerifyRouterOptions {
  /** Look-ups allowed per client address per minute (public route). Default 60. */
  perMinute?: number;
}

/** GET /verify/:code — public, no sign-in, rate limited. Mounted at /api. */
export function createVerifyRouter(ctx: AppContext, options: VerifyRouterOptions = {}): Router {
  const router = Router();
  const limiter = rateLimit({
    windowMs: 60_000,
    limit: options.perMinute ?? Number(process.env.MW_VERIFY_LIMIT ?? 60),
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    keyGenerator: (req) => ipKeyGenerator(req.ip ?? 'unknown'),
    handler: (_req, res, next) => {
      const retryAfter = Number(res.getHeader('Retry-After')) || 60;
      next(
        new RateLimitedError(
          `Too many seal look-ups from this address; try again in a minute.`,
          retryAfter,
        ),
      );
    },
  });
  router.get('/verify/:code', limiter, async (req, res) => {
    const { code } = parse(verifyParams, req.params, 'params');
    const result: VerifyResult = await verifyService.verify(ctx.db, code);
    res.set('Cache-Control', 'no-store').json(result);
  });
  return router;
}
