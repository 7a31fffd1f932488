import { Router } from 'express';
import { changeRoleInput, userIdParams } from '@shared/schemas/users';
import { route } from '../lib/route';
import { can } from '../policy/index';
import { changeStaffRole, deactivateUser, listClients, listStaff, reactivateUser } from '../services/users';

export const staffRouter = Router();
export const clientsRouter = Router();
export const usersRouter = Router();

staffRouter.get(
  '/',
  can('staff:read'),
  route({}, ({ deps, actor }) => listStaff(deps.db, actor)),
);
staffRouter.patch(
  '/:userId',
  can('staff:manage'),
  route({ params: userIdParams, body: changeRoleInput }, ({ deps, actor, params, body }) =>
    changeStaffRole(deps.db, actor, params.userId, body.role),
  ),
);
clientsRouter.get(
  '/',
  can('clients:read'),
  route({}, ({ deps, actor }) => listClients(deps.db, actor)),
);
usersRouter.post(
  '/:userId/deactivate',
  can('staff:manage'),
  route({ params: userIdParams }, ({ deps, actor, params }) =>
    deactivateUser(deps.db, actor, params.userId, deps.clock()),
  ),
);
usersRouter.post(
  '/:userId/reactivate',
  can('staff:manage'),
  route({ params: userIdParams }, ({ deps, actor, params }) => reactivateUser(deps.db, actor, params.userId)),
);
