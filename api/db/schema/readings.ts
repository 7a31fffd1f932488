import { sql } from 'drizzle-orm';
import {
  bigint,
  doublePrecision,
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
    id: bigint('id', { mode: 'number' }).primaryKey().generatedAlwaysAsIdentity(),
    companyId: uuid('company_id')
      .notNull()
      .references(() => companies.id, { onDelete: 'cascade' }),
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
    index('readings_history_idx').on(t.tankId, t.parameter, t.measuredAt),
    // A device's reading is idempotent on (device, parameter, measured at): re-sending adds nothing.
    uniqueIndex('readings_device_key')
      .on(t.deviceId, t.parameter, t.measuredAt)
      .where(sql`${t.deviceId} is not null`),
  ],
);

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
