import { canonicalJson, canonicalText, sha256Hex, type SheetBlock } from '../../../core/index';
import type { NowNames, Verdict, VerifyResult } from '../../../core/contract/verify';
import type { Db } from '../../db/index';
import { revisionsService } from '../revisions/revisions.service';
import { normalizeSealCode } from '../seals/seal-code';
import { recomputeSealDigest } from '../seals/seal-payload';
import type { SealRecord } from '../seals/seals.repository';
import { sealsService } from '../seals/seals.service';
import { verifyDigest } from '../seals/signing-keys';
import type { SheetContext } from '../sheets/sheets.repository';
import { sheetsService } from '../sheets/sheets.service';

// The verdict and what /verify shows with it: the shapes are the contract's.
export type { NowNames, Verdict, VerifyResult };

const unknown = (code: string | null, reason: string): VerifyResult => ({
  verdict: 'unknown-code',
  code,
  sheet: null,
  project: null,
  revision: null,
  principal: null,
  sealedAt: null,
  digest: null,
  payloadVersion: null,
  now: null,
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

/**
 * The sheet and project names to show: on a version-2 seal the sealed ones, with today's names
 * where they differ (never in their place); on a version-1 seal today's, which were never sealed.
 */
function shownNames(
  seal: SealRecord,
  sheet: SheetContext | undefined,
): Pick<VerifyResult, 'sheet' | 'project' | 'now'> {
  if (seal.payloadVersion < 2) {
    return {
      sheet: sheet ? { number: sheet.number, title: sheet.title } : null,
      project: sheet ? { jobNumber: sheet.projectJobNumber, name: sheet.projectName } : null,
      now: null,
    };
  }
  const sealed = {
    sheet: { number: seal.sheetNumber ?? '', title: seal.sheetTitle ?? '' },
    project: { jobNumber: seal.projectJobNumber ?? '', name: seal.projectName ?? '' },
  };
  const now: NowNames = {};
  if (sheet) {
    if (sheet.number !== sealed.sheet.number) now.sheetNumber = sheet.number;
    if (sheet.title !== sealed.sheet.title) now.sheetTitle = sheet.title;
    if (sheet.projectJobNumber !== sealed.project.jobNumber) {
      now.projectJobNumber = sheet.projectJobNumber;
    }
    if (sheet.projectName !== sealed.project.name) now.projectName = sheet.projectName;
  }
  return { ...sealed, now: Object.keys(now).length > 0 ? now : null };
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
      const digest = recomputeSealDigest(
        {
          canonicalTextDigest: textDigest,
          resultsDigest,
          engineVersion: rev.engineVersion,
          revisionId: rev.id,
          revisionNumber: rev.number,
          sheetId: rev.sheetId,
        },
        seal,
      );
      if (digest === null) {
        reasons.push(
          `The seal is of a format (version ${seal.payloadVersion}) this server does not know.`,
        );
      } else if (digest !== seal.digest) {
        reasons.push(
          'The seal digest recomputed from the stored revision differs from the digest that was signed.',
        );
      }
      if (!verifyDigest(seal.publicKey, seal.digest, seal.signature)) {
        reasons.push("The signature is not the principal's signature of the seal digest.");
      }
      if (
        !(await sealsService.wasSigningKey(
          db,
          seal.principalId,
          seal.publicKey,
          new Date(seal.sealedAt),
        ))
      ) {
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
    const shown = shownNames(seal, sheet);
    if (seal.payloadVersion === 1) {
      notes.push(
        "This seal was made before names were sealed: the sheet and project names, the principal's name and the jurisdiction are shown as stored today and are not part of the seal.",
      );
    }
    return {
      verdict: reasons.length === 0 ? 'genuine' : 'does-not-match',
      code,
      ...shown,
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
      payloadVersion: seal.payloadVersion,
      reasons,
      notes,
    };
  },
};
