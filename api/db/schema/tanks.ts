import {
  date,
  doublePrecision,
  index,
  integer,
  pgEnum,
  pgTable,
  primaryKey,
  text,
  timestamp,
  uuid,
  type AnyPgColumn,
} from 'drizzle-orm/pg-core';
import { tankStyles } from '@shared/parameters/limit-templates';
import { id, timestamps } from './columns';
import { companies } from './companies';
import { photos } from './photos';
import { users } from './users';

export const waterType = pgEnum('water_type', ['marine', 'fresh', 'brackish']);
export const tankStyle = pgEnum('tank_style', tankStyles);

export const tanks = pgTable(
  'tanks',
  {
    id: id(),
    companyId: uuid('company_id')
      .notNull()
      .references(() => companies.id, { onDelete: 'restrict' }),
    name: text('name').notNull(),
    siteLabel: text('site_label'),
    waterType: waterType('water_type').notNull().default('marine'),
    style: tankStyle('style').notNull().default('mixed-reef'),
    /** Volumes are kept in litres; gallons are converted on entry through shared/chemistry. */
    displayVolumeL: doublePrecision('display_volume_l').notNull().default(0),
    sumpVolumeL: doublePrecision('sump_volume_l').notNull().default(0),
    lengthCm: doublePrecision('length_cm'),
    widthCm: doublePrecision('width_cm'),
    heightCm: doublePrecision('height_cm'),
    setUpOn: date('set_up_on'),
    assignedTechnicianId: uuid('assigned_technician_id').references(() => users.id, { onDelete: 'set null' }),
    serviceIntervalDays: integer('service_interval_days').notNull().default(14),
    notes: text('notes'),
    coverPhotoId: uuid('cover_photo_id').references((): AnyPgColumn => photos.id, { onDelete: 'set null' }),
    /** IANA zone when the tank is not where the company is. */
    timeZone: text('time_zone'),
    ...timestamps,
  },
  (t) => [
    index('tanks_company_idx').on(t.companyId),
    index('tanks_technician_idx').on(t.assignedTechnicianId),
  ],
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
