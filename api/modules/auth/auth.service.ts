import type { Db } from '../../db/index';
import { ForbiddenError, UnauthenticatedError } from '../../http/errors';
import { activityService } from '../activity/activity.service';
import type { User } from '../users/users.repository';
import { usersRepository } from '../users/users.repository';
import { spendVerifyTime, verifyPassword } from './passwords';
import type { SignInInput } from './auth.schemas';

/** Said only after the right password: a wrong one still gets the words below. */
export const DEACTIVATED_MESSAGE =
  'This account has been deactivated. Ask an administrator of your firm to reactivate it.';

/** The same words for an unknown e-mail and a wrong password: no hint which accounts exist. */
export const INVALID_CREDENTIALS_MESSAGE = 'The e-mail or password is not right.';

export const authService = {
  async checkCredentials(db: Db, input: SignInInput): Promise<User> {
    const found = await usersRepository.findCredentials(db, input.email);
    if (!found) {
      await spendVerifyTime(input.password);
      throw new UnauthenticatedError(INVALID_CREDENTIALS_MESSAGE, 'INVALID_CREDENTIALS');
    }
    if (!(await verifyPassword(found.passwordHash, input.password))) {
      throw new UnauthenticatedError(INVALID_CREDENTIALS_MESSAGE, 'INVALID_CREDENTIALS');
    }
    if (found.deactivated) throw new ForbiddenError(DEACTIVATED_MESSAGE, 'ACCOUNT_DEACTIVATED');
    return found.user;
  },

  async recordSignedIn(db: Db, user: User): Promise<void> {
    await activityService.record(db, {
      actorId: user.id,
      projectId: null,
      action: 'auth.signed_in',
      objectType: 'user',
      objectId: user.id,
      details: {},
    });
  },

  async recordSignedOut(db: Db, user: User): Promise<void> {
    await activityService.record(db, {
      actorId: user.id,
      projectId: null,
      action: 'auth.signed_out',
      objectType: 'user',
      objectId: user.id,
      details: {},
    });
  },
};
