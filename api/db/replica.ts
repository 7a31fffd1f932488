import { drizzle } from 'drizzle-orm/node-postgres';
import pg from 'pg';
import type { Logger } from '../lib/logger';
import { sessionOptions, type Database, type Db } from './client';
import * as schema from './schema/index';

/**
 * Where reads that may lag a little go (history, charts, exports): the replica while it is up and
 * close behind, else the primary. Writes and the authorization checks in front of these reads
 * never come here. Without DATABASE_REPLICA_URL every read is the primary's.
 */
export interface ReadRouting {
  /** Runs a read on the replica when it is fit, else on the primary; a replica failing mid-read is retried there. */
  read<T>(tankId: string, work: (db: Db) => Promise<T>): Promise<T>;
  /** The database for a read that streams page by page (an export): chosen once, not retried. */
  choose(tankId: string): Db;
  /**
   * This tank was just written here: its reads go to the primary for the lag allowance, so a
   * person sees their own readings at once. Per instance: another instance may still show the
   * replica's view for up to that long.
   */
  wrote(tankId: string): void;
  /** Whether reads go to the replica now (health and tests). */
  replicaInUse(): boolean;
  close(): Promise<void>;
}

/** How often the replica's lag is measured. */
const checkEveryMs = 1_000;

/*
 * Lag as the replica sees it: nothing waiting to replay is no lag, however long ago the last
 * transaction was (common practice for a replica of a quiet primary; from memory).
 */
const lagQuery = `select case
    when pg_last_wal_receive_lsn() = pg_last_wal_replay_lsn() then 0
    else coalesce(extract(epoch from now() - pg_last_xact_replay_timestamp()) * 1000, 0)
  end::float8 as lag_ms`;

export function createReadRouting(
  primary: Database,
  options: { replicaUrl?: string; maxLagMs: number; logger: Logger },
): ReadRouting {
  if (!options.replicaUrl) {
    return {
      read: (_tankId, work) => work(primary.db),
      choose: () => primary.db,
      wrote: () => {},
      replicaInUse: () => false,
      close: async () => {},
    };
  }
  const { maxLagMs, logger } = options;
  const pool = new pg.Pool({
    connectionString: options.replicaUrl,
    max: 5,
    connectionTimeoutMillis: 2_000,
    application_name: 'brinewatch-replica-reads',
    options: sessionOptions,
  });
  pool.on('error', () => {});
  const replica = drizzle(pool, { schema }) as Db;
  const writtenUntil = new Map<string, number>();
  let fit = false;
  let closed = false;

  const setFit = (next: boolean, why: string) => {
    if (next !== fit) logger.info({ replica: next ? 'in use' : 'not used', why }, 'replica reads');
    fit = next;
  };
  const check = async () => {
    try {
      const { rows } = await pool.query<{ lag_ms: number }>(lagQuery);
      const lag = rows[0]?.lag_ms ?? Number.POSITIVE_INFINITY;
      setFit(lag <= maxLagMs, `lag ${Math.round(lag)} ms`);
    } catch (error) {
      setFit(false, error instanceof Error ? error.message : 'unreachable');
    }
  };
  let timer: NodeJS.Timeout | undefined;
  const loop = async () => {
    await check();
    if (!closed) timer = setTimeout(() => void loop(), checkEveryMs).unref();
  };
  void loop();

  const replicaFor = (tankId: string) => {
    const until = writtenUntil.get(tankId);
    if (until !== undefined && until <= Date.now()) writtenUntil.delete(tankId);
    return fit && !(until !== undefined && until > Date.now());
  };

  return {
    async read(tankId, work) {
      if (!replicaFor(tankId)) return work(primary.db);
      try {
        return await work(replica);
      } catch (error) {
        // A replica gone mid-read is not the reader's problem; a bad query fails on the primary too.
        logger.warn({ err: error }, 'a replica read failed; reading from the primary');
        setFit(false, 'a read failed');
        return work(primary.db);
      }
    },
    choose: (tankId) => (replicaFor(tankId) ? replica : primary.db),
    wrote(tankId) {
      const now = Date.now();
      if (writtenUntil.size > 10_000) {
        for (const [id, until] of writtenUntil) if (until <= now) writtenUntil.delete(id);
      }
      writtenUntil.set(tankId, now + maxLagMs);
    },
    replicaInUse: () => fit,
    async close() {
      closed = true;
      clearTimeout(timer);
      await pool.end();
    },
  };
}
