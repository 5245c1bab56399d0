import type { Knex } from 'knex';
import type { Sheet, SheetBlock } from '../../../core/index';
import type { ProjectRole } from '../../../core/vocabulary';
import type { RevisionDetail } from '../../../core/contract/revisions';
import { dbNow, type DbOrTx } from '../../db/index';
import { permits, type AccessAction } from '../../http/access';
import type { AppContext } from '../../http/context';
import { AppError, NotFoundError } from '../../http/errors';
import { sendAfterCommit } from '../../mail/mailer';
import { activityService } from '../activity/activity.service';
import { membersService } from '../members/members.service';
import { remarksService } from '../remarks/remarks.service';
import type { SheetContext } from '../sheets/sheets.repository';
import { sheetsService } from '../sheets/sheets.service';
import type { User } from '../users/users.repository';
import { usersService } from '../users/users.service';
import { failedCriteria, issuedMail, returnedMail, signedOffMail } from './review-mail';
import { checkerIsAuthor, wrongState, type RevisionInScope } from './revision-state';
import {
  revisionsRepository,
  type RevisionRecord,
  type RevisionSummary,
} from './revisions.repository';

/** A revision as GET /api/revisions/:id sends it (the route adds its seal): the contract's shape. */
export type { RevisionDetail };

export function sheetOf(rev: Pick<RevisionRecord, 'blocks' | 'settings'>): Sheet {
  return { blocks: rev.blocks as SheetBlock[], settings: rev.settings };
}

async function mustFindRevision(db: DbOrTx, revisionId: number): Promise<RevisionRecord> {
  const rev = await revisionsRepository.findById(db, revisionId);
  if (!rev) throw new NotFoundError(`There is no revision with id ${revisionId}.`);
  return rev;
}

async function inScope(
  ctx: AppContext,
  scope: { revisionId: number; sheetId: number; myRoles: ProjectRole[] },
): Promise<RevisionInScope> {
  const [rev, sheet] = await Promise.all([
    mustFindRevision(ctx.db, scope.revisionId),
    sheetsService.context(ctx.db, scope.sheetId),
  ]);
  return { rev, sheet, myRoles: scope.myRoles };
}

/** The revision, its sheet and the caller's roles for `action`; 404 / 403 by the access policy. */
export async function revisionAccess(
  ctx: AppContext,
  user: User,
  revisionId: number,
  action: AccessAction,
): Promise<RevisionInScope> {
  return inScope(ctx, await ctx.access.revision(user, revisionId, action));
}

/** As revisionAccess, for the revision a remark was made on. */
export async function remarkRevisionAccess(
  ctx: AppContext,
  user: User,
  remarkId: number,
  action: AccessAction,
): Promise<RevisionInScope> {
  return inScope(ctx, await ctx.access.remark(user, remarkId, action));
}

/** The revision and its sheet for a checker's action; 403 when the checker issued it. */
async function checkerAccess(
  ctx: AppContext,
  user: User,
  revisionId: number,
  action: 'revision.return' | 'revision.sign_off',
  doing: string,
): Promise<RevisionInScope> {
  const scope = await revisionAccess(ctx, user, revisionId, action);
  if (scope.rev.issuedBy.id === user.id) throw checkerIsAuthor(scope.rev, doing);
  return scope;
}

type Trx = Knex.Transaction;

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
  extra: { note: string | null; purpose?: string | null },
): Promise<void> {
  await sheetsService.setStatus(trx, sheet.id, sheetStatus);
  await activityService.record(trx, {
    actorId: user.id,
    projectId: sheet.projectId,
    action,
    objectType: 'revision',
    objectId: rev.id,
    details: {
      sheetId: sheet.id,
      revisionNumber: rev.number,
      ...(extra.note ? { note: extra.note } : {}),
      ...(extra.purpose ? { purpose: extra.purpose } : {}),
    },
  });
}

/** The e-mail addresses of the project's members holding any of `roles`, except one person. */
async function emails(
  ctx: AppContext,
  projectId: number,
  roles: ProjectRole[] | null,
  except?: number,
): Promise<string[]> {
  const members = await membersService.list(ctx.db, projectId);
  return members
    .filter((m) => m.userId !== except && (!roles || m.roles.some((r) => roles.includes(r))))
    .map((m) => m.email);
}

async function emailOf(ctx: AppContext, userId: number): Promise<string[]> {
  const person = await usersService.findById(ctx.db, userId);
  return person ? [person.email] : [];
}

export const revisionsService = {
  async list(ctx: AppContext, user: User, sheetId: number): Promise<RevisionSummary[]> {
    await ctx.access.sheet(user, sheetId, 'sheet.read');
    return revisionsRepository.listBySheet(ctx.db, sheetId);
  },

  /** The sheet's history, newest first: all of it for the firm, the client-facing part for a viewer. */
  async history(ctx: AppContext, user: User, sheetId: number) {
    const scope = await ctx.access.sheet(user, sheetId, 'sheet.read');
    const entries = await activityService.listForSheet(ctx.db, scope.projectId, sheetId);
    return permits('sheet.read_internal', user, scope.myRoles)
      ? entries
      : activityService.clientFacing(entries);
  },

  async get(ctx: AppContext, user: User, revisionId: number): Promise<RevisionDetail> {
    const { rev, sheet, myRoles } = await revisionAccess(ctx, user, revisionId, 'sheet.read');
    const { resultsText, ...rest } = rev;
    return {
      ...rest,
      results: JSON.parse(resultsText) as unknown,
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
    ctx: AppContext,
    user: User,
    sheetId: number,
    purpose: string,
  ): Promise<RevisionSummary> {
    const { db } = ctx;
    const access = await ctx.access.sheet(user, sheetId, 'revision.issue');
    const { draft } = await sheetsService.draftOf(db, sheetId);
    const sheet: Sheet = {
      blocks: draft.blocks as SheetBlock[],
      settings: draft.settings ?? {},
    };
    if (sheet.blocks.length === 0) {
      throw new AppError(
        422,
        'SHEET_EMPTY',
        'The draft has no blocks: there is nothing to issue for check.',
      );
    }
    const latestBefore = await revisionsRepository.findLatest(db, sheetId);
    refuseWhileInReview(latestBefore);

    const evaluation = await sheetsService.evaluateStored(ctx, sheetId, sheet);
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

    const issuedAt = await dbNow(db);
    const outcome = await db.transaction(async (trx) => {
      await sheetsService.lock(trx, sheetId);
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
        ? await remarksService.carryOver(trx, {
            from: latest,
            toRevisionId: revisionId,
            toSheet: sheet,
            at: issuedAt,
          })
        : { carried: 0, lineChanged: 0 };
      await sheetsService.setStatus(trx, sheetId, 'in_check');
      await activityService.record(trx, {
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

    const about = await sheetsService.context(db, sheetId);
    await sendAfterCommit(
      ctx.mailer,
      ctx.log,
      issuedMail(about, await emails(ctx, about.projectId, ['checker'], user.id), {
        number: outcome.number,
        purpose,
        issuedBy: user.name,
        remarksCarried: outcome.carried.carried,
        lineChanged: outcome.carried.lineChanged,
      }),
    );
    const list = await revisionsRepository.listBySheet(db, sheetId);
    const made = list.find((r) => r.id === outcome.revisionId);
    if (!made) throw new Error('the issued revision was not found after commit');
    return made;
  },

  /** Return (checker, not the author): the revision goes back; the author edits the draft. */
  /** Return (checker, not the author), with an optional covering note to the author. */
  async returnRevision(
    ctx: AppContext,
    user: User,
    revisionId: number,
    note: string | null = null,
  ): Promise<RevisionSummary> {
    const { rev, sheet } = await checkerAccess(ctx, user, revisionId, 'revision.return', 'return');
    const at = await dbNow(ctx.db);
    await ctx.db.transaction(async (trx) => {
      await lockStatusIs(
        trx,
        rev,
        'in_check',
        'only a revision in check can be returned',
        'REVISION_NOT_IN_CHECK',
      );
      await revisionsRepository.markReturned(trx, rev.id, user.id, at, note);
      await recordCheck(trx, user, sheet, rev, 'returned', 'revision.returned', { note });
    });
    const open = await remarksService.countNotClosed(ctx.db, rev.id);
    await sendAfterCommit(
      ctx.mailer,
      ctx.log,
      returnedMail(sheet, await emailOf(ctx, rev.issuedBy.id), {
        number: rev.number,
        by: user.name,
        openRemarks: open,
        note,
      }),
    );
    return summaryOf(ctx.db, rev.id);
  },

  /**
   * Sign off (checker, not the author): every remark of the revision must be closed. A failed
   * criterion does not refuse it (a failing check can be the finding the sheet records); the mail
   * names it. The note and the purpose ("For construction") are optional.
   */
  async signOff(
    ctx: AppContext,
    user: User,
    revisionId: number,
    input: { note: string | null; purpose: string | null } = { note: null, purpose: null },
  ): Promise<RevisionSummary> {
    const { rev, sheet } = await checkerAccess(
      ctx,
      user,
      revisionId,
      'revision.sign_off',
      'sign off',
    );
    const at = await dbNow(ctx.db);
    await ctx.db.transaction(async (trx) => {
      await lockStatusIs(
        trx,
        rev,
        'in_check',
        'only a revision in check can be signed off',
        'REVISION_NOT_IN_CHECK',
      );
      const notClosed = await remarksService.countNotClosed(trx, rev.id);
      if (notClosed > 0) {
        throw new AppError(
          409,
          'OPEN_REMARKS',
          `Rev ${rev.number} has ${notClosed} remark(s) that are not closed; close every remark before signing off.`,
          { details: { notClosed } },
        );
      }
      await revisionsRepository.markChecked(trx, rev.id, user.id, at, input);
      await recordCheck(trx, user, sheet, rev, 'checked', 'revision.signed_off', input);
    });
    await sendAfterCommit(
      ctx.mailer,
      ctx.log,
      signedOffMail(sheet, await emails(ctx, sheet.projectId, ['principal']), {
        number: rev.number,
        by: user.name,
        note: input.note,
        purpose: input.purpose,
        failed: failedCriteria(rev.resultsText),
      }),
    );
    return summaryOf(ctx.db, rev.id);
  },

  /** Every member's e-mail address, for the seal's mail. */
  emailsOfMembers(ctx: AppContext, projectId: number): Promise<string[]> {
    return emails(ctx, projectId, null);
  },

  /** The revision's summary as lists show it (404 when there is none). */
  summary: summaryOf,

  /** The revisions of a sheet, oldest first. */
  listBySheet(db: DbOrTx, sheetId: number): Promise<RevisionSummary[]> {
    return revisionsRepository.listBySheet(db, sheetId);
  },

  /** A revision by id, or undefined. */
  find(db: DbOrTx, revisionId: number): Promise<RevisionRecord | undefined> {
    return revisionsRepository.findById(db, revisionId);
  },

  /** The sheet a revision belongs to (the access policy's way up). */
  sheetIdOf(db: DbOrTx, revisionId: number): Promise<number | undefined> {
    return revisionsRepository.findSheetIdOf(db, revisionId);
  },

  /** Seal: supersede the sheet's earlier sealed revision, inside the seal's transaction. */
  supersedeEarlier: revisionsRepository.supersedeEarlier,

  /** Seal: the revision is sealed (with the purpose stated at the seal), in the seal's transaction. */
  markSealed(
    trx: Trx,
    revisionId: number,
    by: number,
    at: Date,
    purpose: string | null,
  ): Promise<void> {
    return revisionsRepository.markSealed(trx, revisionId, by, at, purpose);
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

async function summaryOf(db: DbOrTx, revisionId: number): Promise<RevisionSummary> {
  const rev = await mustFindRevision(db, revisionId);
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
