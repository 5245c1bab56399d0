import { blockLines } from '../../../core/index';
import type { DbOrTx } from '../../db/index';
import type { AppContext } from '../../http/context';
import { AppError, NotFoundError, ValidationError } from '../../http/errors';
import { sendAfterCommit } from '../../mail/mailer';
import { activityService } from '../activity/activity.service';
import type { User } from '../users/users.repository';
import { usersService } from '../users/users.service';
import { blockLabel, remarkMail } from '../revisions/review-mail';
import { wrongState, type RevisionInScope } from '../revisions/revision-state';
import { carryRemarks } from './remarks.carry-over';
import {
  remarksRepository,
  type Remark,
  type RemarkReply,
  type RemarkState,
  type RemarkType,
} from './remarks.repository';

async function mustFindRemark(db: DbOrTx, remarkId: number): Promise<Remark> {
  const remark = await remarksRepository.findById(db, remarkId);
  if (!remark) throw new NotFoundError(`There is no remark with id ${remarkId}.`);
  return remark;
}

/**
 * A reply its writer may still change: their own, the last in its thread (nobody has acted on it
 * yet), on a remark not closed, while the revision is in check or returned.
 */
async function ownLastReply(
  db: DbOrTx,
  user: User,
  { rev }: RevisionInScope,
  remarkId: number,
  replyId: number,
  what: 'edited' | 'withdrawn',
): Promise<{ remark: Remark; reply: RemarkReply }> {
  const remark = await mustFindRemark(db, remarkId);
  const reply = remark.replies.find((r) => r.id === replyId);
  if (!reply) throw new NotFoundError(`Remark ${remarkId} has no reply with id ${replyId}.`);
  if (reply.author.id !== user.id) {
    throw new AppError(
      403,
      'NOT_YOUR_REPLY',
      `Only its writer can change a reply; it is ${reply.author.name}'s.`,
    );
  }
  if (rev.status !== 'in_check' && rev.status !== 'returned') {
    throw wrongState(
      rev,
      `a reply is ${what} while its revision is in check or returned`,
      'REVISION_CLOSED_FOR_REMARKS',
    );
  }
  if (remark.state === 'closed' || remark.replies.at(-1)?.id !== reply.id) {
    throw new AppError(
      409,
      'REPLY_SETTLED',
      `This reply can no longer be ${what}: ${remark.state === 'closed' ? 'the checker has closed the remark' : 'someone has replied after it'}. Write a new reply instead.`,
    );
  }
  return { remark, reply };
}

async function recordReplyChange(
  trx: DbOrTx,
  user: User,
  { rev, sheet }: RevisionInScope,
  remarkId: number,
  change: {
    action: 'remark.reply_edited' | 'remark.reply_withdrawn';
    replyId: number;
    before: string;
  },
): Promise<void> {
  await activityService.record(trx, {
    actorId: user.id,
    projectId: sheet.projectId,
    action: change.action,
    objectType: 'remark',
    objectId: remarkId,
    details: {
      sheetId: sheet.id,
      revisionNumber: rev.number,
      replyId: change.replyId,
      text: change.before,
    },
  });
}

/**
 * Remarks on a revision. Each method is handed the revision in scope: the route has asked the
 * revisions service (and through it the access policy) for it with the method's action.
 */
export const remarksService = {
  list(ctx: AppContext, scope: RevisionInScope): Promise<Remark[]> {
    return remarksRepository.listByRevision(ctx.db, scope.rev.id);
  },

  /** Remarks of a revision not yet closed (sign off needs none). */
  countNotClosed(db: DbOrTx, revisionId: number): Promise<number> {
    return remarksRepository.countNotClosed(db, revisionId);
  },

  /** The remarks of several revisions (compare, print). */
  listByRevision(db: DbOrTx, revisionId: number): Promise<Remark[]> {
    return remarksRepository.listByRevision(db, revisionId);
  },

  /** The remark's revision (the access policy's way up). */
  revisionIdOf(db: DbOrTx, remarkId: number): Promise<number | undefined> {
    return remarksRepository.findRevisionIdOf(db, remarkId);
  },

  /** Issue: the open and answered remarks of the previous revision move to the new one. */
  carryOver: carryRemarks,

  /** A checker's remark on one line of one block of a revision in check. */
  async create(
    ctx: AppContext,
    user: User,
    { rev, sheet }: RevisionInScope,
    input: { blockId: string; line: number; type: RemarkType; text: string },
  ): Promise<Remark> {
    if (rev.status !== 'in_check') {
      throw wrongState(rev, 'remarks are left on a revision in check', 'REVISION_NOT_IN_CHECK');
    }
    const block = rev.blocks.find((b) => b.id === input.blockId);
    if (!block) {
      throw new ValidationError(`Rev ${rev.number} has no block "${input.blockId}".`, {
        field: 'blockId',
      });
    }
    const lineCount = blockLines(block.source).length;
    // Line 0 is the block as a whole (its header in the canonical text).
    if (input.line > lineCount) {
      throw new ValidationError(
        `Block "${input.blockId}" of Rev ${rev.number} has ${lineCount} line(s); there is no line ${input.line}.`,
        { field: 'line' },
      );
    }
    const id = await ctx.db.transaction(async (trx) => {
      const remarkId = await remarksRepository.insert(trx, {
        revisionId: rev.id,
        blockId: input.blockId,
        line: input.line,
        type: input.type,
        text: input.text,
        state: 'open',
        authorId: user.id,
        carriedFrom: null,
        lineChanged: false,
      });
      await activityService.record(trx, {
        actorId: user.id,
        projectId: sheet.projectId,
        action: 'remark.added',
        objectType: 'remark',
        objectId: remarkId,
        details: {
          sheetId: sheet.id,
          revisionId: rev.id,
          revisionNumber: rev.number,
          blockId: input.blockId,
          line: input.line,
          type: input.type,
        },
      });
      return remarkId;
    });
    const author = await usersService.findById(ctx.db, rev.issuedBy.id);
    await sendAfterCommit(
      ctx.mailer,
      ctx.log,
      remarkMail(sheet, author ? [author.email] : [], {
        revisionNumber: rev.number,
        by: user.name,
        type: input.type,
        block: blockLabel(rev.blocks, input.blockId),
        line: input.line,
        text: input.text,
      }),
    );
    const made = await remarksRepository.findById(ctx.db, id);
    if (!made) throw new Error('the new remark was not found after commit');
    return made;
  },

  /**
   * A reply in the thread. An author's reply to an open remark marks it answered; the checker
   * closes it. Replies are taken while the revision is in check or returned (the author answers
   * a returned revision's remarks before issuing the next one).
   */
  async reply(
    ctx: AppContext,
    user: User,
    { rev, sheet, myRoles }: RevisionInScope,
    remarkId: number,
    text: string,
  ): Promise<Remark> {
    const remark = await mustFindRemark(ctx.db, remarkId);
    if (rev.status !== 'in_check' && rev.status !== 'returned') {
      throw wrongState(
        rev,
        'replies are taken while a revision is in check or returned',
        'REVISION_CLOSED_FOR_REMARKS',
      );
    }
    const answers =
      myRoles.includes('author') && remark.author.id !== user.id && remark.state === 'open';
    await ctx.db.transaction(async (trx) => {
      const replyId = await remarksRepository.insertReply(trx, remark.id, user.id, text);
      if (answers) await remarksRepository.setState(trx, remark.id, 'answered', user.id);
      await activityService.record(trx, {
        actorId: user.id,
        projectId: sheet.projectId,
        action: 'remark.replied',
        objectType: 'remark',
        objectId: remark.id,
        details: { sheetId: sheet.id, revisionNumber: rev.number, replyId, answered: answers },
      });
    });
    if (remark.author.id !== user.id) {
      const to = await usersService.findById(ctx.db, remark.author.id);
      await sendAfterCommit(ctx.mailer, ctx.log, {
        to: to ? [to.email] : [],
        kind: 'remark.replied',
        relatedSheetId: sheet.id,
        subject: `[${sheet.projectJobNumber}] ${sheet.number} Rev ${rev.number}: reply to your remark`,
        text: `${user.name} replied to your remark on ${blockLabel(rev.blocks, remark.blockId)}, line ${remark.line}:\n\n"${text}"`,
      });
    }
    const updated = await remarksRepository.findById(ctx.db, remark.id);
    if (!updated) throw new Error('the remark was not found after the reply');
    return updated;
  },

  /** Edit one's own reply while it is the last word in the thread (see ownLastReply). */
  async editReply(
    ctx: AppContext,
    user: User,
    scope: RevisionInScope,
    remarkId: number,
    replyId: number,
    text: string,
  ): Promise<Remark> {
    const { remark, reply } = await ownLastReply(ctx.db, user, scope, remarkId, replyId, 'edited');
    if (reply.text === text) return remark;
    await ctx.db.transaction(async (trx) => {
      await remarksRepository.updateReplyText(trx, reply.id, text);
      await recordReplyChange(trx, user, scope, remark.id, {
        action: 'remark.reply_edited',
        replyId: reply.id,
        before: reply.text,
      });
    });
    return mustFindRemark(ctx.db, remark.id);
  },

  /**
   * Withdraw one's own reply while it is the last word in the thread. The remark it answered is
   * open again unless an answer by someone else than the remark's writer remains. Its text stays
   * in the activity log.
   */
  async withdrawReply(
    ctx: AppContext,
    user: User,
    scope: RevisionInScope,
    remarkId: number,
    replyId: number,
  ): Promise<Remark> {
    const { remark, reply } = await ownLastReply(
      ctx.db,
      user,
      scope,
      remarkId,
      replyId,
      'withdrawn',
    );
    const answerRemains = remark.replies.some(
      (r) => r.id !== reply.id && r.author.id !== remark.author.id,
    );
    await ctx.db.transaction(async (trx) => {
      await remarksRepository.deleteReply(trx, reply.id);
      if (remark.state === 'answered' && !answerRemains) {
        await remarksRepository.setState(trx, remark.id, 'open', user.id);
      }
      await recordReplyChange(trx, user, scope, remark.id, {
        action: 'remark.reply_withdrawn',
        replyId: reply.id,
        before: reply.text,
      });
    });
    return mustFindRemark(ctx.db, remark.id);
  },

  /** Close or reopen (checker) while the revision is in check. */
  async setState(
    ctx: AppContext,
    user: User,
    { rev, sheet }: RevisionInScope,
    remarkId: number,
    state: Extract<RemarkState, 'closed' | 'open'>,
  ): Promise<Remark> {
    const remark = await mustFindRemark(ctx.db, remarkId);
    if (rev.issuedBy.id === user.id) {
      throw new AppError(
        403,
        'CHECKER_IS_AUTHOR',
        `You issued Rev ${rev.number}, so you cannot close its remarks: the checker of a revision cannot be its author.`,
      );
    }
    if (rev.status !== 'in_check') {
      throw wrongState(
        rev,
        'remarks are closed or reopened while a revision is in check',
        'REVISION_NOT_IN_CHECK',
      );
    }
    if (remark.state === state) return remark;
    await ctx.db.transaction(async (trx) => {
      await remarksRepository.setState(trx, remark.id, state, user.id);
      await activityService.record(trx, {
        actorId: user.id,
        projectId: sheet.projectId,
        action: state === 'closed' ? 'remark.closed' : 'remark.reopened',
        objectType: 'remark',
        objectId: remark.id,
        details: { sheetId: sheet.id, revisionNumber: rev.number, from: remark.state },
      });
    });
    const updated = await remarksRepository.findById(ctx.db, remark.id);
    if (!updated) throw new Error('the remark was not found after the change');
    return updated;
  },
};
