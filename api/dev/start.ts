import path from 'node:path';
import { loadEnvOrExit } from '../env';
import { withDemoSecrets } from './demo-secrets';
import { loadOrCreateVapidKeys } from '../lib/vapid-keys';
import { connectDatabase } from '../db/client';
import { applyMigrations } from '../db/migrations';
import { seedDemo } from './seed/index';
import { objectStorageFromEnv } from '../lib/object-storage';
import { createLogger } from '../lib/logger';
import { onShutdown, startServer } from '../server';
import { openLocalDatabase } from './local-database';
import { startStandIns } from './stand-ins';

/**
 * `npm start`: the whole demo on one machine — PostgreSQL, the stand-ins for the hosted
 * services, then the app serving the built client. `--dev` adds Vite's dev server.
 */
async function main() {
  const parsedEnv = loadEnvOrExit(await withDemoSecrets());
  // Web push needs VAPID keys (RFC 8292): the demo makes a pair once and keeps it under DATA_DIR.
  const vapid =
    parsedEnv.VAPID_PUBLIC_KEY && parsedEnv.VAPID_PRIVATE_KEY
      ? null
      : await loadOrCreateVapidKeys(path.join(parsedEnv.DATA_DIR, 'vapid'));
  const env = vapid
    ? { ...parsedEnv, VAPID_PUBLIC_KEY: vapid.publicKey, VAPID_PRIVATE_KEY: vapid.privateKey }
    : parsedEnv;
  const logger = createLogger(env.LOG_LEVEL);
  const say = (line: string) => logger.info(line);
  const steps: Array<() => Promise<void>> = [];
  // A second Ctrl-C still stops PostgreSQL, so nothing is left running behind the terminal.
  const urgent = { stop: async () => {} };
  onShutdown(logger, steps, { urgent: () => urgent.stop() });

  const database = await openLocalDatabase(env, say);
  urgent.stop = () => database.stop();
  steps.unshift(() => database.stop());

  const standIns = await startStandIns(env, { mailboxPort: env.MAILBOX_PORT });
  steps.unshift(() => standIns.close());
  // After the stand-ins: the demo's photos are stored in the object-storage stand-in.
  const seeding = connectDatabase(database.url, { max: 1 });
  await applyMigrations(seeding.db);
  const seedStorage = objectStorageFromEnv(env);
  await seedDemo(seeding.db, { issuer: env.OIDC_ISSUER, storage: seedStorage });
  seedStorage.close();
  await seeding.pool.end();
  say(`Identity provider stand-in at ${standIns.idp.issuer}`);
  say(`Object storage stand-in (S3 API) at ${standIns.storage.endpoint}`);
  say(
    `Mail stand-in: SMTP on 127.0.0.1:${standIns.mail.smtpPort}, mailbox at http://127.0.0.1:${standIns.mail.httpPort}`,
  );

  const server = await startServer({ env, databaseUrl: database.url, logger });
  steps.unshift(() => server.close());
  say(`Brinewatch is running at ${server.url}`);

  if (process.argv.includes('--dev')) {
    const { createServer } = await import('vite');
    const vite = await createServer();
    await vite.listen();
    steps.unshift(() => vite.close());
    say(`Vite dev server at http://localhost:${vite.config.server.port}`);
  }
}

await main();
