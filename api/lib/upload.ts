// Multipart uploads held in memory (CSV and photos), with multer's errors mapped to Sheaf's.
import type { RequestHandler } from 'express';
import multer from 'multer';
import { ValidationError } from '../errors';

/** multer's single-file parser with its errors turned into Sheaf's (oversize stays 413). */
export function singleFile(maxBytes: number): RequestHandler {
  const upload = multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: maxBytes, files: 1, fields: 10 },
  }).single('file');
  return (req, res, next) => {
    upload(req, res, (error: unknown) => {
      if (!error) return next();
      const code = (error as { code?: string }).code;
      if (code === 'LIMIT_FILE_SIZE') return next(error);
      if (error instanceof multer.MulterError)
        return next(
          new ValidationError('Send one file in the form field "file"', { file: error.message }),
        );
      next(error);
    });
  };
}
