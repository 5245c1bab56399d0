import type { DbOrTx } from '../../db/index';

/** A remark (or one reply in its thread) the full-text index found, with where it sits. */
export interface RemarkHit {
  remarkId: number;
  replyId: number | null;
  text: string;
  blockId: string;
  line: number;
  revisionId: number;
  revisionNumber: number;
  sheetId: number;
  projectId: number;
  number: string;
  title: string;
  score: number;
}

interface RemarkHitRow {
  remark_id: number;
  reply_id: number | null;
  text: string;
  block_id: string;
  line: number;
  revision_id: number;
  revision_number: number;
  sheet_id: number;
  project_id: number;
  number: string;
  title: string;
  score: number;
}

export const remarksSearchRepository = {
  /**
   * Remarks and replies of the given projects whose text matches a boolean-mode full-text query
   * (indexes remarks_text_fulltext and remark_replies_text_fulltext). Best first.
   */
  async search(
    db: DbOrTx,
    projectIds: readonly number[],
    booleanQuery: string,
    limit: number,
  ): Promise<RemarkHit[]> {
    if (projectIds.length === 0 || !booleanQuery) return [];
    const place = (q: ReturnType<DbOrTx>) =>
      q
        .join('revisions as v', 'v.id', 'r.revision_id')
        .join('sheets as s', 's.id', 'v.sheet_id')
        .whereIn('s.project_id', projectIds);
    const common = [
      'r.block_id',
      'r.line',
      'v.id as revision_id',
      'v.number as revision_number',
      's.id as sheet_id',
      's.project_id',
      's.number',
      's.title',
    ];
    const remarks = place(db('remarks as r'))
      .select(
        'r.id as remark_id',
        db.raw('NULL as reply_id'),
        'r.text',
        ...common,
        db.raw('MATCH (r.text) AGAINST (? IN BOOLEAN MODE) as score', [booleanQuery]),
      )
      .whereRaw('MATCH (r.text) AGAINST (? IN BOOLEAN MODE)', [booleanQuery]);
    const replies = place(db('remark_replies as p').join('remarks as r', 'r.id', 'p.remark_id'))
      .select(
        'r.id as remark_id',
        'p.id as reply_id',
        'p.text',
        ...common,
        db.raw('MATCH (p.text) AGAINST (? IN BOOLEAN MODE) as score', [booleanQuery]),
      )
      .whereRaw('MATCH (p.text) AGAINST (? IN BOOLEAN MODE)', [booleanQuery]);
    const rows = (await db
      .select('*')
      .from(remarks.unionAll(replies, true).as('hits'))
      .orderBy('score', 'desc')
      .orderBy('remark_id')
      .limit(limit)) as RemarkHitRow[];
    return rows.map((r) => ({
      remarkId: r.remark_id,
      replyId: r.reply_id,
      text: r.text,
      blockId: r.block_id,
      line: r.line,
      revisionId: r.revision_id,
      revisionNumber: r.revision_number,
      sheetId: r.sheet_id,
      projectId: r.project_id,
      number: r.number,
      title: r.title,
      score: Number(r.score),
    }));
  },
};
