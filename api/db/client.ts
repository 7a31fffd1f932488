import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import pg from 'pg';
import * as schema from './schema/index';

/** `$client` is the pool, for the few hot-path statements prepared by name (./prepared.ts). */
export type Db = NodePgDatabase<typeof schema> & { $client: pg.Pool };

export interface Database {
  pool: pg.Pool;
  db: Db;
}

/**
 * Settings every API connection starts with. JIT compilation off: PostgreSQL compiles a plan whose
 * estimated cost is high, and a statement probing partitioned readings with parameters is estimated
 * as if it read whole months, so the rate rules' read per batch spent 40–60 ms compiling and 1 ms
 * running (bench rate-series). Our statements are short; none gains from JIT.
 */
export const sessionOptions = '-c jit=off';

export function connectDatabase(url: string, options: { max?: number } = {}): Database {
  // A database that hangs instead of refusing must still end in a 503, not a request that never ends.
  const pool = new pg.Pool({
    connectionString: url,
    max: options.max ?? 10,
    connectionTimeoutMillis: 5_000,
    options: sessionOptions,
  });
  // An idle client losing its connection (the server restarting) must not kill the process.
  pool.on('error', () => {});
  return { pool, db: drizzle(pool, { schema }) };
}
