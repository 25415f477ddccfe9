// Multipart uploads held in memory (CSV and photos), with multer's errors mapped to Sheaf's.
import type { RequestHandler } from 'express';
import multer from 'multer';
import { AppError, ValidationError } from '../errors';
import { findUnsafeText, unsafeTextReason } from '../middleware/body-guard';

/**
 * multer's single-file parser with its errors turned into Sheaf's (oversize stays 413): a
 * truncated or malformed form is a 400 naming `file`, and so is a file name or a form field
 * holding text PostgreSQL cannot store.
 */
export function singleFile(maxBytes: number): RequestHandler {
  const upload = multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: maxBytes, files: 1, fields: 10 },
  }).single('file');
  return (req, res, next) => {
    upload(req, res, (error: unknown) => {
      if (error) {
        const code = (error as { code?: string }).code;
        if (code === 'LIMIT_FILE_SIZE' || error instanceof AppError) return next(error);
        // MulterError, or busboy's "Unexpected end of form" / "Malformed part header".
        return next(
          new ValidationError('Send one whole file in the form field "file"', {
            file: error instanceof Error ? error.message : 'The form could not be read',
          }),
        );
      }
      const nameReason = req.file ? unsafeTextReason(req.file.originalname) : null;
      if (nameReason)
        return next(new ValidationError(`Check file: ${nameReason}`, { file: nameReason }));
      const found = findUnsafeText(req.body ?? {});
      if (found)
        return next(
          new ValidationError(`Check ${found[0]}: ${found[1]}`, { [found[0]]: found[1] }),
        );
      next();
    });
  };
}
