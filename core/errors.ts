/**
 * Typed errors raised by the engine and the sheet evaluator. Every refusal carries an
 * UPPER_SNAKE code that the API maps to a 422 response, a message written for an engineer, and
 * optional details (where, by how much) for the client to show beside the input.
 *
 * @example
 * throw new EngineError('MATRIX_NOT_SYMMETRIC', 'K is not symmetric: K[3,7] = 12 but K[7,3] = 11.', { row: 3, col: 7 });
 */
export type EngineErrorCode =
  | 'MATRIX_NOT_SQUARE'
  | 'MATRIX_SIZE_MISMATCH'
  | 'MATRIX_NOT_SYMMETRIC'
  | 'MATRIX_NOT_FINITE'
  | 'MATRIX_FILE_INVALID'
  | 'MASS_NOT_PSD'
  | 'MASS_SINGULAR'
  | 'STIFFNESS_SINGULAR'
  | 'STIFFNESS_NOT_PSD'
  | 'ZERO_PIVOT'
  | 'NO_CONVERGENCE'
  | 'MODEL_TOO_LARGE'
  | 'CANCELLED'
  | 'INVALID_OPTION'
  | 'INVALID_MODEL'
  | 'SHEET_PARSE'
  | 'SHEET_EVAL'
  | 'SHEET_LIMIT'
  | 'NOT_EVALUATED';

export class EngineError extends Error {
  readonly code: EngineErrorCode;
  readonly details: Record<string, unknown> | undefined;

  constructor(code: EngineErrorCode, message: string, details?: Record<string, unknown>) {
    super(message);
    this.name = 'EngineError';
    this.code = code;
    this.details = details;
  }
}

/** Thrown when an iteration stops at its limit; carries what was found so far. */
export class NoConvergenceError<P = unknown> extends EngineError {
  readonly partial: P;

  constructor(message: string, partial: P, details?: Record<string, unknown>) {
    super('NO_CONVERGENCE', message, details);
    this.name = 'NoConvergenceError';
    this.partial = partial;
  }
}

/** True for any typed error of the engine or the sheet evaluator. */
export function isEngineError(e: unknown): e is EngineError {
  return e instanceof EngineError;
}
