import type { RequestHandler } from 'express';
import type pg from 'pg';
import { RateLimiterPostgres, RateLimiterRes } from 'rate-limiter-flexible';
import { depsOf } from '../deps';
import { HttpError } from '../lib/http-error';
import { devicePolicy } from '../policy/index';
import { findDeviceByToken, type DeviceIdentity } from '../services/devices';

declare module 'express-serve-static-core' {
  interface Request {
    device?: DeviceIdentity;
  }
}

const bearer = /^Bearer ([A-Za-z0-9_-]{20,200})$/;

function refused(message: string) {
  return new HttpError(401, 'invalid_device_token', message);
}

/**
 * The device is whoever its bearer token says, and nothing else: no session, no cookie, no device
 * id in the body. A missing, unknown or revoked token answers 401 in the same words.
 */
export const deviceToken: RequestHandler = devicePolicy(async (req, res, next) => {
  res.setHeader('WWW-Authenticate', 'Bearer realm="brinewatch-ingest"');
  const match = bearer.exec(req.headers.authorization ?? '');
  if (!match) return next(refused('Send the device token as "Authorization: Bearer <token>".'));
  const device = await findDeviceByToken(depsOf(req).db, match[1]!);
  if (!device) return next(refused('This device token is not valid or has been revoked.'));
  res.removeHeader('WWW-Authenticate');
  req.device = device;
  next();
});

/**
 * Per device, shared by every API process through PostgreSQL (RateLimiterPostgres on the app's
 * pool; its table comes from a migration). A device normally posts every few minutes; 20 requests
 * a minute lets one catch up after an outage in 1000-reading batches.
 */
export const ingestRateLimit = { points: 20, durationS: 60 } as const;

const limiters = new WeakMap<pg.Pool, RateLimiterPostgres>();

function limiterFor(pool: pg.Pool): RateLimiterPostgres {
  let limiter = limiters.get(pool);
  if (!limiter) {
    limiter = new RateLimiterPostgres({
      storeClient: pool,
      storeType: 'pool',
      tableName: 'device_rate_limits',
      tableCreated: true,
      keyPrefix: 'ingest',
      points: ingestRateLimit.points,
      duration: ingestRateLimit.durationS,
    });
    limiters.set(pool, limiter);
  }
  return limiter;
}

export const limitIngestRate: RequestHandler = async (req, res, next) => {
  const device = req.device;
  if (!device) return next(refused('No device.'));
  try {
    await limiterFor(depsOf(req).pool).consume(device.id);
  } catch (outcome) {
    if (!(outcome instanceof RateLimiterRes)) throw outcome;
    const retryAfterS = Math.max(1, Math.ceil(outcome.msBeforeNext / 1000));
    res.setHeader('Retry-After', String(retryAfterS));
    return next(
      new HttpError(
        429,
        'rate_limited',
        `This device has sent more than ${ingestRateLimit.points} requests in ${ingestRateLimit.durationS} s. Try again in ${retryAfterS} s.`,
      ),
    );
  }
  next();
};
