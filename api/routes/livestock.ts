import { Router, type Request, type Response } from 'express';
import {
  addLivestockInput,
  addLivestockQuery,
  livestockIdParams,
  updateLivestockInput,
} from '@shared/schemas/livestock';
import { tankIdParams } from '@shared/schemas/tanks';
import { depsOf } from '../deps';
import { parsed, validate } from '../middleware/validate';
import { can, requireActor } from '../policy/index';
import {
  addLivestock,
  checkLivestock,
  deleteLivestock,
  getLivestock,
  listLivestock,
  updateLivestock,
} from '../services/livestock';
import { discardObjects } from '../services/photos';

/** Mounted under /tanks/:tankId/livestock. */
export const livestockRouter = Router({ mergeParams: true });

livestockRouter.get('/', can('tanks:read'), validate({ params: tankIdParams }), getAll);
livestockRouter.post(
  '/',
  can('livestock:write'),
  validate({ params: tankIdParams, query: addLivestockQuery, body: addLivestockInput }),
  postOne,
);
livestockRouter.get('/:livestockId', can('tanks:read'), validate({ params: livestockIdParams }), getOne);
livestockRouter.patch(
  '/:livestockId',
  can('livestock:write'),
  validate({ params: livestockIdParams, body: updateLivestockInput }),
  patchOne,
);
livestockRouter.delete(
  '/:livestockId',
  can('livestock:write'),
  validate({ params: livestockIdParams }),
  deleteOne,
);

async function getAll(req: Request, res: Response) {
  const { tankId } = parsed(res, 'params', tankIdParams);
  res.json(await listLivestock(depsOf(req).db, requireActor(req.actor), tankId));
}

/**
 * `?dryRun=true` answers the compatibility warnings without saving. A real add with warnings
 * the person has not acknowledged is a 409 carrying them, so the form can show why.
 */
async function postOne(req: Request, res: Response) {
  const { db, clock } = depsOf(req);
  const actor = requireActor(req.actor);
  const { tankId } = parsed(res, 'params', tankIdParams);
  const { dryRun } = parsed(res, 'query', addLivestockQuery);
  const input = parsed(res, 'body', addLivestockInput);
  if (dryRun) {
    res.json(await checkLivestock(db, actor, tankId, input));
    return;
  }
  const result = await addLivestock(db, actor, tankId, input, clock());
  if ('blocked' in result) {
    res.status(409).json({
      error: {
        code: 'unacknowledged_warnings',
        message: 'This addition has compatibility warnings. Read them and acknowledge them to add it anyway.',
        warnings: result.blocked.warnings,
      },
    });
    return;
  }
  res.status(201).json(result.added);
}

async function getOne(req: Request, res: Response) {
  const { tankId, livestockId } = parsed(res, 'params', livestockIdParams);
  res.json(await getLivestock(depsOf(req).db, requireActor(req.actor), tankId, livestockId));
}

async function patchOne(req: Request, res: Response) {
  const { db, clock } = depsOf(req);
  const { tankId, livestockId } = parsed(res, 'params', livestockIdParams);
  const input = parsed(res, 'body', updateLivestockInput);
  res.json(await updateLivestock(db, requireActor(req.actor), tankId, livestockId, input, clock()));
}

async function deleteOne(req: Request, res: Response) {
  const { db, storage, logger } = depsOf(req);
  const { tankId, livestockId } = parsed(res, 'params', livestockIdParams);
  const keys = await deleteLivestock(db, requireActor(req.actor), tankId, livestockId);
  await discardObjects(storage, logger, keys);
  res.status(204).end();
}
