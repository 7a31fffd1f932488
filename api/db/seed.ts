import { openLocalDatabase } from '../dev/local-database';
import { loadEnvOrExit } from '../env';
import { connectDatabase } from './client';
import { applyMigrations } from './migrations';
import { seedDemo } from './seed/index';

/** `npm run db:seed` (and `npm run db:migrate` with --migrate-only). */
async function main() {
  const env = loadEnvOrExit();
  const local = await openLocalDatabase(env);
  const { db, pool } = connectDatabase(local.url);
  try {
    await applyMigrations(db);
    if (!process.argv.includes('--migrate-only')) {
      await seedDemo(db, { issuer: env.OIDC_ISSUER });
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
