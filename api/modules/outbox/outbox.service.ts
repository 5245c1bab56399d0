import type { Db } from '../../db/index';
import { outboxRepository, type OutboxMessage } from './outbox.repository';

export const outboxService = {
  /** Newest first; the route allows administrators only. */
  list(db: Db, filter: { sheetId?: number; limit?: number }): Promise<OutboxMessage[]> {
    return outboxRepository.list(db, {
      limit: filter.limit ?? 200,
      ...(filter.sheetId === undefined ? {} : { relatedSheetId: filter.sheetId }),
    });
  },
};
