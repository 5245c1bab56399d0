import { gunzipSync } from 'node:zlib';
import { readJson, type DbOrTx } from '../../db/index';
import {
  ACTIVITY_COLUMNS,
  activityEntryOf,
  type ActivityEntry,
  type ActivityRow,
} from '../activity/activity.repository';

/** The sheet a revision belongs to, with what mail, print and verify need about its project. */
export interface SheetContext {
  id: number;
  projectId: number;
  number: string;
  title: string;
  subject: string;
  status: 'draft' | 'in_check' | 'returned' | 'checked' | 'sealed';
  projectJobNumber: string;
  projectName: string;
  projectClient: string;
  projectSite: string;
  createdBy: number;
}

export interface Recipient {
  id: number;
  name: string;
  email: string;
  roles: string[];
}

/** An entry of a sheet's history: an activity entry. */
export type SheetActivityEntry = ActivityEntry;

export const reviewRepository = {
  async sheetContext(db: DbOrTx, sheetId: number): Promise<SheetContext | undefined> {
    const row = (await db('sheets as s')
      .join('projects as p', 'p.id', 's.project_id')
      .where('s.id', sheetId)
      .first(
        's.id',
        's.project_id',
        's.number',
        's.title',
        's.subject',
        's.status',
        's.created_by',
        'p.job_number',
        'p.name as project_name',
        'p.client',
        'p.site',
      )) as
      | {
          id: number;
          project_id: number;
          number: string;
          title: string;
          subject: string;
          status: SheetContext['status'];
          created_by: number;
          job_number: string;
          project_name: string;
          client: string;
          site: string;
        }
      | undefined;
    if (!row) return undefined;
    return {
      id: row.id,
      projectId: row.project_id,
      number: row.number,
      title: row.title,
      subject: row.subject,
      status: row.status,
      projectJobNumber: row.job_number,
      projectName: row.project_name,
      projectClient: row.client,
      projectSite: row.site,
      createdBy: row.created_by,
    };
  },

  /** The sheet's draft and its version, read for issuing. */
  async draftOf(
    db: DbOrTx,
    sheetId: number,
  ): Promise<
    | { draft: { blocks: unknown[]; settings?: Record<string, unknown> }; version: number }
    | undefined
  > {
    const row = (await db('sheets').where({ id: sheetId }).first('draft', 'draft_version')) as
      { draft: unknown; draft_version: number } | undefined;
    if (!row) return undefined;
    return { draft: readJson(row.draft), version: row.draft_version };
  },

  async lockSheet(db: DbOrTx, sheetId: number): Promise<void> {
    await db('sheets').where({ id: sheetId }).forUpdate().first('id');
  },

  async setSheetStatus(db: DbOrTx, sheetId: number, status: SheetContext['status']): Promise<void> {
    await db('sheets').where({ id: sheetId }).update({ status });
  },

  /** The sheet's uploaded files as text, for re-evaluating a revision on the server. */
  async uploadsOf(db: DbOrTx, sheetId: number): Promise<{ name: string; text: string }[]> {
    const rows = (await db('uploads')
      .where({ sheet_id: sheetId })
      .orderBy('name')
      .select('name', 'encoding', 'bytes')) as { name: string; encoding: string; bytes: Buffer }[];
    return rows.map((r) => ({
      name: r.name,
      text: (r.encoding === 'gzip' ? gunzipSync(r.bytes) : r.bytes).toString('utf8'),
    }));
  },

  /** Project members with their roles; those holding any of `roles` when it is given. */
  async members(db: DbOrTx, projectId: number, roles?: string[]): Promise<Recipient[]> {
    const q = db('project_members as pm')
      .join('users as u', 'u.id', 'pm.user_id')
      .where('pm.project_id', projectId)
      .select('u.id', 'u.name', 'u.email', 'pm.role')
      .orderBy('u.name')
      .orderBy('u.id');
    const rows = (await q) as { id: number; name: string; email: string; role: string }[];
    const byId = new Map<number, Recipient>();
    for (const r of rows) {
      const p = byId.get(r.id) ?? { id: r.id, name: r.name, email: r.email, roles: [] };
      p.roles.push(r.role);
      byId.set(r.id, p);
    }
    const all = [...byId.values()];
    return roles ? all.filter((p) => p.roles.some((r) => roles.includes(r))) : all;
  },

  async userEmail(
    db: DbOrTx,
    userId: number,
  ): Promise<{ name: string; email: string } | undefined> {
    return (await db('users').where({ id: userId }).first('name', 'email')) as
      { name: string; email: string } | undefined;
  },

  /**
   * The sheet's history: activity rows about the sheet itself, and every row whose details name
   * the sheet (revisions, remarks, seals, uploads record `sheetId`).
   */
  async sheetActivity(
    db: DbOrTx,
    projectId: number,
    sheetId: number,
    limit = 300,
  ): Promise<SheetActivityEntry[]> {
    const rows = (await db('activity as a')
      .leftJoin('users as u', 'u.id', 'a.actor_id')
      .where('a.project_id', projectId)
      .where((w) =>
        w
          .where((s) => s.where('a.object_type', 'sheet').where('a.object_id', sheetId))
          .orWhereRaw("JSON_VALUE(a.details, '$.sheetId') = ?", [sheetId]),
      )
      .orderBy('a.at', 'desc')
      .orderBy('a.id', 'desc')
      .limit(limit)
      .select(...ACTIVITY_COLUMNS)) as ActivityRow[];
    return rows.map(activityEntryOf);
  },
};
