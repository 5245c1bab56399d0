import type { Knex } from 'knex';
import { readJson, type DbOrTx } from '../../db/index';
import type { FirmTemplateSummary, TemplateOrigin } from '../../../core/contract/sheets';
import type { SheetBlock, SheetSettings } from '../sheets/sheets.repository';

// A firm template as lists show it, with where it came from: the shapes are the contract's.
export type { FirmTemplateSummary, TemplateOrigin };

export interface FirmTemplate extends FirmTemplateSummary {
  blocks: SheetBlock[];
  /** As saved: a revision stored before settings existed may hold none. */
  settings: Partial<SheetSettings>;
}

export interface NewFirmTemplate {
  name: string;
  description: string;
  blocks: SheetBlock[];
  settings: Record<string, unknown>;
  origin: TemplateOrigin;
  userId: number;
}

interface Row {
  id: number;
  name: string;
  description: string;
  blocks?: unknown;
  settings?: unknown;
  source_project_id: number | null;
  source_job_number: string;
  source_sheet_id: number | null;
  source_sheet_number: string;
  source_revision_id: number | null;
  source_revision_number: number | null;
  created_by: number;
  created_by_name: string;
  created_at: Date;
  updated_at: Date;
}

const SUMMARY_COLUMNS = [
  't.id',
  't.name',
  't.description',
  't.source_project_id',
  't.source_job_number',
  't.source_sheet_id',
  't.source_sheet_number',
  't.source_revision_id',
  't.source_revision_number',
  't.created_by',
  'u.name as created_by_name',
  't.created_at',
  't.updated_at',
];

function summaryOf(row: Row): FirmTemplateSummary {
  return {
    id: row.id,
    name: row.name,
    description: row.description,
    origin: {
      projectId: row.source_project_id,
      jobNumber: row.source_job_number,
      sheetId: row.source_sheet_id,
      sheetNumber: row.source_sheet_number,
      revisionId: row.source_revision_id,
      revisionNumber: row.source_revision_number,
    },
    createdBy: { id: row.created_by, name: row.created_by_name },
    createdAt: new Date(row.created_at).toISOString(),
    updatedAt: new Date(row.updated_at).toISOString(),
  };
}

function base(db: DbOrTx): Knex.QueryBuilder {
  return db('firm_templates as t').join('users as u', 'u.id', 't.created_by');
}

export const templatesRepository = {
  /** Every firm template, by name. */
  async list(db: DbOrTx): Promise<FirmTemplateSummary[]> {
    const rows = (await base(db).select(SUMMARY_COLUMNS).orderBy('t.name')) as Row[];
    return rows.map(summaryOf);
  },

  async find(db: DbOrTx, id: number): Promise<FirmTemplate | undefined> {
    const row = (await base(db)
      .select([...SUMMARY_COLUMNS, 't.blocks', 't.settings'])
      .where('t.id', id)
      .first()) as Row | undefined;
    if (!row) return undefined;
    return {
      ...summaryOf(row),
      blocks: readJson<SheetBlock[]>(row.blocks),
      settings: readJson<Partial<SheetSettings>>(row.settings),
    };
  },

  async insert(db: DbOrTx, t: NewFirmTemplate): Promise<number> {
    const [id] = await db('firm_templates').insert({
      name: t.name,
      description: t.description,
      blocks: JSON.stringify(t.blocks),
      settings: JSON.stringify(t.settings),
      source_project_id: t.origin.projectId,
      source_job_number: t.origin.jobNumber,
      source_sheet_id: t.origin.sheetId,
      source_sheet_number: t.origin.sheetNumber,
      source_revision_id: t.origin.revisionId,
      source_revision_number: t.origin.revisionNumber,
      created_by: t.userId,
      updated_by: t.userId,
    });
    return Number(id);
  },

  async update(
    db: DbOrTx,
    id: number,
    changes: { name?: string; description?: string },
    userId: number,
  ): Promise<void> {
    await db('firm_templates')
      .where({ id })
      .update({ ...changes, updated_by: userId, updated_at: db.fn.now(3) });
  },

  async remove(db: DbOrTx, id: number): Promise<void> {
    await db('firm_templates').where({ id }).delete();
  },
};
