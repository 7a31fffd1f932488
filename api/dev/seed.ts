import path from 'node:path';
import { openLocalDatabase } from './local-database';
import { startObjectStorage } from './object-storage';
import { loadEnvOrExit } from '../env';
import { withDemoSecrets } from './demo-secrets';
import { connectDatabase } from '../db/client';
import { applyMigrations } from '../db/migrations';
import { seedDemo } from './seed/index';
import { objectStorageFromEnv } from '../lib/object-storage';

/** `npm run db:seed` (and `npm run db:migrate` with --migrate-only). */
async function main() {
  const env = loadEnvOrExit(await withDemoSecrets());
  const local = await openLocalDatabase(env);
  const { db, pool } = connectDatabase(local.url);
  try {
    await applyMigrations(db);
    if (!process.argv.includes('--migrate-only')) {
      // The self-contained demo keeps its photos in the object-storage stand-in under DATA_DIR,
      // started here for the seed as the database is; otherwise the configured bucket is used.
      const s3 = new URL(env.S3_ENDPOINT);
      const standIn = env.DATABASE_URL
        ? null
        : await startObjectStorage({
            host: s3.hostname,
            port: Number(s3.port),
            dir: path.join(env.DATA_DIR, 's3'),
            bucket: env.S3_BUCKET,
          });
      const storage = objectStorageFromEnv(env);
      try {
        await seedDemo(db, { issuer: env.OIDC_ISSUER, storage });
      } finally {
        storage.close();
        await standIn?.close();
      }
      console.log('Demo scenario seeded.');
    } else {
      console.log('Migrations applied.');
    }
  } finally {
    await pool.end();
    await local.stop();
  }
}

await main();
