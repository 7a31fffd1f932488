import { aliasedTable, and, asc, desc, eq, inArray, ne, sql, type SQL } from 'drizzle-orm';
import type { AlertListQuery, AlertView } from '@shared/schemas/alerts';
import type { AppDeps } from '../deps';
import type { Db } from '../db/client';
import { alertEvents, alerts, tankMembers, tanks, users } from '../db/schema/index';
import { publishEvent } from '../lib/event-bus';
import { conflict, notFound } from '../lib/http-error';
import { alertJobPriority, queues } from '../lib/job-queue';
import { visibleTanks } from '../policy/index';
import type { Actor } from './actors';
import { evaluateNewReadingsOfTanks, rejudgeLatestReadings, type NewReading } from './alert-engine';
import { withTankAlerts } from './alert-store';
import { fanOutAlertEvent } from './notify';
import { refreshTankStatus } from './tank-status';

const acknowledger = aliasedTable(users, 'acknowledger');

const rankSeverity = sql`case ${alerts.severity} when 'critical' then 0 when 'warning' then 1 else 2 end`;

function statusFilter(status: AlertListQuery['status']): SQL | undefined {
  if (status === 'all') return undefined;
  if (status === 'active') return ne(alerts.status, 'resolved');
  return eq(alerts.status, status);
}

/** The alerts board: the most severe first, then the oldest, within what the actor may see. */
export async function listAlerts(db: Db, actor: Actor, query: AlertListQuery): Promise<AlertView[]> {
  const rows = await db
    .select({
      alert: alerts,
      tank: { id: tanks.id, name: tanks.name, siteLabel: tanks.siteLabel },
      ackName: acknowledger.name,
    })
    .from(alerts)
    .innerJoin(tanks, eq(tanks.id, alerts.tankId))
    .leftJoin(acknowledger, eq(acknowledger.id, alerts.acknowledgedBy))
    .where(
      and(
        visibleTanks(db, actor),
        statusFilter(query.status),
        query.severity ? eq(alerts.severity, query.severity) : undefined,
        query.tankId ? eq(alerts.tankId, query.tankId) : undefined,
      ),
    )
    .orderBy(query.status === 'resolved' ? desc(alerts.resolvedAt) : rankSeverity, asc(alerts.openedAt))
    .limit(query.limit);
  return rows.map(({ alert, tank, ackName }) => present(alert, tank, ackName));
}

function present(
  alert: typeof alerts.$inferSelect,
  tank: { id: string; name: string; siteLabel: string | null },
  ackName: string | null,
): AlertView {
  return {
    id: alert.id,
    tank,
    kind: alert.kind,
    parameter: alert.parameter,
    severity: alert.severity,
    status: alert.status,
    title: alert.title,
    body: alert.body,
    value: alert.value,
    limitValue: alert.limitValue,
    direction: alert.direction,
    openedAt: alert.openedAt.toISOString(),
    lastSeenAt: alert.lastSeenAt.toISOString(),
    acknowledgedAt: alert.acknowledgedAt?.toISOString() ?? null,
    acknowledgedBy: ackName,
    resolvedAt: alert.resolvedAt?.toISOString() ?? null,
  };
}

async function findAlertFor(db: Db, actor: Actor, alertId: string) {
  const [row] = await db
    .select({
      alert: alerts,
      tank: { id: tanks.id, name: tanks.name, siteLabel: tanks.siteLabel },
      ackName: acknowledger.name,
    })
    .from(alerts)
    .innerJoin(tanks, eq(tanks.id, alerts.tankId))
    .leftJoin(acknowledger, eq(acknowledger.id, alerts.acknowledgedBy))
    .where(and(eq(alerts.id, alertId), visibleTanks(db, actor)));
  if (!row) throw notFound('alert');
  return row;
}

export async function getAlert(db: Db, actor: Actor, alertId: string): Promise<AlertView> {
  const { alert, tank, ackName } = await findAlertFor(db, actor, alertId);
  const events = await db
    .select({ event: alertEvents, actorName: users.name })
    .from(alertEvents)
    .leftJoin(users, eq(users.id, alertEvents.actorId))
    .where(eq(alertEvents.alertId, alert.id))
    .orderBy(asc(alertEvents.at), asc(alertEvents.createdAt));
  return {
    ...present(alert, tank, ackName),
    events: events.map(({ event, actorName }) => ({
      id: event.id,
      type: event.type,
      severity: event.severity,
      value: event.value,
      note: event.note,
      actorName,
      at: event.at.toISOString(),
    })),
  };
}

export async function acknowledgeAlert(deps: AppDeps, actor: Actor, alertId: string, note?: string) {
  const { alert } = await findAlertFor(deps.db, actor, alertId);
  const eventId = await withTankAlerts(deps.db, alert.tankId, async (store) => {
    // Read again under the tank's lock: a reading batch or a colleague may have just changed it.
    const current = await store.find(alert.id);
    if (current?.status !== 'open') throw conflict('not_open', 'Only an open alert can be acknowledged.');
    return store.acknowledge(current, { actorId: actor.id, note: note ?? null, at: deps.clock() });
  });
  await announceAlertChange(deps, alert.tankId, alert.companyId, alert.id);
  return { eventId, alert: await getAlert(deps.db, actor, alert.id) };
}

export async function resolveAlert(deps: AppDeps, actor: Actor, alertId: string, note: string) {
  const { alert } = await findAlertFor(deps.db, actor, alertId);
  const eventId = await withTankAlerts(deps.db, alert.tankId, async (store) => {
    const current = await store.find(alert.id);
    if (!current || current.status === 'resolved')
      throw conflict('already_resolved', 'This alert is already resolved.');
    return store.resolve(current, { at: deps.clock(), actorId: actor.id, note });
  });
  await afterAlertEvents(deps, [eventId]);
  return getAlert(deps.db, actor, alert.id);
}

/** Everyone who watches a tank's alerts live: its owners and the company's staff. */
async function watchersOf(db: Db, tankId: string, companyId: string): Promise<string[]> {
  const owners = await db
    .select({ id: tankMembers.userId })
    .from(tankMembers)
    .where(eq(tankMembers.tankId, tankId));
  const staff = await db
    .select({ id: users.id })
    .from(users)
    .where(
      and(
        eq(users.companyId, companyId),
        inArray(users.role, ['technician', 'admin']),
        eq(users.status, 'active'),
      ),
    );
  return [...new Set([...owners, ...staff].map((row) => row.id))];
}

async function announceAlertChange(deps: AppDeps, tankId: string, companyId: string, alertId: string) {
  await publishEvent(deps.pool, {
    type: 'alert',
    userIds: await watchersOf(deps.db, tankId, companyId),
    tankId,
    alertId,
  });
}

/**
 * After alert events are committed: tell every watching screen at once, and plan the
 * notifications — through the job queue when one runs, in-process otherwise (API-only tests).
 */
export async function afterAlertEvents(deps: AppDeps, eventIds: readonly string[]) {
  const changedTanks = new Set<string>();
  for (const eventId of eventIds) {
    const [row] = await deps.db
      .select({
        alertId: alerts.id,
        tankId: alerts.tankId,
        companyId: alerts.companyId,
        severity: alertEvents.severity,
      })
      .from(alertEvents)
      .innerJoin(alerts, eq(alerts.id, alertEvents.alertId))
      .where(eq(alertEvents.id, eventId));
    if (!row) continue;
    changedTanks.add(row.tankId);
    await announceAlertChange(deps, row.tankId, row.companyId, row.alertId);
    if (deps.jobs) {
      await deps.jobs.send(
        queues.fanOut,
        { eventId },
        { singletonKey: eventId, priority: alertJobPriority[row.severity] },
      );
    } else await fanOutAlertEvent(deps, eventId);
  }
  // The overview's order follows at once. The change is already stored and announced, and the
  // sweep and every overview page judge again, so a failure here is only logged.
  if (changedTanks.size > 0) {
    await refreshTankStatus(deps.db, [...changedTanks], deps.clock()).catch((error: unknown) =>
      deps.logger.error({ err: error }, 'storing tank statuses after an alert change failed'),
    );
  }
}

/** After a limits change: the latest readings judged again under the new limits (see the engine). */
export async function rejudgeAfterLimitsChange(deps: AppDeps, tankId: string, latest: readonly NewReading[]) {
  try {
    await afterAlertEvents(deps, await rejudgeLatestReadings(deps.db, tankId, latest));
  } catch (error) {
    deps.logger.error({ err: error, tankId }, 'alert evaluation after a limits change failed');
  }
}

/**
 * Called by every path that stores readings, after their commit. The readings are already
 * safe, so a failure here is logged rather than turned into an error for the sender (who would
 * only send the same readings again); evaluating them again later is harmless. Several tanks'
 * batches are judged in one pass; should that pass fail, each tank is judged again on its own, so
 * one tank's trouble never keeps another's alerts back.
 */
export async function raiseAlertsForTanks(
  deps: AppDeps,
  batches: ReadonlyMap<string, readonly NewReading[]>,
) {
  const judge = async (group: ReadonlyMap<string, readonly NewReading[]>): Promise<string[]> => {
    try {
      return await evaluateNewReadingsOfTanks(deps.db, group);
    } catch (error) {
      if (group.size === 1) {
        deps.logger.error({ err: error, tankId: [...group.keys()][0] }, 'alert evaluation failed');
        return [];
      }
      deps.logger.warn(
        { err: error, tanks: group.size },
        'alert pass of several tanks failed; judging each alone',
      );
      const events: string[] = [];
      for (const [tankId, batch] of group) events.push(...(await judge(new Map([[tankId, batch]]))));
      return events;
    }
  };
  const events = await judge(batches);
  try {
    await afterAlertEvents(deps, events);
  } catch (error) {
    deps.logger.error({ err: error, tanks: [...batches.keys()] }, 'alert notification planning failed');
  }
}
