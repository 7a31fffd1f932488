import { index, json, pgTable, timestamp, varchar } from 'drizzle-orm/pg-core';

/**
 * connect-pg-simple's table, owned by our migrations (the store's createTableIfMissing is
 * off). Its columns are the store's own; `expire` is timestamptz like every time we keep.
 */
export const sessions = pgTable(
  'session',
  {
    sid: varchar('sid').primaryKey(),
    sess: json('sess').notNull(),
    expire: timestamp('expire', { withTimezone: true, precision: 6 }).notNull(),
  },
  (t) => [index('IDX_session_expire').on(t.expire)],
);
