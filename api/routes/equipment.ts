import { Router, type Request, type Response } from 'express';
import { equipmentIdParams, equipmentInput, equipmentPatch } from '@shared/schemas/equipment';
import { tankIdParams } from '@shared/schemas/tanks';
import { depsOf } from '../deps';
import { parsed, validate } from '../middleware/validate';
import { can, requireActor } from '../policy/index';
import {
  createEquipment,
  deleteEquipment,
  getEquipment,
  listEquipment,
  updateEquipment,
} from '../services/equipment';

/** Mounted under /tanks/:tankId/equipment. */
export const equipmentRouter = Router({ mergeParams: true });

equipmentRouter.get('/', can('tanks:read'), validate({ params: tankIdParams }), getAll);
equipmentRouter.post(
  '/',
  can('equipment:write'),
  validate({ params: tankIdParams, body: equipmentInput }),
  postOne,
);
equipmentRouter.get('/:equipmentId', can('tanks:read'), validate({ params: equipmentIdParams }), getOne);
equipmentRouter.patch(
  '/:equipmentId',
  can('equipment:write'),
  validate({ params: equipmentIdParams, body: equipmentPatch }),
  patchOne,
);
equipmentRouter.delete(
  '/:equipmentId',
  can('equipment:write'),
  validate({ params: equipmentIdParams }),
  deleteOne,
);

async function getAll(req: Request, res: Response) {
  const { tankId } = parsed(res, 'params', tankIdParams);
  res.json(await listEquipment(depsOf(req).db, requireActor(req.actor), tankId));
}

async function postOne(req: Request, res: Response) {
  const { tankId } = parsed(res, 'params', tankIdParams);
  const input = parsed(res, 'body', equipmentInput);
  res.status(201).json(await createEquipment(depsOf(req).db, requireActor(req.actor), tankId, input));
}

async function getOne(req: Request, res: Response) {
  const { tankId, equipmentId } = parsed(res, 'params', equipmentIdParams);
  res.json(await getEquipment(depsOf(req).db, requireActor(req.actor), tankId, equipmentId));
}

async function patchOne(req: Request, res: Response) {
  const { tankId, equipmentId } = parsed(res, 'params', equipmentIdParams);
  const input = parsed(res, 'body', equipmentPatch);
  res.json(await updateEquipment(depsOf(req).db, requireActor(req.actor), tankId, equipmentId, input));
}

async function deleteOne(req: Request, res: Response) {
  const { tankId, equipmentId } = parsed(res, 'params', equipmentIdParams);
  await deleteEquipment(depsOf(req).db, requireActor(req.actor), tankId, equipmentId);
  res.status(204).end();
}
