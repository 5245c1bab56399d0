import { describeMatrixText, isEngineError, type EngineError } from '../../../core/index';
import { AppError, ValidationError } from '../../http/errors';
import type { UploadAsymmetry, UploadFormat } from './uploads.repository';

/**
 * What an upload response says about a matrix file (core's `MatrixAnalysis`): its shape, the
 * nonzeros of the full matrix, whether it is symmetric and where the worst asymmetry sits.
 */
export interface MatrixFileShape {
  rows: number;
  cols: number;
  nonzeros: number;
  symmetric: boolean;
  worstAsymmetry: UploadAsymmetry | null;
}

/** Matrix Market by the .mtx extension or its header line; CSV by the .csv extension. */
export function detectFormat(name: string, text: string): UploadFormat {
  const lower = name.toLowerCase();
  if (lower.endsWith('.mtx') || lower.endsWith('.mm')) return 'matrix-market';
  if (lower.endsWith('.csv')) return 'csv';
  if (/^%%MatrixMarket/i.test(text)) return 'matrix-market';
  throw new ValidationError(
    `${name} is neither a Matrix Market file (.mtx) nor a CSV file (.csv); upload one of those.`,
    { field: 'file' },
  );
}

/** The engine's refusal of a matrix file as the API's 422 MATRIX_FILE_INVALID naming the line. */
export function matrixFileError(e: EngineError, name: string): AppError {
  const line = typeof e.details?.line === 'number' ? e.details.line : 0;
  return new AppError(422, 'MATRIX_FILE_INVALID', e.message, {
    field: 'file',
    details: { ...e.details, line, file: name, reason: e.code },
  });
}

/**
 * Reads an uploaded matrix file with the engine's readers far enough to describe it (core's
 * `describeMatrixText`), refusing anything that is not a matrix with 422 MATRIX_FILE_INVALID
 * naming the line (`details.line`, 1-based).
 */
export function describeMatrixFile(
  text: string,
  format: UploadFormat,
  name: string,
): MatrixFileShape {
  try {
    return describeMatrixText(text, format, name);
  } catch (e) {
    if (isEngineError(e)) throw matrixFileError(e, name);
    throw e;
  }
}
