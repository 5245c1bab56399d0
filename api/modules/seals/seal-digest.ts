import { createHash } from 'node:crypto';

/** Everything a seal vouches for. sealedAt is an ISO-8601 UTC instant with milliseconds. */
export interface SealPayload {
  canonicalTextDigest: string;
  resultsDigest: string;
  engineVersion: string;
  revisionId: number;
  revisionNumber: number;
  sheetId: number;
  principalId: number;
  licenceNumber: string;
  sealedAt: string;
}

/** JSON with object keys sorted at every level, no spaces: one text for one value. */
export function canonicalJson(value: unknown): string {
  if (value === null || typeof value !== 'object') return JSON.stringify(value);
  if (Array.isArray(value)) return `[${value.map((v) => canonicalJson(v)).join(',')}]`;
  const entries = Object.entries(value as Record<string, unknown>)
    .filter(([, v]) => v !== undefined)
    .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
  return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(',')}}`;
}

/** SHA-256 (FIPS 180-4), lower-case hex, of a UTF-8 text. */
export function sha256Hex(text: string): string {
  return createHash('sha256').update(text, 'utf8').digest('hex');
}

/** The seal digest: SHA-256 over the canonical JSON of the payload, tagged with its format. */
export function sealDigest(payload: SealPayload): string {
  return sha256Hex(canonicalJson({ format: 'modewright-seal-v1', ...payload }));
}
