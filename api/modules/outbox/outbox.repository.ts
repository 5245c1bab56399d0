import type { DbOrTx } from '../../db/index';

import type { OutboxMessage } from '../../../core/contract/outbox';

export type { OutboxMessage };

export interface NewOutboxMessage {
  messageId: string | null;
  from: string;
  to: string[];
  subject: string;
  text: string;
  kind: string | null;
  relatedSheetId: number | null;
}

interface OutboxRow {
  id: number;
  from_address: string;
  to_addresses: string;
  subject: string;
  text: string;
  kind: string | null;
  created_at: Date;
  related_sheet_id: number | null;
  related_project_id: number | null;
}

function toMessage(row: OutboxRow): OutboxMessage {
  return {
    id: row.id,
    to: row.to_addresses.split(',').filter((a) => a !== ''),
    from: row.from_address,
    subject: row.subject,
    text: row.text,
    kind: row.kind,
    createdAt: new Date(row.created_at).toISOString(),
    relatedSheetId: row.related_sheet_id,
    relatedProjectId: row.related_project_id,
  };
}

export const outboxRepository = {
  async insert(db: DbOrTx, message: NewOutboxMessage): Promise<number> {
    const [id] = await db('outbox').insert({
      message_id: message.messageId,
      from_address: message.from,
      to_addresses: message.to.join(','),
      subject: message.subject,
      text: message.text,
      kind: message.kind,
      related_sheet_id: message.relatedSheetId,
    });
    if (id === undefined) throw new Error('outbox insert returned no id');
    return id;
  },

  async list(
    db: DbOrTx,
    filter: { relatedSheetId?: number; recipient?: string; limit: number },
  ): Promise<OutboxMessage[]> {
    const q = db<OutboxRow>('outbox')
      .leftJoin('sheets', 'sheets.id', 'outbox.related_sheet_id')
      .select(
        'outbox.id',
        'outbox.from_address',
        'outbox.to_addresses',
        'outbox.subject',
        'outbox.text',
        'outbox.kind',
        'outbox.created_at',
        'outbox.related_sheet_id',
        'sheets.project_id as related_project_id',
      )
      .orderBy('outbox.created_at', 'desc')
      .orderBy('outbox.id', 'desc')
      .limit(filter.limit);
    if (filter.relatedSheetId !== undefined) {
      q.where('outbox.related_sheet_id', filter.relatedSheetId);
    }
    // to_addresses is the comma-joined list; addresses compare without regard to case.
    if (filter.recipient !== undefined) {
      q.whereRaw('FIND_IN_SET(LOWER(?), LOWER(outbox.to_addresses)) > 0', [filter.recipient]);
    }
    const rows = (await q) as OutboxRow[];
    return rows.map(toMessage);
  },
};
