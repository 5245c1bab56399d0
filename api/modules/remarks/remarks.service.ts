import { blockLines } from '../../../core/index';
import { AppError, NotFoundError, ValidationError } from '../../http/errors';
import type { User } from '../users/users.repository';
import { blockLabel, remarkMail } from '../revisions/review-mail';
import { recordReviewActivity, sendAfterCommit, type ReviewDeps } from '../revisions/review-deps';
import { reviewRepository } from '../revisions/review.repository';
import { revisionAccess, wrongState } from '../revisions/revisions.service';
import {
  remarksRepository,
  type Remark,
  type RemarkState,
  type RemarkType,
} from './remarks.repository';

async function remarkAccess(
  deps: ReviewDeps,
  user: User,
  remarkId: number,
  need?: ('author' | 'checker')[],
  action?: string,
) {
  const revisionId = await remarksRepository.findRevisionIdOf(deps.db, remarkId);
  if (revisionId === undefined) throw new NotFoundError(`There is no remark with id ${remarkId}.`);
  const access = await revisionAccess(deps, user, revisionId, need, action);
  const remark = await remarksRepository.findById(deps.db, remarkId);
  if (!remark) throw new NotFoundError(`There is no remark with id ${remarkId}.`);
  return { ...access, remark };
}

export const remarksService = {
  async list(deps: ReviewDeps, user: User, revisionId: number): Promise<Remark[]> {
    await revisionAccess(deps, user, revisionId);
    return remarksRepository.listByRevision(deps.db, revisionId);
  },

  /** A checker's remark on one line of one block of a revision in check. */
  async create(
    deps: ReviewDeps,
    user: User,
    revisionId: number,
    input: { blockId: string; line: number; type: RemarkType; text: string },
  ): Promise<Remark> {
    const { rev, sheet } = await revisionAccess(
      deps,
      user,
      revisionId,
      ['checker'],
      'leave remarks',
    );
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
    const id = await deps.db.transaction(async (trx) => {
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
      await recordReviewActivity(trx, {
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
    const author = await reviewRepository.userEmail(deps.db, rev.issuedBy.id);
    await sendAfterCommit(
      deps,
      remarkMail(sheet, author ? [author.email] : [], {
        revisionNumber: rev.number,
        by: user.name,
        type: input.type,
        block: blockLabel(rev.blocks, input.blockId),
        line: input.line,
        text: input.text,
      }),
    );
    const made = await remarksRepository.findById(deps.db, id);
    if (!made) throw new Error('the new remark was not found after commit');
    return made;
  },

  /**
   * A reply in the thread. An author's reply to an open remark marks it answered; the checker
   * closes it. Replies are taken while the revision is in check or returned (the author answers
   * a returned revision's remarks before issuing the next one).
   */
  async reply(deps: ReviewDeps, user: User, remarkId: number, text: string): Promise<Remark> {
    const { rev, sheet, remark, myRoles } = await remarkAccess(
      deps,
      user,
      remarkId,
      ['author', 'checker'],
      'reply to remarks',
    );
    if (rev.status !== 'in_check' && rev.status !== 'returned') {
      throw wrongState(
        rev,
        'replies are taken while a revision is in check or returned',
        'REVISION_CLOSED_FOR_REMARKS',
      );
    }
    const answers =
      myRoles.includes('author') && remark.author.id !== user.id && remark.state === 'open';
    await deps.db.transaction(async (trx) => {
      const replyId = await remarksRepository.insertReply(trx, remark.id, user.id, text);
      if (answers) await remarksRepository.setState(trx, remark.id, 'answered', user.id);
      await recordReviewActivity(trx, {
        actorId: user.id,
        projectId: sheet.projectId,
        action: 'remark.replied',
        objectType: 'remark',
        objectId: remark.id,
        details: { sheetId: sheet.id, revisionNumber: rev.number, replyId, answered: answers },
      });
    });
    if (remark.author.id !== user.id) {
      const to = await reviewRepository.userEmail(deps.db, remark.author.id);
      await sendAfterCommit(deps, {
        to: to ? [to.email] : [],
        kind: 'remark.replied',
        relatedSheetId: sheet.id,
        subject: `[${sheet.projectJobNumber}] ${sheet.number} Rev ${rev.number}: reply to your remark`,
        text: `${user.name} replied to your remark on ${blockLabel(rev.blocks, remark.blockId)}, line ${remark.line}:\n\n"${text}"`,
      });
    }
    const updated = await remarksRepository.findById(deps.db, remark.id);
    if (!updated) throw new Error('the remark was not found after the reply');
    return updated;
  },

  /** Close or reopen (checker) while the revision is in check. */
  async setState(
    deps: ReviewDeps,
    user: User,
    remarkId: number,
    state: Extract<RemarkState, 'closed' | 'open'>,
  ): Promise<Remark> {
    const { rev, sheet, remark } = await remarkAccess(
      deps,
      user,
      remarkId,
      ['checker'],
      'close or reopen remarks',
    );
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
    await deps.db.transaction(async (trx) => {
      await remarksRepository.setState(trx, remark.id, state, user.id);
      await recordReviewActivity(trx, {
        actorId: user.id,
        projectId: sheet.projectId,
        action: state === 'closed' ? 'remark.closed' : 'remark.reopened',
        objectType: 'remark',
        objectId: remark.id,
        details: { sheetId: sheet.id, revisionNumber: rev.number, from: remark.state },
      });
    });
    const updated = await remarksRepository.findById(deps.db, remark.id);
    if (!updated) throw new Error('the remark was not found after the change');
    return updated;
  },
};
