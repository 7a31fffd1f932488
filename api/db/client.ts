import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import pg from 'pg';
import * as schema from './schema/index';

/** `$client` is the pool, for the few hot-path statements prepared by name (./prepared.ts). */
export type Db = NodePgDatabase<typeof schema> & { $client: pg.Pool };

export interface Database {
  pool: pg.Pool;
  db: Db;
}

export function connectDatabase(url: string, options: { max?: number } = {}): Database {
  // A database that hangs instead of refusing must still end in a 503, not a request that never ends.
  const pool = new pg.Pool({ connectionString: url, max: options.max ?? 10, connectionTimeoutMillis: 5_000 });
  // An idle client losing its connection (the server restarting) must not kill the process.
  pool.on('error', () => {});
  return { pool, db: drizzle(pool, { schema }) };
}
