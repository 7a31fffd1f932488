import connectPgSimple from 'connect-pg-simple';
import type { RequestHandler } from 'express';
import session, { type Session } from 'express-session';
import type pg from 'pg';
import type { Env } from '../env';

declare module 'express-session' {
  interface SessionData {
    userId: string;
    /** Epoch ms of sign-in and of the last request: the absolute and idle limits start here. */
    signedInAt: number;
    lastSeenAt: number;
    idToken: string;
    noAccess: { email: string | null; name: string | null; reason: string };
  }
}

export const sessionCookieName = (secure: boolean) => (secure ? '__Host-bw_session' : 'bw_session');

export function isHttps(env: Env) {
  return (env.APP_ORIGIN ?? '').startsWith('https://');
}

/** Sessions live in PostgreSQL (connect-pg-simple), so every API process sees the same ones. */
export function createSessionMiddleware(env: Env, pool: pg.Pool): RequestHandler {
  const PgStore = connectPgSimple(session);
  const secure = isHttps(env);
  return session({
    name: sessionCookieName(secure),
    secret: env.SESSION_SECRET.split(','),
    store: new PgStore({
      pool,
      tableName: 'session',
      createTableIfMissing: false,
      pruneSessionInterval: 15 * 60,
      // The cookie's expiry is fixed at sign-in (`rolling: false`), so a touch would rewrite the same
      // expiry in a durable UPDATE on every request. loadActor saves `lastSeenAt` once a minute.
      disableTouch: true,
    }),
    resave: false,
    saveUninitialized: false,
    rolling: false,
    proxy: secure,
    cookie: {
      httpOnly: true,
      sameSite: 'lax',
      secure,
      path: '/',
      maxAge: env.SESSION_ABSOLUTE_DAYS * 24 * 60 * 60 * 1000,
    },
  });
}

function settle(run: (done: (error?: unknown) => void) => void): Promise<void> {
  return new Promise((resolve, reject) => run((error) => (error ? reject(error) : resolve())));
}

/** Writes the session now, so the store holds it before the browser is redirected. */
export const saveSession = (data: Session) => settle((done) => data.save(done));
/** A new id for the same browser: at sign-in, so an id set before sign-in is worth nothing after. */
export const regenerateSession = (data: Session) => settle((done) => data.regenerate(done));
export const destroySession = (data: Session) => settle((done) => data.destroy(done));
