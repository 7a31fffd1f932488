import { Router } from 'express';
import {
  createTankInput,
  tankIdParams,
  tankListQuery,
  tankOverviewQuery,
  updateTankInput,
} from '@shared/schemas/tanks';
import { created, route } from '../lib/route';
import { can } from '../policy/index';
import { tankComfortRange } from '../services/livestock';
import {
  createTank,
  getTankDetail,
  listAssignableStaff,
  listTankChoices,
  listTanks,
  tankOverview,
  updateTank,
} from '../services/tanks';

export const tanksRouter = Router();

tanksRouter.get(
  '/',
  can('tanks:read'),
  route({ query: tankListQuery }, ({ deps, actor, query }) => listTanks(deps.db, actor, query, deps.clock())),
);
tanksRouter.post(
  '/',
  can('tanks:write'),
  route({ body: createTankInput }, async ({ deps, actor, body }) =>
    created(await createTank(deps.db, actor, body, deps.clock())),
  ),
);
tanksRouter.get(
  '/overview',
  can('clients:read'),
  route({ query: tankOverviewQuery }, ({ deps, actor, query }) =>
    tankOverview(deps.db, actor, query, deps.clock()),
  ),
);
tanksRouter.get(
  '/technicians',
  can('tanks:write'),
  route({}, ({ deps, actor }) => listAssignableStaff(deps.db, actor)),
);
tanksRouter.get(
  '/choices',
  can('tanks:read'),
  route({}, ({ deps, actor }) => listTankChoices(deps.db, actor)),
);
tanksRouter.get(
  '/:tankId',
  can('tanks:read'),
  route({ params: tankIdParams }, ({ deps, actor, params }) =>
    getTankDetail(deps.db, actor, params.tankId, deps.clock()),
  ),
);
tanksRouter.patch(
  '/:tankId',
  can('tanks:write'),
  route({ params: tankIdParams, body: updateTankInput }, ({ deps, actor, params, body }) =>
    updateTank(deps.db, actor, params.tankId, body, deps.clock()),
  ),
);
tanksRouter.get(
  '/:tankId/comfort-range',
  can('tanks:read'),
  route({ params: tankIdParams }, ({ deps, actor, params }) =>
    tankComfortRange(deps.db, actor, params.tankId),
  ),
);
