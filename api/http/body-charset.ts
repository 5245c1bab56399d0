import type { RequestHandler } from 'express';
import { AppError } from './errors';

const UTF8 = new Set(['utf-8', 'utf8']);

/**
 * Refuses a body that declares a charset other than UTF-8 with 415 UNSUPPORTED_CHARSET, before
 * the JSON parser reads it: JSON travels in UTF-8 (RFC 8259 §8.1), and every text the API stores
 * is kept in UTF-8. A body without a charset parameter is read as UTF-8.
 */
export const requireUtf8Body: RequestHandler = (req, _res, next) => {
  const type = req.headers['content-type'];
  if (!type || req.is('multipart/form-data')) return next();
  const declared = /;\s*charset\s*=\s*"?([^";\s]+)"?/i.exec(type)?.[1]?.toLowerCase();
  if (declared === undefined || UTF8.has(declared)) return next();
  next(
    new AppError(
      415,
      'UNSUPPORTED_CHARSET',
      `The request body is declared as ${declared}; send it as UTF-8 (charset=utf-8).`,
      { details: { charset: declared } },
    ),
  );
};
