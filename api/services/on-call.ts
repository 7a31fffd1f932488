import { and, asc, desc, eq, gt, inArray, isNotNull, or, sql } from 'drizzle-orm';
import type { DeliveryView, OnCallShiftInput, OnCallShiftView } from '@shared/schemas/on-call';
import { urgentCategoryNames, type UrgentCategory } from '@shared/urgent/categories';
import type { Db } from '../db/client';
import {
  alertEvents,
  alerts,
  careTips,
  conversationMessages,
  deliveries,
  onCallShifts,
  tanks,
  urgentRequestEvents,
  urgentRequests,
  users,
  visits,
} from '../db/schema/index';
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
  // One row per delivery: each subject's tables are left-joined, and only the one the delivery
  // names matches (deliveries_one_subject), so its company decides whether the row is ours.
  const subjectTankId = sql`coalesce(${alerts.tankId}, ${visits.tankId}, ${conversationMessages.tankId}, ${urgentRequests.tankId})`;
  const rows = await db
    .select({
      id: deliveries.id,
      channel: deliveries.channel,
      status: deliveries.status,
      attempts: deliveries.attempts,
      lastError: deliveries.lastError,
      createdAt: deliveries.createdAt,
      alertEventId: deliveries.alertEventId,
      visitId: deliveries.visitId,
      tipId: deliveries.tipId,
      messageId: deliveries.messageId,
      urgentEventId: deliveries.urgentEventId,
      recipient: users.name,
      alertTitle: alerts.title,
      tipTitle: careTips.title,
      urgentRequestId: urgentRequests.id,
      urgentCategory: urgentRequests.category,
      tankId: tanks.id,
      tankName: tanks.name,
    })
    .from(deliveries)
    .innerJoin(users, eq(users.id, deliveries.userId))
    .leftJoin(alertEvents, eq(alertEvents.id, deliveries.alertEventId))
    .leftJoin(alerts, eq(alerts.id, alertEvents.alertId))
    .leftJoin(visits, eq(visits.id, deliveries.visitId))
    .leftJoin(careTips, eq(careTips.id, deliveries.tipId))
    // Only a message's company and tank are read, never its words: it may be an internal note.
    .leftJoin(conversationMessages, eq(conversationMessages.id, deliveries.messageId))
    .leftJoin(urgentRequestEvents, eq(urgentRequestEvents.id, deliveries.urgentEventId))
    .leftJoin(urgentRequests, eq(urgentRequests.id, urgentRequestEvents.requestId))
    .leftJoin(tanks, eq(tanks.id, subjectTankId))
    .where(
      and(
        eq(deliveries.status, 'failed'),
        or(
          and(isNotNull(deliveries.alertEventId), eq(alerts.companyId, actor.companyId)),
          // A visit belongs to its tank's company.
          and(isNotNull(deliveries.visitId), eq(tanks.companyId, actor.companyId)),
          and(isNotNull(deliveries.tipId), eq(careTips.companyId, actor.companyId)),
          and(isNotNull(deliveries.messageId), eq(conversationMessages.companyId, actor.companyId)),
          and(isNotNull(deliveries.urgentEventId), eq(urgentRequests.companyId, actor.companyId)),
        ),
      ),
    )
    .orderBy(desc(deliveries.createdAt), desc(deliveries.id))
    .limit(100);
  return rows.flatMap((row) => {
    const subject = failedDeliverySubject(row);
    // The company test above already needs the subject's row, so this only guards the types.
    if (!subject) return [];
    return [
      {
        id: row.id,
        channel: row.channel,
        status: row.status,
        attempts: row.attempts,
        lastError: row.lastError,
        recipient: row.recipient,
        ...subject,
        createdAt: row.createdAt.toISOString(),
      },
    ];
  });
}

interface FailedDeliveryRow {
  alertEventId: string | null;
  visitId: string | null;
  tipId: string | null;
  messageId: string | null;
  urgentEventId: string | null;
  alertTitle: string | null;
  tipTitle: string | null;
  urgentRequestId: string | null;
  urgentCategory: UrgentCategory | null;
  tankId: string | null;
  tankName: string | null;
}

type DeliverySubject = Pick<DeliveryView, 'kind' | 'about' | 'tankName' | 'link'>;

/** Names the one subject a delivery tells of, and where staff open it. */
function failedDeliverySubject(row: FailedDeliveryRow): DeliverySubject | null {
  const { tankId, tankName } = row;
  if (row.alertEventId && row.alertTitle !== null && tankId) {
    return { kind: 'alert', about: `Alert: ${row.alertTitle}`, tankName, link: `/tanks/${tankId}` };
  }
  if (row.visitId && tankId) {
    return { kind: 'visit', about: 'Visit report', tankName, link: `/visits/${row.visitId}` };
  }
  if (row.tipId && row.tipTitle !== null) {
    return {
      kind: 'tip',
      about: `Care tip: ${row.tipTitle}`,
      tankName: null,
      link: `/console/tips/${row.tipId}`,
    };
  }
  if (row.messageId && tankId) {
    return { kind: 'message', about: 'Message', tankName, link: `/tanks/${tankId}/messages` };
  }
  if (row.urgentEventId && row.urgentRequestId && row.urgentCategory) {
    return {
      kind: 'urgent',
      about: `Urgent visit request: ${urgentCategoryNames[row.urgentCategory].label}`,
      tankName,
      link: `/urgent/${row.urgentRequestId}`,
    };
  }
  return null;
}
