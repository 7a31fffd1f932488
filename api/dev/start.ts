import path from 'node:path';
import { loadEnvOrExit } from '../env';
import { withDemoSecrets } from './demo-secrets';
import { loadOrCreateVapidKeys } from '../lib/vapid-keys';
import { createLogger } from '../lib/logger';
import { ensureClientBuild } from './client-build';
import { openLocalDatabase, type LocalDatabase } from './local-database';
import type { StandIns } from './stand-ins';
import type { RunningServer } from '../server';

/**
 * `npm start`: the whole demo on one machine — PostgreSQL, the stand-ins for the hosted
 * services, then the app serving the built client (built first when its sources changed).
 * `--dev` adds Vite's dev server instead.
 *
 * A second start should be ready within seconds, so what can overlap does: PostgreSQL starts in
 * its own process, and a client build in its own, while this one loads the app's modules (the
 * larger part of a start; hence the imports below the first steps) and starts the stand-ins.
 */
async function main() {
  const dev = process.argv.includes('--dev');
  const parsedEnv = loadEnvOrExit(await withDemoSecrets());
  // Web push needs VAPID keys (RFC 8292): the demo makes a pair once and keeps it under DATA_DIR.
  const vapid =
    parsedEnv.VAPID_PUBLIC_KEY && parsedEnv.VAPID_PRIVATE_KEY
      ? null
      : await loadOrCreateVapidKeys(path.join(parsedEnv.DATA_DIR, 'vapid'));
  const withVapid = vapid
    ? { ...parsedEnv, VAPID_PUBLIC_KEY: vapid.publicKey, VAPID_PRIVATE_KEY: vapid.privateKey }
    : parsedEnv;
  // Online payment goes to the local payment stand-in unless told otherwise (never in production).
  const env =
    withVapid.STRIPE_API_URL || withVapid.NODE_ENV === 'production'
      ? withVapid
      : { ...withVapid, STRIPE_API_URL: `http://127.0.0.1:${withVapid.PAYMENTS_PORT}` };
  const logger = createLogger(env.LOG_LEVEL);
  const say = (line: string) => logger.info(line);
  const took = (step: string) =>
    logger.debug({ step, atMs: Math.round(process.uptime() * 1000) }, 'start step');

  const running: {
    database?: LocalDatabase;
    standIns?: StandIns;
    server?: RunningServer;
    vite?: { close(): Promise<void> };
  } = {};
  const databaseStarting = openLocalDatabase(env, say).then((database) => {
    took('postgres');
    return (running.database = database);
  });
  const clientBuilding = dev ? Promise.resolve(null) : ensureClientBuild({ log: say });
  const standInsStarting = import('./stand-ins').then(async ({ startStandIns }) => {
    running.standIns = await startStandIns(env, { mailboxPort: env.MAILBOX_PORT });
    took('stand-ins');
    return running.standIns;
  });
  // Awaited below; marked handled so a failure while the modules load ends the start with its own error.
  for (const step of [databaseStarting, clientBuilding, standInsStarting]) step.catch(() => {});

  const [
    { onShutdown, startServer },
    { connectDatabase },
    { applyMigrations },
    { seedDemoOnce },
    { objectStorageFromEnv },
  ] = await Promise.all([
    import('../server'),
    import('../db/client'),
    import('../db/migrations'),
    import('./seed-once'),
    import('../lib/object-storage'),
  ]);
  took('imports');
  // In this order; a second Ctrl-C still stops PostgreSQL, so nothing is left running behind the terminal.
  onShutdown(
    logger,
    [
      async () => running.vite?.close(),
      async () => running.server?.close(),
      async () => running.standIns?.close(),
      async () => running.database?.stop(),
    ],
    { urgent: async () => running.database?.stop() },
  );

  const [database, standIns] = await Promise.all([databaseStarting, standInsStarting]);
  // After the stand-ins: the demo's photos are stored in the object-storage stand-in.
  const seeding = connectDatabase(database.url, { max: 1 });
  await applyMigrations(seeding.db);
  took('migrations');
  const seedStorage = objectStorageFromEnv(env);
  const seeded = await seedDemoOnce(seeding.db, {
    issuer: env.OIDC_ISSUER,
    storage: seedStorage,
    storageTarget: `${env.S3_ENDPOINT}/${env.S3_BUCKET}`,
  });
  seedStorage.close();
  await seeding.pool.end();
  took('seed');
  say(seeded === 'seeded' ? 'Demo scenario written' : 'Demo scenario already written today: left as it is');
  say(`Identity provider stand-in at ${standIns.idp.issuer}`);
  say(`Object storage stand-in (S3 API) at ${standIns.storage.endpoint}`);
  say(
    `Mail stand-in: SMTP on 127.0.0.1:${standIns.mail.smtpPort}, mailbox at http://127.0.0.1:${standIns.mail.httpPort}`,
  );
  if (standIns.payments) {
    say(`Payment provider stand-in (test cards, e.g. 4242 4242 4242 4242) at ${standIns.payments.url}`);
  }

  const client = await clientBuilding;
  if (client) say(client === 'built' ? 'Client built into dist/web' : 'Client in dist/web is up to date');
  took('client');

  running.server = await startServer({ env, databaseUrl: database.url, logger });
  took('server');
  say(`Brinewatch is running at ${running.server.url}`);

  if (dev) {
    const { createServer } = await import('vite');
    const vite = await createServer();
    await vite.listen();
    running.vite = vite;
    say(`Vite dev server at http://localhost:${vite.config.server.port}`);
  }
}

await main();
