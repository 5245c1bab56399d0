import type { Db, DbOrTx } from '../../db/index';
import type { User } from '../users/users.repository';
import { outboxRepository, type NewOutboxMessage, type OutboxMessage } from './outbox.repository';

export const outboxService = {
  /** Keeps a message the outbox transport of the mailer built. */
  store(db: DbOrTx, message: NewOutboxMessage): Promise<number> {
    return outboxRepository.insert(db, message);
  },

  /**
   * The mail a person may read, newest first: an administrator all of it (`scope: 'all'`),
   * everyone else the messages addressed to their e-mail address (`scope: 'mine'`).
   */
  async listFor(
    db: Db,
    user: User,
    filter: { sheetId?: number; limit?: number },
  ): Promise<{ scope: 'all' | 'mine'; messages: OutboxMessage[] }> {
    const messages = await outboxRepository.list(db, {
      limit: filter.limit ?? 200,
      ...(filter.sheetId === undefined ? {} : { relatedSheetId: filter.sheetId }),
      ...(user.isAdmin ? {} : { recipient: user.email }),
    });
    return { scope: user.isAdmin ? 'all' : 'mine', messages };
  },
};
