import { createHash, randomBytes } from 'node:crypto';
import type { Db, DbOrTx } from '../../db/index';
import { endAllSessions } from '../../db/session-store';
import { AppError, ConflictError, NotFoundError } from '../../http/errors';
import { sendAfterCommit, type Mailer } from '../../mail/mailer';
import type { Logger } from '../../http/logger';
import { activityService } from '../activity/activity.service';
import { hashPassword } from '../auth/passwords';
import { sealsService } from '../seals/seals.service';
import { passwordResetMail, RESET_LINK_HOURS } from './password-reset-mail';
import type { CreateUserInput, ResetPasswordInput, UpdateUserInput } from './users.schemas';
import { usersRepository, type ManagedUser, type User } from './users.repository';

/** The reset token travels only in the mail; the database keeps its SHA-256. */
function hashToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}

async function managed(db: DbOrTx, id: number): Promise<ManagedUser> {
  const user = await usersRepository.findManagedById(db, id);
  if (!user) throw new NotFoundError(`There is no person with id ${id}.`);
  return user;
}

async function refuseTakenEmail(db: DbOrTx, email: string, exceptId?: number): Promise<void> {
  const holder = await usersRepository.findByEmail(db, email);
  if (holder && holder.id !== exceptId) {
    throw new ConflictError('A person with this e-mail address already exists.', {
      code: 'DUPLICATE',
      field: 'email',
    });
  }
}

const INVALID_LINK =
  'This reset link is not valid: it may have been used already, replaced by a newer one, or ' +
  'mistyped. Ask your administrator to send a new one.';

export interface MailParts {
  mailer: Mailer;
  log: Logger;
}

export const usersService = {
  findById(db: Db, id: number): Promise<User | undefined> {
    return usersRepository.findById(db, id);
  },

  /** Who a session names; a deactivated person's session names nobody. */
  findActiveById(db: Db, id: number): Promise<User | undefined> {
    return usersRepository.findActiveById(db, id);
  },

  /** The stored password hash (sealing and changing the password check the one typed). */
  passwordHashOf(db: DbOrTx, userId: number): Promise<string | undefined> {
    return usersRepository.passwordHashOf(db, userId);
  },

  setPasswordHash(db: DbOrTx, userId: number, hash: string): Promise<void> {
    return usersRepository.setPasswordHash(db, userId, hash);
  },

  list(db: Db): Promise<ManagedUser[]> {
    return usersRepository.list(db);
  },

  async create(db: Db, actor: User, input: CreateUserInput): Promise<User> {
    const passwordHash = await hashPassword(input.password);
    return db.transaction(async (trx) => {
      await refuseTakenEmail(trx, input.email);
      const id = await usersRepository.insert(trx, {
        email: input.email,
        name: input.name,
        passwordHash,
        isAdmin: input.isAdmin,
        licenceNumber: input.licenceNumber,
        jurisdiction: input.jurisdiction,
      });
      await activityService.record(trx, {
        actorId: actor.id,
        projectId: null,
        action: 'user.created',
        objectType: 'user',
        objectId: id,
        details: { email: input.email, name: input.name, isAdmin: input.isAdmin },
      });
      const user = await usersRepository.findById(trx, id);
      if (!user) throw new Error(`user ${id} vanished inside its own transaction`);
      return user;
    });
  },

  /** Name, e-mail, licence and jurisdiction; the activity row keeps what they were before. */
  async update(db: Db, actor: User, id: number, input: UpdateUserInput): Promise<ManagedUser> {
    return db.transaction(async (trx) => {
      const before = await managed(trx, id);
      if (input.email !== undefined) await refuseTakenEmail(trx, input.email, id);
      const changed: Record<string, { from: string | null; to: string | null }> = {};
      for (const key of ['email', 'name', 'licenceNumber', 'jurisdiction'] as const) {
        const to = input[key];
        if (to !== undefined && to !== before[key]) changed[key] = { from: before[key], to };
      }
      if (Object.keys(changed).length === 0) return before;
      await usersRepository.update(trx, id, input);
      await activityService.record(trx, {
        actorId: actor.id,
        projectId: null,
        action: 'user.updated',
        objectType: 'user',
        objectId: id,
        details: { changed },
      });
      return managed(trx, id);
    });
  },

  /**
   * Deactivates a person: every session they hold ends in the same transaction, sign-in is
   * refused from then on, and nothing they wrote, checked or sealed changes.
   */
  async deactivate(
    db: Db,
    actor: User,
    id: number,
  ): Promise<{ user: ManagedUser; sessionsEnded: number }> {
    if (id === actor.id) {
      throw new AppError(
        409,
        'SELF_DEACTIVATION',
        'You cannot deactivate your own account; ask another administrator.',
      );
    }
    return db.transaction(async (trx) => {
      const before = await managed(trx, id);
      if (before.deactivatedAt) {
        throw new ConflictError(`${before.name} is already deactivated.`);
      }
      await usersRepository.setDeactivated(trx, id, true);
      const sessionsEnded = await endAllSessions(trx, id);
      await activityService.record(trx, {
        actorId: actor.id,
        projectId: null,
        action: 'user.deactivated',
        objectType: 'user',
        objectId: id,
        details: { email: before.email, sessionsEnded },
      });
      return { user: await managed(trx, id), sessionsEnded };
    });
  },

  async reactivate(db: Db, actor: User, id: number): Promise<ManagedUser> {
    return db.transaction(async (trx) => {
      const before = await managed(trx, id);
      if (!before.deactivatedAt) throw new ConflictError(`${before.name} is already active.`);
      await usersRepository.setDeactivated(trx, id, false);
      await activityService.record(trx, {
        actorId: actor.id,
        projectId: null,
        action: 'user.reactivated',
        objectType: 'user',
        objectId: id,
        details: { email: before.email, deactivatedAt: before.deactivatedAt },
      });
      return managed(trx, id);
    });
  },

  /**
   * Sends a one-time link to set a new password. A fresh random token (256 bits) goes only into
   * the mail; an earlier unused link for the same person stops working.
   */
  async sendPasswordReset(
    db: Db,
    mail: MailParts,
    actor: User,
    id: number,
    origin: string,
  ): Promise<{ expiresAt: string }> {
    const token = randomBytes(32).toString('base64url');
    const expiresAt = new Date(Date.now() + RESET_LINK_HOURS * 3600 * 1000);
    const person = await db.transaction(async (trx) => {
      const target = await managed(trx, id);
      if (target.deactivatedAt) {
        throw new ConflictError(
          `${target.name} is deactivated; reactivate the account before sending a reset link.`,
        );
      }
      await usersRepository.retireOpenPasswordResets(trx, id);
      await usersRepository.insertPasswordReset(trx, {
        userId: id,
        tokenHash: hashToken(token),
        createdBy: actor.id,
        expiresAt,
      });
      await activityService.record(trx, {
        actorId: actor.id,
        projectId: null,
        action: 'user.password_reset_sent',
        objectType: 'user',
        objectId: id,
        details: { email: target.email, expiresAt: expiresAt.toISOString() },
      });
      return target;
    });
    const link = `${origin}/reset-password#${token}`;
    await sendAfterCommit(
      mail.mailer,
      mail.log,
      passwordResetMail(person.email, person, actor.name, link),
    );
    return { expiresAt: expiresAt.toISOString() };
  },

  /**
   * Sets a new password from a reset link: the link must exist, be unused and unexpired, and its
   * person active. It is spent in the same transaction, and every session of the person ends.
   */
  async resetPassword(db: Db, input: ResetPasswordInput): Promise<{ email: string }> {
    const newHash = await hashPassword(input.newPassword);
    return db.transaction(async (trx) => {
      const reset = await usersRepository.findPasswordResetForUpdate(trx, hashToken(input.token));
      if (!reset || reset.usedAt) {
        throw new AppError(410, 'RESET_LINK_INVALID', INVALID_LINK, { field: 'token' });
      }
      if (new Date(reset.expiresAt).getTime() <= Date.now()) {
        throw new AppError(
          410,
          'RESET_LINK_EXPIRED',
          'This reset link has expired. Ask your administrator to send a new one.',
          { field: 'token' },
        );
      }
      const person = await managed(trx, reset.userId);
      if (person.deactivatedAt) {
        throw new AppError(
          403,
          'ACCOUNT_DEACTIVATED',
          'This account is deactivated; ask your administrator to reactivate it.',
        );
      }
      await usersRepository.setPasswordHash(trx, person.id, newHash);
      await usersRepository.markPasswordResetUsed(trx, reset.id);
      const sessionsEnded = await endAllSessions(trx, person.id);
      // The signing key is locked under the old password, which a reset does not know.
      await sealsService.retireSigningKey(trx, person.id, 'password set from a reset link');
      await activityService.record(trx, {
        actorId: person.id,
        projectId: null,
        action: 'account.password_reset',
        objectType: 'user',
        objectId: person.id,
        details: { resetId: reset.id, sessionsEnded },
      });
      return { email: person.email };
    });
  },
};
