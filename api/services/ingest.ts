import { sql } from 'drizzle-orm';
import type { ParameterKey } from '@shared/parameters/keys';
import { checkStoredValue } from '@shared/parameters/units';
import {
  deviceReadingInput,
  maxDeviceBatch,
  type IngestRejectionReason,
  type IngestResult,
} from '@shared/schemas/readings';
import type { AppDeps } from '../deps';
import { groupCommit } from '../lib/group-commit';
import { commitReadingsStatement, timeProblem, timeProblemMessage, type StoredReading } from './readings';
import type { Db } from '../db/client';
import { HttpError } from '../lib/http-error';
import type { DeviceIdentity } from './devices';

export interface DeviceRow {
  parameter: ParameterKey;
  value: number;
  entered: number;
  unit: string;
  measuredAt: Date;
}

/** A device's last_seen_at moves at most once a minute: the stale-device sweep needs no finer. */
const lastSeenStepMs = 60_000;

/** One request's checked readings, waiting to be stored with the others of its group. */
export interface DeviceBatch {
  device: DeviceIdentity;
  rows: readonly DeviceRow[];
}

/**
 * Device batches that arrive while others are being stored are stored together: one statement and
 * one commit for the group, then one alert pass for all its tanks (see `groupCommit`). Two groups
 * may be on their way at once, so the next one gathers while the last one's alerts are judged.
 */
const ingestGroups = { maxInFlight: 2, maxReadings: 5 * maxDeviceBatch } as const;

/**
 * The group's batches in one statement, so one transaction without BEGIN and COMMIT: the rows go in
 * as one array per column (no per-row work in the query builder), the unique index drops what is
 * already stored, and the trigger on readings keeps the latest readings and the rollups in the same
 * statement. The devices' last_seen_at ride along. Returns each batch's new readings, in order.
 */
async function storeDeviceBatches(
  db: Pick<Db, 'execute'>,
  batches: readonly DeviceBatch[],
  now: Date,
): Promise<StoredReading[][]> {
  // The same reading in two batches of the group (a device re-sending while its first request is
  // still on its way) is offered once, by the first; the index would keep only one of them anyway.
  const owner = new Map<string, number>();
  const rows: (DeviceRow & { device: DeviceIdentity })[] = [];
  const keyOf = (deviceId: string, parameter: string, at: number) => `${deviceId} ${parameter} ${at}`;
  batches.forEach(({ device, rows: batch }, index) => {
    for (const row of batch) {
      const key = keyOf(device.id, row.parameter, row.measuredAt.getTime());
      if (owner.has(key)) continue;
      owner.set(key, index);
      rows.push({ ...row, device });
    }
  });
  const stored = batches.map((): StoredReading[] => []);
  const deviceIds = [...new Set(batches.map((batch) => batch.device.id))];
  const result = await db.execute<{
    device_id: string;
    parameter: ParameterKey;
    value: number;
    measured_at: string;
  }>(sql`
    with seen as (
      update devices set last_seen_at = ${now.toISOString()}::timestamptz
      where id = any(${sql.param(deviceIds)}::uuid[])
        and (last_seen_at is null or last_seen_at < ${new Date(now.getTime() - lastSeenStepMs).toISOString()}::timestamptz)
    )
    insert into readings (company_id, tank_id, device_id, source, parameter, value, entered_value, entered_unit, measured_at)
    select r.company_id, r.tank_id, r.device_id, 'device', r.parameter, r.value, r.entered, r.unit, r.measured_at
    from unnest(
      ${sql.param(rows.map((row) => row.device.companyId))}::uuid[],
      ${sql.param(rows.map((row) => row.device.tankId))}::uuid[],
      ${sql.param(rows.map((row) => row.device.id))}::uuid[],
      ${sql.param(rows.map((row) => row.parameter))}::parameter_key[],
      ${sql.param(rows.map((row) => row.value))}::float8[],
      ${sql.param(rows.map((row) => row.entered))}::float8[],
      ${sql.param(rows.map((row) => row.unit))}::text[],
      ${sql.param(rows.map((row) => row.measuredAt.toISOString()))}::timestamptz[]
    ) as r(company_id, tank_id, device_id, parameter, value, entered, unit, measured_at)
    on conflict (device_id, parameter, measured_at) where device_id is not null do nothing
    returning device_id, parameter, value, measured_at`);
  for (const row of result.rows) {
    const measuredAt = new Date(row.measured_at);
    const index = owner.get(keyOf(row.device_id, row.parameter, measuredAt.getTime()))!;
    stored[index]!.push({ parameter: row.parameter, value: row.value, measuredAt, source: 'device' });
  }
  return stored;
}

/**
 * Stores a group of batches and judges their tanks; each batch answers how many of its readings were
 * new, or the error that kept it out. (Exported for tests, which build groups the timing would not.)
 */
export async function writeDeviceGroup(
  deps: AppDeps,
  batches: DeviceBatch[],
): Promise<PromiseSettledResult<number>[]> {
  try {
    return await commitReadingsStatement(deps, async (db) => {
      const stored = await storeDeviceBatches(db, batches, deps.clock());
      const byTank = new Map<string, StoredReading[]>();
      batches.forEach(({ device }, index) => {
        byTank.set(device.tankId, [...(byTank.get(device.tankId) ?? []), ...stored[index]!]);
      });
      return {
        stored: byTank,
        result: stored.map((list) => ({ status: 'fulfilled' as const, value: list.length })),
      };
    });
  } catch (error) {
    if (batches.length === 1) throw error;
    // One batch can fail the statement for all (its tank deleted a moment ago): each goes alone,
    // so only that one fails. (Judging never throws: the readings are stored by then.)
    return Promise.all(
      batches.map((batch) =>
        writeDeviceGroup(deps, [batch]).then(
          ([result]) => result!,
          (reason: unknown): PromiseRejectedResult => ({ status: 'rejected', reason }),
        ),
      ),
    );
  }
}

const writers = new WeakMap<AppDeps, (batch: DeviceBatch) => Promise<number>>();

function writerFor(deps: AppDeps) {
  let writer = writers.get(deps);
  if (!writer) {
    writer = groupCommit((batches: DeviceBatch[]) => writeDeviceGroup(deps, batches), {
      maxInFlight: ingestGroups.maxInFlight,
      maxSize: ingestGroups.maxReadings,
      sizeOf: (batch) => batch.rows.length,
    });
    writers.set(deps, writer);
  }
  return writer;
}

function shapeReason(path: PropertyKey | undefined): IngestRejectionReason {
  if (path === 'parameter') return 'unknown-parameter';
  if (path === 'unit') return 'unknown-unit';
  return 'invalid';
}

/**
 * Stores a device's batch. Each reading is judged on its own: bad ones are listed by index and
 * reason while the good ones are kept. Re-sending is harmless: duplicates inside the batch are
 * dropped first, and the unique index on (device, parameter, measured_at) with ON CONFLICT DO
 * NOTHING drops the ones already stored, also against a concurrent request with the same
 * readings. The new readings' alerts are raised after the commit, before this returns; batches of
 * other devices arriving meanwhile share the statement and the alert pass (`ingestGroups`).
 */
export async function ingestReadings(
  deps: AppDeps,
  device: DeviceIdentity,
  batch: readonly unknown[],
): Promise<IngestResult> {
  if (batch.length > maxDeviceBatch) {
    throw new HttpError(413, 'batch_too_large', `Send at most ${maxDeviceBatch} readings per request.`);
  }
  const now = deps.clock();
  const existsFrom = device.tankExistsFrom;

  const rejected: IngestResult['rejected'] = [];
  const seen = new Set<string>();
  const rows: DeviceRow[] = [];
  let duplicate = 0;
  batch.forEach((raw, index) => {
    const parsed = deviceReadingInput.safeParse(raw);
    if (!parsed.success) {
      const issue = parsed.error.issues[0]!;
      const field = issue.path[0];
      rejected.push({
        index,
        reason: shapeReason(field),
        message: field === undefined ? issue.message : `${String(field)}: ${issue.message}`,
      });
      return;
    }
    const reading = parsed.data;
    const measuredAt = new Date(reading.measuredAt);
    const problem = timeProblem(measuredAt, existsFrom, now);
    if (problem) {
      rejected.push({ index, reason: problem, message: timeProblemMessage(problem, existsFrom) });
      return;
    }
    const stored = checkStoredValue(reading.parameter, reading.value, reading.unit);
    if (!stored.ok) {
      rejected.push({
        index,
        reason: stored.field === 'unit' ? 'unknown-unit' : 'implausible',
        message: stored.message,
      });
      return;
    }
    // Times are kept to the millisecond, so two readings that differ by less are one reading.
    const key = `${reading.parameter}@${measuredAt.getTime()}`;
    if (seen.has(key)) {
      duplicate += 1;
      return;
    }
    seen.add(key);
    rows.push({
      parameter: reading.parameter,
      value: stored.value,
      entered: reading.value,
      unit: reading.unit,
      measuredAt,
    });
  });

  const accepted = await writerFor(deps)({ device, rows });
  return { accepted, duplicate: duplicate + rows.length - accepted, rejected };
}
