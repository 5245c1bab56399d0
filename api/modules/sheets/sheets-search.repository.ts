import { readJson, type DbOrTx } from '../../db/index';
import type { SheetBlock } from './sheets.repository';

/** A sheet the full-text index found, with what a result needs to say where the words are. */
export interface SheetHit {
  sheetId: number;
  projectId: number;
  number: string;
  title: string;
  subject: string;
  blocks: SheetBlock[];
  score: number;
}

interface SheetHitRow {
  id: number;
  project_id: number;
  number: string;
  title: string;
  subject: string;
  draft: unknown;
  score: number;
}

export const sheetsSearchRepository = {
  /**
   * Sheets of the given projects whose number, title, subject or draft block sources match a
   * boolean-mode full-text query (index sheets_search_fulltext), or whose number is `exactNumber`
   * (a sheet number is mostly short tokens the full-text index leaves out). Best first.
   */
  async search(
    db: DbOrTx,
    projectIds: readonly number[],
    booleanQuery: string,
    exactNumber: string,
    limit: number,
  ): Promise<SheetHit[]> {
    if (projectIds.length === 0) return [];
    const match = 'MATCH (s.number, s.title, s.subject, s.draft_text) AGAINST (? IN BOOLEAN MODE)';
    const rows = (await db('sheets as s')
      .select(
        's.id',
        's.project_id',
        's.number',
        's.title',
        's.subject',
        's.draft',
        db.raw(`(s.number = ?) * 1000 + ${booleanQuery ? match : '0'} as score`, [
          exactNumber,
          ...(booleanQuery ? [booleanQuery] : []),
        ]),
      )
      .whereIn('s.project_id', projectIds)
      .andWhere((w) => {
        w.where('s.number', exactNumber);
        if (booleanQuery) w.orWhereRaw(match, [booleanQuery]);
      })
      .orderBy('score', 'desc')
      .orderBy('s.id')
      .limit(limit)) as SheetHitRow[];
    return rows.map((r) => ({
      sheetId: r.id,
      projectId: r.project_id,
      number: r.number,
      title: r.title,
      subject: r.subject,
      blocks: readJson<{ blocks: SheetBlock[] }>(r.draft).blocks,
      score: Number(r.score),
    }));
  },
};
