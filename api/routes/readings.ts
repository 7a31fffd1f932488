import { Router, type Request, type Response } from 'express';
import {
  createReadingsInput,
  importReadingsInput,
  readingExportQuery,
  readingHistoryQuery,
  readingListQuery,
  type Reading,
} from '@shared/schemas/readings';
import { tankIdParams } from '@shared/schemas/tanks';
import { depsOf } from '../deps';
import { parsed, validate } from '../middleware/validate';
import { can, requireActor } from '../policy/index';
import { raiseAlertsFor } from '../services/alerts';
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
  validate({ params: tankIdParams, query: readingHistoryQuery }),
  getHistory,
);
readingsRouter.post(
  '/',
  can('readings:write'),
  validate({ params: tankIdParams, body: createReadingsInput }),
  postReadings,
);
readingsRouter.get('/latest', can('readings:read'), validate({ params: tankIdParams }), getLatest);
readingsRouter.get(
  '/list',
  can('readings:read'),
  validate({ params: tankIdParams, query: readingListQuery }),
  getList,
);
readingsRouter.get(
  '/export',
  can('readings:read'),
  validate({ params: tankIdParams, query: readingExportQuery }),
  getExport,
);
readingsRouter.post(
  '/import',
  can('readings:write'),
  validate({ params: tankIdParams, body: importReadingsInput }),
  postImport,
);

async function getHistory(req: Request, res: Response) {
  const { tankId } = parsed(res, 'params', tankIdParams);
  const query = parsed(res, 'query', readingHistoryQuery);
  res.json(await readingHistory(depsOf(req).db, requireActor(req.actor), tankId, query));
}

async function postReadings(req: Request, res: Response) {
  const deps = depsOf(req);
  const { tankId } = parsed(res, 'params', tankIdParams);
  const input = parsed(res, 'body', createReadingsInput);
  const saved = await recordReadings(deps.db, requireActor(req.actor), tankId, input, deps.clock());
  await raiseAlertsFor(deps, tankId, saved.map(asNewReading));
  res.status(201).json({ readings: saved });
}

const asNewReading = (reading: Reading) => ({
  parameter: reading.parameter,
  value: reading.value,
  measuredAt: new Date(reading.measuredAt),
  source: reading.source,
});

async function getLatest(req: Request, res: Response) {
  const { db, clock } = depsOf(req);
  const { tankId } = parsed(res, 'params', tankIdParams);
  res.json(await latestReadings(db, requireActor(req.actor), tankId, clock()));
}

async function getList(req: Request, res: Response) {
  const { tankId } = parsed(res, 'params', tankIdParams);
  const query = parsed(res, 'query', readingListQuery);
  res.json(await listReadings(depsOf(req).db, requireActor(req.actor), tankId, query));
}

async function getExport(req: Request, res: Response) {
  const { tankId } = parsed(res, 'params', tankIdParams);
  const query = parsed(res, 'query', readingExportQuery);
  await exportReadingsCsv(depsOf(req).db, requireActor(req.actor), tankId, query, res);
}

async function postImport(req: Request, res: Response) {
  const deps = depsOf(req);
  const { tankId } = parsed(res, 'params', tankIdParams);
  const input = parsed(res, 'body', importReadingsInput);
  const saved = await importReadings(deps.db, requireActor(req.actor), tankId, input, deps.clock());
  await raiseAlertsFor(deps, tankId, saved.map(asNewReading));
  res.status(201).json({ imported: saved.length });
}
