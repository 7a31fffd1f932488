import { Router, type Request, type Response } from 'express';
import { changeRoleInput, userIdParams } from '@shared/schemas/users';
import { depsOf } from '../deps';
import { parsed, validate } from '../middleware/validate';
import { can, requireActor } from '../policy/index';
import { changeStaffRole, deactivateUser, listClients, listStaff, reactivateUser } from '../services/users';

export const staffRouter = Router();
export const clientsRouter = Router();
export const usersRouter = Router();

staffRouter.get('/', can('staff:read'), getStaff);
staffRouter.patch(
  '/:userId',
  can('staff:manage'),
  validate({ params: userIdParams, body: changeRoleInput }),
  patchRole,
);
clientsRouter.get('/', can('clients:read'), getClients);
usersRouter.post(
  '/:userId/deactivate',
  can('staff:manage'),
  validate({ params: userIdParams }),
  postDeactivate,
);
usersRouter.post(
  '/:userId/reactivate',
  can('staff:manage'),
  validate({ params: userIdParams }),
  postReactivate,
);

async function getStaff(req: Request, res: Response) {
  res.json(await listStaff(depsOf(req).db, requireActor(req.actor)));
}

async function patchRole(req: Request, res: Response) {
  const { userId } = parsed(res, 'params', userIdParams);
  const { role } = parsed(res, 'body', changeRoleInput);
  res.json(await changeStaffRole(depsOf(req).db, requireActor(req.actor), userId, role));
}

async function getClients(req: Request, res: Response) {
  res.json(await listClients(depsOf(req).db, requireActor(req.actor)));
}

async function postDeactivate(req: Request, res: Response) {
  const { db, clock } = depsOf(req);
  const { userId } = parsed(res, 'params', userIdParams);
  res.json(await deactivateUser(db, requireActor(req.actor), userId, clock()));
}

async function postReactivate(req: Request, res: Response) {
  const { userId } = parsed(res, 'params', userIdParams);
  res.json(await reactivateUser(depsOf(req).db, requireActor(req.actor), userId));
}
