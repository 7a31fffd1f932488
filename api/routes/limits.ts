import { Router } from 'express';
import { updateLimitsInput } from '@shared/schemas/limits';
import { tankIdParams } from '@shared/schemas/tanks';
import { route } from '../lib/route';
import { can } from '../policy/index';
import { auditSourceOf } from '../services/audit';
import { getLimits, updateLimits } from '../services/limits';

/** Mounted at /api/tanks/:tankId/limits. */
export const limitsRouter = Router({ mergeParams: true });

limitsRouter.get(
  '/',
  can('limits:read'),
  route({ params: tankIdParams }, ({ deps, actor, params }) => getLimits(deps.db, actor, params.tankId)),
);
limitsRouter.put(
  '/',
  can('limits:write'),
  route({ params: tankIdParams, body: updateLimitsInput }, (ctx) =>
    updateLimits(ctx.deps, ctx.actor, ctx.params.tankId, ctx.body, auditSourceOf(ctx)),
  ),
);
