/**
 * Canonical JSON and SHA-256 digests. Canonical JSON: object keys sorted by code unit, no
 * whitespace, numbers printed with `Number.prototype.toString` (shortest round-trip form),
 * non-finite numbers refused, `undefined` fields dropped. The same results give the same bytes on
 * every run and every machine.
 */
import { sha256 } from '@noble/hashes/sha2.js';
import { bytesToHex, utf8ToBytes } from '@noble/hashes/utils.js';
import { EngineError } from '../errors';
import { canonicalText } from './source';
import type { Sheet, SheetResults } from './types';
import { ENGINE_VERSION } from './version';

/** Canonical JSON of a plain value (see the module comment). */
export function canonicalJson(value: unknown): string {
  if (value === null) return 'null';
  switch (typeof value) {
    case 'number':
      if (!Number.isFinite(value)) {
        throw new EngineError(
          'SHEET_EVAL',
          'A result is not a finite number and cannot be stored.',
        );
      }
      return Object.is(value, -0) ? '0' : value.toString();
    case 'boolean':
      return value ? 'true' : 'false';
    case 'string':
      return JSON.stringify(value);
    case 'object': {
      if (Array.isArray(value))
        return `[${value.map((v) => canonicalJson(v === undefined ? null : v)).join(',')}]`;
      if (ArrayBuffer.isView(value)) {
        return canonicalJson(Array.from(value as unknown as ArrayLike<number>));
      }
      const obj = value as Record<string, unknown>;
      const keys = Object.keys(obj)
        .filter((k) => obj[k] !== undefined)
        .sort();
      return `{${keys.map((k) => `${JSON.stringify(k)}:${canonicalJson(obj[k])}`).join(',')}}`;
    }
    default:
      throw new EngineError('SHEET_EVAL', `A result of type ${typeof value} cannot be stored.`);
  }
}

/** SHA-256 of a UTF-8 string, lower-case hex. */
export function sha256Hex(text: string): string {
  return bytesToHex(sha256(utf8ToBytes(text)));
}

export interface SheetDigests {
  /** SHA-256 of the canonical text. */
  canonicalText: string;
  /** SHA-256 of the canonical JSON of the results. */
  results: string;
}

/**
 * The canonical text, canonical results JSON and their digests, with the engine version.
 *
 * @example
 * const d = digestSheet(sheet, evaluateSheet(sheet));
 * d.digests.canonicalText // 64 hex digits
 */
export function digestSheet(
  sheet: Sheet,
  results: SheetResults,
): { canonicalText: string; resultsJson: string; digests: SheetDigests; engineVersion: string } {
  const text = canonicalText(sheet);
  const resultsJson = canonicalJson(results);
  return {
    canonicalText: text,
    resultsJson,
    digests: { canonicalText: sha256Hex(text), results: sha256Hex(resultsJson) },
    engineVersion: ENGINE_VERSION,
  };
}
