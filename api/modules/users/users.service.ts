import type { Db, DbOrTx } from '../../db/index';
import { ConflictError } from '../../http/errors';
import { activityService } from '../activity/activity.service';
import { hashPassword } from '../auth/passwords';
import type { CreateUserInput } from './users.schemas';
import { usersRepository, type User } from './users.repository';

export const usersService = {
  findById(db: Db, id: number): Promise<User | undefined> {
    return usersRepository.findById(db, id);
  },

  /** The stored password hash (sealing and changing the password check the one typed). */
  passwordHashOf(db: DbOrTx, userId: number): Promise<string | undefined> {
    return usersRepository.passwordHashOf(db, userId);
  },

  setPasswordHash(db: DbOrTx, userId: number, hash: string): Promise<void> {
    return usersRepository.setPasswordHash(db, userId, hash);
  },

  list(db: Db): Promise<User[]> {
    return usersRepository.list(db);
  },

  async create(db: Db, actor: User, input: CreateUserInput): Promise<User> {
    const passwordHash = await hashPassword(input.password);
    return db.transaction(async (trx) => {
      if (await usersRepository.findByEmail(trx, input.email)) {
        throw new ConflictError('A person with this e-mail address already exists.', {
          code: 'DUPLICATE',
          field: 'email',
        });
      }
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
};
