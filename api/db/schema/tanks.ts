import { sql } from 'drizzle-orm';
import {
  type AnyPgColumn,
  check,
  date,
  doublePrecision,
  index,
  integer,
  jsonb,
  pgEnum,
  pgTable,
  primaryKey,
  text,
  timestamp,
  uniqueIndex,
  uuid,
} from 'drizzle-orm/pg-core';
import { tankStatusValues } from '@shared/parameters/health';
import { tankStyles } from '@shared/parameters/limit-templates';
import { livestockStatuses } from '@shared/schemas/livestock-status';
import { id, timestamps } from './columns';
import { companies } from './companies';
import { users } from './users';

/*
 * A tank, what lives in it and its photos share one module: these tables refer to each other (a
 * tank's cover photo, a photo's animal, an animal's tank), and modules must not.
 */

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
    /** When the last published visit report's visit began; set by publishing. */
    lastVisitAt: timestamp('last_visit_at', { withTimezone: true }),
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

/** Species a company adds beyond the catalogue shipped with the product (which lives in shared/). */
export const companySpecies = pgTable(
  'company_species',
  {
    id: id(),
    companyId: uuid('company_id')
      .notNull()
      .references(() => companies.id, { onDelete: 'cascade' }),
    commonName: text('common_name').notNull(),
    scientificName: text('scientific_name').notNull(),
    /** Scientific family when known; rivalry between related fish is judged by it. */
    family: text('family'),
    /** The same care-profile shape as the catalogue, validated by shared/livestock/species.ts. */
    profile: jsonb('profile').notNull(),
    ...timestamps,
  },
  (t) => [uniqueIndex('company_species_name_key').on(t.companyId, t.scientificName)],
);

export const livestockStatus = pgEnum('livestock_status', livestockStatuses);

export const livestock = pgTable(
  'livestock',
  {
    id: id(),
    companyId: uuid('company_id')
      .notNull()
      .references(() => companies.id, { onDelete: 'cascade' }),
    tankId: uuid('tank_id')
      .notNull()
      .references(() => tanks.id, { onDelete: 'cascade' }),
    /** Exactly one of these: a catalogue id, or the company's own species. */
    catalogueSpeciesId: text('catalogue_species_id'),
    companySpeciesId: uuid('company_species_id').references(() => companySpecies.id, {
      onDelete: 'restrict',
    }),
    nickname: text('nickname'),
    quantity: integer('quantity').notNull().default(1),
    addedOn: date('added_on'),
    source: text('source'),
    placement: text('placement'),
    status: livestockStatus('status').notNull().default('stable'),
    ...timestamps,
  },
  (t) => [
    index('livestock_tank_idx').on(t.tankId),
    check('livestock_one_species', sql`(${t.catalogueSpeciesId} is null) <> (${t.companySpeciesId} is null)`),
    check('livestock_quantity_positive', sql`${t.quantity} > 0`),
  ],
);

export const livestockStatusEvents = pgTable(
  'livestock_status_events',
  {
    id: id(),
    livestockId: uuid('livestock_id')
      .notNull()
      .references(() => livestock.id, { onDelete: 'cascade' }),
    status: livestockStatus('status').notNull(),
    note: text('note'),
    changedBy: uuid('changed_by').references(() => users.id, { onDelete: 'set null' }),
    changedAt: timestamp('changed_at', { withTimezone: true }).notNull(),
    ...timestamps,
  },
  (t) => [index('livestock_status_events_livestock_idx').on(t.livestockId, t.changedAt)],
);

export const photoSubject = pgEnum('photo_subject', ['tank', 'livestock', 'visit', 'message']);

/**
 * A re-encoded picture in object storage. It belongs to one tank (and maybe one animal), so
 * it is served under exactly the same access rule as that tank.
 */
export const photos = pgTable(
  'photos',
  {
    id: id(),
    companyId: uuid('company_id')
      .notNull()
      .references(() => companies.id, { onDelete: 'cascade' }),
    tankId: uuid('tank_id')
      .notNull()
      .references((): AnyPgColumn => tanks.id, { onDelete: 'cascade' }),
    livestockId: uuid('livestock_id').references((): AnyPgColumn => livestock.id, { onDelete: 'cascade' }),
    subject: photoSubject('subject').notNull(),
    objectKey: text('object_key').notNull(),
    thumbnailKey: text('thumbnail_key').notNull(),
    contentType: text('content_type').notNull(),
    width: integer('width').notNull(),
    height: integer('height').notNull(),
    bytes: integer('bytes').notNull(),
    caption: text('caption'),
    uploadedBy: uuid('uploaded_by').references(() => users.id, { onDelete: 'set null' }),
    ...timestamps,
  },
  (t) => [index('photos_tank_idx').on(t.tankId), index('photos_livestock_idx').on(t.livestockId)],
);

/**
 * Each tank's status as last judged (shared/tanks/status.ts `judgeTank`), so the staff overview can
 * sort and page thousands of tanks by trouble without judging them all. Written after readings and
 * alert changes and re-judged by the minute sweep (api/services/tank-status.ts); the page a person
 * sees is judged again live, so this only ever decides the order, never what a row says.
 */
export const tankStatuses = pgTable(
  'tank_status',
  {
    tankId: uuid('tank_id')
      .primaryKey()
      .references(() => tanks.id, { onDelete: 'cascade' }),
    companyId: uuid('company_id')
      .notNull()
      .references(() => companies.id, { onDelete: 'cascade' }),
    status: text('status', { enum: tankStatusValues }).notNull(),
    /** Worst first: alert 0, watch 1, no data 2, healthy 3. */
    rank: integer('rank').notNull(),
    reason: text('reason').notNull(),
    /** When the tank came into this status: the longest in trouble come first. */
    since: timestamp('since', { withTimezone: true }).notNull(),
    judgedAt: timestamp('judged_at', { withTimezone: true }).notNull(),
  },
  (t) => [
    index('tank_status_order_idx').on(t.companyId, t.rank, t.since, t.tankId),
    index('tank_status_judged_idx').on(t.judgedAt),
  ],
);
