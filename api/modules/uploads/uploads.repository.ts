import { promisify } from 'node:util';
import { gunzip, gzipSync } from 'node:zlib';
import type { UploadRef } from '../../workers/queue';
import { readJson, type DbOrTx } from '../../db/index';
import type { Upload, UploadAsymmetry, UploadFormat } from '../../../core/contract/uploads';

const gunzipAsync = promisify(gunzip);

export type { Upload, UploadAsymmetry, UploadFormat } from '../../../core/contract/uploads';

interface UploadRow {
  id: number;
  sheet_id: number;
  name: string;
  format: UploadFormat;
  size: number;
  sha256: string;
  rows: number;
  cols: number;
  nonzeros: number | string;
  symmetric: number | boolean;
  worst_asymmetry: unknown;
  created_at: Date;
  created_by: number;
  created_by_name: string;
}

const COLUMNS = [
  'up.id',
  'up.sheet_id',
  'up.name',
  'up.format',
  'up.size',
  'up.sha256',
  'up.rows',
  'up.cols',
  'up.nonzeros',
  'up.symmetric',
  'up.worst_asymmetry',
  'up.created_at',
  'up.created_by',
  'u.name as created_by_name',
];

function toUpload(row: UploadRow): Upload {
  return {
    id: row.id,
    sheetId: row.sheet_id,
    name: row.name,
    format: row.format,
    size: row.size,
    sha256: row.sha256,
    rows: row.rows,
    cols: row.cols,
    nonzeros: Number(row.nonzeros),
    symmetric: Boolean(row.symmetric),
    worstAsymmetry:
      row.worst_asymmetry === null ? null : readJson<UploadAsymmetry>(row.worst_asymmetry),
    createdAt: new Date(row.created_at).toISOString(),
    createdBy: { id: row.created_by, name: row.created_by_name },
  };
}

function selectUploads(db: DbOrTx) {
  return db('uploads as up').join('users as u', 'u.id', 'up.created_by').select(COLUMNS);
}

export async function listUploadsBySheet(db: DbOrTx, sheetId: number): Promise<Upload[]> {
  const rows = (await selectUploads(db)
    .where('up.sheet_id', sheetId)
    .orderBy('up.name', 'asc')) as UploadRow[];
  return rows.map(toUpload);
}

export async function findUploadByName(
  db: DbOrTx,
  sheetId: number,
  name: string,
): Promise<Upload | undefined> {
  const row = (await selectUploads(db)
    .where({ 'up.sheet_id': sheetId, 'up.name': name })
    .first()) as UploadRow | undefined;
  return row ? toUpload(row) : undefined;
}

export async function findUploadById(db: DbOrTx, id: number): Promise<Upload | undefined> {
  const row = (await selectUploads(db).where('up.id', id).first()) as UploadRow | undefined;
  return row ? toUpload(row) : undefined;
}

/** Stores an upload; the bytes are gzip-compressed here and inflated by readUploadBytes. */
export async function insertUpload(
  db: DbOrTx,
  upload: Omit<Upload, 'id' | 'createdAt' | 'createdBy'> & { bytes: Buffer; userId: number },
): Promise<number> {
  const [id] = await db('uploads').insert({
    sheet_id: upload.sheetId,
    name: upload.name,
    format: upload.format,
    size: upload.size,
    sha256: upload.sha256,
    encoding: 'gzip',
    bytes: gzipSync(upload.bytes),
    rows: upload.rows,
    cols: upload.cols,
    nonzeros: upload.nonzeros,
    symmetric: upload.symmetric,
    worst_asymmetry: upload.worstAsymmetry === null ? null : JSON.stringify(upload.worstAsymmetry),
    created_by: upload.userId,
  });
  return Number(id);
}

/** Every upload of a sheet as an evaluation job names it: id, name, size and SHA-256. */
export async function listUploadRefs(db: DbOrTx, sheetId: number): Promise<UploadRef[]> {
  const rows = (await db('uploads')
    .where({ sheet_id: sheetId })
    .orderBy('name', 'asc')
    .select('id', 'name', 'size', 'sha256')) as UploadRef[];
  return rows.map((r) => ({ id: r.id, name: r.name, size: Number(r.size), sha256: r.sha256 }));
}

/**
 * The bytes of upload `id` as uploaded (inflated here; insertUpload compressed them), or
 * undefined when there is none. Inflating stops with a RangeError past `maxBytes`, so stored
 * bytes that would inflate beyond the size they were stored with never fill memory.
 */
export async function readUploadBytes(
  db: DbOrTx,
  id: number,
  maxBytes: number,
): Promise<Buffer | undefined> {
  const row = (await db('uploads').where({ id }).first('encoding', 'bytes')) as
    { encoding: 'gzip' | 'identity'; bytes: Buffer } | undefined;
  if (!row) return undefined;
  if (row.encoding === 'identity') {
    if (row.bytes.length > maxBytes) throw new RangeError('the stored bytes exceed their size');
    return row.bytes;
  }
  return gunzipAsync(row.bytes, { maxOutputLength: Math.max(1, maxBytes) });
}
