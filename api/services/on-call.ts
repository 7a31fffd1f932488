import { and, asc, desc, eq, gt, inArray } from 'drizzle-orm';
import type { DeliveryView, OnCallShiftInput, OnCallShiftView } from '@shared/schemas/on-call';
import type { Db } from '../db/client';
import { alertEvents, alerts, deliveries, onCallShifts, tanks, users } from '../db/schema/index';
import { badRequest, notFound } from '../lib/http-error';
import type { Actor } from './actors';

/** Shifts that have not ended yet, soonest first. */
export async function listShifts(db: Db, actor: Actor, now: Date): Promise<OnCallShiftView[]> {
  const rows = await db
    .select({ shift: onCallShifts, name: users.name })
    .from(onCallShifts)
    .innerJoin(users, eq(users.id, onCallShifts.userId))
    .where(and(eq(onCallShifts.companyId, actor.companyId), gt(onCallShifts.endsAt, now)))
    .orderBy(asc(onCallShifts.startsAt));
  return rows.map(({ shift, name }) => ({
    id: shift.id,
    user: { id: shift.userId, name },
    startsAt: shift.startsAt.toISOString(),
    endsAt: shift.endsAt.toISOString(),
    current: shift.startsAt <= now && shift.endsAt > now,
  }));
}

export async function addShift(db: Db, actor: Actor, input: OnCallShiftInput, now: Date) {
  const [person] = await db
    .select({ id: users.id })
    .from(users)
    .where(
      and(
        eq(users.id, input.userId),
        eq(users.companyId, actor.companyId),
        inArray(users.role, ['technician', 'admin']),
        eq(users.status, 'active'),
      ),
    );
  if (!person)
    throw badRequest('invalid_request', 'Choose an active member of staff.', [
      { path: 'body.userId', message: 'Not a member of your staff.' },
    ]);
  await db.insert(onCallShifts).values({
    companyId: actor.companyId,
    userId: person.id,
    startsAt: new Date(input.startsAt),
    endsAt: new Date(input.endsAt),
  });
  return listShifts(db, actor, now);
}

export async function removeShift(db: Db, actor: Actor, shiftId: string) {
  const [removed] = await db
    .delete(onCallShifts)
    .where(and(eq(onCallShifts.id, shiftId), eq(onCallShifts.companyId, actor.companyId)))
    .returning({ id: onCallShifts.id });
  if (!removed) throw notFound('shift');
}

/** Deliveries that could not be made (out of retries, or refused): what staff follow up by hand. */
export async function listFailedDeliveries(db: Db, actor: Actor): Promise<DeliveryView[]> {
  const rows = await db
    .select({ delivery: deliveries, recipient: users.name, alertTitle: alerts.title, tankName: tanks.name })
    .from(deliveries)
    .innerJoin(alertEvents, eq(alertEvents.id, deliveries.alertEventId))
    .innerJoin(alerts, eq(alerts.id, alertEvents.alertId))
    .innerJoin(tanks, eq(tanks.id, alerts.tankId))
    .innerJoin(users, eq(users.id, deliveries.userId))
    .where(and(eq(alerts.companyId, actor.companyId), eq(deliveries.status, 'failed')))
    .orderBy(desc(deliveries.createdAt))
    .limit(100);
  return rows.map(({ delivery, recipient, alertTitle, tankName }) => ({
    id: delivery.id,
    channel: delivery.channel,
    status: delivery.status,
    attempts: delivery.attempts,
    lastError: delivery.lastError,
    recipient,
    alertTitle,
    tankName,
    createdAt: delivery.createdAt.toISOString(),
  }));
}
