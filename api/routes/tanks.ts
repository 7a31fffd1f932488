import { Router, type Request, type Response } from 'express';
import { tankIdParams } from '@shared/schemas/tanks';
import { depsOf } from '../deps';
import { parsed, validate } from '../middleware/validate';
import { can, requireActor } from '../policy/index';
import { getTank, listTanks } from '../services/tanks';

export const tanksRouter = Router();

tanksRouter.get('/', can('tanks:read'), getTanks);
tanksRouter.get('/:tankId', can('tanks:read'), validate({ params: tankIdParams }), getOneTank);

async function getTanks(req: Request, res: Response) {
  res.json(await listTanks(depsOf(req).db, requireActor(req.actor)));
}

async function getOneTank(req: Request, res: Response) {
  const { tankId } = parsed(res, 'params', tankIdParams);
  res.json(await getTank(depsOf(req).db, requireActor(req.actor), tankId));
}
