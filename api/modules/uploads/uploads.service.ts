import { createHash } from 'node:crypto';
import { isEngineError, type SheetUpload } from '../../../core/index';
import type { DbOrTx } from '../../db/index';
import { isDuplicateKeyError } from '../../db/index';
import type { AppContext } from '../../http/context';
import { AppError, ConflictError, ValidationError } from '../../http/errors';
import { activityService } from '../activity/activity.service';
import type { UploadRef } from '../../workers/queue';
import type { User } from '../users/users.repository';
import { detectFormat, matrixFileError, type MatrixFileShape } from './uploads.parse';
import {
  findUploadById,
  findUploadByName,
  insertUpload,
  listUploadRefs,
  listUploadsBySheet,
  readUploadBytes,
  type Upload,
} from './uploads.repository';

/** A file as multer hands it over (memory storage). */
export interface ReceivedFile {
  originalname: string;
  buffer: Buffer;
  size: number;
}

export interface UploadResult {
  upload: Upload;
  /** False when the very same file (same name and SHA-256) was already stored. */
  created: boolean;
}

const MAX_NAME = 191;

/**
 * The name a matrix block refers to (`from: <name>`): the file's own name without any folder,
 * trimmed. Control characters and names that are empty or too long are refused.
 */
export function uploadName(originalName: string): string {
  const name = originalName.split(/[\\/]/).pop()?.trim() ?? '';
  if (name === '' || name === '.' || name === '..') {
    throw new ValidationError('The file has no name; give it one ending in .mtx or .csv.', {
      field: 'file',
    });
  }
  if (name.length > MAX_NAME) {
    throw new ValidationError(`The file name is longer than ${MAX_NAME} characters.`, {
      field: 'file',
    });
  }
  // eslint-disable-next-line no-control-regex
  if (/[\u0000-\u001f\u007f]/.test(name)) {
    throw new ValidationError('The file name contains control characters.', { field: 'file' });
  }
  return name;
}

export const uploadsService = {
  /** 404 for an unknown sheet, 403 unless the person is an author on its project. */
  async checkCanUpload({ access }: AppContext, user: User, sheetId: number): Promise<void> {
    await access.sheet(user, sheetId, 'upload.add');
  },

  /**
   * Stores a Matrix Market or CSV file on a sheet after reading it with the engine's readers, so
   * a file that is not a matrix is refused now (422 MATRIX_FILE_INVALID with its line), not at
   * the first evaluation. Uploads never change: a different file under a name already taken is
   * refused (409), the same file again answers with the stored upload. The file is read by
   * `ctx.describeMatrixFile` (the worker pool's reader in the app).
   */
  async add(
    ctx: AppContext,
    user: User,
    sheetId: number,
    file: ReceivedFile | undefined,
  ): Promise<UploadResult> {
    const { db } = ctx;
    const access = await ctx.access.sheet(user, sheetId, 'upload.add');
    if (!file) {
      throw new ValidationError('Choose a file to upload (form field "file").', { field: 'file' });
    }
    const name = uploadName(file.originalname);
    const text = decodeText(file.buffer, name);
    const format = detectFormat(name, text);
    const sha256 = createHash('sha256').update(file.buffer).digest('hex');

    const existing = await findUploadByName(db, sheetId, name);
    if (existing) return sameOrConflict(existing, sha256, name);

    const shape: MatrixFileShape = await ctx.describeMatrixFile(text, format, name).catch((e) => {
      throw isEngineError(e) ? matrixFileError(e, name) : e;
    });
    let id: number;
    try {
      id = await db.transaction(async (trx) => {
        const uploadId = await insertUpload(trx, {
          sheetId,
          name,
          format,
          size: file.buffer.length,
          sha256,
          ...shape,
          bytes: file.buffer,
          userId: user.id,
        });
        await activityService.record(trx, {
          actorId: user.id,
          projectId: access.projectId,
          action: 'upload.added',
          objectType: 'upload',
          objectId: uploadId,
          details: {
            sheetId,
            name,
            format,
            size: file.buffer.length,
            sha256,
            rows: shape.rows,
            cols: shape.cols,
          },
        });
        return uploadId;
      });
    } catch (e) {
      if (isDuplicateKeyError(e)) {
        const raced = await findUploadByName(db, sheetId, name);
        if (raced) return sameOrConflict(raced, sha256, name);
      }
      throw e;
    }
    const upload = await findUploadById(db, id);
    if (!upload) throw new Error('upload vanished after its own insert');
    return { upload, created: true };
  },

  async list({ db, access }: AppContext, user: User, sheetId: number): Promise<Upload[]> {
    await access.sheet(user, sheetId, 'sheet.read');
    return listUploadsBySheet(db, sheetId);
  },

  /**
   * The sheet's uploads as an evaluation names them (id, name, size, SHA-256): what goes into
   * a job and into the results store's key. No role check: callers do.
   */
  refsForSheet(db: DbOrTx, sheetId: number): Promise<UploadRef[]> {
    return listUploadRefs(db, sheetId);
  },

  /**
   * The text of the upload `ref` names, for the engine: read from MariaDB (by a worker process,
   * or in this one for the demo seeds), inflated no further than `ref.size`, and refused unless
   * the bytes are `ref.size` long with SHA-256 `ref.sha256`.
   */
  async readUpload(db: DbOrTx, ref: UploadRef): Promise<SheetUpload> {
    const bytes = await readUploadBytes(db, ref.id, ref.size).catch((e: unknown) => {
      if (e instanceof RangeError) return null;
      throw e;
    });
    if (bytes === undefined) {
      throw new AppError(
        404,
        'UPLOAD_MISSING',
        `The file ${ref.name} (upload ${ref.id}) is no longer stored; upload it again.`,
        { details: { upload: ref.id, name: ref.name } },
      );
    }
    if (
      bytes === null ||
      bytes.length !== ref.size ||
      createHash('sha256').update(bytes).digest('hex') !== ref.sha256
    ) {
      throw new AppError(
        409,
        'UPLOAD_CHANGED',
        `The stored bytes of ${ref.name} are not the ${ref.size} bytes with SHA-256 ${ref.sha256} the evaluation was asked for; evaluate again.`,
        { details: { upload: ref.id, name: ref.name } },
      );
    }
    return { name: ref.name, text: bytes.toString('utf8') };
  },
};

/**
 * An upload already under this name: the same file answers with it. Names are compared as the
 * database's unique index does (case-insensitively), so `k.mtx` after `K.mtx` is refused too: a
 * matrix block's `from:` must name exactly one file.
 */
function sameOrConflict(existing: Upload, sha256: string, name: string): UploadResult {
  if (existing.name !== name) {
    throw new ConflictError(
      `This sheet already has a file named ${existing.name}; names that differ only in capitals would be confused. Upload under another name.`,
      {
        code: 'CONFLICT',
        field: 'file',
        details: { existing: { id: existing.id, name: existing.name } },
      },
    );
  }
  if (existing.sha256 === sha256) return { upload: existing, created: false };
  throw new ConflictError(
    `This sheet already has a file named ${existing.name} (uploaded by ${existing.createdBy.name}). Uploads are kept unchanged so that issued revisions can be re-run; upload the new file under another name and change the matrix block's "from:" line.`,
    {
      code: 'CONFLICT',
      field: 'file',
      details: { existing: { id: existing.id, sha256: existing.sha256 } },
    },
  );
}

/** Matrix files are text: UTF-8 (a byte-order mark is dropped). Binary files are refused. */
function decodeText(buffer: Buffer, name: string): string {
  if (buffer.includes(0)) {
    throw new AppError(
      422,
      'MATRIX_FILE_INVALID',
      `${name} is not a text file; upload a Matrix Market (.mtx) or CSV (.csv) file.`,
      { field: 'file', details: { line: 1 } },
    );
  }
  const text = new TextDecoder('utf-8', { fatal: false }).decode(buffer);
  return text.startsWith('\uFEFF') ? text.slice(1) : text;
}
