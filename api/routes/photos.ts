import { Router } from 'express';
import { photoIdParams, photoUploadFields } from '@shared/schemas/photos';
import { tankIdParams } from '@shared/schemas/tanks';
import type { AppDeps } from '../deps';
import { created, noContent, route, streamed } from '../lib/route';
import { photoUpload } from '../middleware/photo-upload';
import { perActor, rateLimit } from '../middleware/rate-limit';
import { can } from '../policy/index';
import type { Actor } from '../services/actors';
import { auditSourceOf } from '../services/audit';
import { deletePhoto, listTankPhotos, openPhoto, uploadPhoto } from '../services/photos';

/** Mounted under /tanks/:tankId/photos. */
export const tankPhotosRouter = Router({ mergeParams: true });
export const photosRouter = Router();

export const uploadsPerWindow = { points: 30, durationS: 10 * 60 } as const;

/**
 * Re-encoding is the costly part of an upload, so each person gets a budget of attempts (failed
 * ones count too).
 */
const limitUploads = rateLimit({
  name: 'photo-upload',
  ...uploadsPerWindow,
  keyOf: perActor,
  message: (retryAfterS) =>
    `That is ${uploadsPerWindow.points} photos in ${uploadsPerWindow.durationS / 60} minutes. Try again in ${Math.ceil(retryAfterS / 60)} minutes.`,
});

tankPhotosRouter.get(
  '/',
  can('tanks:read'),
  route({ params: tankIdParams }, ({ deps, actor, params }) => listTankPhotos(deps.db, actor, params.tankId)),
);
tankPhotosRouter.post(
  '/',
  can('photos:write'),
  limitUploads,
  photoUpload,
  route({ params: tankIdParams, body: photoUploadFields }, async ({ deps, actor, params, body, file }) =>
    created(await uploadPhoto(deps, actor, params.tankId, { bytes: file!.buffer, ...body })),
  ),
);
photosRouter.get(
  '/:photoId',
  can('photos:read'),
  route({ params: photoIdParams }, ({ deps, actor, params }) =>
    sendPhoto(deps, actor, params.photoId, 'main'),
  ),
);
photosRouter.get(
  '/:photoId/thumbnail',
  can('photos:read'),
  route({ params: photoIdParams }, ({ deps, actor, params }) =>
    sendPhoto(deps, actor, params.photoId, 'thumbnail'),
  ),
);
photosRouter.delete(
  '/:photoId',
  can('photos:write'),
  route({ params: photoIdParams }, async (ctx) => {
    await deletePhoto(ctx.deps, ctx.actor, ctx.params.photoId, auditSourceOf(ctx));
    return noContent();
  }),
);

/**
 * Photos leave only through here, under the tank's access rule. A photo never changes under its
 * id, so the browser may keep it, but privately: it is one client's tank.
 */
async function sendPhoto(deps: AppDeps, actor: Actor, photoId: string, size: 'main' | 'thumbnail') {
  const stored = await openPhoto(deps, actor, photoId, size);
  return streamed(
    {
      'Content-Type': stored.contentType,
      ...(stored.contentLength !== undefined ? { 'Content-Length': String(stored.contentLength) } : {}),
      'X-Content-Type-Options': 'nosniff',
      'Cache-Control': 'private, max-age=31536000, immutable',
      'Content-Disposition': 'inline',
    },
    stored.body,
  );
}
