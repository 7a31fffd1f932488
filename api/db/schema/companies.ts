import { pgTable, text, uniqueIndex } from 'drizzle-orm/pg-core';
import { id, timestamps } from './columns';

export const companies = pgTable(
  'companies',
  {
    id: id(),
    slug: text('slug').notNull(),
    name: text('name').notNull(),
    /** IANA zone the company works in; tanks may override it. */
    timeZone: text('time_zone').notNull().default('UTC'),
    ...timestamps,
  },
  (t) => [uniqueIndex('companies_slug_key').on(t.slug)],
);
