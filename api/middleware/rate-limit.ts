import type { Request, RequestHandler, Response } from 'express';
import type pg from 'pg';
import { RateLimiterPostgres, RateLimiterRes } from 'rate-limiter-flexible';
import { depsOf } from '../deps';
import type { Env } from '../env';
import { HttpError, unauthorized } from '../lib/http-error';
import { requireActor } from '../policy/index';

export interface RateLimit {
  /** Tells this limit's keys apart from other limits' in the shared table. */
  name: string;
  /** The budget, or how to read it from the environment (where a deployment may set it). */
  points: number | ((env: Env) => number);
  durationS: number;
  /** Whose budget a request spends (a person, a device); throw an HttpError to refuse it. */
  keyOf: (req: Request) => string;
  /** The sentence a refused caller reads, given how many seconds to wait. */
  message: (retryAfterS: number) => string;
  /**
   * `'failures'`: only refused attempts spend the budget (the route reports each one with
   * `countFailure(req)`); once it is spent every request is refused before any check runs, so
   * guessing stops while honest callers, who rarely fail, are never slowed. Default: every request.
   */
  counts?: 'requests' | 'failures';
}

declare module 'express-serve-static-core' {
  interface Request {
    /** Set by failure-counting limits in front of the handler; see `countFailure`. */
    rateLimitFailures?: Array<() => Promise<void>>;
  }
}

/** A budget per signed-in person. */
export const perActor = (req: Request) => requireActor(req.actor).id;

/**
 * A budget per client address. `trust proxy` is loopback only, so behind our own reverse proxy this
 * is the browser's address and a client cannot choose it with X-Forwarded-For.
 */
export const perIp = (req: Request) => req.ip ?? req.socket.remoteAddress ?? 'unknown';

/** Spends one point of every failure-counting limit in front of this request. */
export async function countFailure(req: Request) {
  for (const spend of req.rateLimitFailures ?? []) await spend();
}

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
  const pointsOf = (env: Env) => (typeof limit.points === 'number' ? limit.points : limit.points(env));
  const limiterFor = ({ pool, env }: { pool: pg.Pool; env: Env }) => {
    let limiter = limiters.get(pool);
    if (!limiter) {
      limiter = new RateLimiterPostgres({
        storeClient: pool,
        storeType: 'pool',
        tableName: 'rate_limits',
        tableCreated: true,
        keyPrefix: limit.name,
        points: pointsOf(env),
        duration: limit.durationS,
      });
      limiters.set(pool, limiter);
    }
    return limiter;
  };

  const refuse = (res: Response, msBeforeNext: number) => {
    const retryAfterS = Math.max(1, Math.ceil(msBeforeNext / 1000));
    res.setHeader('Retry-After', String(retryAfterS));
    return new HttpError(429, 'rate_limited', limit.message(retryAfterS));
  };

  if (limit.counts === 'failures') {
    return async (req, res, next) => {
      const key = limit.keyOf(req);
      const deps = depsOf(req);
      const limiter = limiterFor(deps);
      const spent = await limiter.get(key);
      if (spent && spent.consumedPoints >= pointsOf(deps.env)) throw refuse(res, spent.msBeforeNext);
      req.rateLimitFailures = [
        ...(req.rateLimitFailures ?? []),
        async () => void (await limiter.penalty(key, 1)),
      ];
      next();
    };
  }

  return async (req, res, next) => {
    const key = limit.keyOf(req);
    try {
      await limiterFor(depsOf(req)).consume(key);
    } catch (outcome) {
      if (!(outcome instanceof RateLimiterRes)) throw outcome;
      throw refuse(res, outcome.msBeforeNext);
    }
    next();
  };
}
