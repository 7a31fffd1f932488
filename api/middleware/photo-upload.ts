import type { RequestHandler } from 'express';
import multer from 'multer';
import { HttpError } from '../lib/http-error';

export const photoFieldName = 'photo';
export const maxPhotoBytes = 10 * 1024 * 1024;

/**
 * The photo is held in memory because sharp re-encodes it at once and only the re-encoded
 * version is stored; at 10 MB and one file per request that stays cheap. A few small text
 * fields (a caption, say) are allowed beside it, so the form can grow without a new limit.
 */
const parseMultipart = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: maxPhotoBytes, files: 1, fields: 10, fieldSize: 16 * 1024, parts: 11 },
}).single(photoFieldName);

function toHttpError(error: unknown): HttpError {
  if (error instanceof multer.MulterError) {
    switch (error.code) {
      case 'LIMIT_FILE_SIZE':
        return new HttpError(413, 'payload_too_large', 'The photo is larger than 10 MB.');
      case 'LIMIT_UNEXPECTED_FILE':
      case 'LIMIT_FILE_COUNT':
        return new HttpError(400, 'invalid_upload', `Send one photo, in the form field "${photoFieldName}".`);
      default:
        return new HttpError(400, 'invalid_upload', `The upload could not be read: ${error.message}.`);
    }
  }
  // Anything else comes from busboy reading a malformed or cut-off multipart body.
  return new HttpError(400, 'invalid_upload', 'The upload could not be read.');
}

/** Puts the uploaded file on `req.file` (bytes in `req.file.buffer`) and text fields on `req.body`. */
export const photoUpload: RequestHandler = (req, res, next) => {
  parseMultipart(req, res, (error?: unknown) => {
    if (error) return next(toHttpError(error));
    if (!req.file) {
      return next(
        new HttpError(400, 'photo_missing', `Attach a photo in the form field "${photoFieldName}".`),
      );
    }
    next();
  });
};
