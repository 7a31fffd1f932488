import { Router } from 'express';
import { tankIdParams } from '@shared/schemas/tanks';
import { timelineQuery } from '@shared/schemas/timeline';
import { route } from '../lib/route';
import { can } from '../policy/index';
import { tankTimeline } from '../services/timeline';

/** Mounted under /tanks/:tankId/timeline. */
export const timelineRouter = Router({ mergeParams: true });

timelineRouter.get(
  '/',
  can('tanks:read'),
  route({ params: tankIdParams, query: timelineQuery }, ({ deps, actor, params, query }) =>
    tankTimeline(deps.db, actor, params.tankId, query),
  ),
);
