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
import { commitReadingsStatement, timeProblem, timeProblemMessage } from './readings';
import type { Db } from '../db/client';
import { HttpError } from '../lib/http-error';
import type { DeviceIdentity } from './devices';

interface DeviceRow {
  parameter: ParameterKey;
  value: number;
  entered: number;
  unit: string;
  measuredAt: Date;
}

/** A device's last_seen_at moves at most once a minute: the stale-device sweep needs no finer. */
const lastSeenStepMs = 60_000;

/**
 * The batch in one statement, so one transaction without BEGIN and COMMIT: the rows go in as one
 * array per column (no per-row work in the query builder), the unique index drops what is already
 * stored, and the trigger on readings keeps the latest readings and the rollups in the same
 * statement. The device's last_seen_at rides along.
 */
async function storeDeviceBatch(
  db: Pick<Db, 'execute'>,
  device: DeviceIdentity,
  rows: readonly DeviceRow[],
  now: Date,
) {
  const result = await db.execute<{ parameter: ParameterKey; value: number; measured_at: string }>(sql`
    with seen as (
      update devices set last_seen_at = ${now.toISOString()}::timestamptz
      where id = ${device.id}
        and (last_seen_at is null or last_seen_at < ${new Date(now.getTime() - lastSeenStepMs).toISOString()}::timestamptz)
    )
    insert into readings (company_id, tank_id, device_id, source, parameter, value, entered_value, entered_unit, measured_at)
    select ${device.companyId}::uuid, ${device.tankId}::uuid, ${device.id}::uuid, 'device', r.parameter, r.value, r.entered, r.unit, r.measured_at
    from unnest(
      ${sql.param(rows.map((row) => row.parameter))}::parameter_key[],
      ${sql.param(rows.map((row) => row.value))}::float8[],
      ${sql.param(rows.map((row) => row.entered))}::float8[],
      ${sql.param(rows.map((row) => row.unit))}::text[],
      ${sql.param(rows.map((row) => row.measuredAt.toISOString()))}::timestamptz[]
    ) as r(parameter, value, entered, unit, measured_at)
    on conflict (device_id, parameter, measured_at) where device_id is not null do nothing
    returning parameter, value, measured_at`);
  return result.rows.map((row) => ({
    parameter: row.parameter,
    value: row.value,
    measuredAt: new Date(row.measured_at),
    source: 'device' as const,
  }));
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
 * readings. The new readings' alerts are raised after the commit, before this returns.
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

  const accepted = await commitReadingsStatement(deps, device.tankId, async (db) => {
    const stored = await storeDeviceBatch(db, device, rows, now);
    return { stored, result: stored.length };
  });
  return { accepted, duplicate: duplicate + rows.length - accepted, rejected };
}
