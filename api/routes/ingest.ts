import { Router, type Request, type Response } from 'express';
import { deviceIngestEnvelope, maxDeviceBatch } from '@shared/schemas/readings';
import { depsOf } from '../deps';
import { HttpError } from '../lib/http-error';
import { deviceToken, limitIngestRate } from '../middleware/device-token';
import { parsed, validate } from '../middleware/validate';
import { raiseAlertsFor } from '../services/alerts';
import { ingestReadings } from '../services/ingest';

/**
 * Device ingest, mounted at /api/ingest before the session middleware: a device proves itself
 * with its bearer token only, so there is no cookie to read and no cross-site form to guard.
 */
export const ingestRouter = Router();

ingestRouter.post(
  '/readings',
  deviceToken,
  limitIngestRate,
  validate({ body: deviceIngestEnvelope }),
  postReadings,
);

async function postReadings(req: Request, res: Response) {
  const deps = depsOf(req);
  const { readings } = parsed(res, 'body', deviceIngestEnvelope);
  if (readings.length > maxDeviceBatch) {
    throw new HttpError(413, 'batch_too_large', `Send at most ${maxDeviceBatch} readings per request.`);
  }
  const { summary, inserted } = await ingestReadings(deps.db, req.device!, readings, deps.clock());
  await raiseAlertsFor(deps, req.device!.tankId, inserted);
  res.json(summary);
}
