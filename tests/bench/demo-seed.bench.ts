import { sql } from 'drizzle-orm';
import { bench, describe } from 'vitest';
import { seedDemo } from '../../api/dev/seed/index';
import { createDatabaseFrom } from '../helpers/db';
import { startTestCluster } from '../helpers/global-db';

/*
 * The demo scenario with its year of readings (device readings every 5 minutes on two tanks, home
 * tests and visit readings on all five): how long a first `npm start` spends writing it. The target
 * that used to live in a test ("in seconds") is measured here instead. Run with `npm run bench`.
 */
const cluster = await startTestCluster();
const databases: Array<Awaited<ReturnType<typeof createDatabaseFrom>>> = [];

describe('demo seed', () => {
  bench(
    'the demo scenario on a fresh database',
    async () => {
      const database = await createDatabaseFrom(cluster.baseUrl);
      databases.push(database);
      const started = performance.now();
      await seedDemo(database.db, { issuer: 'http://127.0.0.1:3001', raiseAlerts: false });
      const { rows } = await database.db.execute<{ n: number }>(sql`select count(*)::int as n from readings`);
      console.log(
        `demo-seed: scenario with ${rows[0]!.n} readings in ${Math.round(performance.now() - started)} ms`,
      );
    },
    {
      iterations: 3,
      warmupIterations: 0,
      teardown: (_task, mode) => {
        if (mode !== 'run') return;
        for (const database of databases) void database.pool.end();
        void cluster.stop();
      },
    },
  );
});
