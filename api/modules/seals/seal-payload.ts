import { canonicalJson, sha256Hex } from '../../../core/index';
import { sealDigest, type SealPayload } from './seal-digest';

/** The payload version new seals are made with. */
export const SEAL_PAYLOAD_VERSION = 2;

/**
 * What a version-2 seal adds to version 1: every value /verify shows besides the revision's own
 * digests, as it was at sealing.
 */
export interface SealedNames {
  projectName: string;
  projectJobNumber: string;
  sheetNumber: string;
  sheetTitle: string;
  principalName: string;
  jurisdiction: string;
}

export type SealPayloadV2 = SealPayload & SealedNames;

/** A seal's stored facts, enough to rebuild the payload its digest was made from. */
export interface StoredSealFacts {
  payloadVersion: number;
  principalId: number;
  principalName: string;
  licenceNumber: string;
  jurisdiction: string;
  sealedAt: string;
  projectName: string | null;
  projectJobNumber: string | null;
  sheetNumber: string | null;
  sheetTitle: string | null;
}

/** The revision's values, recomputed from its stored row by whoever checks the seal. */
export interface RevisionFacts {
  canonicalTextDigest: string;
  resultsDigest: string;
  engineVersion: string;
  revisionId: number;
  revisionNumber: number;
  sheetId: number;
}

/**
 * The version-2 digest: SHA-256 over the canonical JSON of the payload tagged
 * 'modewright-seal-v2'. The tag keeps it apart from version 1, whose payload lacks the names.
 */
export function sealDigestV2(payload: SealPayloadV2): string {
  return sha256Hex(canonicalJson({ format: 'modewright-seal-v2', ...payload }));
}

/** The payload and digest a new seal signs. */
export function buildSealPayload(
  revision: RevisionFacts,
  seal: Omit<StoredSealFacts, 'payloadVersion'> & SealedNames,
): { payloadVersion: number; payload: SealPayloadV2; digest: string } {
  const payload: SealPayloadV2 = {
    ...revision,
    principalId: seal.principalId,
    licenceNumber: seal.licenceNumber,
    sealedAt: seal.sealedAt,
    projectName: seal.projectName,
    projectJobNumber: seal.projectJobNumber,
    sheetNumber: seal.sheetNumber,
    sheetTitle: seal.sheetTitle,
    principalName: seal.principalName,
    jurisdiction: seal.jurisdiction,
  };
  return { payloadVersion: SEAL_PAYLOAD_VERSION, payload, digest: sealDigestV2(payload) };
}

/**
 * Recomputes a stored seal's digest with the payload of its own version: a version-1 seal from
 * the revision, principal, licence and time; a version-2 seal from those and the stored names.
 * Null for a version this server does not know.
 */
export function recomputeSealDigest(revision: RevisionFacts, seal: StoredSealFacts): string | null {
  const base: SealPayload = {
    ...revision,
    principalId: seal.principalId,
    licenceNumber: seal.licenceNumber,
    sealedAt: seal.sealedAt,
  };
  if (seal.payloadVersion === 1) return sealDigest(base);
  if (seal.payloadVersion !== 2) return null;
  return sealDigestV2({
    ...base,
    projectName: seal.projectName ?? '',
    projectJobNumber: seal.projectJobNumber ?? '',
    sheetNumber: seal.sheetNumber ?? '',
    sheetTitle: seal.sheetTitle ?? '',
    principalName: seal.principalName,
    jurisdiction: seal.jurisdiction,
  });
}
