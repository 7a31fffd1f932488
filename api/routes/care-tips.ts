import { Router } from 'express';
import {
  audienceCountInput,
  careTipIdParams,
  careTipInput,
  careTipPatch,
  sendTipInput,
  sendToTankInput,
  tipFeedQuery,
} from '@shared/schemas/care-tips';
import { tankIdParams } from '@shared/schemas/tanks';
import { created, noContent, route } from '../lib/route';
import { can } from '../policy/index';
import {
  audienceCount,
  createTip,
  getTip,
  listTips,
  markHelpful,
  sendTip,
  sendTipToTank,
  tipFeed,
  tipReach,
  tipSuggestions,
  unmarkHelpful,
  updateTip,
  withdrawTip,
} from '../services/care-tips';

export const careTipsRouter = Router();
/** Mounted under /tanks/:tankId/tip-suggestions. */
export const tankTipSuggestionsRouter = Router({ mergeParams: true });

careTipsRouter.get(
  '/',
  can('care-tips:write'),
  route({}, ({ deps, actor }) => listTips(deps.db, actor)),
);
careTipsRouter.post(
  '/',
  can('care-tips:write'),
  route({ body: careTipInput }, async ({ deps, actor, body }) =>
    created(await createTip(deps.db, actor, body)),
  ),
);
// Before "/:tipId", which would read "feed" as an id.
careTipsRouter.get(
  '/feed',
  can('care-tips:read'),
  route({ query: tipFeedQuery }, ({ deps, actor, query }) => tipFeed(deps.db, actor, query)),
);
careTipsRouter.post(
  '/audience-count',
  can('care-tips:write'),
  route({ body: audienceCountInput }, ({ deps, actor, body }) => audienceCount(deps.db, actor, body)),
);
careTipsRouter.get(
  '/:tipId',
  can('care-tips:write'),
  route({ params: careTipIdParams }, ({ deps, actor, params }) => getTip(deps.db, actor, params.tipId)),
);
careTipsRouter.patch(
  '/:tipId',
  can('care-tips:write'),
  route({ params: careTipIdParams, body: careTipPatch }, ({ deps, actor, params, body }) =>
    updateTip(deps.db, actor, params.tipId, body),
  ),
);
careTipsRouter.post(
  '/:tipId/send',
  can('care-tips:write'),
  route({ params: careTipIdParams, body: sendTipInput }, ({ deps, actor, params, body }) =>
    sendTip(deps, actor, params.tipId, body),
  ),
);
careTipsRouter.post(
  '/:tipId/withdraw',
  can('care-tips:write'),
  route({ params: careTipIdParams }, ({ deps, actor, params }) => withdrawTip(deps, actor, params.tipId)),
);
careTipsRouter.get(
  '/:tipId/reach',
  can('care-tips:write'),
  route({ params: careTipIdParams }, ({ deps, actor, params }) => tipReach(deps.db, actor, params.tipId)),
);
careTipsRouter.post(
  '/:tipId/send-to-tank',
  can('care-tips:write'),
  route({ params: careTipIdParams, body: sendToTankInput }, ({ deps, actor, params, body }) =>
    sendTipToTank(deps, actor, params.tipId, body),
  ),
);
careTipsRouter.put(
  '/:tipId/helpful',
  can('care-tips:read'),
  route({ params: careTipIdParams }, async ({ deps, actor, params }) => {
    await markHelpful(deps.db, actor, params.tipId);
    return noContent();
  }),
);
careTipsRouter.delete(
  '/:tipId/helpful',
  can('care-tips:read'),
  route({ params: careTipIdParams }, async ({ deps, actor, params }) => {
    await unmarkHelpful(deps.db, actor, params.tipId);
    return noContent();
  }),
);

tankTipSuggestionsRouter.get(
  '/',
  can('care-tips:write'),
  route({ params: tankIdParams }, ({ deps, actor, params }) => tipSuggestions(deps, actor, params.tankId)),
);
