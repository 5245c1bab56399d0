import type { ActivityAction } from '../../../core/vocabulary';
import { readJson, type DbOrTx } from '../../db/index';
import type { ActivityEntry } from '../../../core/contract/activity';

export type { ActivityAction };

export interface NewActivity {
  actorId: number | null;
  projectId: number | null;
  action: ActivityAction;
  objectType: string;
  objectId: number | null;
  details: Record<string, unknown>;
}

/** An activity row as lists send it (the shape is the contract's). */
export type { ActivityEntry } from '../../../core/contract/activity';

/** An activity row joined with its actor's name (`users as u`), as the lists select it. */
export interface ActivityRow {
  id: number;
  at: Date;
  actor_id: number | null;
  actor_name: string | null;
  action: string;
  object_type: string;
  object_id: number | null;
  details: unknown;
}

/** The columns of an activity row (`activity as a`) with its actor's name (`users as u`). */
export const ACTIVITY_COLUMNS = [
  'a.id',
  'a.at',
  'a.actor_id',
  'u.name as actor_name',
  'a.action',
  'a.object_type',
  'a.object_id',
  'a.details',
] as const;

/** Maps an activity row to the entry the API sends; a removed actor keeps the id. */
export function activityEntryOf(row: ActivityRow): ActivityEntry {
  return {
    id: Number(row.id),
    at: new Date(row.at).toISOString(),
    actor: row.actor_id === null ? null : { id: row.actor_id, name: row.actor_name ?? '(removed)' },
    action: row.action,
    objectType: row.object_type,
    objectId: row.object_id === null ? null : Number(row.object_id),
    details: readJson<Record<string, unknown>>(row.details),
  };
}

export const activityRepository = {
  async insert(db: DbOrTx, entry: NewActivity): Promise<number> {
    const [id] = await db('activity').insert({
      actor_id: entry.actorId,
      project_id: entry.projectId,
      action: entry.action,
      object_type: entry.objectType,
      object_id: entry.objectId,
      details: JSON.stringify(entry.details),
    });
    if (id === undefined) throw new Error('activity insert returned no id');
    return id;
  },

  async listByProject(db: DbOrTx, projectId: number, limit: number): Promise<ActivityEntry[]> {
    const rows: ActivityRow[] = await db('activity as a')
      .leftJoin('users as u', 'u.id', 'a.actor_id')
      .select(...ACTIVITY_COLUMNS)
      .where('a.project_id', projectId)
      .orderBy('a.at', 'desc')
      .orderBy('a.id', 'desc')
      .limit(limit);
    const entries = rows.map(activityEntryOf);
    return withSheets(db, entries);
  },

  /**
   * A sheet's history: rows about the sheet itself, and every row whose details name the sheet
   * (revisions, remarks, seals, uploads record `sheetId`). Newest first.
   */
  async listBySheet(
    db: DbOrTx,
    projectId: number,
    sheetId: number,
    limit: number,
  ): Promise<ActivityEntry[]> {
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

/** The id of the sheet an entry is about, if any. */
function sheetIdOf(entry: ActivityEntry): number | null {
  const fromDetails = entry.details?.sheetId;
  if (typeof fromDetails === 'number') return fromDetails;
  return entry.objectType === 'sheet' && entry.objectId !== null ? entry.objectId : null;
}

/** Adds each entry's sheet (number and title), so the log can say "DYN-02 Rev 1", not an id. */
async function withSheets(db: DbOrTx, entries: ActivityEntry[]): Promise<ActivityEntry[]> {
  const ids = [...new Set(entries.map(sheetIdOf).filter((id): id is number => id !== null))];
  if (ids.length === 0) return entries;
  const sheets: { id: number; number: string; title: string }[] = await db('sheets')
    .whereIn('id', ids)
    .select('id', 'number', 'title');
  const byId = new Map(sheets.map((s) => [Number(s.id), { ...s, id: Number(s.id) }]));
  return entries.map((entry) => {
    const id = sheetIdOf(entry);
    const sheet = id === null ? undefined : byId.get(id);
    return sheet ? { ...entry, sheet } : entry;
  });
}
