import { Router } from 'express';
import {
  createReadingsInput,
  importReadingsInput,
  readingExportQuery,
  readingHistoryQuery,
  readingListQuery,
} from '@shared/schemas/readings';
import { tankIdParams } from '@shared/schemas/tanks';
import { created, route, streamed } from '../lib/route';
import { can } from '../policy/index';
import { auditSourceOf, recordReadingsExport } from '../services/audit';
import { readingHistory } from '../services/history';
import {
  exportReadingsCsv,
  importReadings,
  latestReadings,
  listReadings,
  recordReadings,
} from '../services/readings';

/** Mounted at /api/tanks/:tankId/readings. */
export const readingsRouter = Router({ mergeParams: true });

readingsRouter.get(
  '/',
  can('readings:read'),
  route({ params: tankIdParams, query: readingHistoryQuery }, ({ deps, actor, params, query }) =>
    readingHistory(deps.db, deps.reads, actor, params.tankId, query),
  ),
);
readingsRouter.post(
  '/',
  can('readings:write'),
  route({ params: tankIdParams, body: createReadingsInput }, async ({ deps, actor, params, body }) =>
    created({ readings: await recordReadings(deps, actor, params.tankId, body) }),
  ),
);
readingsRouter.get(
  '/latest',
  can('readings:read'),
  route({ params: tankIdParams }, ({ deps, actor, params }) =>
    latestReadings(deps.db, actor, params.tankId, deps.clock()),
  ),
);
readingsRouter.get(
  '/list',
  can('readings:read'),
  route({ params: tankIdParams, query: readingListQuery }, ({ deps, actor, params, query }) =>
    listReadings(deps.db, deps.reads, actor, params.tankId, query),
  ),
);
readingsRouter.get(
  '/export',
  can('readings:read'),
  route({ params: tankIdParams, query: readingExportQuery }, async (ctx) => {
    const { deps, actor, params, query } = ctx;
    const csv = await exportReadingsCsv(deps.db, deps.reads, actor, params.tankId, query, deps.clock());
    await recordReadingsExport(deps.db, actor, params.tankId, query, auditSourceOf(ctx));
    return streamed(
      {
        'Content-Type': 'text/csv; charset=utf-8',
        'Content-Disposition': `attachment; filename="${csv.fileName}"`,
      },
      csv.lines,
    );
  }),
);
readingsRouter.post(
  '/import',
  can('readings:write'),
  route({ params: tankIdParams, body: importReadingsInput }, async ({ deps, actor, params, body }) =>
    created({ imported: (await importReadings(deps, actor, params.tankId, body)).length }),
  ),
);
