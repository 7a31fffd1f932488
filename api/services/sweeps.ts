import { and, eq, inArray, isNull, lt, ne, sql } from 'drizzle-orm';
import { describeAlert } from '@shared/alerts/describe-alert';
import { evaluateOverdue } from '@shared/alerts/overdue';
import {
  deviceStaleAfter,
  evaluateStaleDevice,
  reportingGaps,
  reportingGapsSampled,
  reportingRhythmLookBackMs,
} from '@shared/alerts/stale-device';
import { parameterCatalogue, parametersFor } from '@shared/parameters/catalogue';
import type { ParameterKey } from '@shared/parameters/keys';
import type { AppDeps } from '../deps';
import { alerts, auditEvents, companies, devices, readings, tanks } from '../db/schema/index';
import { withTankAlerts, type NewAlert } from './alert-store';

/**
 * One sweep's verdict on one subject: open `alert` while the condition holds, else resolve
 * whatever is open under `ruleKey`. Each runs under its tank's lock, like every alert change.
 */
async function settle(deps: AppDeps, tankId: string, ruleKey: string, alert: NewAlert | null, now: Date) {
  return withTankAlerts(deps.db, tankId, async (store) => {
    if (alert) return store.open(alert);
    const open = await store.findOpen(ruleKey);
    return open ? store.resolve(open, { at: now }) : null;
  });
}

/**
 * Each device's latest report times, for every device in one statement: one backward probe of
 * readings_device_key per device and parameter, no further back than `reportingRhythmLookBackMs`
 * before the device was last seen (so only the latest month partitions are read). A device never
 * seen has sent nothing to read.
 */
async function recentReports(
  deps: AppDeps,
  devicesSeen: readonly { id: string; lastSeenAt: Date | null }[],
): Promise<Map<string, Date[]>> {
  const reports = new Map<string, Date[]>(devicesSeen.map(({ id }) => [id, []]));
  const seen = devicesSeen.filter(
    (device): device is { id: string; lastSeenAt: Date } => device.lastSeenAt !== null,
  );
  if (seen.length === 0) return reports;
  const result = await deps.db.execute<{ device_id: string; at: string }>(sql`
    select d.id as device_id, t.at
    from unnest(
      ${sql.param(seen.map((device) => device.id))}::uuid[],
      ${sql.param(seen.map((device) => new Date(device.lastSeenAt.getTime() - reportingRhythmLookBackMs).toISOString()))}::timestamptz[]
    ) as d(id, since)
    cross join lateral (
      select distinct m.measured_at as at
      from unnest(enum_range(null::parameter_key)) as p(parameter)
      cross join lateral (
        select r.measured_at from readings r
        where r.device_id = d.id and r.parameter = p.parameter and r.measured_at >= d.since
        order by r.measured_at desc
        limit ${reportingGapsSampled + 1}
      ) m
      order by at desc
      limit ${reportingGapsSampled + 1}
    ) t`);
  for (const row of result.rows) reports.get(row.device_id)!.push(new Date(row.at));
  return reports;
}

/**
 * A device silent for longer than three of its usual intervals (at least 30 minutes, the rule tank
 * health uses: `deviceStaleAfter`) opens one alert; its next reading closes it.
 */
export async function sweepStaleDevices(deps: AppDeps): Promise<string[]> {
  const now = deps.clock();
  const rows = await deps.db
    .select({
      device: devices,
      tankName: tanks.name,
      timeZone: sql<string>`coalesce(${tanks.timeZone}, ${companies.timeZone})`,
    })
    .from(devices)
    .innerJoin(tanks, eq(tanks.id, devices.tankId))
    .innerJoin(companies, eq(companies.id, tanks.companyId))
    .where(isNull(devices.revokedAt));
  const reports = await recentReports(
    deps,
    rows.map(({ device }) => device),
  );
  // Alerts of this kind not yet resolved: a device whose verdict matches needs no transaction.
  const unresolved = new Set(
    (
      await deps.db
        .select({ ruleKey: alerts.ruleKey })
        .from(alerts)
        .where(and(eq(alerts.kind, 'device-stale'), ne(alerts.status, 'resolved')))
    ).map((row) => row.ruleKey),
  );
  const events: string[] = [];
  for (const { device, tankName, timeZone } of rows) {
    const ruleKey = `device-stale:${device.id}`;
    const staleAfterMs = deviceStaleAfter(reportingGaps(reports.get(device.id)!));
    const outcome = evaluateStaleDevice(device, now, staleAfterMs);
    // Still silent with its alert open, or reporting with none: nothing to change. Otherwise the
    // tank's lock and a fresh read in settle() decide, so a change made meanwhile is respected.
    if (outcome.stale === unresolved.has(ruleKey)) continue;
    let alert: NewAlert | null = null;
    if (outcome.stale) {
      const text = describeAlert(
        {
          kind: 'device-stale',
          deviceName: device.name,
          lastSeen: device.lastSeenAt,
          silentForMs: outcome.silentForMs,
        },
        { tankName, timeZone },
      );
      alert = {
        companyId: device.companyId,
        kind: 'device-stale',
        ruleKey,
        parameter: null,
        severity: text.severity,
        title: text.title,
        body: text.body,
        value: null,
        limitValue: null,
        direction: null,
        at: now,
      };
    }
    const eventId = await settle(deps, device.tankId, ruleKey, alert, now);
    if (eventId) events.push(eventId);
  }
  return events;
}

/**
 * Home tests that are due: for each tank and each parameter it has been tested for by hand,
 * a low-urgency notice once the test interval has passed; a new reading closes it.
 */
export async function sweepOverdueTests(deps: AppDeps): Promise<string[]> {
  const now = deps.clock();
  const latest = await deps.db
    .select({
      tankId: readings.tankId,
      companyId: tanks.companyId,
      tankName: tanks.name,
      waterType: tanks.waterType,
      timeZone: sql<string>`coalesce(${tanks.timeZone}, ${companies.timeZone})`,
      parameter: readings.parameter,
      lastAt: sql<Date>`max(${readings.measuredAt})`.mapWith((v: string) => new Date(v)),
    })
    .from(readings)
    .innerJoin(tanks, eq(tanks.id, readings.tankId))
    .innerJoin(companies, eq(companies.id, tanks.companyId))
    .where(inArray(readings.source, ['home-test', 'visit']))
    .groupBy(
      readings.tankId,
      tanks.companyId,
      tanks.name,
      tanks.waterType,
      tanks.timeZone,
      companies.timeZone,
      readings.parameter,
    );
  const events: string[] = [];
  for (const row of latest) {
    const parameter = row.parameter as ParameterKey;
    const interval = parameterCatalogue[parameter].homeTestIntervalMs;
    if (interval === null || !parametersFor(row.waterType).includes(parameter)) continue;
    const ruleKey = `test-overdue:${parameter}`;
    const outcome = evaluateOverdue(row.lastAt, interval, now);
    let alert: NewAlert | null = null;
    if (outcome.overdue) {
      const text = describeAlert(
        { kind: 'test-overdue', parameter, lastMeasuredAt: row.lastAt, intervalMs: interval, now },
        { tankName: row.tankName, timeZone: row.timeZone },
      );
      alert = {
        companyId: row.companyId,
        kind: 'test-overdue',
        ruleKey,
        parameter,
        severity: outcome.severity,
        title: text.title,
        body: text.body,
        value: null,
        limitValue: null,
        direction: null,
        at: now,
      };
    }
    const eventId = await settle(deps, row.tankId, ruleKey, alert, now);
    if (eventId) events.push(eventId);
  }
  return events;
}

/**
 * Audit entries older than AUDIT_RETENTION_DAYS are deleted, the one deletion the table's trigger
 * lets through: the setting is local to this transaction, so no other statement ever has it.
 */
export async function purgeExpiredAudit(deps: AppDeps): Promise<number> {
  const cutoff = new Date(deps.clock().getTime() - deps.env.AUDIT_RETENTION_DAYS * 24 * 60 * 60_000);
  return deps.db.transaction(async (tx) => {
    await tx.execute(sql`set local brinewatch.audit_purge = 'on'`);
    const result = await tx.delete(auditEvents).where(lt(auditEvents.at, cutoff));
    return result.rowCount ?? 0;
  });
}
