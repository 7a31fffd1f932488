import type { Readable } from 'node:stream';
import { Router, type Request, type RequestHandler, type Response } from 'express';
import { RateLimiterMemory, RateLimiterRes } from 'rate-limiter-flexible';
import { photoIdParams, photoUploadFields } from '@shared/schemas/photos';
import { tankIdParams } from '@shared/schemas/tanks';
import { depsOf } from '../deps';
import { HttpError } from '../lib/http-error';
import { photoUpload } from '../middleware/photo-upload';
import { parsed, validate } from '../middleware/validate';
import { can, requireActor } from '../policy/index';
import { deletePhoto, listTankPhotos, openPhoto, uploadPhoto } from '../services/photos';

/** Mounted under /tanks/:tankId/photos. */
export const tankPhotosRouter = Router({ mergeParams: true });
export const photosRouter = Router();

export const uploadsPerWindow = { points: 30, durationSeconds: 10 * 60 };

/**
 * Re-encoding is the costly part of an upload, so each person gets a budget of attempts (failed
 * ones count too). Kept in memory: one API process today; a shared store is needed for several.
 */
const uploadBudget = new RateLimiterMemory({
  keyPrefix: 'photo-upload',
  points: uploadsPerWindow.points,
  duration: uploadsPerWindow.durationSeconds,
});

const limitUploads: RequestHandler = (req, res, next) => {
  uploadBudget.consume(requireActor(req.actor).id).then(
    () => next(),
    (rejection: unknown) => {
      if (!(rejection instanceof RateLimiterRes)) return next(rejection);
      const seconds = Math.max(1, Math.ceil(rejection.msBeforeNext / 1000));
      res.setHeader('Retry-After', String(seconds));
      next(
        new HttpError(
          429,
          'too_many_uploads',
          `That is ${uploadsPerWindow.points} photos in ${uploadsPerWindow.durationSeconds / 60} minutes. Try again in ${Math.ceil(seconds / 60)} minutes.`,
        ),
      );
    },
  );
};

tankPhotosRouter.get('/', can('tanks:read'), validate({ params: tankIdParams }), getTankPhotos);
tankPhotosRouter.post(
  '/',
  can('photos:write'),
  limitUploads,
  photoUpload,
  validate({ params: tankIdParams, body: photoUploadFields }),
  postPhoto,
);
photosRouter.get('/:photoId', can('photos:read'), validate({ params: photoIdParams }), getMain);
photosRouter.get(
  '/:photoId/thumbnail',
  can('photos:read'),
  validate({ params: photoIdParams }),
  getThumbnail,
);
photosRouter.delete('/:photoId', can('photos:write'), validate({ params: photoIdParams }), deleteOne);

async function getTankPhotos(req: Request, res: Response) {
  const { tankId } = parsed(res, 'params', tankIdParams);
  res.json(await listTankPhotos(depsOf(req).db, requireActor(req.actor), tankId));
}

async function postPhoto(req: Request, res: Response) {
  const { tankId } = parsed(res, 'params', tankIdParams);
  const fields = parsed(res, 'body', photoUploadFields);
  const photo = await uploadPhoto(depsOf(req), requireActor(req.actor), tankId, {
    bytes: req.file!.buffer,
    ...fields,
  });
  res.status(201).json(photo);
}

function getMain(req: Request, res: Response) {
  return sendPhoto(req, res, 'main');
}

function getThumbnail(req: Request, res: Response) {
  return sendPhoto(req, res, 'thumbnail');
}

/**
 * Photos leave only through here, under the tank's access rule. A photo never changes under its
 * id, so the browser may keep it, but privately: it is one client's tank.
 */
async function sendPhoto(req: Request, res: Response, size: 'main' | 'thumbnail') {
  const { photoId } = parsed(res, 'params', photoIdParams);
  const stored = await openPhoto(depsOf(req), requireActor(req.actor), photoId, size);
  res.setHeader('Content-Type', stored.contentType);
  if (stored.contentLength !== undefined) res.setHeader('Content-Length', String(stored.contentLength));
  res.setHeader('X-Content-Type-Options', 'nosniff');
  res.setHeader('Cache-Control', 'private, max-age=31536000, immutable');
  res.setHeader('Content-Disposition', 'inline');
  streamTo(stored.body, res);
}

function streamTo(body: Readable, res: Response) {
  // A reader who goes away mid-photo must not leave the storage connection open.
  res.on('close', () => body.destroy());
  body.pipe(res);
}

async function deleteOne(req: Request, res: Response) {
  const { photoId } = parsed(res, 'params', photoIdParams);
  await deletePhoto(depsOf(req), requireActor(req.actor), photoId);
  res.status(204).end();
}
