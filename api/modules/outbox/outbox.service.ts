import type { Db } from '../../db/index';
import { outboxRepository, type OutboxMessage } from './outbox.repository';

export const outboxService = {
  /** Newest first; with `recipient`, only the messages addressed to that e-mail address. */
  list(
    db: Db,
    filter: { sheetId?: number; limit?: number; recipient?: string },
  ): Promise<OutboxMessage[]> {
    return outboxRepository.list(db, {
      limit: filter.limit ?? 200,
      ...(filter.sheetId === undefined ? {} : { relatedSheetId: filter.sheetId }),
      ...(filter.recipient === undefined ? {} : { recipient: filter.recipient }),
    });
  },
};
