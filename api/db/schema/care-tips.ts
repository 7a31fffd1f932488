import { index, jsonb, pgEnum, pgTable, primaryKey, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { tipCategories, tipStatuses } from '@shared/schemas/care-tips';
import { id, timestamps } from './columns';
import { companies } from './companies';
import { photos, tanks } from './tanks';
import { users } from './users';

export const tipCategory = pgEnum('tip_category', tipCategories);
export const tipStatus = pgEnum('tip_status', tipStatuses);

export const careTips = pgTable(
  'care_tips',
  {
    id: id(),
    companyId: uuid('company_id')
      .notNull()
      .references(() => companies.id, { onDelete: 'cascade' }),
    title: text('title').notNull(),
    /** Markdown. */
    body: text('body').notNull(),
    category: tipCategory('category').notNull(),
    photoId: uuid('photo_id').references(() => photos.id, { onDelete: 'set null' }),
    /** shared/schemas/care-tips.ts tipAudience. */
    audience: jsonb('audience').notNull(),
    /** shared/schemas/care-tips.ts tipTrigger[]: when staff are offered it for one tap. */
    suggestWhen: jsonb('suggest_when').notNull().default([]),
    status: tipStatus('status').notNull().default('draft'),
    sendAt: timestamp('send_at', { withTimezone: true }),
    sentAt: timestamp('sent_at', { withTimezone: true }),
    withdrawnAt: timestamp('withdrawn_at', { withTimezone: true }),
    createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
    ...timestamps,
  },
  (t) => [index('care_tips_company_idx').on(t.companyId, t.createdAt)],
);

/** Each tank a tip reached, once: a second send to the same tank finds its row and does nothing. */
export const careTipTanks = pgTable(
  'care_tip_tanks',
  {
    tipId: uuid('tip_id')
      .notNull()
      .references(() => careTips.id, { onDelete: 'cascade' }),
    tankId: uuid('tank_id')
      .notNull()
      .references(() => tanks.id, { onDelete: 'cascade' }),
    deliveredAt: timestamp('delivered_at', { withTimezone: true }).notNull(),
    sentBy: uuid('sent_by').references(() => users.id, { onDelete: 'set null' }),
    ...timestamps,
  },
  (t) => [
    primaryKey({ columns: [t.tipId, t.tankId] }),
    index('care_tip_tanks_tank_idx').on(t.tankId, t.deliveredAt),
  ],
);

/** Each owner of each tank the tip reached, as they were at the time. */
export const careTipReaders = pgTable(
  'care_tip_readers',
  {
    tipId: uuid('tip_id')
      .notNull()
      .references(() => careTips.id, { onDelete: 'cascade' }),
    tankId: uuid('tank_id')
      .notNull()
      .references(() => tanks.id, { onDelete: 'cascade' }),
    userId: uuid('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    ...timestamps,
  },
  (t) => [
    primaryKey({ columns: [t.tipId, t.tankId, t.userId] }),
    index('care_tip_readers_user_idx').on(t.userId),
  ],
);

export const careTipHelpful = pgTable(
  'care_tip_helpful',
  {
    tipId: uuid('tip_id')
      .notNull()
      .references(() => careTips.id, { onDelete: 'cascade' }),
    userId: uuid('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    ...timestamps,
  },
  (t) => [primaryKey({ columns: [t.tipId, t.userId] })],
);
