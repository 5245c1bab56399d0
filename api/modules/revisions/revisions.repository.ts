import type { Knex } from 'knex';
import { readJson, type DbOrTx } from '../../db/index';
import type { PersonRef } from '../../../core/contract/common';
import type { RevisionBlock, RevisionSummary } from '../../../core/contract/revisions';
import type { RevisionStatus } from '../../../core/vocabulary';

// A revision as lists show it, and its frozen blocks: the shapes are the contract's.
export type { PersonRef, RevisionBlock, RevisionStatus, RevisionSummary };

/** A revision with everything that was frozen when it was issued, exactly as stored. */
export interface RevisionRecord extends RevisionSummary {
  blocks: RevisionBlock[];
  settings: Record<string, unknown>;
  canonicalText: string;
  /** The results JSON text as stored: the bytes a seal vouches for. */
  resultsText: string;
  digests: { canonicalText: string; results: string };
  engineVersion: string;
}

export interface NewRevision {
  sheetId: number;
  number: number;
  purpose: string;
  blocks: RevisionBlock[];
  settings: Record<string, unknown>;
  canonicalText: string;
  resultsText: string;
  canonicalTextDigest: string;
  resultsDigest: string;
  engineVersion: string;
  issuedBy: number;
  issuedAt: Date;
}

interface RevisionRow {
  id: number;
  sheet_id: number;
  number: number;
  status: RevisionStatus;
  purpose: string;
  issued_by: number;
  issued_by_name: string;
  issued_at: Date;
  returned_by: number | null;
  returned_by_name: string | null;
  returned_at: Date | null;
  checked_by: number | null;
  checked_by_name: string | null;
  checked_at: Date | null;
  sealed_by: number | null;
  sealed_by_name: string | null;
  sealed_at: Date | null;
  superseded_at: Date | null;
  seal_code: string | null;
  check_note: string | null;
  checked_purpose: string | null;
  sealed_purpose: string | null;
  blocks?: string;
  settings?: string;
  canonical_text?: string;
  results?: string;
  canonical_text_digest?: string;
  results_digest?: string;
  engine_version?: string;
}

const iso = (d: Date | null): string | null => (d === null ? null : new Date(d).toISOString());

const person = (id: number | null, name: string | null): PersonRef | null =>
  id === null ? null : { id, name: name ?? '(removed)' };

function summaryQuery(db: DbOrTx): Knex.QueryBuilder {
  return db('revisions as r')
    .join('users as ib', 'ib.id', 'r.issued_by')
    .leftJoin('users as rb', 'rb.id', 'r.returned_by')
    .leftJoin('users as cb', 'cb.id', 'r.checked_by')
    .leftJoin('users as sb', 'sb.id', 'r.sealed_by')
    .leftJoin('seals as s', 's.revision_id', 'r.id')
    .select(
      'r.id',
      'r.sheet_id',
      'r.number',
      'r.status',
      'r.purpose',
      'r.issued_by',
      'ib.name as issued_by_name',
      'r.issued_at',
      'r.returned_by',
      'rb.name as returned_by_name',
      'r.returned_at',
      'r.checked_by',
      'cb.name as checked_by_name',
      'r.checked_at',
      'r.sealed_by',
      'sb.name as sealed_by_name',
      'r.sealed_at',
      'r.superseded_at',
      's.code as seal_code',
      'r.check_note',
      'r.checked_purpose',
      'r.sealed_purpose',
    );
}

function toSummary(row: RevisionRow): RevisionSummary {
  return {
    id: row.id,
    sheetId: row.sheet_id,
    number: row.number,
    status: row.status,
    purpose: row.purpose,
    issuedBy: { id: row.issued_by, name: row.issued_by_name },
    issuedAt: new Date(row.issued_at).toISOString(),
    returnedBy: person(row.returned_by, row.returned_by_name),
    returnedAt: iso(row.returned_at),
    checkedBy: person(row.checked_by, row.checked_by_name),
    checkedAt: iso(row.checked_at),
    sealedBy: person(row.sealed_by, row.sealed_by_name),
    sealedAt: iso(row.sealed_at),
    supersededAt: iso(row.superseded_at),
    sealCode: row.seal_code,
    checkNote: row.check_note,
    checkedPurpose: row.checked_purpose,
    sealedPurpose: row.sealed_purpose,
  };
}

function toRecord(row: RevisionRow): RevisionRecord {
  return {
    ...toSummary(row),
    blocks: JSON.parse(row.blocks ?? '[]') as RevisionBlock[],
    settings: JSON.parse(row.settings ?? '{}') as Record<string, unknown>,
    canonicalText: row.canonical_text ?? '',
    resultsText: row.results ?? 'null',
    digests: { canonicalText: row.canonical_text_digest ?? '', results: row.results_digest ?? '' },
    engineVersion: row.engine_version ?? '',
  };
}

const contentColumns = [
  'r.blocks',
  'r.settings',
  'r.canonical_text',
  'r.results',
  'r.canonical_text_digest',
  'r.results_digest',
  'r.engine_version',
];

export const revisionsRepository = {
  async listBySheet(db: DbOrTx, sheetId: number): Promise<RevisionSummary[]> {
    const rows = (await summaryQuery(db)
      .where('r.sheet_id', sheetId)
      .orderBy('r.number', 'asc')) as RevisionRow[];
    return rows.map(toSummary);
  },

  async findById(db: DbOrTx, id: number): Promise<RevisionRecord | undefined> {
    const row = (await summaryQuery(db).select(contentColumns).where('r.id', id).first()) as
      RevisionRow | undefined;
    return row ? toRecord(row) : undefined;
  },

  /** The newest revision of a sheet, with its content. */
  async findLatest(db: DbOrTx, sheetId: number): Promise<RevisionRecord | undefined> {
    const row = (await summaryQuery(db)
      .select(contentColumns)
      .where('r.sheet_id', sheetId)
      .orderBy('r.number', 'desc')
      .first()) as RevisionRow | undefined;
    return row ? toRecord(row) : undefined;
  },

  /** The blocks of the newest revision of each sheet named, keyed by sheet id. */
  async latestBlocksOf(
    db: DbOrTx,
    sheetIds: readonly number[],
  ): Promise<Map<number, { id: number; number: number; blocks: RevisionBlock[] }>> {
    const out = new Map<number, { id: number; number: number; blocks: RevisionBlock[] }>();
    if (sheetIds.length === 0) return out;
    const rows = (await db('revisions as r')
      .whereIn('r.sheet_id', sheetIds)
      .whereRaw(
        'r.number = (select max(r2.number) from revisions r2 where r2.sheet_id = r.sheet_id)',
      )
      .select('r.id', 'r.sheet_id', 'r.number', 'r.blocks')) as {
      id: number;
      sheet_id: number;
      number: number;
      blocks: unknown;
    }[];
    for (const r of rows) {
      out.set(r.sheet_id, {
        id: r.id,
        number: r.number,
        blocks: readJson<RevisionBlock[]>(r.blocks),
      });
    }
    return out;
  },

  async findSheetIdOf(db: DbOrTx, id: number): Promise<number | undefined> {
    const row = (await db('revisions').where({ id }).first('sheet_id')) as
      { sheet_id: number } | undefined;
    return row?.sheet_id;
  },

  /** Locks the revision row until the transaction ends; returns its current status. */
  async lockStatus(trx: Knex.Transaction, id: number): Promise<RevisionStatus | undefined> {
    const row = (await trx('revisions').where({ id }).forUpdate().first('status')) as
      { status: RevisionStatus } | undefined;
    return row?.status;
  },

  async insert(db: DbOrTx, r: NewRevision): Promise<number> {
    const [id] = await db('revisions').insert({
      sheet_id: r.sheetId,
      number: r.number,
      status: 'in_check',
      purpose: r.purpose,
      blocks: JSON.stringify(r.blocks),
      settings: JSON.stringify(r.settings),
      canonical_text: r.canonicalText,
      results: r.resultsText,
      canonical_text_digest: r.canonicalTextDigest,
      results_digest: r.resultsDigest,
      engine_version: r.engineVersion,
      issued_by: r.issuedBy,
      issued_at: r.issuedAt,
    });
    if (id === undefined) throw new Error('revisions insert returned no id');
    return id;
  },

  async markReturned(
    db: DbOrTx,
    id: number,
    by: number,
    at: Date,
    note: string | null,
  ): Promise<void> {
    await db('revisions')
      .where({ id })
      .update({ status: 'returned', returned_by: by, returned_at: at, check_note: note });
  },

  async markChecked(
    db: DbOrTx,
    id: number,
    by: number,
    at: Date,
    input: { note: string | null; purpose: string | null },
  ): Promise<void> {
    await db('revisions').where({ id }).update({
      status: 'checked',
      checked_by: by,
      checked_at: at,
      check_note: input.note,
      checked_purpose: input.purpose,
    });
  },

  async markSealed(
    db: DbOrTx,
    id: number,
    by: number,
    at: Date,
    purpose: string | null,
  ): Promise<void> {
    await db('revisions')
      .where({ id })
      .update({ status: 'sealed', sealed_by: by, sealed_at: at, sealed_purpose: purpose });
  },

  /** sealed -> superseded for the sheet's earlier sealed revisions (the one step the triggers allow). */
  async supersedeEarlier(
    db: DbOrTx,
    sheetId: number,
    exceptId: number,
    at: Date,
  ): Promise<number[]> {
    const rows = (await db('revisions')
      .where({ sheet_id: sheetId, status: 'sealed' })
      .whereNot({ id: exceptId })
      .select('id')) as { id: number }[];
    if (rows.length === 0) return [];
    const ids = rows.map((r) => r.id);
    await db('revisions').whereIn('id', ids).update({ status: 'superseded', superseded_at: at });
    return ids;
  },

  async maxNumber(db: DbOrTx, sheetId: number): Promise<number> {
    const row = (await db('revisions')
      .where({ sheet_id: sheetId })
      .max({ n: 'number' })
      .first()) as { n: number | null } | undefined;
    return Number(row?.n ?? 0);
  },
};
