import { execFileSync } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { TestProject } from 'vitest/node';
import webpush from 'web-push';
import { connectDatabase } from '../../api/db/client';
import { seedDemo } from '../../api/dev/seed/index';
import { startPushService, type StandInSubscription } from '../../api/dev/push-service';
import { objectStorageFromEnv } from '../../api/lib/object-storage';
import { startStandIns } from '../../api/dev/stand-ins';
import { parseEnv } from '../../api/env';
import { createLogger } from '../../api/lib/logger';
import { startServer, webDist } from '../../api/server';
import { testSecrets } from './app';
import { ensureChromium } from './chromium';
import { createDatabaseFrom } from './db';
import { freePort } from './free-port';
import { startTestCluster } from './global-db';
import { testPaymentKeys } from './stack';

declare module 'vitest' {
  export interface ProvidedContext {
    appUrl: string;
    mailboxUrl: string;
    /**
     * The push stand-in the app's sender trusts, with one subscription made for a test to register
     * for someone (POST /api/push/subscriptions) and then read at `${origin}/api/received`.
     */
    pushStandIn: { origin: string; caCertPem: string; subscription: StandInSubscription };
    /**
     * The payment stand-in (STRIPE_API_URL): its payment pages are at `${url}/pay/…`, the event log at
     * `${url}/_stand-in/events`; the secret key authorizes its POST controls (api/dev/payment-provider.ts).
     */
    paymentsStandIn: { url: string; secretKey: string; webhookSecret: string };
  }
}

/**
 * The whole product for the browser tests, as `npm start` runs it but on free ports: a fresh
 * seeded database, the identity provider and mail stand-ins, the app and its built client.
 */
export default async function setup(project: TestProject) {
  ensureChromium();
  if (!existsSync(path.join(webDist, 'index.html'))) {
    execFileSync('npx', ['vite', 'build', '--logLevel', 'warn'], { stdio: 'inherit' });
  }
  const cluster = await startTestCluster();
  const database = await createDatabaseFrom(cluster.baseUrl);
  const [port, idpPort, smtpPort, mailboxPort, s3Port, paymentsPort] = (await Promise.all(
    Array.from({ length: 6 }, () => freePort()),
  )) as [number, number, number, number, number, number];
  const dataDir = mkdtempSync(path.join(os.tmpdir(), 'brinewatch-e2e-'));
  const vapid = webpush.generateVAPIDKeys();
  const push = await startPushService({ port: 0, dir: path.join(dataDir, 'push') });
  const pushCaFile = path.join(dataDir, 'push-ca.pem');
  writeFileSync(pushCaFile, push.caCertPem);
  const pushSubscription = await push.createSubscription({ applicationServerKey: vapid.publicKey });
  const env = parseEnv({
    NODE_ENV: 'test',
    LOG_LEVEL: 'silent',
    PORT: String(port),
    DATABASE_URL: database.url,
    OIDC_ISSUER: `http://127.0.0.1:${idpPort}`,
    SMTP_PORT: String(smtpPort),
    S3_ENDPOINT: `http://127.0.0.1:${s3Port}`,
    DATA_DIR: dataDir,
    // Every browser here signs in from 127.0.0.1; the per-address limit is tested in tests/api.
    SIGN_IN_STARTS_PER_10_MIN: '10000',
    ...testSecrets,
    VAPID_PUBLIC_KEY: vapid.publicKey,
    VAPID_PRIVATE_KEY: vapid.privateKey,
    PUSH_TRUSTED_CA_FILE: pushCaFile,
    ...testPaymentKeys,
    STRIPE_API_URL: `http://127.0.0.1:${paymentsPort}`,
  });
  const standIns = await startStandIns(env, { mailboxPort });
  const seeding = connectDatabase(database.url, { max: 1 });
  const seedStorage = objectStorageFromEnv(env);
  await seedDemo(seeding.db, { issuer: env.OIDC_ISSUER, storage: seedStorage, raiseAlerts: false });
  seedStorage.close();
  await seeding.pool.end();
  // The browser tests check exact boards and notification lists, so the 07:00 overdue-test sweep
  // must not open notices in whichever run crosses that hour.
  const server = await startServer({
    env,
    databaseUrl: database.url,
    logger: createLogger('silent'),
    dailySweeps: false,
  });
  project.provide('appUrl', server.url);
  project.provide('mailboxUrl', `http://127.0.0.1:${mailboxPort}`);
  project.provide('pushStandIn', {
    origin: push.origin,
    caCertPem: push.caCertPem,
    subscription: pushSubscription,
  });
  project.provide('paymentsStandIn', {
    url: standIns.payments!.url,
    secretKey: testPaymentKeys.STRIPE_SECRET_KEY,
    webhookSecret: testPaymentKeys.STRIPE_WEBHOOK_SECRET,
  });
  project.provide('postgresBaseUrl', cluster.baseUrl);
  return async () => {
    await server.close();
    await standIns.close();
    await push.close();
    await database.drop();
    await cluster.stop();
    rmSync(dataDir, { recursive: true, force: true });
  };
}
