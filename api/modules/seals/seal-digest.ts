import { canonicalJson, sha256Hex } from '../../../core/index';

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

/**
 * The seal digest: SHA-256 over the sheet engine's canonical JSON (sorted keys, no spaces) of
 * the payload, tagged with its format so a later format can never be confused with this one.
 */
export function sealDigest(payload: SealPayload): string {
  return sha256Hex(canonicalJson({ format: 'modewright-seal-v1', ...payload }));
}
