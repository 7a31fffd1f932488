import type { Request, RequestHandler } from 'express';
import type pg from 'pg';
import { RateLimiterPostgres, RateLimiterRes } from 'rate-limiter-flexible';
import { depsOf } from '../deps';
import { HttpError, unauthorized } from '../lib/http-error';
import { requireActor } from '../policy/index';

export interface RateLimit {
  /** Tells this limit's keys apart from other limits' in the shared table. */
  name: string;
  points: number;
  durationS: number;
  /** Whose budget a request spends (a person, a device); throw an HttpError to refuse it. */
  keyOf: (req: Request) => string;
  /** The sentence a refused caller reads, given how many seconds to wait. */
  message: (retryAfterS: number) => string;
}

/** A budget per signed-in person. */
export const perActor = (req: Request) => requireActor(req.actor).id;

/** A budget per device, after `deviceToken` has proved which one is calling. */
export const perDevice = (req: Request) => {
  if (!req.device) throw unauthorized('No device.');
  return req.device.id;
};

/**
 * Every rate limit in the API. Counters live in PostgreSQL (rate-limiter-flexible's
 * RateLimiterPostgres on the app's pool, table `rate_limits` from our migrations), so a limit holds
 * across every API process and survives a restart. Over the limit: 429 `rate_limited` with
 * Retry-After in seconds (RFC 9110 §10.2.3).
 */
export function rateLimit(limit: RateLimit): RequestHandler {
  const limiters = new WeakMap<pg.Pool, RateLimiterPostgres>();
  const limiterFor = (pool: pg.Pool) => {
    let limiter = limiters.get(pool);
    if (!limiter) {
      limiter = new RateLimiterPostgres({
        storeClient: pool,
        storeType: 'pool',
        tableName: 'rate_limits',
        tableCreated: true,
        keyPrefix: limit.name,
        points: limit.points,
        duration: limit.durationS,
      });
      limiters.set(pool, limiter);
    }
    return limiter;
  };

  return async (req, res, next) => {
    const key = limit.keyOf(req);
    try {
      await limiterFor(depsOf(req).pool).consume(key);
    } catch (outcome) {
      if (!(outcome instanceof RateLimiterRes)) throw outcome;
      const retryAfterS = Math.max(1, Math.ceil(outcome.msBeforeNext / 1000));
      res.setHeader('Retry-After', String(retryAfterS));
      throw new HttpError(429, 'rate_limited', limit.message(retryAfterS));
    }
    next();
  };
}
