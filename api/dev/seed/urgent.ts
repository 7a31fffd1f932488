/*
 * The demo's urgent visits: the company's settings (a call-out fee, the default first aid), a
 * request behind the urgent heater visit weeks ago (resolved, with
 * every step it went through) and one request open today, acknowledged and waiting for a technician.
 * Everything was announced when it happened, so seeding sends nothing. Rows are keyed by `demoId`
 * and written again in place on the next run.
 */
import { and, asc, eq, ne, sql } from 'drizzle-orm';
import { parameterCatalogue } from '@shared/parameters/catalogue';
import type { UrgentSnapshot } from '@shared/schemas/urgent-requests';
import type { Db } from '../../db/client';
import {
  alerts,
  readings,
  tanks,
  urgentRequestEvents,
  urgentRequests,
  urgentSettings,
  visits,
} from '../../db/schema/index';
import { demoId, demoTankId } from './ids';
import { demoVisitId } from './visits';
import { demoPeople } from '../demo-people';

const minuteMs = 60_000;

export interface SeedUrgentOptions {
  companyId: string;
  /** Ids of the demo people by their identity (`u-mara`…). */
  people: ReadonlyMap<string, string>;
  now: Date;
}

const nameOf = (sub: string) => demoPeople.find((person) => person.sub === sub)!.name;

/** The tank as the request found it: the latest reading of each parameter until then, and the alerts open now. */
async function snapshotAt(
  db: Db,
  tankId: string,
  at: Date,
  withOpenAlerts: boolean,
): Promise<UrgentSnapshot> {
  const latest = await db.execute<{ parameter: string; value: number; measured_at: Date | string }>(sql`
    select distinct on (r.parameter) r.parameter, r.value, r.measured_at
    from ${readings} r
    where r.tank_id = ${tankId} and r.measured_at <= ${at.toISOString()}::timestamptz
    order by r.parameter, r.measured_at desc`);
  const open = withOpenAlerts
    ? await db
        .select({ id: alerts.id, title: alerts.title, severity: alerts.severity, openedAt: alerts.openedAt })
        .from(alerts)
        .where(and(eq(alerts.tankId, tankId), ne(alerts.status, 'resolved')))
        .orderBy(asc(alerts.openedAt))
    : [];
  return {
    readings: latest.rows.map((row) => {
      const info = parameterCatalogue[row.parameter as keyof typeof parameterCatalogue];
      return {
        parameter: row.parameter,
        label: info.label,
        value: row.value,
        unit: info.unit,
        at: new Date(row.measured_at).toISOString(),
      };
    }),
    openAlerts: open.map((alert) => ({ ...alert, openedAt: alert.openedAt.toISOString() })),
  };
}

export async function seedDemoUrgent(db: Db, options: SeedUrgentOptions): Promise<void> {
  const { companyId, people, now } = options;
  const [tank] = await db
    .select({ id: tanks.id })
    .from(tanks)
    .where(and(eq(tanks.companyId, companyId), eq(tanks.id, demoTankId('saltfig-lagoon'))));
  if (!tank) return;
  const ago = (minutes: number) => new Date(now.getTime() - minutes * minuteMs);
  const person = (sub: string) => ({ id: people.get(sub)!, name: nameOf(sub) });

  // The heater that failed overnight at the dental practice: the urgent visit in the visit reports.
  const [heaterVisit] = await db
    .select({
      windowStart: visits.windowStart,
      windowEnd: visits.windowEnd,
      publishedAt: visits.publishedAt,
    })
    .from(visits)
    .where(eq(visits.id, demoVisitId('quayside-reef', 'heater')));
  const quayside = demoTankId('quayside-reef');
  const lagoon = demoTankId('saltfig-lagoon');
  const felix = person('u-felix');
  const rosa = person('u-rosa');
  const priya = person('u-priya');
  const mara = person('u-mara');

  const requests: (typeof urgentRequests.$inferInsert)[] = [];
  const events: (typeof urgentRequestEvents.$inferInsert)[] = [];
  const event = (
    requestKey: string,
    index: number,
    values: Omit<typeof urgentRequestEvents.$inferInsert, 'id' | 'requestId'>,
  ) =>
    events.push({
      id: demoId(`urgent-event:${requestKey}:${index}`),
      requestId: demoId(`urgent-request:${requestKey}`),
      // Told when it happened.
      fannedOutAt: values.at,
      ...values,
    });

  if (heaterVisit?.publishedAt) {
    const arrived = heaterVisit.windowStart;
    const asked = new Date(arrived.getTime() - 95 * minuteMs);
    requests.push({
      id: demoId('urgent-request:quayside-heater'),
      companyId,
      tankId: quayside,
      requestedBy: felix.id,
      requestedByName: felix.name,
      category: 'temperature',
      equipmentId: null,
      description:
        'The fish are hiding and hardly moving, and the glass feels cold. The controller says 21 °C. Nothing is wet and no board has tripped.',
      someoneOnSite: true,
      access: 'Side door on Quay Street; ring the bell and I will let you in.',
      // Ofcom keeps 020 7946 0000–0999 for drama: numbers that reach nobody (from memory).
      phone: '+44 20 7946 0456',
      bestTime: 'As soon as you can',
      status: 'resolved',
      eta: arrived,
      technicianId: priya.id,
      visitId: demoVisitId('quayside-reef', 'heater'),
      callOutFeeCents: 8500,
      currency: 'GBP',
      snapshot: await snapshotAt(db, quayside, asked, false),
      escalationLevel: 0,
      acknowledgedAt: new Date(asked.getTime() + 9 * minuteMs),
      closedAt: heaterVisit.publishedAt,
      createdAt: asked,
    });
    const key = 'quayside-heater';
    event(key, 0, { type: 'requested', actorId: felix.id, actorName: felix.name, at: asked });
    event(key, 1, {
      type: 'acknowledged',
      actorId: priya.id,
      actorName: priya.name,
      note: 'Sounds like a heater. Keep the lid on and do not add warm water; I am bringing a spare.',
      eta: arrived,
      at: new Date(asked.getTime() + 9 * minuteMs),
    });
    event(key, 2, {
      type: 'assigned',
      actorId: priya.id,
      actorName: priya.name,
      eta: arrived,
      at: new Date(asked.getTime() + 10 * minuteMs),
    });
    event(key, 3, {
      type: 'on-the-way',
      actorId: priya.id,
      actorName: priya.name,
      eta: arrived,
      at: new Date(arrived.getTime() - 35 * minuteMs),
    });
    event(key, 4, { type: 'on-site', actorId: priya.id, actorName: priya.name, at: arrived });
    event(key, 5, {
      type: 'resolved',
      actorId: priya.id,
      actorName: priya.name,
      note: 'The visit report is published.',
      at: heaterVisit.publishedAt,
    });
  }

  // Today at the restaurant: the skimmer overflowing, acknowledged and waiting for a technician.
  const asked = ago(25);
  const eta = new Date(now.getTime() + 45 * minuteMs);
  requests.push({
    id: demoId('urgent-request:lagoon-skimmer'),
    companyId,
    tankId: lagoon,
    requestedBy: rosa.id,
    requestedByName: rosa.name,
    category: 'equipment',
    equipmentId: demoId('equipment:saltfig-lagoon:skimmer'),
    description:
      'The skimmer is pouring brown foam and the cup is overflowing onto the plant room floor. I switched it off at the wall; the switch and the floor there are dry.',
    someoneOnSite: true,
    access: 'Staff entrance on Mill Lane; ask at the bar for Rosa.',
    phone: '+44 20 7946 0123',
    bestTime: 'Before 17:00, when dinner service starts',
    status: 'acknowledged',
    eta,
    technicianId: null,
    visitId: null,
    callOutFeeCents: 8500,
    currency: 'GBP',
    snapshot: await snapshotAt(db, lagoon, asked, true),
    escalationLevel: 0,
    acknowledgedAt: ago(12),
    closedAt: null,
    createdAt: asked,
  });
  event('lagoon-skimmer', 0, { type: 'requested', actorId: rosa.id, actorName: rosa.name, at: asked });
  event('lagoon-skimmer', 1, {
    type: 'acknowledged',
    actorId: mara.id,
    actorName: mara.name,
    note: 'Leave the skimmer off and mop up once the area is dry and nothing near it is powered. Tomas comes after his current visit.',
    eta,
    at: ago(12),
  });

  /** On conflict, every column any row names takes the value of the row being inserted. */
  const upsert = <T extends Record<string, unknown>>(rows: T[]) =>
    Object.fromEntries(
      [...new Set(rows.flatMap((row) => Object.keys(row)))]
        .filter((key) => key !== 'id')
        .map((key) => [key, sql.raw(`excluded.${key.replace(/[A-Z]/g, (c) => `_${c.toLowerCase()}`)}`)]),
    );

  await db.transaction(async (tx) => {
    await tx
      .insert(urgentSettings)
      .values({ companyId, ackTargetMinutes: 30, firstAid: {} })
      .onConflictDoUpdate({
        target: urgentSettings.companyId,
        set: { ackTargetMinutes: 30, firstAid: {} },
      });
    await tx
      .insert(urgentRequests)
      .values(requests)
      .onConflictDoUpdate({
        target: urgentRequests.id,
        set: upsert(requests),
      });
    await tx
      .insert(urgentRequestEvents)
      .values(events)
      .onConflictDoUpdate({
        target: urgentRequestEvents.id,
        set: upsert(events),
      });
  });
}
