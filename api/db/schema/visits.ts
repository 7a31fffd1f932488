import { sql } from 'drizzle-orm';
import {
  boolean,
  check,
  date,
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
import { photoPhases, visitKinds, visitStatuses } from '@shared/schemas/visits';
import { id, timestamps } from './columns';
import { companies } from './companies';
import { photos, tanks } from './tanks';
import { users } from './users';

export const visitKind = pgEnum('visit_kind', visitKinds);
export const visitStatus = pgEnum('visit_status', visitStatuses);
export const photoPhase = pgEnum('photo_phase', photoPhases);

/**
 * A repeating routine service. Its visits are written out as rows a few weeks ahead (and further
 * when someone looks further), so a single occurrence can be moved, reassigned or reported on like
 * any other visit. Wall times are in the tank's zone, so 09:00 stays 09:00 across a clock change.
 */
export const visitSeries = pgTable(
  'visit_series',
  {
    id: id(),
    companyId: uuid('company_id')
      .notNull()
      .references(() => companies.id, { onDelete: 'cascade' }),
    tankId: uuid('tank_id')
      .notNull()
      .references(() => tanks.id, { onDelete: 'cascade' }),
    technicianId: uuid('technician_id').references(() => users.id, { onDelete: 'set null' }),
    /** RFC 5545 recurrence rule, without DTSTART (the first day below is the start). */
    rrule: text('rrule').notNull(),
    firstDay: date('first_day').notNull(),
    startTime: text('start_time').notNull(),
    endTime: text('end_time').notNull(),
    /** Occurrences exist as visit rows up to and including this day. */
    writtenUntil: date('written_until').notNull(),
    endedAt: timestamp('ended_at', { withTimezone: true }),
    ...timestamps,
  },
  (t) => [index('visit_series_tank_idx').on(t.tankId)],
);

export const visits = pgTable(
  'visits',
  {
    id: id(),
    companyId: uuid('company_id')
      .notNull()
      .references(() => companies.id, { onDelete: 'cascade' }),
    tankId: uuid('tank_id')
      .notNull()
      .references(() => tanks.id, { onDelete: 'cascade' }),
    seriesId: uuid('series_id').references(() => visitSeries.id, { onDelete: 'set null' }),
    /** The series day this visit stands for, even after it was moved; null outside a series. */
    occurrenceDay: date('occurrence_day'),
    technicianId: uuid('technician_id').references(() => users.id, { onDelete: 'set null' }),
    kind: visitKind('kind').notNull(),
    status: visitStatus('status').notNull().default('scheduled'),
    windowStart: timestamp('window_start', { withTimezone: true }).notNull(),
    windowEnd: timestamp('window_end', { withTimezone: true }).notNull(),
    note: text('note'),
    /** The technician's working copy of the report; `version` counts its saves. */
    draft: jsonb('draft'),
    version: integer('version').notNull().default(0),
    /** What owners read; replaced (the earlier one kept in visit_report_versions) when republished. */
    published: jsonb('published'),
    publishedVersion: integer('published_version'),
    publishedAt: timestamp('published_at', { withTimezone: true }),
    publishedBy: uuid('published_by').references(() => users.id, { onDelete: 'set null' }),
    editedAt: timestamp('edited_at', { withTimezone: true }),
    /** When owners were told of the first publishing; a sweep retries any left unannounced. */
    announcedAt: timestamp('announced_at', { withTimezone: true }),
    createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
    ...timestamps,
  },
  (t) => [
    index('visits_company_window_idx').on(t.companyId, t.windowStart),
    index('visits_technician_window_idx').on(t.technicianId, t.windowStart),
    index('visits_tank_window_idx').on(t.tankId, t.windowStart),
    uniqueIndex('visits_series_day_key').on(t.seriesId, t.occurrenceDay),
    check('visits_window_order', sql`${t.windowEnd} > ${t.windowStart}`),
  ],
);

/** Every published text of a report, so an edit after publishing never loses what owners read. */
export const visitReportVersions = pgTable(
  'visit_report_versions',
  {
    id: id(),
    visitId: uuid('visit_id')
      .notNull()
      .references(() => visits.id, { onDelete: 'cascade' }),
    version: integer('version').notNull(),
    content: jsonb('content').notNull(),
    publishedAt: timestamp('published_at', { withTimezone: true }).notNull(),
    publishedBy: uuid('published_by').references(() => users.id, { onDelete: 'set null' }),
    ...timestamps,
  },
  (t) => [uniqueIndex('visit_report_versions_key').on(t.visitId, t.version)],
);

/** Something to do on a later visit; open until a report ticks it off. */
export const visitItems = pgTable(
  'visit_items',
  {
    id: id(),
    companyId: uuid('company_id')
      .notNull()
      .references(() => companies.id, { onDelete: 'cascade' }),
    tankId: uuid('tank_id')
      .notNull()
      .references(() => tanks.id, { onDelete: 'cascade' }),
    fromVisitId: uuid('from_visit_id')
      .notNull()
      .references(() => visits.id, { onDelete: 'cascade' }),
    text: text('text').notNull(),
    openedAt: timestamp('opened_at', { withTimezone: true }).notNull(),
    closedInVisitId: uuid('closed_in_visit_id').references(() => visits.id, { onDelete: 'set null' }),
    closedAt: timestamp('closed_at', { withTimezone: true }),
    ...timestamps,
  },
  (t) => [index('visit_items_tank_idx').on(t.tankId, t.openedAt)],
);

/**
 * Photos a report uses. A visit photo is shown to owners only once the report that uses it is
 * published, so a draft's pictures stay with the company.
 */
export const visitPhotos = pgTable(
  'visit_photos',
  {
    visitId: uuid('visit_id')
      .notNull()
      .references(() => visits.id, { onDelete: 'cascade' }),
    photoId: uuid('photo_id')
      .notNull()
      .references(() => photos.id, { onDelete: 'cascade' }),
    phase: photoPhase('phase').notNull(),
    published: boolean('published').notNull().default(false),
    ...timestamps,
  },
  (t) => [primaryKey({ columns: [t.visitId, t.photoId] }), index('visit_photos_photo_idx').on(t.photoId)],
);
