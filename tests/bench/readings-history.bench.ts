import { eq, sql } from 'drizzle-orm';
import { bench, describe } from 'vitest';
import type { Database } from '../../api/db/client';
import { createReadRouting } from '../../api/db/replica';
import { createLogger } from '../../api/lib/logger';
import { tanks } from '../../api/db/schema/index';
import { readingHistory } from '../../api/services/history';
import type { Actor } from '../../api/services/actors';
import { dayMs } from '@shared/parameters/catalogue';
import { createDatabaseFrom } from '../helpers/db';
import { createCompany, createPerson, createTank } from '../helpers/factories';
import { startTestCluster } from '../helpers/global-db';

/*
 * One year of 5-minute readings of one parameter (105,121 rows) read back for a chart as at most
 * 500 buckets. Run with `npm run bench`; the cluster is throwaway (fsync off), like the tests'.
 */
const now = new Date('2026-12-01T12:00:00.000Z');
const query = {
  parameter: 'temperature' as const,
  from: new Date(now.getTime() - 365 * dayMs).toISOString(),
  to: now.toISOString(),
  points: 500,
};

// Vitest's bench mode runs no beforeAll/afterAll hooks, so the data is set up at module load
// (top-level await) and torn down by the bench's own teardown after the measured run.
const cluster = await startTestCluster();
const database = await createDatabaseFrom(cluster.baseUrl);
/** No replica here: every read is the primary's. */
const reads = createReadRouting(database, { maxLagMs: 0, logger: createLogger('silent') });
const { actor, tankId } = await arrange(database.db);

async function arrange(db: Database['db']): Promise<{ actor: Actor; tankId: string }> {
  const company = await createCompany(db);
  const owner = await createPerson(db, {
    companyId: company.id,
    role: 'owner',
    issuer: 'http://bench.invalid',
  });
  const tank = await createTank(db, { companyId: company.id, owners: [owner] });
  await db.update(tanks).set({ setUpOn: '2024-01-01' }).where(eq(tanks.id, tank.id));
  const reader: Actor = { ...owner, companyName: company.name };
  const started = performance.now();
  await db.execute(sql`
    insert into readings (company_id, tank_id, parameter, value, entered_value, entered_unit, measured_at, source)
    select ${company.id}, ${tank.id}, 'temperature', v, v, '°C', t, 'device'
    from (
      select t, 25.5 + 0.4 * sin(extract(epoch from t) / 13751) + random() * 0.1 as v
      from generate_series(${query.from}::timestamptz, ${query.to}::timestamptz, interval '5 minutes') t
    ) s`);
  await db.execute(sql`analyze readings`);
  const rows = await db.execute<{ n: number }>(sql`select count(*)::int as n from readings`);
  const first = performance.now();
  const history = await readingHistory(db, reads, reader, tank.id, query);
  const took = performance.now() - first;
  if (history.mode !== 'buckets' || history.buckets.length > 500 || history.total !== rows.rows[0]!.n) {
    throw new Error(
      `expected ≤ 500 buckets over every reading, got ${history.buckets.length} (${history.mode})`,
    );
  }
  console.log(
    `readings-history: ${rows.rows[0]!.n} rows written in ${Math.round(first - started)} ms; one year → ` +
      `${history.buckets.length} buckets of ${history.bucketMs! / 3_600_000} h in ${took.toFixed(1)} ms (first, cold call)`,
  );
  return { actor: reader, tankId: tank.id };
}

describe('readings history', () => {
  bench(
    'one year of 5-minute readings → ≤ 500 buckets',
    async () => {
      await readingHistory(database.db, reads, actor, tankId, query);
    },
    {
      iterations: 30,
      warmupIterations: 3,
      // Tinybench does not await teardown, so the cluster is stopped first: its pg_ctl stop runs
      // synchronously, before the bench process can exit. The database goes with the cluster.
      teardown: (_task, mode) => {
        if (mode !== 'run') return;
        void database.pool.end();
        void cluster.stop();
      },
    },
  );
});
