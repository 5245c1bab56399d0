import { randomUUID } from 'node:crypto';
import type { ErrorRequestHandler, RequestHandler } from 'express';
import { isEngineError } from '../../core/index';
import { duplicateKeyIndex, isDuplicateKeyError } from '../db/index';
import { AppError, ConflictError, NotFoundError } from './errors';
import type { Logger } from './logger';
import { requestErrorFrom } from './request-errors';
import { isZodError, validationErrorFrom } from './validate';

/** Which field a unique index protects, so a duplicate can be attached to the form input. */
const uniqueIndexFields: Record<string, { field: string; message: string }> = {
  projects_job_number_unique: {
    field: 'jobNumber',
    message: 'A project with this job number already exists.',
  },
  users_email_unique: {
    field: 'email',
    message: 'A person with this e-mail address already exists.',
  },
};

interface EngineErrorLike {
  name: string;
  code: string;
  message: string;
  details?: Record<string, unknown> | undefined;
}

// core's typed errors; an error rebuilt after crossing a worker thread has lost its class, so one
// with the engine's name and a code counts too.
function isEngineFailure(e: unknown): e is EngineErrorLike {
  return (
    isEngineError(e) ||
    (e instanceof Error &&
      (e.name === 'EngineError' || e.name === 'NoConvergenceError') &&
      typeof (e as { code?: unknown }).code === 'string')
  );
}

/** Normalises anything thrown into an AppError; unknown errors become a 500 with a log id. */
export function normaliseError(err: unknown, log: Logger, where: string): AppError {
  if (err instanceof AppError) return err;
  if (isZodError(err)) return validationErrorFrom(err);
  if (isEngineFailure(err)) {
    return new AppError(422, err.code, err.message, err.details ? { details: err.details } : {});
  }
  const fromRequest = requestErrorFrom(err);
  if (fromRequest) return fromRequest;
  if (isDuplicateKeyError(err)) {
    const known = uniqueIndexFields[duplicateKeyIndex(err) ?? ''];
    return new ConflictError(known?.message ?? 'This record already exists.', {
      code: 'DUPLICATE',
      ...(known ? { field: known.field } : {}),
    });
  }
  const logId = randomUUID().slice(0, 8);
  log.error(`[${logId}] ${where}`, err);
  return new AppError(500, 'INTERNAL', `Something went wrong on the server (log id ${logId}).`, {
    details: { logId },
  });
}

export function errorMiddleware(log: Logger): ErrorRequestHandler {
  return (err, req, res, _next) => {
    const path = req.originalUrl.split('?')[0];
    const appError = normaliseError(err, log, `${req.method} ${path}`);
    if (res.headersSent) {
      res.end();
      return;
    }
    const retryAfter = appError.details?.retryAfterSeconds;
    if (typeof retryAfter === 'number' && !res.getHeader('Retry-After')) {
      res.set('Retry-After', String(retryAfter));
    }
    res.status(appError.status).json({
      error: {
        code: appError.code,
        message: appError.message,
        ...(appError.field ? { field: appError.field } : {}),
        ...(appError.details ? { details: appError.details } : {}),
      },
    });
  };
}

/** Unknown /api addresses answer in the error shape rather than with the client's page. */
export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new NotFoundError(`There is no API route ${req.method} ${req.originalUrl.split('?')[0]}.`));
};
