import { Router, type Request, type Response } from 'express';
import { createTankInput, tankIdParams, tankListQuery, updateTankInput } from '@shared/schemas/tanks';
import { depsOf } from '../deps';
import { parsed, validate } from '../middleware/validate';
import { can, requireActor } from '../policy/index';
import { tankComfortRange } from '../services/livestock';
import { createTank, getTankDetail, listAssignableStaff, listTanks, updateTank } from '../services/tanks';

export const tanksRouter = Router();

tanksRouter.get('/', can('tanks:read'), validate({ query: tankListQuery }), getTanks);
tanksRouter.post('/', can('tanks:write'), validate({ body: createTankInput }), postTank);
tanksRouter.get('/technicians', can('tanks:write'), getTechnicians);
tanksRouter.get('/:tankId', can('tanks:read'), validate({ params: tankIdParams }), getOneTank);
tanksRouter.patch(
  '/:tankId',
  can('tanks:write'),
  validate({ params: tankIdParams, body: updateTankInput }),
  patchTank,
);
tanksRouter.get(
  '/:tankId/comfort-range',
  can('tanks:read'),
  validate({ params: tankIdParams }),
  getComfortRange,
);

async function getTanks(req: Request, res: Response) {
  const { db, clock } = depsOf(req);
  res.json(await listTanks(db, requireActor(req.actor), parsed(res, 'query', tankListQuery), clock()));
}

async function postTank(req: Request, res: Response) {
  const { db, clock } = depsOf(req);
  const input = parsed(res, 'body', createTankInput);
  res.status(201).json(await createTank(db, requireActor(req.actor), input, clock()));
}

async function getTechnicians(req: Request, res: Response) {
  res.json(await listAssignableStaff(depsOf(req).db, requireActor(req.actor)));
}

async function getOneTank(req: Request, res: Response) {
  const { db, clock } = depsOf(req);
  const { tankId } = parsed(res, 'params', tankIdParams);
  res.json(await getTankDetail(db, requireActor(req.actor), tankId, clock()));
}

async function patchTank(req: Request, res: Response) {
  const { db, clock } = depsOf(req);
  const { tankId } = parsed(res, 'params', tankIdParams);
  const input = parsed(res, 'body', updateTankInput);
  res.json(await updateTank(db, requireActor(req.actor), tankId, input, clock()));
}

async function getComfortRange(req: Request, res: Response) {
  const { tankId } = parsed(res, 'params', tankIdParams);
  res.json(await tankComfortRange(depsOf(req).db, requireActor(req.actor), tankId));
}
