import { canonicalJson, canonicalText, sha256Hex, type SheetBlock } from '../../../core/index';
import type { Db } from '../../db/index';
import { revisionsService } from '../revisions/revisions.service';
import { normalizeSealCode } from '../seals/seal-code';
import { sealDigest } from '../seals/seal-digest';
import { sealsService } from '../seals/seals.service';
import { verifyDigest } from '../seals/signing-keys';
import { sheetsService } from '../sheets/sheets.service';

export type Verdict = 'genuine' | 'does-not-match' | 'unknown-code';

export interface VerifyResult {
  verdict: Verdict;
  code: string | null;
  sheet: { number: string; title: string } | null;
  project: { jobNumber: string; name: string } | null;
  revision: { number: number; status: string; supersededAt: string | null } | null;
  principal: { name: string; licenceNumber: string; jurisdiction: string } | null;
  sealedAt: string | null;
  digest: string | null;
  /** Why it does not match (empty when genuine); notes that do not change the verdict follow. */
  reasons: string[];
  notes: string[];
}

const unknown = (code: string | null, reason: string): VerifyResult => ({
  verdict: 'unknown-code',
  code,
  sheet: null,
  project: null,
  revision: null,
  principal: null,
  sealedAt: null,
  digest: null,
  reasons: [reason],
  notes: [],
});

function isCanonicalJson(text: string): boolean {
  try {
    return canonicalJson(JSON.parse(text)) === text;
  } catch {
    return false;
  }
}

function safeCanonicalText(blocks: unknown): string | null {
  try {
    return canonicalText({ blocks: blocks as SheetBlock[] });
  } catch {
    return null;
  }
}

export const verifyService = {
  /**
   * Recomputes everything from the stored revision row, never from stored digests: the SHA-256 of
   * its canonical text and of its results, the canonical text rebuilt from its blocks, the seal
   * digest over those, and the Ed25519 signature against the principal's public key.
   */
  async verify(db: Db, rawCode: string): Promise<VerifyResult> {
    const code = normalizeSealCode(rawCode);
    if (!code) {
      return unknown(null, 'A seal code is 10 letters and digits, printed as XXXXX-XXXXX.');
    }
    const seal = await sealsService.findByCode(db, code);
    if (!seal) return unknown(code, `No seal has the code ${code}.`);
    const rev = await revisionsService.find(db, seal.revisionId);
    const sheet = rev ? await sheetsService.findContext(db, rev.sheetId) : undefined;
    const reasons: string[] = [];
    const notes: string[] = [];
    if (!rev || !sheet) {
      reasons.push('The sealed revision is no longer in the database.');
    } else {
      const textDigest = sha256Hex(rev.canonicalText);
      if (textDigest !== seal.canonicalTextDigest) {
        reasons.push('The canonical text of the revision is not the text that was sealed.');
      }
      const rebuilt = safeCanonicalText(rev.blocks);
      if (rebuilt !== rev.canonicalText) {
        reasons.push("The revision's blocks no longer give its canonical text.");
      }
      const resultsDigest = sha256Hex(rev.resultsText);
      const canonicalResults = isCanonicalJson(rev.resultsText);
      if (resultsDigest !== seal.resultsDigest || !canonicalResults) {
        reasons.push('The results of the revision are not the results that were sealed.');
      }
      if (rev.engineVersion !== seal.engineVersion) {
        reasons.push(
          'The engine version recorded with the revision is not the one that was sealed.',
        );
      }
      if (rev.status !== 'sealed' && rev.status !== 'superseded') {
        reasons.push(`The revision is recorded as ${rev.status}, not sealed.`);
      }
      const digest = sealDigest({
        canonicalTextDigest: textDigest,
        resultsDigest,
        engineVersion: rev.engineVersion,
        revisionId: rev.id,
        revisionNumber: rev.number,
        sheetId: rev.sheetId,
        principalId: seal.principalId,
        licenceNumber: seal.licenceNumber,
        sealedAt: seal.sealedAt,
      });
      if (digest !== seal.digest) {
        reasons.push(
          'The seal digest recomputed from the stored revision differs from the digest that was signed.',
        );
      }
      if (!verifyDigest(seal.publicKey, seal.digest, seal.signature)) {
        reasons.push("The signature is not the principal's signature of the seal digest.");
      }
      const key = await sealsService.signingKeyOf(db, seal.principalId);
      if (!key || key.publicKey.trim() !== seal.publicKey.trim()) {
        reasons.push(
          "The key that signed this seal is not the principal's registered signing key.",
        );
      }
      if (rev.status === 'superseded') {
        notes.push(
          `Rev ${rev.number} has been superseded by a later sealed revision of this sheet.`,
        );
      }
    }
    return {
      verdict: reasons.length === 0 ? 'genuine' : 'does-not-match',
      code,
      sheet: sheet ? { number: sheet.number, title: sheet.title } : null,
      project: sheet ? { jobNumber: sheet.projectJobNumber, name: sheet.projectName } : null,
      revision: rev
        ? { number: rev.number, status: rev.status, supersededAt: rev.supersededAt }
        : null,
      principal: {
        name: seal.principalName,
        licenceNumber: seal.licenceNumber,
        jurisdiction: seal.jurisdiction,
      },
      sealedAt: seal.sealedAt,
      digest: seal.digest,
      reasons,
      notes,
    };
  },
};
