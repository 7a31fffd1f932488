import { Router } from 'express';
import { equipmentIdParams, equipmentInput, equipmentPatch } from '@shared/schemas/equipment';
import { tankIdParams } from '@shared/schemas/tanks';
import { created, noContent, route } from '../lib/route';
import { can } from '../policy/index';
import {
  createEquipment,
  deleteEquipment,
  getEquipment,
  listEquipment,
  updateEquipment,
} from '../services/equipment';

/** Mounted under /tanks/:tankId/equipment. */
export const equipmentRouter = Router({ mergeParams: true });

equipmentRouter.get(
  '/',
  can('tanks:read'),
  route({ params: tankIdParams }, ({ deps, actor, params }) => listEquipment(deps.db, actor, params.tankId)),
);
equipmentRouter.post(
  '/',
  can('equipment:write'),
  route({ params: tankIdParams, body: equipmentInput }, async ({ deps, actor, params, body }) =>
    created(await createEquipment(deps.db, actor, params.tankId, body)),
  ),
);
equipmentRouter.get(
  '/:equipmentId',
  can('tanks:read'),
  route({ params: equipmentIdParams }, ({ deps, actor, params }) =>
    getEquipment(deps.db, actor, params.tankId, params.equipmentId),
  ),
);
equipmentRouter.patch(
  '/:equipmentId',
  can('equipment:write'),
  route({ params: equipmentIdParams, body: equipmentPatch }, ({ deps, actor, params, body }) =>
    updateEquipment(deps.db, actor, params.tankId, params.equipmentId, body),
  ),
);
equipmentRouter.delete(
  '/:equipmentId',
  can('equipment:write'),
  route({ params: equipmentIdParams }, async ({ deps, actor, params }) => {
    await deleteEquipment(deps.db, actor, params.tankId, params.equipmentId);
    return noContent();
  }),
);
