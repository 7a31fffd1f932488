import { Router } from 'express';
import { onCallShiftInput, shiftIdParams } from '@shared/schemas/on-call';
import { created, noContent, route } from '../lib/route';
import { can } from '../policy/index';
import { addShift, listFailedDeliveries, listShifts, removeShift } from '../services/on-call';

export const onCallRouter = Router();
export const deliveriesRouter = Router();

onCallRouter.get(
  '/',
  can('on-call:read'),
  route({}, ({ deps, actor }) => listShifts(deps.db, actor, deps.clock())),
);
onCallRouter.post(
  '/',
  can('on-call:manage'),
  route({ body: onCallShiftInput }, async ({ deps, actor, body }) =>
    created(await addShift(deps.db, actor, body, deps.clock())),
  ),
);
onCallRouter.delete(
  '/:shiftId',
  can('on-call:manage'),
  route({ params: shiftIdParams }, async ({ deps, actor, params }) => {
    await removeShift(deps.db, actor, params.shiftId);
    return noContent();
  }),
);
deliveriesRouter.get(
  '/failed',
  can('on-call:read'),
  route({}, ({ deps, actor }) => listFailedDeliveries(deps.db, actor)),
);
