import { execFileSync } from 'node:child_process';
import path from 'node:path';
import pg from 'pg';
import { startPostgres } from '../../../api/dev/postgres';
import { freePort } from '../../helpers/free-port';

/**
 * The bench cluster is kept between runs (seeding takes minutes), in `.data/bench` unless
 * BENCH_DATA_DIR names another folder. It is seeded with fsync off and measured with it on.
 */
export const benchDataDir = path.resolve(process.env.BENCH_DATA_DIR ?? '.data/bench');
export const benchDatabase = 'brinewatch_bench';

export interface BenchCluster {
  /** The bench database. */
  url: string;
  /** Server URL without a database name. */
  baseUrl: string;
  durable: boolean;
  stop(): Promise<void>;
}

export async function startBenchCluster(options: { durable: boolean }): Promise<BenchCluster> {
  if (process.env.DATABASE_URL) {
    throw new Error('Benches start their own PostgreSQL in BENCH_DATA_DIR; unset DATABASE_URL.');
  }
  const postgres = await startPostgres({
    dir: benchDataDir,
    port: await freePort(),
    database: benchDatabase,
    durable: options.durable,
    log: (line) => console.log(`bench postgres: ${line}`),
  });
  const baseUrl = postgres.url.slice(0, postgres.url.lastIndexOf('/'));
  return {
    url: postgres.url,
    baseUrl,
    durable: options.durable,
    async stop() {
      await postgres.stop();
      // With fsync off the shutdown checkpoint only reached the page cache.
      if (!options.durable) execFileSync('sync');
    },
  };
}

/** The settings every measurement must run under; refuses to measure a cluster without them. */
export async function assertDurable(url: string): Promise<{ fsync: string; synchronousCommit: string }> {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    const { rows } = await client.query<{ fsync: string; synchronous_commit: string }>(
      `select current_setting('fsync') as fsync, current_setting('synchronous_commit') as synchronous_commit`,
    );
    const { fsync, synchronous_commit: synchronousCommit } = rows[0]!;
    if (fsync !== 'on' || synchronousCommit !== 'on') {
      throw new Error(
        `measuring needs fsync and synchronous_commit on (fsync=${fsync}, sync=${synchronousCommit})`,
      );
    }
    return { fsync, synchronousCommit };
  } finally {
    await client.end();
  }
}
