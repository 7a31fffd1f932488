import { Router } from 'express';
import { changeRoleInput, userIdParams } from '@shared/schemas/users';
import { route } from '../lib/route';
import { can } from '../policy/index';
import { auditSourceOf } from '../services/audit';
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
  route({ params: userIdParams, body: changeRoleInput }, (ctx) =>
    changeStaffRole(ctx.deps.db, ctx.actor, ctx.params.userId, ctx.body.role, auditSourceOf(ctx)),
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
  route({ params: userIdParams }, (ctx) =>
    deactivateUser(ctx.deps.db, ctx.actor, ctx.params.userId, auditSourceOf(ctx)),
  ),
);
usersRouter.post(
  '/:userId/reactivate',
  can('staff:manage'),
  route({ params: userIdParams }, (ctx) =>
    reactivateUser(ctx.deps.db, ctx.actor, ctx.params.userId, auditSourceOf(ctx)),
  ),
);
