import multer from 'multer';
import type { RequestHandler } from 'express';
import { UPLOAD_LIMITS } from '@shared/rider';
import { AppError } from '../errors';

const MB = 1024 * 1024;

/**
 * One file per request (field `file`) in memory, capped at the largest size we accept (a clip);
 * the photo limit is applied after the content says it is a photo. One file per request keeps
 * progress and retry per file in the browser.
 */
const single = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: UPLOAD_LIMITS.clipBytes, files: 1, fields: 4, fieldSize: 200, fieldNameSize: 40, parts: 6, headerPairs: 40 },
}).single('file');

/** Multer's and busboy's errors, in our error shape: 413 for size and count, 400 otherwise. */
function translate(error: unknown): AppError {
  if (error instanceof AppError) return error;
  if (error instanceof multer.MulterError) {
    switch (error.code) {
      case 'LIMIT_FILE_SIZE':
        return new AppError(413, 'file_too_large', `That file is too large: photos can be at most ${UPLOAD_LIMITS.photoBytes / MB} MB and clips ${UPLOAD_LIMITS.clipBytes / MB} MB.`);
      case 'LIMIT_FILE_COUNT':
        return new AppError(413, 'too_many_files', 'Send one file at a time.');
      case 'LIMIT_UNEXPECTED_FILE':
        return new AppError(400, 'validation_failed', 'Send the file in the form field named "file", one file at a time.');
      default:
        return new AppError(400, 'malformed_upload', 'The upload form was not filled in the way we expect. Please try again.');
    }
  }
  return new AppError(400, 'malformed_upload', 'The upload could not be read; it may have been cut off. Please try again.');
}

export const receiveSingleUpload: RequestHandler = (req, res, next) => {
  single(req, res, (error?: unknown) => next(error ? translate(error) : undefined));
};
