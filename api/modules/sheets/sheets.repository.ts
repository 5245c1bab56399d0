import type { Knex } from 'knex';
import { readJson, type DbOrTx } from '../../db/index';

import type { BlockKind } from '../../../core/index';
import type { SheetStatus } from '../../../core/vocabulary';
import type { UnitSystem } from '../../../core/display-units';
import type { PersonRef } from '../../../core/contract/common';
import type { SheetSummary } from '../../../core/contract/sheets';

export type { BlockKind, SheetStatus };

export interface SheetBlock {
  id: string;
  kind: BlockKind;
  source: string;
}

export interface SheetSettings {
  significantFigures: number;
  /** The units results are shown in (display only); SI when absent. */
  units?: UnitSystem;
}

export interface SheetDraft {
  blocks: SheetBlock[];
  settings: SheetSettings;
}

// A sheet as lists show it: the contract's shape.
export type { PersonRef, SheetSummary };

export interface SheetRecord extends SheetSummary {
  draft: SheetDraft;
  projectJobNumber: string;
  projectName: string;
}

interface SheetRow {
  id: number;
  project_id: number;
  number: string;
  title: string;
  subject: string;
  status: SheetStatus;
  draft: unknown;
  draft_version: number;
  created_at: Date;
  created_by: number;
  created_by_name: string;
  updated_at: Date;
  updated_by: number;
  updated_by_name: string;
  project_job_number?: string;
  project_name?: string;
}

function baseQuery(db: DbOrTx): Knex.QueryBuilder {
  return db('sheets as s')
    .join('users as cu', 'cu.id', 's.created_by')
    .join('users as uu', 'uu.id', 's.updated_by')
    .select(
      's.id',
      's.project_id',
      's.number',
      's.title',
      's.subject',
      's.status',
      's.draft_version',
      's.created_at',
      's.created_by',
      'cu.name as created_by_name',
      's.updated_at',
      's.updated_by',
      'uu.name as updated_by_name',
    );
}

function toSummary(row: SheetRow): Omit<SheetSummary, 'latestRevision'> {
  return {
    id: row.id,
    projectId: row.project_id,
    number: row.number,
    title: row.title,
    subject: row.subject,
    status: row.status,
    draftVersion: row.draft_version,
    createdAt: new Date(row.created_at).toISOString(),
    createdBy: { id: row.created_by, name: row.created_by_name },
    updatedAt: new Date(row.updated_at).toISOString(),
    updatedBy: { id: row.updated_by, name: row.updated_by_name },
  };
}

/** The latest revision of each sheet named, keyed by sheet id. */
async function latestRevisions(
  db: DbOrTx,
  sheetIds: number[],
): Promise<Map<number, SheetSummary['latestRevision']>> {
  const out = new Map<number, SheetSummary['latestRevision']>();
  if (sheetIds.length === 0) return out;
  const rows = (await db('revisions as r')
    .whereIn('r.sheet_id', sheetIds)
    .whereRaw('r.number = (select max(r2.number) from revisions r2 where r2.sheet_id = r.sheet_id)')
    .select('r.id', 'r.sheet_id', 'r.number', 'r.status')) as {
    id: number;
    sheet_id: number;
    number: number;
    status: string;
  }[];
  for (const r of rows) out.set(r.sheet_id, { id: r.id, number: r.number, status: r.status });
  return out;
}

export async function listSheetsByProject(db: DbOrTx, projectId: number): Promise<SheetSummary[]> {
  const rows = (await baseQuery(db)
    .where('s.project_id', projectId)
    .orderBy('s.number', 'asc')) as SheetRow[];
  const latest = await latestRevisions(
    db,
    rows.map((r) => r.id),
  );
  return rows.map((r) => ({ ...toSummary(r), latestRevision: latest.get(r.id) ?? null }));
}

export async function findSheetById(db: DbOrTx, sheetId: number): Promise<SheetRecord | undefined> {
  const row = (await baseQuery(db)
    .join('projects as p', 'p.id', 's.project_id')
    .select('s.draft', 'p.job_number as project_job_number', 'p.name as project_name')
    .where('s.id', sheetId)
    .first()) as SheetRow | undefined;
  if (!row) return undefined;
  const latest = await latestRevisions(db, [row.id]);
  return {
    ...toSummary(row),
    latestRevision: latest.get(row.id) ?? null,
    draft: readJson<SheetDraft>(row.draft),
    projectJobNumber: row.project_job_number ?? '',
    projectName: row.project_name ?? '',
  };
}

/** The project a sheet belongs to, for the role check before anything else is read. */
export async function findSheetProjectId(db: DbOrTx, sheetId: number): Promise<number | undefined> {
  const row = (await db('sheets').where({ id: sheetId }).first('project_id')) as
    { project_id: number } | undefined;
  return row?.project_id;
}

/** Locks the sheet row for the rest of the transaction (serializes writes to one sheet). */
export async function lockSheet(trx: Knex.Transaction, sheetId: number): Promise<void> {
  await trx('sheets').where({ id: sheetId }).forUpdate().first('id');
}

export async function insertSheet(
  db: DbOrTx,
  sheet: {
    projectId: number;
    number: string;
    title: string;
    subject: string;
    draft: SheetDraft;
    userId: number;
  },
): Promise<number> {
  const [id] = await db('sheets').insert({
    project_id: sheet.projectId,
    number: sheet.number,
    title: sheet.title,
    subject: sheet.subject,
    status: 'draft',
    draft: JSON.stringify(sheet.draft),
    draft_version: 1,
    created_by: sheet.userId,
    updated_by: sheet.userId,
  });
  return Number(id);
}

export async function updateSheetFields(
  db: DbOrTx,
  sheetId: number,
  fields: { number?: string; title?: string; subject?: string },
  userId: number,
): Promise<void> {
  await db('sheets')
    .where({ id: sheetId })
    .update({ ...fields, updated_by: userId, updated_at: db.fn.now(3) });
}

/**
 * Writes the draft only when the version is still `expectedVersion`, and moves the version on by
 * one. Returns false when someone else saved in between (nothing is written then).
 */
export async function saveDraftIfVersion(
  db: DbOrTx,
  sheetId: number,
  expectedVersion: number,
  draft: SheetDraft,
  userId: number,
): Promise<boolean> {
  const changed = await db('sheets')
    .where({ id: sheetId, draft_version: expectedVersion })
    .update({
      draft: JSON.stringify(draft),
      draft_version: db.raw('draft_version + 1'),
      updated_by: userId,
      updated_at: db.fn.now(3),
    });
  return changed === 1;
}

/** Sets a sheet's status (used by the review module when a revision moves on). */
export async function setSheetStatus(
  db: DbOrTx,
  sheetId: number,
  status: SheetStatus,
): Promise<void> {
  await db('sheets').where({ id: sheetId }).update({ status });
}

export async function countRevisions(db: DbOrTx, sheetId: number): Promise<number> {
  const row = (await db('revisions').where({ sheet_id: sheetId }).count({ n: '*' }).first()) as
    { n: number | string } | undefined;
  return Number(row?.n ?? 0);
}

export async function deleteSheet(db: DbOrTx, sheetId: number): Promise<void> {
  await db('sheets').where({ id: sheetId }).delete();
}

/**
 * True when this person recorded `sheet.draft_saved` on this sheet within the last `minutes`
 * (database clock), so autosaves are coalesced in the activity log.
 */
export async function hasRecentDraftSavedActivity(
  db: DbOrTx,
  sheetId: number,
  userId: number,
  minutes: number,
): Promise<boolean> {
  const row = (await db('activity')
    .where({
      action: 'sheet.draft_saved',
      object_type: 'sheet',
      object_id: sheetId,
      actor_id: userId,
    })
    .andWhereRaw('at > now(3) - interval ? minute', [minutes])
    .first('id')) as { id: number } | undefined;
  return row !== undefined;
}

/** The sheet a revision belongs to, with what mail, print and verify need about its project. */
export interface SheetContext {
  id: number;
  projectId: number;
  number: string;
  title: string;
  subject: string;
  status: SheetStatus;
  projectJobNumber: string;
  projectName: string;
  projectClient: string;
  projectSite: string;
  createdBy: number;
}

export async function findSheetContext(
  db: DbOrTx,
  sheetId: number,
): Promise<SheetContext | undefined> {
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
        status: SheetStatus;
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
}
