import path from 'node:path';
import { rm } from 'node:fs/promises';
import multer, { MulterError } from 'multer';
import type { ErrorRequestHandler, RequestHandler } from 'express';
import type { AppContext } from '../app-context';
import { AppError } from '../http/app-error';
import { HashingDiskStorage } from './ingest/hashing-disk-storage';
import { sniffFormat } from './ingest/sniff-format';

/** The field the file travels in. */
export const FILE_FIELD = 'file';

/**
 * Receives exactly one file per request into `storage/tmp/uploads`, hashing it on the way and
 * refusing it as soon as its first bytes show it is not an image we take.
 */
export function receiveOneFile(ctx: AppContext): RequestHandler {
  const storage = new HashingDiskStorage(path.join(ctx.config.storageDir, 'tmp', 'uploads'), (head) => {
    if (head.length === 0) return null; // an empty file gets its own error after the upload
    const sniffed = sniffFormat(head);
    return 'refused' in sniffed ? new AppError(415, 'unsupported_format', sniffed.refused) : null;
  });
  const upload = multer({
    storage,
    // Keep the name as sent: a name with folders in it is refused, not silently shortened.
    preservePath: true,
    // Browsers send file names as UTF-8; busboy would read them as Latin-1 otherwise.
    defParamCharset: 'utf8',
    limits: { fileSize: ctx.config.images.uploadMaxBytes, files: 1, fields: 30, fieldSize: 10_000, parts: 32 },
  }).single(FILE_FIELD);
  const limitText = formatBytes(ctx.config.images.uploadMaxBytes);
  return (req, res, next) => {
    upload(req, res, (err: unknown) => {
      if (err) return next(translate(err, limitText));
      if (!req.file) return next(new AppError(422, 'validation_failed', 'Attach one image file.', [{ field: FILE_FIELD, message: 'Send the image as multipart/form-data in the field "file".' }]));
      next();
    });
  };
}

/** Whatever went wrong after a file arrived, its temporary copy goes before the error is answered. */
export const removeUploadOnError: ErrorRequestHandler = async (err, req, _res, next) => {
  if (req.file?.path) await rm(req.file.path, { force: true });
  next(err);
};

function translate(err: unknown, limitText: string): unknown {
  if (err instanceof AppError) return err;
  if (err instanceof MulterError) {
    if (err.code === 'LIMIT_FILE_SIZE') return new AppError(413, 'file_too_large', `This file is larger than the upload limit of ${limitText}.`);
    if (err.code === 'LIMIT_FILE_COUNT' || err.code === 'LIMIT_UNEXPECTED_FILE') {
      return new AppError(422, 'validation_failed', 'Send one file per request, in the field "file".', [{ field: FILE_FIELD, message: 'One file per request.' }]);
    }
    return new AppError(422, 'validation_failed', `The form is not acceptable: ${err.message}.`);
  }
  const message = String((err as Error)?.message ?? '');
  // busboy and multer report a client that went away, or a body cut short, in these words.
  if (/aborted|closed|Unexpected end of form|Malformed part header|Multipart: Boundary not found/i.test(message)) {
    return new AppError(400, 'upload_incomplete', 'The upload did not arrive complete; send the file again.');
  }
  return err;
}

function formatBytes(n: number): string {
  const gib = n / 1024 ** 3;
  if (gib >= 1) return `${Number(gib.toFixed(1))} GiB`;
  const mib = n / 1024 ** 2;
  return mib >= 1 ? `${Number(mib.toFixed(1))} MiB` : `${Math.ceil(n / 1024)} KiB`;
}
