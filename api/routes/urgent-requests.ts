import { Router, type RequestHandler } from 'express';
import { tankIdParams } from '@shared/schemas/tanks';
import {
  urgentBoardQuery,
  urgentMoveInput,
  urgentRequestIdParams,
  urgentRequestInput,
  urgentRequestsPerTankHour,
  urgentSettingsInput,
} from '@shared/schemas/urgent-requests';
import { depsOf } from '../deps';
import { created, route } from '../lib/route';
import { rateLimit } from '../middleware/rate-limit';
import { can, findTankFor, requireActor } from '../policy/index';
import { auditSourceOf } from '../services/audit';
import {
  createUrgentRequest,
  getUrgentRequest,
  getUrgentSettings,
  moveUrgentRequest,
  saveUrgentSettings,
  tankUrgentRequests,
  urgentBoard,
} from '../services/urgent-requests';

/** Mounted under /tanks/:tankId/urgent-requests. */
export const tankUrgentRequestsRouter = Router({ mergeParams: true });
export const urgentRequestsRouter = Router();
export const urgentSettingsRouter = Router();

/** A burst of requests for one tank is a client in trouble or a stuck form, not more emergencies. */
const limitRequestsPerTank = rateLimit({
  name: 'urgent-request',
  points: urgentRequestsPerTankHour,
  durationS: 3600,
  keyOf: (req) => String(req.params.tankId),
  message: (retryAfterS) =>
    `This tank has had ${urgentRequestsPerTankHour} urgent requests in the past hour. Call us if it cannot wait, or try again in ${Math.ceil(retryAfterS / 60)} minutes.`,
});

/**
 * The per-tank budget is spent only by people who may ask for that tank: the tank is looked up
 * first (404 for anyone else), so a stranger holding its id cannot use the budget up. A malformed
 * id spends nothing; the route reports it with every other issue.
 */
const limitPerVisibleTank: RequestHandler = async (req, res, next) => {
  const params = tankIdParams.safeParse(req.params);
  if (!params.success) return next();
  await findTankFor(depsOf(req).db, requireActor(req.actor), params.data.tankId, 'read');
  return limitRequestsPerTank(req, res, next);
};

tankUrgentRequestsRouter.get(
  '/',
  can('urgent:read'),
  route({ params: tankIdParams }, ({ deps, actor, params }) =>
    tankUrgentRequests(deps.db, actor, params.tankId),
  ),
);
tankUrgentRequestsRouter.post(
  '/',
  can('urgent:request'),
  limitPerVisibleTank,
  route({ params: tankIdParams, body: urgentRequestInput }, async ({ deps, actor, params, body }) =>
    created(await createUrgentRequest(deps, actor, params.tankId, body)),
  ),
);

urgentRequestsRouter.get(
  '/',
  can('urgent:manage'),
  route({ query: urgentBoardQuery }, ({ deps, actor, query }) => urgentBoard(deps.db, actor, query)),
);
urgentRequestsRouter.get(
  '/:requestId',
  can('urgent:read'),
  route({ params: urgentRequestIdParams }, ({ deps, actor, params }) =>
    getUrgentRequest(deps.db, actor, params.requestId),
  ),
);
urgentRequestsRouter.post(
  '/:requestId/moves',
  can('urgent:manage'),
  route({ params: urgentRequestIdParams, body: urgentMoveInput }, ({ deps, actor, params, body }) =>
    moveUrgentRequest(deps, actor, params.requestId, body),
  ),
);

urgentSettingsRouter.get(
  '/',
  can('urgent:read'),
  route({}, ({ deps, actor }) => getUrgentSettings(deps.db, actor)),
);
urgentSettingsRouter.put(
  '/',
  can('urgent:settings'),
  route({ body: urgentSettingsInput }, (ctx) =>
    saveUrgentSettings(ctx.deps.db, ctx.actor, ctx.body, auditSourceOf(ctx)),
  ),
);
