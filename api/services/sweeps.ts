import { and, eq, inArray, isNotNull, isNull, ne, sql } from 'drizzle-orm';
import { describeAlert } from '@shared/alerts/describe-alert';
import { deviceStaleAfterMs, parameterCatalogue, parametersFor } from '@shared/parameters/catalogue';
import type { ParameterKey } from '@shared/parameters/keys';
import type { AppDeps } from '../deps';
import { alertEvents, alerts, companies, devices, readings, tanks } from '../db/schema/index';

type Opened = { eventId: string };

async function openIfNone(
  deps: AppDeps,
  values: Omit<typeof alerts.$inferInsert, 'status'>,
): Promise<Opened | null> {
  return deps.db.transaction(async (tx) => {
    await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${values.tankId}))`);
    const [existing] = await tx
      .select({ id: alerts.id })
      .from(alerts)
      .where(
        and(
          eq(alerts.tankId, values.tankId),
          eq(alerts.ruleKey, values.ruleKey),
          ne(alerts.status, 'resolved'),
        ),
      );
    if (existing) return null;
    const [alert] = await tx.insert(alerts).values(values).returning({ id: alerts.id });
    const [event] = await tx
      .insert(alertEvents)
      .values({ alertId: alert!.id, type: 'opened', severity: values.severity, at: values.openedAt })
      .returning({ id: alertEvents.id });
    return { eventId: event!.id };
  });
}

async function resolveOpen(deps: AppDeps, tankId: string, ruleKey: string, at: Date): Promise<string | null> {
  return deps.db.transaction(async (tx) => {
    const [existing] = await tx
      .select({ id: alerts.id, severity: alerts.severity })
      .from(alerts)
      .where(and(eq(alerts.tankId, tankId), eq(alerts.ruleKey, ruleKey), ne(alerts.status, 'resolved')))
      .for('update');
    if (!existing) return null;
    await tx.update(alerts).set({ status: 'resolved', resolvedAt: at }).where(eq(alerts.id, existing.id));
    const [event] = await tx
      .insert(alertEvents)
      .values({ alertId: existing.id, type: 'resolved', severity: existing.severity, at })
      .returning({ id: alertEvents.id });
    return event!.id;
  });
}

/** A device silent for longer than it should be (30 minutes) opens one alert; its next reading closes it. */
export async function sweepStaleDevices(deps: AppDeps): Promise<string[]> {
  const now = deps.clock();
  const cutoff = new Date(now.getTime() - deviceStaleAfterMs);
  const rows = await deps.db
    .select({
      device: devices,
      tankName: tanks.name,
      timeZone: sql<string>`coalesce(${tanks.timeZone}, ${companies.timeZone})`,
    })
    .from(devices)
    .innerJoin(tanks, eq(tanks.id, devices.tankId))
    .innerJoin(companies, eq(companies.id, tanks.companyId))
    .where(and(isNull(devices.revokedAt), isNotNull(devices.lastSeenAt)));
  const events: string[] = [];
  for (const { device, tankName, timeZone } of rows) {
    const ruleKey = `device-stale:${device.id}`;
    const lastSeen = device.lastSeenAt!;
    if (lastSeen < cutoff) {
      const text = describeAlert(
        {
          kind: 'device-stale',
          deviceName: device.name,
          lastSeen,
          silentForMs: now.getTime() - lastSeen.getTime(),
        },
        { tankName, timeZone },
      );
      const opened = await openIfNone(deps, {
        companyId: device.companyId,
        tankId: device.tankId,
        kind: 'device-stale',
        ruleKey,
        parameter: null,
        severity: text.severity,
        title: text.title,
        body: text.body,
        openedAt: now,
        lastSeenAt: now,
      });
      if (opened) events.push(opened.eventId);
    } else {
      const resolved = await resolveOpen(deps, device.tankId, ruleKey, now);
      if (resolved) events.push(resolved);
    }
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
    if (now.getTime() - row.lastAt.getTime() <= interval) {
      const resolved = await resolveOpen(deps, row.tankId, ruleKey, now);
      if (resolved) events.push(resolved);
      continue;
    }
    const text = describeAlert(
      { kind: 'test-overdue', parameter, lastMeasuredAt: row.lastAt, intervalMs: interval, now },
      { tankName: row.tankName, timeZone: row.timeZone },
    );
    const opened = await openIfNone(deps, {
      companyId: row.companyId,
      tankId: row.tankId,
      kind: 'test-overdue',
      ruleKey,
      parameter,
      severity: 'notice',
      title: text.title,
      body: text.body,
      openedAt: now,
      lastSeenAt: now,
    });
    if (opened) events.push(opened.eventId);
  }
  return events;
}
