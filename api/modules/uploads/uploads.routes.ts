import type { Request, Response } from 'express';
import { Router } from 'express';
import multer from 'multer';
import { currentUser, requireSignedIn } from '../../http/auth';
import type { AppContext } from '../../http/context';
import { AppError, PayloadTooLargeError, ValidationError } from '../../http/errors';
import { isMalformedMultipart } from '../../http/request-errors';
import { parse } from '../../http/validate';
import { sheetParams } from '../sheets/sheets.schemas';
import { uploadsService, type ReceivedFile } from './uploads.service';
import type { UploadResponse, UploadsResponse } from '../../../core/contract/uploads';

function megabytes(bytes: number): string {
  const mb = bytes / (1024 * 1024);
  return mb >= 1 ? `${Number(mb.toFixed(1))} MB` : `${Math.ceil(bytes / 1024)} kB`;
}

/**
 * Matrix files uploaded to a sheet: POST (multipart, field `file`) and GET. Mounted at /api.
 */
export function createUploadsRouter(ctx: AppContext): Router {
  const limit = ctx.config.uploadLimitBytes;
  const receive = multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: limit, files: 1, fields: 10, parts: 12 },
    defParamCharset: 'utf8',
  }).single('file');

  // multer's own errors become the API's: the size limit is a 413 naming the limit.
  function receiveFile(req: Request, res: Response): Promise<ReceivedFile | undefined> {
    return new Promise((resolve, reject) => {
      receive(req, res, (err: unknown) => {
        if (!err) return resolve(req.file);
        if (err instanceof multer.MulterError) {
          if (err.code === 'LIMIT_FILE_SIZE') {
            return reject(
              new PayloadTooLargeError(
                `The file is larger than the upload limit of ${megabytes(limit)}; the administrator can raise it with MW_UPLOAD_LIMIT_BYTES.`,
              ),
            );
          }
          if (err.code === 'LIMIT_UNEXPECTED_FILE' || err.code === 'LIMIT_FILE_COUNT') {
            return reject(
              new ValidationError('Send one file, in the form field "file".', { field: 'file' }),
            );
          }
          return reject(
            new ValidationError(`The upload form is not valid: ${err.message}.`, { field: 'file' }),
          );
        }
        if (isMalformedMultipart(err)) {
          return reject(
            new AppError(
              400,
              'BAD_REQUEST',
              'The upload arrived cut off or malformed; send the file again as multipart/form-data with the form field "file".',
              { field: 'file' },
            ),
          );
        }
        reject(err);
      });
    });
  }

  const router = Router();

  router.post('/sheets/:sheetId/uploads', requireSignedIn, async (req, res) => {
    const { sheetId } = parse(sheetParams, req.params, 'params');
    const user = currentUser(req);
    // Refuse the wrong role before reading a large body.
    await uploadsService.checkCanUpload(ctx, user, sheetId);
    if (!req.is('multipart/form-data')) {
      throw new AppError(
        415,
        'UNSUPPORTED_MEDIA_TYPE',
        'Send the file as multipart/form-data with the form field "file".',
        { field: 'file' },
      );
    }
    const file = await receiveFile(req, res);
    const { upload, created } = await uploadsService.add(ctx, user, sheetId, file);
    res.status(created ? 201 : 200).json({ upload } satisfies UploadResponse);
  });

  router.get('/sheets/:sheetId/uploads', requireSignedIn, async (req, res) => {
    const { sheetId } = parse(sheetParams, req.params, 'params');
    res.json({
      uploads: await uploadsService.list(ctx, currentUser(req), sheetId),
    } satisfies UploadsResponse);
  });

  return router;
}
