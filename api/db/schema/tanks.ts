import { index, pgTable, primaryKey, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { id, timestamps } from './columns';
import { companies } from './companies';
import { users } from './users';

export const tanks = pgTable(
  'tanks',
  {
    id: id(),
    companyId: uuid('company_id')
      .notNull()
      .references(() => companies.id, { onDelete: 'restrict' }),
    name: text('name').notNull(),
    siteLabel: text('site_label'),
    ...timestamps,
  },
  (t) => [index('tanks_company_idx').on(t.companyId)],
);

/** Owners reach tanks only through membership: a tank can have several owners, an owner several tanks. */
export const tankMembers = pgTable(
  'tank_members',
  {
    tankId: uuid('tank_id')
      .notNull()
      .references(() => tanks.id, { onDelete: 'cascade' }),
    userId: uuid('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true })
      .notNull()
      .defaultNow()
      .$onUpdate(() => new Date()),
  },
  (t) => [primaryKey({ columns: [t.tankId, t.userId] }), index('tank_members_user_idx').on(t.userId)],
);
