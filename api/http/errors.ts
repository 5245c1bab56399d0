/**
 * The one error model of the API. Every error response is
 * { error: { code, message, field?, details? } } with the status of the subclass.
 */
export interface AppErrorOptions {
  field?: string;
  details?: Record<string, unknown>;
}

export class AppError extends Error {
  readonly status: number;
  readonly code: string;
  readonly field: string | undefined;
  readonly details: Record<string, unknown> | undefined;

  constructor(status: number, code: string, message: string, options: AppErrorOptions = {}) {
    super(message);
    this.name = 'AppError';
    this.status = status;
    this.code = code;
    this.field = options.field;
    this.details = options.details;
  }
}

export class BadRequestError extends AppError {
  constructor(message: string, options?: AppErrorOptions) {
    super(400, 'BAD_REQUEST', message, options);
  }
}

export class UnauthenticatedError extends AppError {
  constructor(message = 'Sign in to continue.', code = 'UNAUTHENTICATED') {
    super(401, code, message);
  }
}

export class ForbiddenError extends AppError {
  constructor(message = 'Your role does not allow this.', code = 'FORBIDDEN') {
    super(403, code, message);
  }
}

export class NotFoundError extends AppError {
  constructor(message: string) {
    super(404, 'NOT_FOUND', message);
  }
}

export class ConflictError extends AppError {
  constructor(message: string, options?: AppErrorOptions & { code?: 'CONFLICT' | 'DUPLICATE' }) {
    super(409, options?.code ?? 'CONFLICT', message, options);
  }
}

export class PayloadTooLargeError extends AppError {
  constructor(message: string) {
    super(413, 'PAYLOAD_TOO_LARGE', message);
  }
}

export class ValidationError extends AppError {
  constructor(message: string, options?: AppErrorOptions) {
    super(422, 'VALIDATION', message, options);
  }
}

export class RateLimitedError extends AppError {
  constructor(message: string, retryAfterSeconds?: number) {
    super(
      429,
      'RATE_LIMITED',
      message,
      retryAfterSeconds === undefined ? {} : { details: { retryAfterSeconds } },
    );
  }
}
