import type { Sheet, SheetBlock } from '../../../core/index';
import { AppError, NotFoundError } from '../../http/errors';
import { dbNow } from '../../db/index';
import type { User } from '../users/users.repository';
import { checkSheetAccess } from '../sheets/sheets.access';
import { remarksRepository } from '../remarks/remarks.repository';
import { sealsRepository, type SealRecord } from '../seals/seals.repository';
import { carryRemarks } from './carry-over';
import { issuedMail, returnedMail, signedOffMail } from './review-mail';
import { reviewRepository, type SheetContext } from './review.repository';
import { recordReviewActivity, sendAfterCommit, type ReviewDeps } from './review-deps';
import {
  revisionsRepository,
  type RevisionBlock,
  type RevisionRecord,
  type RevisionSummary,
} from './revisions.repository';

/** The seal as a revision shows it. */
export interface SealView {
  code: string;
  digest: string;
  signature: string;
  publicKey: string;
  principal: { id: number; name: string; licenceNumber: string; jurisdiction: string };
  sealedAt: string;
  engineVersion: string;
}

/** A revision as the API sends it (GET /api/revisions/:id). */
export interface RevisionDetail extends RevisionSummary {
  blocks: RevisionBlock[];
  settings: Record<string, unknown>;
  canonicalText: string;
  results: unknown;
  digests: { canonicalText: string; results: string };
  engineVersion: string;
  seal: SealView | null;
  sheet: { id: number; number: string; title: string; projectId: number };
  myRoles: string[];
}

export function sealView(seal: SealRecord): SealView {
  return {
    code: seal.code,
    digest: seal.digest,
    signature: seal.signature,
    publicKey: seal.publicKey,
    principal: {
      id: seal.principalId,
      name: seal.principalName,
      licenceNumber: seal.licenceNumber,
      jurisdiction: seal.jurisdiction,
    },
    sealedAt: seal.sealedAt,
    engineVersion: seal.engineVersion,
  };
}

export function sheetOf(rev: Pick<RevisionRecord, 'blocks' | 'settings'>): Sheet {
  return { blocks: rev.blocks as SheetBlock[], settings: rev.settings };
}

export async function mustFindSheet(deps: ReviewDeps, sheetId: number): Promise<SheetContext> {
  const sheet = await reviewRepository.sheetContext(deps.db, sheetId);
  if (!sheet) throw new NotFoundError(`There is no sheet with id ${sheetId}.`);
  return sheet;
}

export async function mustFindRevision(
  deps: ReviewDeps,
  revisionId: number,
): Promise<RevisionRecord> {
  const rev = await revisionsRepository.findById(deps.db, revisionId);
  if (!rev) throw new NotFoundError(`There is no revision with id ${revisionId}.`);
  return rev;
}

/** The revision, its sheet and the caller's roles; 404 / 403 as for the sheet. */
export async function revisionAccess(
  deps: ReviewDeps,
  user: User,
  revisionId: number,
  need?: ('author' | 'checker' | 'principal' | 'viewer')[],
  action?: string,
): Promise<{ rev: RevisionRecord; sheet: SheetContext; myRoles: string[] }> {
  const sheetId = await revisionsRepository.findSheetIdOf(deps.db, revisionId);
  if (sheetId === undefined) throw new NotFoundError(`There is no revision with id ${revisionId}.`);
  const access = await checkSheetAccess(deps.db, user, sheetId, need, action);
  const [rev, sheet] = await Promise.all([
    mustFindRevision(deps, revisionId),
    mustFindSheet(deps, sheetId),
  ]);
  return { rev, sheet, myRoles: access.myRoles };
}

const statusWords: Record<string, string> = {
  in_check: 'in check',
  returned: 'returned to the author',
  checked: 'signed off and awaiting its seal',
  sealed: 'sealed',
  superseded: 'superseded by a later sealed revision',
};

export function wrongState(
  rev: { number: number; status: string },
  needed: string,
  code: string,
): AppError {
  return new AppError(
    409,
    code,
    `Rev ${rev.number} is ${statusWords[rev.status] ?? rev.status}; ${needed}.`,
    { details: { status: rev.status } },
  );
}

function checkerIsAuthor(rev: RevisionRecord, doing: string): AppError {
  return new AppError(
    403,
    'CHECKER_IS_AUTHOR',
    `You issued Rev ${rev.number}, so you cannot ${doing} it: a revision is checked by someone who did not write it.`,
  );
}

/** The revision and its sheet for a checker's action; 403 when the checker issued it. */
async function checkerAccess(
  deps: ReviewDeps,
  user: User,
  revisionId: number,
  doing: string,
): Promise<{ rev: RevisionRecord; sheet: SheetContext }> {
  const { rev, sheet } = await revisionAccess(
    deps,
    user,
    revisionId,
    ['checker'],
    `${doing} a revision`,
  );
  if (rev.issuedBy.id === user.id) throw checkerIsAuthor(rev, doing);
  return { rev, sheet };
}

type Trx = Parameters<typeof revisionsRepository.lockStatus>[0];

/** Locks the revision's row and refuses (409 `code`) unless its status is `wanted`. */
export async function lockStatusIs(
  trx: Trx,
  rev: RevisionRecord,
  wanted: RevisionRecord['status'],
  needed: string,
  code: string,
): Promise<void> {
  const status = await revisionsRepository.lockStatus(trx, rev.id);
  if (status !== wanted) {
    throw wrongState({ number: rev.number, status: status ?? rev.status }, needed, code);
  }
}

/** The sheet's new status and the checker's activity entry, inside the action's transaction. */
async function recordCheck(
  trx: Trx,
  user: User,
  sheet: SheetContext,
  rev: RevisionRecord,
  sheetStatus: 'returned' | 'checked',
  action: 'revision.returned' | 'revision.signed_off',
): Promise<void> {
  await reviewRepository.setSheetStatus(trx, sheet.id, sheetStatus);
  await recordReviewActivity(trx, {
    actorId: user.id,
    projectId: sheet.projectId,
    action,
    objectType: 'revision',
    objectId: rev.id,
    details: { sheetId: sheet.id, revisionNumber: rev.number },
  });
}

async function emails(
  deps: ReviewDeps,
  projectId: number,
  roles: string[],
  except?: number,
): Promise<string[]> {
  const people = await reviewRepository.members(deps.db, projectId, roles);
  return people.filter((p) => p.id !== except).map((p) => p.email);
}

async function emailOf(deps: ReviewDeps, userId: number): Promise<string[]> {
  const person = await reviewRepository.userEmail(deps.db, userId);
  return person ? [person.email] : [];
}

export const revisionsService = {
  async list(deps: ReviewDeps, user: User, sheetId: number): Promise<RevisionSummary[]> {
    await checkSheetAccess(deps.db, user, sheetId);
    return revisionsRepository.listBySheet(deps.db, sheetId);
  },

  async get(deps: ReviewDeps, user: User, revisionId: number): Promise<RevisionDetail> {
    const { rev, sheet, myRoles } = await revisionAccess(deps, user, revisionId);
    const seal = await sealsRepository.findByRevision(deps.db, rev.id);
    const { resultsText, ...rest } = rev;
    return {
      ...rest,
      results: JSON.parse(resultsText) as unknown,
      seal: seal ? sealView(seal) : null,
      sheet: { id: sheet.id, number: sheet.number, title: sheet.title, projectId: sheet.projectId },
      myRoles,
    };
  },

  /**
   * Issue for check (author): evaluate the draft in a worker, then in one transaction freeze
   * blocks, canonical text, results, both digests and the engine version as Rev n+1, carry the
   * open and answered remarks of Rev n over, and move the sheet to in check.
   */
  async issue(
    deps: ReviewDeps,
    user: User,
    sheetId: number,
    purpose: string,
  ): Promise<RevisionSummary> {
    const access = await checkSheetAccess(
      deps.db,
      user,
      sheetId,
      ['author'],
      'issue a sheet for check',
    );
    const snapshot = await reviewRepository.draftOf(deps.db, sheetId);
    if (!snapshot) throw new NotFoundError(`There is no sheet with id ${sheetId}.`);
    const sheet: Sheet = {
      blocks: snapshot.draft.blocks as SheetBlock[],
      settings: snapshot.draft.settings ?? {},
    };
    if (sheet.blocks.length === 0) {
      throw new AppError(
        422,
        'SHEET_EMPTY',
        'The draft has no blocks: there is nothing to issue for check.',
      );
    }
    const latestBefore = await revisionsRepository.findLatest(deps.db, sheetId);
    refuseWhileInReview(latestBefore);

    const uploads = await reviewRepository.uploadsOf(deps.db, sheetId);
    const evaluation = await deps.evaluate(sheet, uploads);
    const firstError = evaluation.results.errors[0];
    if (firstError) {
      throw new AppError(
        422,
        'SHEET_HAS_ERRORS',
        `The draft has ${evaluation.results.errors.length} error(s); fix them before issuing. ` +
          `First: block ${firstError.blockIndex + 1} (${firstError.blockId}), line ${firstError.line}: ${firstError.message}`,
        { details: { errors: evaluation.results.errors.slice(0, 20) } },
      );
    }

    const issuedAt = await dbNow(deps.db);
    const outcome = await deps.db.transaction(async (trx) => {
      await reviewRepository.lockSheet(trx, sheetId);
      const latest = await revisionsRepository.findLatest(trx, sheetId);
      refuseWhileInReview(latest);
      const number = (latest?.number ?? 0) + 1;
      const revisionId = await revisionsRepository.insert(trx, {
        sheetId,
        number,
        purpose,
        blocks: sheet.blocks,
        settings: (sheet.settings ?? {}) as Record<string, unknown>,
        canonicalText: evaluation.canonicalText,
        resultsText: evaluation.resultsJson,
        canonicalTextDigest: evaluation.digests.canonicalText,
        resultsDigest: evaluation.digests.results,
        engineVersion: evaluation.engineVersion,
        issuedBy: user.id,
        issuedAt,
      });
      const carried = latest
        ? await carryRemarks(trx, {
            from: latest,
            toRevisionId: revisionId,
            toSheet: sheet,
            at: issuedAt,
          })
        : { carried: 0, lineChanged: 0 };
      await reviewRepository.setSheetStatus(trx, sheetId, 'in_check');
      await recordReviewActivity(trx, {
        actorId: user.id,
        projectId: access.projectId,
        action: 'revision.issued',
        objectType: 'revision',
        objectId: revisionId,
        details: {
          sheetId,
          revisionNumber: number,
          purpose,
          canonicalTextDigest: evaluation.digests.canonicalText,
          resultsDigest: evaluation.digests.results,
          remarksCarried: carried.carried,
          remarksLineChanged: carried.lineChanged,
        },
      });
      return { revisionId, number, carried };
    });

    const ctx = await mustFindSheet(deps, sheetId);
    await sendAfterCommit(
      deps,
      issuedMail(ctx, await emails(deps, ctx.projectId, ['checker'], user.id), {
        number: outcome.number,
        purpose,
        issuedBy: user.name,
        remarksCarried: outcome.carried.carried,
        lineChanged: outcome.carried.lineChanged,
      }),
    );
    const list = await revisionsRepository.listBySheet(deps.db, sheetId);
    const made = list.find((r) => r.id === outcome.revisionId);
    if (!made) throw new Error('the issued revision was not found after commit');
    return made;
  },

  /** Return (checker, not the author): the revision goes back; the author edits the draft. */
  async returnRevision(deps: ReviewDeps, user: User, revisionId: number): Promise<RevisionSummary> {
    const { rev, sheet } = await checkerAccess(deps, user, revisionId, 'return');
    const at = await dbNow(deps.db);
    await deps.db.transaction(async (trx) => {
      await lockStatusIs(
        trx,
        rev,
        'in_check',
        'only a revision in check can be returned',
        'REVISION_NOT_IN_CHECK',
      );
      await revisionsRepository.markReturned(trx, rev.id, user.id, at);
      await recordCheck(trx, user, sheet, rev, 'returned', 'revision.returned');
    });
    const open = await remarksRepository.countNotClosed(deps.db, rev.id);
    await sendAfterCommit(
      deps,
      returnedMail(sheet, await emailOf(deps, rev.issuedBy.id), {
        number: rev.number,
        by: user.name,
        openRemarks: open,
      }),
    );
    return summaryOf(deps, rev.id);
  },

  /** Sign off (checker, not the author): every remark of the revision must be closed. */
  async signOff(deps: ReviewDeps, user: User, revisionId: number): Promise<RevisionSummary> {
    const { rev, sheet } = await checkerAccess(deps, user, revisionId, 'sign off');
    const at = await dbNow(deps.db);
    await deps.db.transaction(async (trx) => {
      await lockStatusIs(
        trx,
        rev,
        'in_check',
        'only a revision in check can be signed off',
        'REVISION_NOT_IN_CHECK',
      );
      const notClosed = await remarksRepository.countNotClosed(trx, rev.id);
      if (notClosed > 0) {
        throw new AppError(
          409,
          'OPEN_REMARKS',
          `Rev ${rev.number} has ${notClosed} remark(s) that are not closed; close every remark before signing off.`,
          { details: { notClosed } },
        );
      }
      await revisionsRepository.markChecked(trx, rev.id, user.id, at);
      await recordCheck(trx, user, sheet, rev, 'checked', 'revision.signed_off');
    });
    await sendAfterCommit(
      deps,
      signedOffMail(sheet, await emails(deps, sheet.projectId, ['principal']), {
        number: rev.number,
        by: user.name,
      }),
    );
    return summaryOf(deps, rev.id);
  },
};

function refuseWhileInReview(latest: RevisionRecord | undefined): void {
  if (!latest) return;
  if (latest.status === 'in_check') {
    throw wrongState(
      latest,
      'it must be returned or signed off and sealed before the next revision is issued',
      'REVISION_IN_CHECK',
    );
  }
  if (latest.status === 'checked') {
    throw wrongState(
      latest,
      'it must be sealed before the next revision is issued',
      'REVISION_AWAITING_SEAL',
    );
  }
}

export async function summaryOf(deps: ReviewDeps, revisionId: number): Promise<RevisionSummary> {
  const rev = await mustFindRevision(deps, revisionId);
  const {
    blocks: _b,
    settings: _s,
    canonicalText: _c,
    resultsText: _r,
    digests: _d,
    engineVersion: _e,
    ...summary
  } = rev;
  return summary;
}
