import type { NextFunction, Request, Response } from 'express';
import multer from 'multer';
import { ApiError, Invalid } from '../errors';

const kib = (bytes: number) =>
  bytes >= 1024 * 1024 ? `${(bytes / 1024 / 1024).toFixed(bytes % (1024 * 1024) ? 1 : 0)} MiB` : `${Math.round(bytes / 1024)} KiB`;

/**
 * One file in memory under `field`, at most `maxBytes`; nothing touches the disk here, so a refused
 * upload leaves nothing behind. Multer's and busboy's errors become 413 or 400 with a plain message.
 */
export function singleUpload(field: string, maxBytes: number, what: string) {
  const handler = multer({ storage: multer.memoryStorage(), limits: { fileSize: maxBytes, files: 1, fields: 10, fieldSize: 4096, parts: 12 } }).single(field);
  return (req: Request, res: Response, next: NextFunction) => {
    handler(req, res, (err: unknown) => {
      if (!err) return next();
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE') return next(new ApiError(413, 'too_large', `The ${what} is larger than ${kib(maxBytes)}. Send a smaller file.`));
        if (err.code === 'LIMIT_UNEXPECTED_FILE' || err.code === 'LIMIT_FILE_COUNT')
          return next(
            Invalid(`Send exactly one ${what} in the form field "${field}".`, [{ path: field, message: `${field} must be the only file in the form` }]),
          );
        return next(Invalid(`The upload form could not be read (${err.message.toLowerCase()}). Send one file in the field "${field}".`));
      }
      next(Invalid(`The upload could not be read as a form. Send the ${what} as multipart/form-data in the field "${field}".`));
    });
  };
}

/** The uploaded file, or a 400 that says which field to use. */
export function requireFile(req: Request, field: string, what: string): Express.Multer.File {
  if (!req.file || req.file.size === 0)
    throw Invalid(`No ${what} was sent. Choose a file and send it in the form field "${field}".`, [{ path: field, message: `${field} is required` }]);
  return req.file;
}
