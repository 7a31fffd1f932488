import { index, pgEnum, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { id, timestamps } from './columns';
import { companies } from './companies';
import { roles } from '@shared/people/permissions';

export const userRole = pgEnum('user_role', roles);
export const userStatus = pgEnum('user_status', ['active', 'deactivated']);

export const users = pgTable(
  'users',
  {
    id: id(),
    companyId: uuid('company_id')
      .notNull()
      .references(() => companies.id, { onDelete: 'restrict' }),
    /** A person is (issuer, subject) at their identity provider; e-mail is only contact data. */
    issuer: text('issuer').notNull(),
    subject: text('subject').notNull(),
    email: text('email').notNull(),
    name: text('name').notNull(),
    role: userRole('role').notNull(),
    status: userStatus('status').notNull().default('active'),
    timeZone: text('time_zone'),
    deactivatedAt: timestamp('deactivated_at', { withTimezone: true }),
    /** SHA-256 of the secret in the person's calendar feed address; reset by issuing a new one. */
    calendarTokenHash: text('calendar_token_hash'),
    ...timestamps,
  },
  (t) => [
    uniqueIndex('users_identity_key').on(t.issuer, t.subject),
    uniqueIndex('users_calendar_token_key').on(t.calendarTokenHash),
    index('users_company_idx').on(t.companyId, t.role),
  ],
);
