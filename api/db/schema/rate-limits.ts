import { bigint, integer, pgTable, varchar } from 'drizzle-orm/pg-core';

/**
 * rate-limiter-flexible's Postgres store for every rate limit (middleware/rate-limit.ts), one row
 * per limit and caller, keyed `<limit name>:<caller>`. Kept in a migration rather than created by
 * the library at run time. Its columns, their order and their names are the library's (it inserts
 * positionally and upserts on its own), hence no created_at/updated_at here. The table is UNLOGGED
 * (drizzle/0017): spending a point waits for no durable commit.
 */
export const rateLimits = pgTable('rate_limits', {
  key: varchar('key', { length: 255 }).primaryKey(),
  points: integer('points').notNull().default(0),
  /** Epoch milliseconds when the window ends. */
  expire: bigint('expire', { mode: 'number' }),
});
