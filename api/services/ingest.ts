import { eq, sql } from 'drizzle-orm';
import type { ParameterKey } from '@shared/parameters/keys';
import { checkStoredValue } from '@shared/parameters/units';
import {
  deviceReadingInput,
  maxDeviceBatch,
  type IngestRejectionReason,
  type IngestResult,
} from '@shared/schemas/readings';
import type { AppDeps } from '../deps';
import { devices, readings, tanks } from '../db/schema/index';
import { HttpError, notFound } from '../lib/http-error';
import type { DeviceIdentity } from './devices';
import { commitReadings, tankExistsFrom, timeProblem, timeProblemMessage } from './readings';

type NewReading = typeof readings.$inferInsert;

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
  const [tank] = await deps.db
    .select({ createdAt: tanks.createdAt, setUpOn: tanks.setUpOn })
    .from(tanks)
    .where(eq(tanks.id, device.tankId));
  if (!tank) throw notFound('tank');
  const existsFrom = tankExistsFrom(tank);

  const rejected: IngestResult['rejected'] = [];
  const seen = new Set<string>();
  const rows: NewReading[] = [];
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
      companyId: device.companyId,
      tankId: device.tankId,
      parameter: reading.parameter,
      value: stored.value,
      enteredValue: reading.value,
      enteredUnit: reading.unit,
      measuredAt,
      source: 'device',
      deviceId: device.id,
    });
  });

  const accepted = await commitReadings(deps, device.tankId, async (tx) => {
    const inserted: Array<{ parameter: ParameterKey; value: number; measuredAt: Date; source: 'device' }> =
      [];
    if (rows.length > 0) {
      const saved = await tx
        .insert(readings)
        .values(rows)
        .onConflictDoNothing({
          target: [readings.deviceId, readings.parameter, readings.measuredAt],
          where: sql`${readings.deviceId} is not null`,
        })
        .returning({ parameter: readings.parameter, value: readings.value, measuredAt: readings.measuredAt });
      inserted.push(...saved.map((row) => ({ ...row, source: 'device' as const })));
    }
    await tx.update(devices).set({ lastSeenAt: now }).where(eq(devices.id, device.id));
    return { stored: inserted, result: inserted.length };
  });
  return { accepted, duplicate: duplicate + rows.length - accepted, rejected };
}
