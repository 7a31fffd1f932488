import { Router } from 'express';
import { createDeviceInput, deviceParams } from '@shared/schemas/readings';
import { tankIdParams } from '@shared/schemas/tanks';
import { created, route } from '../lib/route';
import { can } from '../policy/index';
import { auditSourceOf } from '../services/audit';
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
  route({ params: tankIdParams, body: createDeviceInput }, async (ctx) =>
    created(await createDevice(ctx.deps.db, ctx.actor, ctx.params.tankId, ctx.body.name, auditSourceOf(ctx))),
  ),
);
/** Revokes the token; the device and its readings stay. */
devicesRouter.delete(
  '/:deviceId',
  can('devices:manage'),
  route({ params: deviceParams }, (ctx) =>
    revokeDevice(ctx.deps.db, ctx.actor, ctx.params.tankId, ctx.params.deviceId, auditSourceOf(ctx)),
  ),
);
