import { EngineError } from '../errors';

/** Throws INVALID_MODEL unless x is a finite number > 0 (or ≥ 0 when `allowZero`). */
export function positiveNumber(x: unknown, field: string, what: string, allowZero = false): number {
  if (typeof x !== 'number' || !Number.isFinite(x) || x < 0 || (!allowZero && x === 0)) {
    throw new EngineError(
      'INVALID_MODEL',
      `${what} must be a finite number ${allowZero ? '≥ 0' : '> 0'}, got ${String(x)}.`,
      { field },
    );
  }
  return x;
}
