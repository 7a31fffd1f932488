import { performance } from 'node:perf_hooks';
import { connectDatabase } from '../../../api/db/client';
import { applyMigrations } from '../../../api/db/migrations';
import { assertDurable, startBenchCluster } from '../support/cluster';

/*
 * `npx tsx tests/bench/seed/migrate.ts`: brings a seeded bench cluster to the current schema on
 * its own, timed, with fsync and synchronous_commit on as a production database runs it. The API
 * applies migrations when it starts, but a large move (16 M readings into monthly partitions)
 * outlasts the 180 s the bench waits for the API to answer.
 */
const cluster = await startBenchCluster({ durable: true });
try {
  await assertDurable(cluster.url);
  const { pool, db } = connectDatabase(cluster.url, { max: 2 });
  try {
    const before = await pool.query(`select count(*)::int as n from drizzle.__drizzle_migrations`);
    const started = performance.now();
    await applyMigrations(db);
    const seconds = (performance.now() - started) / 1000;
    const after = await pool.query(`select count(*)::int as n from drizzle.__drizzle_migrations`);
    const readings = await pool.query(`select count(*)::bigint as n from readings`);
    console.log(
      `migrations ${before.rows[0].n} → ${after.rows[0].n} applied in ${(seconds / 60).toFixed(1)} min (${seconds.toFixed(0)} s); readings: ${readings.rows[0].n}`,
    );
  } finally {
    await pool.end();
  }
} finally {
  await cluster.stop();
}
