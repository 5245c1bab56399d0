import { AppError } from '../../http/errors';
import type { Db } from '../../db/index';
import { endOtherSessions } from '../../db/session-store';
import { hashPassword, verifyPassword } from '../auth/passwords';
import type { User } from '../users/users.repository';
import { activityService } from '../activity/activity.service';
import { sealsService } from '../seals/seals.service';
import { reencryptSigningKey } from '../seals/signing-keys';
import { usersService } from '../users/users.service';

export const accountService = {
  /**
   * Changes the signed-in person's password. A principal's signing key is locked under the
   * password, so it is unlocked with the current one and locked again under the new one in the
   * same transaction: the key pair stays the same and every earlier seal still verifies. The
   * person's other sessions end with it (the one that asked stays signed in).
   */
  async changePassword(
    db: Db,
    user: User,
    input: { currentPassword: string; newPassword: string },
    sessionId: string,
  ): Promise<{ signingKeyReencrypted: boolean; otherSessionsEnded: number }> {
    const hash = await usersService.passwordHashOf(db, user.id);
    if (!hash || !(await verifyPassword(hash, input.currentPassword))) {
      throw new AppError(403, 'WRONG_PASSWORD', 'The current password is not right.', {
        field: 'currentPassword',
      });
    }
    if (input.newPassword === input.currentPassword) {
      throw new AppError(422, 'VALIDATION', 'The new password is the same as the current one.', {
        field: 'newPassword',
      });
    }
    const newHash = await hashPassword(input.newPassword);
    const key = await sealsService.signingKeyOf(db, user.id);
    const relocked = key
      ? await reencryptSigningKey(key, input.currentPassword, input.newPassword).catch(() => null)
      : null;
    const otherSessionsEnded = await db.transaction(async (trx) => {
      await usersService.setPasswordHash(trx, user.id, newHash);
      if (relocked) await sealsService.saveSigningKey(trx, relocked);
      const ended = await endOtherSessions(trx, user.id, sessionId);
      await activityService.record(trx, {
        actorId: user.id,
        projectId: null,
        action: 'account.password_changed',
        objectType: 'user',
        objectId: user.id,
        details: {
          signingKeyReencrypted: relocked !== null,
          hadSigningKey: key !== undefined,
          otherSessionsEnded: ended,
        },
      });
      return ended;
    });
    return { signingKeyReencrypted: relocked !== null, otherSessionsEnded };
  },
};
