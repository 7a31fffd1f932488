import { Router } from 'express';
import {
  addLivestockInput,
  addLivestockQuery,
  livestockIdParams,
  updateLivestockInput,
} from '@shared/schemas/livestock';
import { tankIdParams } from '@shared/schemas/tanks';
import { created, noContent, route, withStatus, type SignedInContext } from '../lib/route';
import { can } from '../policy/index';
import {
  addLivestock,
  checkLivestock,
  deleteLivestock,
  getLivestock,
  listLivestock,
  updateLivestock,
} from '../services/livestock';
import { discardObjects } from '../services/photos';

/** Mounted under /tanks/:tankId/livestock. */
export const livestockRouter = Router({ mergeParams: true });

const addSchemas = { params: tankIdParams, query: addLivestockQuery, body: addLivestockInput };

livestockRouter.get(
  '/',
  can('tanks:read'),
  route({ params: tankIdParams }, ({ deps, actor, params }) => listLivestock(deps.db, actor, params.tankId)),
);
livestockRouter.post('/', can('livestock:write'), route(addSchemas, postOne));
livestockRouter.get(
  '/:livestockId',
  can('tanks:read'),
  route({ params: livestockIdParams }, ({ deps, actor, params }) =>
    getLivestock(deps.db, actor, params.tankId, params.livestockId),
  ),
);
livestockRouter.patch(
  '/:livestockId',
  can('livestock:write'),
  route({ params: livestockIdParams, body: updateLivestockInput }, ({ deps, actor, params, body }) =>
    updateLivestock(deps.db, actor, params.tankId, params.livestockId, body, deps.clock()),
  ),
);
livestockRouter.delete(
  '/:livestockId',
  can('livestock:write'),
  route({ params: livestockIdParams }, async ({ deps, actor, params }) => {
    const keys = await deleteLivestock(deps.db, actor, params.tankId, params.livestockId);
    await discardObjects(deps.storage, deps.logger, keys);
    return noContent();
  }),
);

/**
 * `?dryRun=true` answers the compatibility warnings without saving. A real add with warnings
 * the person has not acknowledged is a 409 carrying them, so the form can show why.
 */
async function postOne({ deps, actor, params, query, body }: SignedInContext<typeof addSchemas>) {
  if (query.dryRun) return checkLivestock(deps.db, actor, params.tankId, body);
  const result = await addLivestock(deps.db, actor, params.tankId, body, deps.clock());
  if ('blocked' in result) {
    return withStatus(409, {
      error: {
        code: 'unacknowledged_warnings',
        message: 'This addition has compatibility warnings. Read them and acknowledge them to add it anyway.',
        warnings: result.blocked.warnings,
      },
    });
  }
  return created(result.added);
}
