import { Readable, Writable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { eq, sql } from 'drizzle-orm';
import { bench, describe } from 'vitest';
import type { Database } from '../../api/db/client';
import { createReadRouting } from '../../api/db/replica';
import { createLogger } from '../../api/lib/logger';
import { tanks } from '../../api/db/schema/index';
import { exportReadingsCsv } from '../../api/services/readings';
import type { Actor } from '../../api/services/actors';
import { dayMs } from '@shared/parameters/catalogue';
import { createDatabaseFrom } from '../helpers/db';
import { createCompany, createPerson, createTank } from '../helpers/factories';
import { startTestCluster } from '../helpers/global-db';

/*
 * A year of 5-minute device readings of four parameters (420,484 rows) exported as CSV, written to
 * a sink that counts bytes, as a slow download would take it. Target: under 10 s here. Run with
 * `npm run bench`; the cluster is throwaway (fsync off), like the tests'.
 */
const now = new Date('2026-12-01T12:00:00.000Z');
const query = { from: new Date(now.getTime() - 365 * dayMs).toISOString(), to: now.toISOString() };
const parameters = [
  ['temperature', '°C', 25.5, 0.4],
  ['salinity', 'salinity', 35, 0.3],
  ['ph', '', 8.1, 0.15],
  ['orp', 'mV', 320, 30],
] as const;

// Vitest's bench mode runs no beforeAll/afterAll hooks, so the data is set up at module load
// (top-level await) and torn down by the bench's own teardown after the measured run.
const cluster = await startTestCluster();
const database = await createDatabaseFrom(cluster.baseUrl);
/** No replica here: every read is the primary's. */
const reads = createReadRouting(database, { maxLagMs: 0, logger: createLogger('silent') });
const { actor, tankId, rowCount } = await arrange(database.db);

async function arrange(db: Database['db']) {
  const company = await createCompany(db);
  const owner = await createPerson(db, {
    companyId: company.id,
    role: 'owner',
    issuer: 'http://bench.invalid',
  });
  const tank = await createTank(db, { companyId: company.id, owners: [owner] });
  await db.update(tanks).set({ setUpOn: '2024-01-01' }).where(eq(tanks.id, tank.id));
  for (const [parameter, unit, mid, swing] of parameters) {
    await db.execute(sql`
      insert into readings (company_id, tank_id, parameter, value, entered_value, entered_unit, measured_at, source)
      select ${company.id}, ${tank.id}, ${parameter}, v, v, ${unit}, t, 'device'
      from (
        select t, ${mid}::float8 + ${swing}::float8 * sin(extract(epoch from t) / 13751) as v
        from generate_series(${query.from}::timestamptz, ${query.to}::timestamptz, interval '5 minutes') t
      ) s`);
  }
  await db.execute(sql`analyze readings`);
  const rows = await db.execute<{ n: number }>(sql`select count(*)::int as n from readings`);
  const reader: Actor = { ...owner, companyName: company.name };
  return { actor: reader, tankId: tank.id, rowCount: rows.rows[0]!.n };
}

/** One whole export into a byte-counting sink; returns its lines and bytes. */
async function exportOnce() {
  const csv = await exportReadingsCsv(database.db, reads, actor, tankId, query, now);
  let bytes = 0;
  let lines = 0;
  await pipeline(
    Readable.from(csv.lines),
    new Writable({
      write(chunk: Buffer | string, _encoding, done) {
        const text = chunk.toString();
        bytes += Buffer.byteLength(text);
        for (let i = text.indexOf('\n'); i !== -1; i = text.indexOf('\n', i + 1)) lines += 1;
        done();
      },
    }),
  );
  return { bytes, lines };
}

const rssBefore = process.memoryUsage().rss;
let peakRss = rssBefore;
const sampler = setInterval(() => (peakRss = Math.max(peakRss, process.memoryUsage().rss)), 50);
const started = performance.now();
const first = await exportOnce();
const took = performance.now() - started;
clearInterval(sampler);
const rssAfter = process.memoryUsage().rss;
if (first.lines !== rowCount + 1) throw new Error(`expected ${rowCount + 1} lines, got ${first.lines}`);
const mb = (n: number) => (n / 1024 / 1024).toFixed(1);
console.log(
  `readings-export: ${rowCount} rows → ${mb(first.bytes)} MB of CSV in ${(took / 1000).toFixed(2)} s ` +
    `(first, cold call); rss ${mb(rssBefore)} MB before, ${mb(rssAfter)} MB after, ${mb(peakRss)} MB peak`,
);

describe('readings export', () => {
  bench(
    'a year of 5-minute readings of four parameters → CSV',
    async () => {
      await exportOnce();
    },
    {
      iterations: 3,
      warmupIterations: 0,
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
