import { Router, type Request, type Response } from 'express';
import { createDeviceInput, deviceParams } from '@shared/schemas/readings';
import { tankIdParams } from '@shared/schemas/tanks';
import { depsOf } from '../deps';
import { parsed, validate } from '../middleware/validate';
import { can, requireActor } from '../policy/index';
import { createDevice, listDevices, revokeDevice } from '../services/devices';

/** Mounted at /api/tanks/:tankId/devices. */
export const devicesRouter = Router({ mergeParams: true });

devicesRouter.get('/', can('devices:manage'), validate({ params: tankIdParams }), getDevices);
devicesRouter.post(
  '/',
  can('devices:manage'),
  validate({ params: tankIdParams, body: createDeviceInput }),
  postDevice,
);
devicesRouter.delete('/:deviceId', can('devices:manage'), validate({ params: deviceParams }), deleteDevice);

async function getDevices(req: Request, res: Response) {
  const { tankId } = parsed(res, 'params', tankIdParams);
  res.json(await listDevices(depsOf(req).db, requireActor(req.actor), tankId));
}

async function postDevice(req: Request, res: Response) {
  const { tankId } = parsed(res, 'params', tankIdParams);
  const { name } = parsed(res, 'body', createDeviceInput);
  res.status(201).json(await createDevice(depsOf(req).db, requireActor(req.actor), tankId, name));
}

/** Revokes the token; the device and its readings stay. */
async function deleteDevice(req: Request, res: Response) {
  const { db, clock } = depsOf(req);
  const { tankId, deviceId } = parsed(res, 'params', deviceParams);
  res.json(await revokeDevice(db, requireActor(req.actor), tankId, deviceId, clock()));
}
