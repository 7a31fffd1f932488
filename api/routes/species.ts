import { Router } from 'express';
import { speciesIdParams, speciesQuery } from '@shared/schemas/livestock';
import { speciesInput } from '@shared/schemas/species';
import { created, route } from '../lib/route';
import { can } from '../policy/index';
import { createCompanySpecies, getSpecies, searchSpecies } from '../services/species';

export const speciesRouter = Router();

speciesRouter.get(
  '/',
  can('species:read'),
  route({ query: speciesQuery }, ({ deps, actor, query }) => searchSpecies(deps.db, actor, query)),
);
speciesRouter.post(
  '/',
  can('species:write'),
  route({ body: speciesInput }, async ({ deps, actor, body }) =>
    created(await createCompanySpecies(deps.db, actor, body)),
  ),
);
speciesRouter.get(
  '/:speciesId',
  can('species:read'),
  route({ params: speciesIdParams }, ({ deps, actor, params }) =>
    getSpecies(deps.db, actor, params.speciesId),
  ),
);
