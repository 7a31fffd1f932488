import type { RequestHandler } from 'express';
import { depsOf } from '../deps';
import { findActiveActor, type Actor } from '../services/actors';
import { destroySession } from './session';

declare module 'express-serve-static-core' {
  interface Request {
    actor?: Actor | null;
  }
}

const touchEveryMs = 60_000;

/**
 * Who is asking, read from the database on every request (a role change or deactivation
 * applies at once), with the idle and absolute session limits enforced here on the server.
 */
export const loadActor: RequestHandler = async (req, _res, next) => {
  req.actor = null;
  const data = req.session;
  if (!data?.userId) return next();
  const { env, db, clock } = depsOf(req);
  const now = clock().getTime();
  const idleMs = env.SESSION_IDLE_MINUTES * 60_000;
  const absoluteMs = env.SESSION_ABSOLUTE_DAYS * 24 * 60 * 60_000;
  const expired = now - (data.signedInAt ?? 0) > absoluteMs || now - (data.lastSeenAt ?? 0) > idleMs;
  const actor = expired ? null : await findActiveActor(db, data.userId);
  if (!actor) {
    await destroySession(req.session);
    return next();
  }
  if (now - (data.lastSeenAt ?? 0) > touchEveryMs) data.lastSeenAt = now;
  req.actor = actor;
  next();
};
