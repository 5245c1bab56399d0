import { AppError, BadRequestError, PayloadTooLargeError } from './errors';
import { DatabaseUnavailableError, isDatabaseUnavailable } from './database-unavailable';

interface BodyParserError {
  type?: unknown;
  status?: unknown;
  expose?: unknown;
  message?: unknown;
}

/**
 * The errors the request machinery raises before a route runs (body-parser, busboy inside
 * multer) and a database that cannot be reached, as the API's errors; undefined for anything
 * else. Every one is the client's or the infrastructure's, never a 500.
 */
export function requestErrorFrom(err: unknown): AppError | undefined {
  if (isDatabaseUnavailable(err)) return new DatabaseUnavailableError();
  const e = (err ?? {}) as BodyParserError;
  switch (e.type) {
    case 'entity.too.large':
      return new PayloadTooLargeError('The request body is too large.');
    case 'entity.parse.failed':
      return new BadRequestError('The request body is not valid JSON.');
    case 'charset.unsupported':
      return new AppError(415, 'UNSUPPORTED_CHARSET', 'Send the request body as UTF-8.');
    case 'encoding.unsupported':
      return new AppError(
        415,
        'UNSUPPORTED_ENCODING',
        'The request body is compressed in a way the server does not read; send it uncompressed.',
      );
    case 'request.aborted':
    case 'request.size.invalid':
    case 'stream.encoding.set':
    case 'stream.not.readable':
      return new BadRequestError('The request body arrived incomplete or unreadable.');
    default:
      break;
  }
  // Anything else body-parser marks as the client's fault (http-errors with expose).
  if (
    typeof e.status === 'number' &&
    e.status >= 400 &&
    e.status < 500 &&
    e.expose === true &&
    typeof e.message === 'string'
  ) {
    return new AppError(
      e.status,
      e.status === 413 ? 'PAYLOAD_TOO_LARGE' : 'BAD_REQUEST',
      e.message,
    );
  }
  return undefined;
}

/** busboy's words for a multipart body that is cut off or malformed. */
export function isMalformedMultipart(err: unknown): boolean {
  const message = err instanceof Error ? err.message : '';
  return /Unexpected end of (form|multipart)|Malformed (part )?header|Malformed urlencoded|multipart|boundary/i.test(
    message,
  );
}
