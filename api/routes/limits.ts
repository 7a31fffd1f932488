import { Router, type Request, type Response } from 'express';
import { updateLimitsInput } from '@shared/schemas/limits';
import { tankIdParams } from '@shared/schemas/tanks';
import { depsOf } from '../deps';
import { parsed, validate } from '../middleware/validate';
import { can, requireActor } from '../policy/index';
import { getLimits, updateLimits } from '../services/limits';

/** Mounted at /api/tanks/:tankId/limits. */
export const limitsRouter = Router({ mergeParams: true });

limitsRouter.get('/', can('limits:read'), validate({ params: tankIdParams }), getTankLimits);
limitsRouter.put(
  '/',
  can('limits:write'),
  validate({ params: tankIdParams, body: updateLimitsInput }),
  putTankLimits,
);

async function getTankLimits(req: Request, res: Response) {
  const { tankId } = parsed(res, 'params', tankIdParams);
  res.json(await getLimits(depsOf(req).db, requireActor(req.actor), tankId));
}

async function putTankLimits(req: Request, res: Response) {
  const { tankId } = parsed(res, 'params', tankIdParams);
  const input = parsed(res, 'body', updateLimitsInput);
  res.json(await updateLimits(depsOf(req).db, requireActor(req.actor), tankId, input));
}
