import { Router } from 'express';
import { createDeviceInput, deviceParams } from '@shared/schemas/readings';
import { tankIdParams } from '@shared/schemas/tanks';
import { created, route } from '../lib/route';
import { can } from '../policy/index';
import { createDevice, listDevices, revokeDevice } from '../services/devices';

/** Mounted at /api/tanks/:tankId/devices. */
export const devicesRouter = Router({ mergeParams: true });

devicesRouter.get(
  '/',
  can('devices:manage'),
  route({ params: tankIdParams }, ({ deps, actor, params }) => listDevices(deps.db, actor, params.tankId)),
);
devicesRouter.post(
  '/',
  can('devices:manage'),
  route({ params: tankIdParams, body: createDeviceInput }, async ({ deps, actor, params, body }) =>
    created(await createDevice(deps.db, actor, params.tankId, body.name)),
  ),
);
/** Revokes the token; the device and its readings stay. */
devicesRouter.delete(
  '/:deviceId',
  can('devices:manage'),
  route({ params: deviceParams }, ({ deps, actor, params }) =>
    revokeDevice(deps.db, actor, params.tankId, params.deviceId, deps.clock()),
  ),
);
