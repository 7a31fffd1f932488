import { Router, type Request, type Response } from 'express';
import { onCallShiftInput, shiftIdParams } from '@shared/schemas/on-call';
import { depsOf } from '../deps';
import { parsed, validate } from '../middleware/validate';
import { can, requireActor } from '../policy/index';
import { addShift, listFailedDeliveries, listShifts, removeShift } from '../services/on-call';

export const onCallRouter = Router();
export const deliveriesRouter = Router();

onCallRouter.get('/', can('on-call:read'), getShifts);
onCallRouter.post('/', can('on-call:manage'), validate({ body: onCallShiftInput }), postShift);
onCallRouter.delete('/:shiftId', can('on-call:manage'), validate({ params: shiftIdParams }), deleteShift);
deliveriesRouter.get('/failed', can('on-call:read'), getFailedDeliveries);

async function getShifts(req: Request, res: Response) {
  const { db, clock } = depsOf(req);
  res.json(await listShifts(db, requireActor(req.actor), clock()));
}

async function postShift(req: Request, res: Response) {
  const { db, clock } = depsOf(req);
  res
    .status(201)
    .json(await addShift(db, requireActor(req.actor), parsed(res, 'body', onCallShiftInput), clock()));
}

async function deleteShift(req: Request, res: Response) {
  const { shiftId } = parsed(res, 'params', shiftIdParams);
  await removeShift(depsOf(req).db, requireActor(req.actor), shiftId);
  res.status(204).end();
}

async function getFailedDeliveries(req: Request, res: Response) {
  res.json(await listFailedDeliveries(depsOf(req).db, requireActor(req.actor)));
}
