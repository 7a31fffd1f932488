import { Router } from 'express';
import { z } from 'zod';
import { tankIdParams } from '@shared/schemas/tanks';
import {
  publishReportInput,
  saveReportInput,
  scheduleQuery,
  scheduleVisitInput,
  updateVisitInput,
  visitIdParams,
} from '@shared/schemas/visits';
import { created, route } from '../lib/route';
import { can } from '../policy/index';
import {
  getVisit,
  getVisitVersion,
  listSchedule,
  publishReport,
  saveReport,
  scheduleVisit,
  tankVisits,
  updateVisit,
} from '../services/visits';

export const visitsRouter = Router();
/** Mounted under /tanks/:tankId/visits. */
export const tankVisitsRouter = Router({ mergeParams: true });

const versionParams = visitIdParams.extend({ version: z.coerce.number().int().min(0).max(1_000_000) });

visitsRouter.get(
  '/',
  can('visits:write'),
  route({ query: scheduleQuery }, ({ deps, actor, query }) => listSchedule(deps, actor, query)),
);
visitsRouter.post(
  '/',
  can('visits:write'),
  route({ body: scheduleVisitInput }, async ({ deps, actor, body }) =>
    created(await scheduleVisit(deps, actor, body)),
  ),
);
visitsRouter.get(
  '/:visitId',
  can('visits:read'),
  route({ params: visitIdParams }, ({ deps, actor, params }) => getVisit(deps.db, actor, params.visitId)),
);
visitsRouter.patch(
  '/:visitId',
  can('visits:write'),
  route({ params: visitIdParams, body: updateVisitInput }, ({ deps, actor, params, body }) =>
    updateVisit(deps, actor, params.visitId, body),
  ),
);
visitsRouter.put(
  '/:visitId/report',
  can('visits:write'),
  route({ params: visitIdParams, body: saveReportInput }, ({ deps, actor, params, body }) =>
    saveReport(deps, actor, params.visitId, body),
  ),
);
visitsRouter.post(
  '/:visitId/publish',
  can('visits:write'),
  route({ params: visitIdParams, body: publishReportInput }, ({ deps, actor, params, body }) =>
    publishReport(deps, actor, params.visitId, body),
  ),
);
visitsRouter.get(
  '/:visitId/versions/:version',
  can('visits:read'),
  route({ params: versionParams }, ({ deps, actor, params }) =>
    getVisitVersion(deps.db, actor, params.visitId, params.version),
  ),
);

tankVisitsRouter.get(
  '/',
  can('visits:read'),
  route({ params: tankIdParams }, ({ deps, actor, params }) => tankVisits(deps, actor, params.tankId)),
);
