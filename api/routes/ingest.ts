import { Router } from 'express';
import { deviceIngestEnvelope } from '@shared/schemas/readings';
import { deviceRoute } from '../lib/route';
import { deviceToken } from '../middleware/device-token';
import { perDevice, perIp, rateLimit } from '../middleware/rate-limit';
import { ingestReadings } from '../services/ingest';

/**
 * Device ingest, mounted at /api/ingest before the session middleware: a device proves itself
 * with its bearer token only, so there is no cookie to read and no cross-site form to guard.
 */
export const ingestRouter = Router();

/**
 * Per device. A device normally posts every few minutes; 20 requests a minute lets one catch up
 * after an outage in 1000-reading batches.
 */
export const ingestRateLimit = { points: 20, durationS: 60 } as const;

const limitIngestRate = rateLimit({
  name: 'ingest',
  ...ingestRateLimit,
  keyOf: perDevice,
  message: (retryAfterS) =>
    `This device has sent more than ${ingestRateLimit.points} requests in ${ingestRateLimit.durationS} s. Try again in ${retryAfterS} s.`,
});

/**
 * Per client address, counting refused tokens only: a device with a typo'd token retrying every
 * few minutes stays well inside it, while guessing stops after a few tries (common practice).
 */
export const deviceTokenFailureLimit = { points: 20, durationS: 10 * 60 } as const;

const limitDeviceTokenFailures = rateLimit({
  name: 'device-token-failures',
  ...deviceTokenFailureLimit,
  counts: 'failures',
  keyOf: perIp,
  message: (retryAfterS) =>
    `Too many refused device tokens from this address. Try again in ${retryAfterS} s.`,
});

ingestRouter.post(
  '/readings',
  limitDeviceTokenFailures,
  deviceToken,
  limitIngestRate,
  deviceRoute({ body: deviceIngestEnvelope }, ({ deps, device, body }) =>
    ingestReadings(deps, device, body.readings),
  ),
);
