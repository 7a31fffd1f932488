import { readFileSync } from 'node:fs';
import type { Request } from 'express';
import type { PgBoss } from 'pg-boss';
import type pg from 'pg';
import type { Database, Db } from './db/client';
import { createReadRouting, type ReadRouting } from './db/replica';
import { appOrigin, type Env } from './env';
import { systemClock, type Clock } from './lib/clock';
import type { Logger } from './lib/logger';
import { createMailer, type Mailer } from './lib/mailer';
import { objectStorageFromEnv, type ObjectStorage } from './lib/object-storage';
import { createPaymentProvider, type PaymentProvider } from './lib/payments';
import { createOidcClient, type OidcClient } from './lib/oidc-client';
import type { EventListener } from './lib/event-bus';
import { createPushSender, type PushSender } from './lib/web-push-sender';

/** Everything the app needs from outside, passed in so tests can hand over their own. */
export interface AppDeps {
  env: Env;
  db: Db;
  pool: pg.Pool;
  /** Reads that may lag a little (history, charts, exports): the replica when there is a fit one. */
  reads: ReadRouting;
  logger: Logger;
  clock: Clock;
  oidc: OidcClient;
  mailer: Mailer;
  storage: ObjectStorage;
  /** pg-boss; null where nothing runs in the background (API-only tests). */
  jobs: PgBoss | null;
  /** Web push sender; null when no VAPID keys are configured. */
  push: PushSender | null;
  /** The payment provider's SDK; null when online payment is not configured. */
  payments: PaymentProvider | null;
  /** This process's LISTEN connection for live events; null where nothing streams. */
  events: EventListener | null;
  /** Built client to serve; omitted in API-only tests and when Vite serves the client. */
  webDist?: string;
}

export function depsOf(req: Request): AppDeps {
  return req.app.locals.deps as AppDeps;
}

/** The production wiring: clients for the identity provider and mail built from the environment. */
export function createDeps(options: {
  env: Env;
  database: Database;
  logger: Logger;
  clock?: Clock;
  webDist?: string;
  jobs?: PgBoss | null;
  events?: EventListener | null;
}): AppDeps {
  const { env, database, logger, clock = systemClock } = options;
  const origin = appOrigin(env);
  return {
    env,
    db: database.db,
    pool: database.pool,
    reads: createReadRouting(database, {
      replicaUrl: env.DATABASE_REPLICA_URL,
      maxLagMs: env.REPLICA_MAX_LAG_MS,
      logger,
    }),
    logger,
    clock,
    oidc: createOidcClient({
      issuer: env.OIDC_ISSUER,
      clientId: env.OIDC_CLIENT_ID,
      clientSecret: env.OIDC_CLIENT_SECRET,
      redirectUri: `${origin}/auth/callback`,
      postLogoutRedirectUri: `${origin}/`,
      clock,
    }),
    mailer: createMailer({ host: env.SMTP_HOST, port: env.SMTP_PORT, from: env.MAIL_FROM }),
    storage: objectStorageFromEnv(env),
    jobs: options.jobs ?? null,
    events: options.events ?? null,
    push:
      env.VAPID_PUBLIC_KEY && env.VAPID_PRIVATE_KEY
        ? createPushSender({
            vapid: {
              publicKey: env.VAPID_PUBLIC_KEY,
              privateKey: env.VAPID_PRIVATE_KEY,
              subject: env.VAPID_SUBJECT,
            },
            ...(env.PUSH_TRUSTED_CA_FILE
              ? { trustedCaPem: readFileSync(env.PUSH_TRUSTED_CA_FILE, 'utf8') }
              : {}),
          })
        : null,
    payments: createPaymentProvider(env),
    webDist: options.webDist,
  };
}
