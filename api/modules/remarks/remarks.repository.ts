import type { Knex } from 'knex';
import { dbNow, type DbOrTx } from '../../db/index';

import type { PersonRef } from '../../../core/contract/common';
import type { EarlierRemark, Remark, RemarkReply } from '../../../core/contract/remarks';
import type { RemarkState, RemarkType } from '../../../core/vocabulary';

// A remark, its replies and the thread on earlier revisions: the shapes are the contract's.
export type { EarlierRemark, PersonRef, Remark, RemarkReply, RemarkState, RemarkType };

export interface NewRemark {
  revisionId: number;
  blockId: string;
  line: number;
  type: RemarkType;
  text: string;
  state: RemarkState;
  authorId: number;
  carriedFrom: { remarkId: number; revisionNumber: number; line: number } | null;
  lineChanged: boolean;
  createdAt?: Date;
}

interface RemarkRow {
  id: number;
  revision_id: number;
  block_id: string;
  line: number;
  type: RemarkType;
  text: string;
  state: RemarkState;
  carried_from_remark_id: number | null;
  carried_from_revision_number: number | null;
  carried_from_line: number | null;
  line_changed: number | boolean;
  author_id: number;
  author_name: string;
  created_at: Date;
  updated_at: Date;
  closed_by: number | null;
  closed_by_name: string | null;
  closed_at: Date | null;
}

interface ReplyRow {
  id: number;
  remark_id: number;
  text: string;
  author_id: number;
  author_name: string;
  created_at: Date;
  edited_at: Date | null;
}

function baseQuery(db: DbOrTx): Knex.QueryBuilder {
  return db('remarks as m')
    .join('users as a', 'a.id', 'm.author_id')
    .leftJoin('users as c', 'c.id', 'm.closed_by')
    .select('m.*', 'a.name as author_name', 'c.name as closed_by_name');
}

async function repliesOf(db: DbOrTx, ids: number[]): Promise<Map<number, RemarkReply[]>> {
  const replies: ReplyRow[] =
    ids.length === 0
      ? []
      : await db('remark_replies as p')
          .join('users as a', 'a.id', 'p.author_id')
          .whereIn('p.remark_id', ids)
          .orderBy('p.created_at', 'asc')
          .orderBy('p.id', 'asc')
          .select(
            'p.id',
            'p.remark_id',
            'p.text',
            'p.author_id',
            'a.name as author_name',
            'p.created_at',
            'p.edited_at',
          );
  const byRemark = new Map<number, RemarkReply[]>();
  for (const p of replies) {
    const list = byRemark.get(p.remark_id) ?? [];
    list.push({
      id: p.id,
      text: p.text,
      author: { id: p.author_id, name: p.author_name },
      createdAt: new Date(p.created_at).toISOString(),
      editedAt: p.edited_at === null ? null : new Date(p.edited_at).toISOString(),
    });
    byRemark.set(p.remark_id, list);
  }
  return byRemark;
}

/** The rows each remark was carried from, back to the first, keyed by id. */
async function predecessors(
  db: DbOrTx,
  rows: RemarkRow[],
): Promise<Map<number, RemarkRow & { revision_number: number }>> {
  const found = new Map<number, RemarkRow & { revision_number: number }>();
  let wanted = rows.map((r) => r.carried_from_remark_id);
  // One query per revision back; a chain is as long as the sheet's revisions.
  for (;;) {
    const ids = [...new Set(wanted)].filter((id): id is number => id !== null && !found.has(id));
    if (ids.length === 0) return found;
    const more = (await baseQuery(db)
      .join('revisions as rv', 'rv.id', 'm.revision_id')
      .select('rv.number as revision_number')
      .whereIn('m.id', ids)) as (RemarkRow & { revision_number: number })[];
    if (more.length === 0) return found;
    for (const r of more) found.set(r.id, r);
    wanted = more.map((r) => r.carried_from_remark_id);
  }
}

async function withReplies(db: DbOrTx, rows: RemarkRow[]): Promise<Remark[]> {
  const before = await predecessors(db, rows);
  const byRemark = await repliesOf(db, [...rows.map((r) => r.id), ...before.keys()]);
  // The row a remark was carried from; each points at an older one, so a walk ends at the first.
  const from = (r: RemarkRow) =>
    r.carried_from_remark_id === null ? undefined : before.get(r.carried_from_remark_id);
  const earlierOf = (row: RemarkRow): EarlierRemark[] => {
    const chain: EarlierRemark[] = [];
    for (let prev = from(row); prev; prev = from(prev)) {
      chain.unshift({
        remarkId: prev.id,
        revisionNumber: prev.revision_number,
        line: prev.line,
        author: { id: prev.author_id, name: prev.author_name },
        createdAt: new Date(prev.created_at).toISOString(),
        replies: byRemark.get(prev.id) ?? [],
      });
    }
    return chain;
  };
  return rows.map((r) => ({
    id: r.id,
    revisionId: r.revision_id,
    blockId: r.block_id,
    line: r.line,
    type: r.type,
    text: r.text,
    state: r.state,
    carriedFrom:
      r.carried_from_remark_id === null
        ? null
        : {
            remarkId: r.carried_from_remark_id,
            revisionNumber: r.carried_from_revision_number ?? 0,
            line: r.carried_from_line ?? 0,
          },
    lineChanged: Boolean(r.line_changed),
    author: { id: r.author_id, name: r.author_name },
    createdAt: new Date(r.created_at).toISOString(),
    updatedAt: new Date(r.updated_at).toISOString(),
    closedBy:
      r.closed_by === null ? null : { id: r.closed_by, name: r.closed_by_name ?? '(removed)' },
    closedAt: r.closed_at === null ? null : new Date(r.closed_at).toISOString(),
    replies: byRemark.get(r.id) ?? [],
    earlier: earlierOf(r),
  }));
}

export const remarksRepository = {
  async listByRevision(db: DbOrTx, revisionId: number): Promise<Remark[]> {
    const rows = (await baseQuery(db)
      .where('m.revision_id', revisionId)
      .orderBy('m.block_id')
      .orderBy('m.line')
      .orderBy('m.id')) as RemarkRow[];
    return withReplies(db, rows);
  },

  async listByRevisions(db: DbOrTx, revisionIds: number[]): Promise<Remark[]> {
    if (revisionIds.length === 0) return [];
    const rows = (await baseQuery(db)
      .whereIn('m.revision_id', revisionIds)
      .orderBy('m.id')) as RemarkRow[];
    return withReplies(db, rows);
  },

  async findById(db: DbOrTx, id: number): Promise<Remark | undefined> {
    const rows = (await baseQuery(db).where('m.id', id)) as RemarkRow[];
    return (await withReplies(db, rows))[0];
  },

  async findRevisionIdOf(db: DbOrTx, id: number): Promise<number | undefined> {
    const row = (await db('remarks').where({ id }).first('revision_id')) as
      { revision_id: number } | undefined;
    return row?.revision_id;
  },

  async insert(db: DbOrTx, r: NewRemark): Promise<number> {
    const at = r.createdAt ?? (await dbNow(db));
    const [id] = await db('remarks').insert({
      revision_id: r.revisionId,
      block_id: r.blockId,
      line: r.line,
      type: r.type,
      text: r.text,
      state: r.state,
      carried_from_remark_id: r.carriedFrom?.remarkId ?? null,
      carried_from_revision_number: r.carriedFrom?.revisionNumber ?? null,
      carried_from_line: r.carriedFrom?.line ?? null,
      line_changed: r.lineChanged,
      author_id: r.authorId,
      created_at: at,
      updated_at: at,
    });
    if (id === undefined) throw new Error('remarks insert returned no id');
    return id;
  },

  async insertReply(db: DbOrTx, remarkId: number, authorId: number, text: string): Promise<number> {
    const [id] = await db('remark_replies').insert({
      remark_id: remarkId,
      author_id: authorId,
      text,
      created_at: db.fn.now(3),
    });
    if (id === undefined) throw new Error('remark_replies insert returned no id');
    return id;
  },

  async updateReplyText(db: DbOrTx, replyId: number, text: string): Promise<void> {
    await db('remark_replies')
      .where({ id: replyId })
      .update({ text, edited_at: db.fn.now(3) });
  },

  async deleteReply(db: DbOrTx, replyId: number): Promise<void> {
    await db('remark_replies').where({ id: replyId }).delete();
  },

  async setState(db: DbOrTx, id: number, state: RemarkState, by: number): Promise<void> {
    const now = await dbNow(db);
    await db('remarks')
      .where({ id })
      .update({
        state,
        updated_at: now,
        closed_by: state === 'closed' ? by : null,
        closed_at: state === 'closed' ? now : null,
      });
  },

  async countNotClosed(db: DbOrTx, revisionId: number): Promise<number> {
    const row = (await db('remarks')
      .where({ revision_id: revisionId })
      .whereNot({ state: 'closed' })
      .count({ n: '*' })
      .first()) as { n: number | string } | undefined;
    return Number(row?.n ?? 0);
  },
};
