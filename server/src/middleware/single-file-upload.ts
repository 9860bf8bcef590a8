import type { RequestHandler } from 'express';
import multer from 'multer';
import { AppError } from '../errors';

/**
 * Accepts one file in the named multipart field, held in memory up to the size limit; multer's
 * own errors become the one error shape, naming the field.
 */
export function singleFileUpload(field: string, maxBytes: number, what: string): RequestHandler {
  const upload = multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: maxBytes, files: 1, fields: 5 },
  }).single(field);
  return (req, res, next) => {
    upload(req, res, (error: unknown) => {
      if (!error) return next();
      const code = (error as { code?: string }).code;
      if (code === 'LIMIT_FILE_SIZE')
        return next(
          new AppError('PAYLOAD_TOO_LARGE', `The ${what} is larger than ${maxBytes / 1024 / 1024} MB`, {
            [field]: 'Too large',
          }),
        );
      next(
        new AppError('VALIDATION_FAILED', `The upload was not accepted: ${(error as Error).message}`, {
          [field]: `Send one file in the field "${field}"`,
        }),
      );
    });
  };
}

/** The last path segment of a browser-sent file name, printable characters only. */
export function safeFileName(originalName: string, fallback: string): string {
  return (
    (originalName.split(/[\\/]/).pop() ?? fallback).replace(/[^\p{L}\p{N} ._()-]/gu, '_').slice(0, 200) || fallback
  );
}
