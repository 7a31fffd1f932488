import { sql } from 'drizzle-orm';
import {
  bigint,
  doublePrecision,
  integer,
  index,
  pgEnum,
  pgTable,
  primaryKey,
  text,
  timestamp,
  uniqueIndex,
  uuid,
} from 'drizzle-orm/pg-core';
import { parameterKeys } from '@shared/parameters/keys';
import { id, timestamps } from './columns';
import { companies } from './companies';
import { tanks } from './tanks';
import { users } from './users';

export const parameterKey = pgEnum('parameter_key', parameterKeys);
export const readingSource = pgEnum('reading_source', ['visit', 'home-test', 'device']);

/** A controller or probe posting readings for one tank with its own token (only the hash is kept). */
export const devices = pgTable(
  'devices',
  {
    id: id(),
    companyId: uuid('company_id')
      .notNull()
      .references(() => companies.id, { onDelete: 'cascade' }),
    tankId: uuid('tank_id')
      .notNull()
      .references(() => tanks.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    tokenHash: text('token_hash').notNull(),
    /** The first characters of the token, so staff can tell devices apart without the secret. */
    tokenHint: text('token_hint').notNull(),
    lastSeenAt: timestamp('last_seen_at', { withTimezone: true }),
    revokedAt: timestamp('revoked_at', { withTimezone: true }),
    createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
    ...timestamps,
  },
  (t) => [uniqueIndex('devices_token_key').on(t.tokenHash), index('devices_tank_idx').on(t.tankId)],
);

/**
 * The busiest table (10,000 tanks × 6 device parameters every 5 minutes ≈ 17 M rows a month).
 * History is read by (tank, parameter, time), so that is the index. Monthly range partitions are
 * the plan once a single table's index no longer fits in memory; see DEVELOPERS.md, Decisions.
 */
export const readings = pgTable(
  'readings',
  {
    id: bigint('id', { mode: 'number' }).notNull().generatedAlwaysAsIdentity(),
    // No foreign key of its own: the tank's (below) already ties the row to a company that exists
    // and removes it with the company, and a per-row check here cost device ingest about a
    // millisecond per 100 readings (tests/bench ingest).
    companyId: uuid('company_id').notNull(),
    tankId: uuid('tank_id')
      .notNull()
      .references(() => tanks.id, { onDelete: 'cascade' }),
    parameter: parameterKey('parameter').notNull(),
    /** In the parameter's stored unit (°C, practical salinity, dKH, mg/L as NO3, …). */
    value: doublePrecision('value').notNull(),
    enteredValue: doublePrecision('entered_value').notNull(),
    enteredUnit: text('entered_unit').notNull(),
    measuredAt: timestamp('measured_at', { withTimezone: true }).notNull(),
    source: readingSource('source').notNull(),
    recordedBy: uuid('recorded_by').references(() => users.id, { onDelete: 'set null' }),
    deviceId: uuid('device_id').references(() => devices.id, { onDelete: 'restrict' }),
    method: text('method'),
    note: text('note'),
    /** A specific-gravity reading depends on both temperatures, so both are kept with it. */
    sampleTempC: doublePrecision('sample_temp_c'),
    referenceTempC: doublePrecision('reference_temp_c'),
    ...timestamps,
  },
  (t) => [
    // Partitioned by measured_at (drizzle/0020), which every unique key must include.
    primaryKey({ columns: [t.id, t.measuredAt] }),
    index('readings_history_idx').on(t.tankId, t.parameter, t.measuredAt),
    // A device's reading is idempotent on (device, parameter, measured at): re-sending adds nothing.
    uniqueIndex('readings_device_key')
      .on(t.deviceId, t.parameter, t.measuredAt)
      .where(sql`${t.deviceId} is not null`),
    // The readings people took (a few a week among 288 a day from a device), for charts and the
    // overdue-test sweep, without walking the device rows.
    index('readings_people_idx')
      .on(t.tankId, t.parameter, t.measuredAt)
      .where(sql`${t.source} <> 'device'`),
  ],
);

/**
 * The newest reading per (tank, parameter), kept by a trigger on `readings` in the statement that
 * stores the readings (drizzle/0016), so a tank's health is one primary-key probe per parameter.
 * `device_moments` are the last report times of the device behind it, newest first, up to and
 * including this reading: they set how fresh the device's reading counts as.
 */
export const latestReadings = pgTable(
  'latest_readings',
  {
    tankId: uuid('tank_id')
      .notNull()
      .references(() => tanks.id, { onDelete: 'cascade' }),
    parameter: parameterKey('parameter').notNull(),
    readingId: bigint('reading_id', { mode: 'number' }).notNull(),
    value: doublePrecision('value').notNull(),
    measuredAt: timestamp('measured_at', { withTimezone: true }).notNull(),
    source: readingSource('source').notNull(),
    deviceId: uuid('device_id'),
    deviceMoments: timestamp('device_moments', { withTimezone: true }).array(),
  },
  (t) => [primaryKey({ columns: [t.tankId, t.parameter] })],
);

/**
 * Summaries of readings per (tank, parameter) and hour or UTC day, kept by the same trigger, so a
 * year's chart reads 365 rows instead of 105,000. Buckets start on the chart's own grid
 * (`bucketOrigin`), so any whole-hour or whole-day width is a union of them. `last_*` is the
 * newest reading in the bucket.
 */
const rollupColumns = () => ({
  tankId: uuid('tank_id')
    .notNull()
    .references(() => tanks.id, { onDelete: 'cascade' }),
  parameter: parameterKey('parameter').notNull(),
  bucketStart: timestamp('bucket_start', { withTimezone: true }).notNull(),
  min: doublePrecision('min').notNull(),
  max: doublePrecision('max').notNull(),
  sum: doublePrecision('sum').notNull(),
  count: integer('count').notNull(),
  deviceCount: integer('device_count').notNull(),
  homeCount: integer('home_count').notNull(),
  visitCount: integer('visit_count').notNull(),
  lastValue: doublePrecision('last_value').notNull(),
  lastAt: timestamp('last_at', { withTimezone: true }).notNull(),
});

export const readingRollupsHourly = pgTable('reading_rollups_hourly', rollupColumns(), (t) => [
  primaryKey({ columns: [t.tankId, t.parameter, t.bucketStart] }),
]);

export const readingRollupsDaily = pgTable('reading_rollups_daily', rollupColumns(), (t) => [
  primaryKey({ columns: [t.tankId, t.parameter, t.bucketStart] }),
]);

/**
 * Warning and critical bands per tank and parameter; any bound may be open (null). The row also
 * holds the tank's own rate rule: alert when the value changes by more than `rateMaxChange` within
 * `ratePerHours`; both null means the parameter catalogue's common-practice default.
 */
export const tankLimits = pgTable(
  'tank_limits',
  {
    tankId: uuid('tank_id')
      .notNull()
      .references(() => tanks.id, { onDelete: 'cascade' }),
    parameter: parameterKey('parameter').notNull(),
    warnLow: doublePrecision('warn_low'),
    warnHigh: doublePrecision('warn_high'),
    critLow: doublePrecision('crit_low'),
    critHigh: doublePrecision('crit_high'),
    rateMaxChange: doublePrecision('rate_max_change'),
    ratePerHours: doublePrecision('rate_per_hours'),
    updatedBy: uuid('updated_by').references(() => users.id, { onDelete: 'set null' }),
    ...timestamps,
  },
  (t) => [primaryKey({ columns: [t.tankId, t.parameter] })],
);
