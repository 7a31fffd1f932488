import { and, asc, eq, gt, inArray, isNull, lt, lte, ne, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import type { NotificationChannel } from '@shared/schemas/notifications';
import { urgentCategoryNames } from '@shared/urgent/categories';
import { defaultAckTargetMinutes, urgentStatusNames, type UrgentStatus } from '@shared/urgent/lifecycle';
import { formatDateTime } from '@shared/text/dates';
import type { AppDeps } from '../deps';
import type { Db } from '../db/client';
import {
  companies,
  deliveries,
  equipment,
  notificationPreferences,
  onCallShifts,
  tankMembers,
  tanks,
  urgentRequestEvents,
  urgentRequests,
  urgentSettings,
  users,
} from '../db/schema/index';
import { publishEvent } from '../lib/event-bus';
import { queues } from '../lib/job-queue';
import type { Actor } from './actors';
import {
  deliverNewsEmail,
  deliverNewsPush,
  firstWords,
  newsBodyLength,
  ownersOf,
  readPreferences,
  tellPerson,
  type News,
  type NewsDelivery,
  type NewsReader,
} from './notify';

/*
 * Who hears of an urgent visit request, and what they read. A new request goes at once to whoever
 * is on call (the company's admins when nobody is), on every channel and through quiet hours: it is
 * the one piece of news staff have asked to be woken for. Left unacknowledged past the company's
 * target it goes to the admins, and again at twice the target. Owners follow each change of status
 * on the channels they chose for urgent updates; they never hear of escalations.
 */

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];
type RequestRow = typeof urgentRequests.$inferSelect;
type EventRow = typeof urgentRequestEvents.$inferSelect;
type EventType = EventRow['type'];

const everyChannel: readonly NotificationChannel[] = ['in-app', 'email', 'push'];

export const urgentLink = (requestId: string) => `/urgent/${requestId}`;

/** One change of a request, written in the transaction that made it. */
export async function recordUrgentEvent(
  tx: Tx,
  event: {
    requestId: string;
    type: EventType;
    actor: Pick<Actor, 'id' | 'name'> | null;
    note?: string;
    eta?: Date | null;
    at: Date;
  },
): Promise<string> {
  const [row] = await tx
    .insert(urgentRequestEvents)
    .values({
      requestId: event.requestId,
      type: event.type,
      actorId: event.actor?.id ?? null,
      actorName: event.actor?.name ?? null,
      note: event.note ?? '',
      eta: event.eta ?? null,
      at: event.at,
    })
    .returning({ id: urgentRequestEvents.id });
  return row!.id;
}

/** Columns a person needs to be told something, as `ownersOf` gives them for owners. */
const readerColumns = {
  id: users.id,
  email: users.email,
  name: users.name,
  timeZone: sql<string>`coalesce(${users.timeZone}, ${companies.timeZone})`,
  preferences: notificationPreferences.preferences,
};

function readersWhere(deps: AppDeps, where: ReturnType<typeof and>) {
  return deps.db
    .select(readerColumns)
    .from(users)
    .innerJoin(companies, eq(companies.id, users.companyId))
    .leftJoin(notificationPreferences, eq(notificationPreferences.userId, users.id))
    .where(and(where, eq(users.status, 'active')))
    .orderBy(asc(users.name), asc(users.id));
}

/** Staff whose on-call shift covers `now` (shifts are instants, so a change of the clocks moves nothing). */
export async function onCallNow(deps: AppDeps, companyId: string, now: Date): Promise<NewsReader[]> {
  const onCall = deps.db
    .select({ userId: onCallShifts.userId })
    .from(onCallShifts)
    .where(
      and(
        eq(onCallShifts.companyId, companyId),
        lte(onCallShifts.startsAt, now),
        gt(onCallShifts.endsAt, now),
      ),
    );
  return readersWhere(
    deps,
    and(eq(users.companyId, companyId), ne(users.role, 'owner'), inArray(users.id, onCall)),
  );
}

function activeAdmins(deps: AppDeps, companyId: string): Promise<NewsReader[]> {
  return readersWhere(deps, and(eq(users.companyId, companyId), eq(users.role, 'admin')));
}

function person(deps: AppDeps, userId: string): Promise<NewsReader[]> {
  return readersWhere(deps, and(eq(users.id, userId)));
}

/** Everyone whose screens show the request: its tank's owners and the company's active staff. */
async function watchers(deps: AppDeps, request: Pick<RequestRow, 'tankId' | 'companyId'>, owners = true) {
  const staff = await deps.db
    .select({ id: users.id })
    .from(users)
    .where(and(eq(users.companyId, request.companyId), ne(users.role, 'owner'), eq(users.status, 'active')));
  const members = owners
    ? await deps.db
        .select({ id: tankMembers.userId })
        .from(tankMembers)
        .where(eq(tankMembers.tankId, request.tankId))
    : [];
  return [...new Set([...members, ...staff].map((row) => row.id))];
}

/** Who is told of one event, and on which channels. */
async function audienceOf(deps: AppDeps, event: EventRow, request: RequestRow, now: Date) {
  const plan = new Map<string, { person: NewsReader; channels: readonly NotificationChannel[] }>();
  const add = (people: NewsReader[], channels?: readonly NotificationChannel[]) => {
    for (const reader of people) {
      if (plan.has(reader.id)) continue;
      const chosen =
        channels ?? readPreferences(reader.preferences, reader.timeZone).preferences.urgentUpdates;
      plan.set(reader.id, { person: reader, channels: chosen });
    }
  };
  if (event.type === 'requested') {
    const onCall = await onCallNow(deps, request.companyId, now);
    add(onCall.length > 0 ? onCall : await activeAdmins(deps, request.companyId), everyChannel);
  } else if (event.type === 'escalated') {
    add(await activeAdmins(deps, request.companyId), everyChannel);
    if ((await escalationLevelOf(deps, event)) >= 2) {
      add(await onCallNow(deps, request.companyId, now), everyChannel);
    }
    return [...plan.values()];
  } else if (event.type === 'assigned' && request.technicianId && request.technicianId !== event.actorId) {
    add(await person(deps, request.technicianId), everyChannel);
  }
  // The owner who sent the request knows they did; anyone else on the tank hears of it.
  const owners = (await ownersOf(deps, request.tankId)).filter(
    (owner) => event.type !== 'requested' || owner.id !== request.requestedBy,
  );
  add(owners);
  return [...plan.values()];
}

/** 1 for the first escalation of a request, 2 for the second. */
async function escalationLevelOf(deps: AppDeps, event: EventRow): Promise<number> {
  const [row] = await deps.db
    .select({ n: sql<number>`count(*)`.mapWith(Number) })
    .from(urgentRequestEvents)
    .where(
      and(
        eq(urgentRequestEvents.requestId, event.requestId),
        eq(urgentRequestEvents.type, 'escalated'),
        lte(urgentRequestEvents.at, event.at),
      ),
    );
  return row?.n ?? 1;
}

async function loadEvent(deps: AppDeps, eventId: string) {
  const [row] = await deps.db
    .select({ event: urgentRequestEvents, request: urgentRequests })
    .from(urgentRequestEvents)
    .innerJoin(urgentRequests, eq(urgentRequests.id, urgentRequestEvents.requestId))
    .where(eq(urgentRequestEvents.id, eventId));
  return row ?? null;
}

/**
 * Plans the notifications of one event: an in-app notification per person and a delivery plus a
 * queued job per e-mail and push destination, all keyed by (event, person or destination), so
 * planning twice sends nothing twice.
 */
export async function fanOutUrgentEvent(deps: AppDeps, eventId: string) {
  const loaded = await loadEvent(deps, eventId);
  if (!loaded) return;
  const { event, request } = loaded;
  const now = deps.clock();
  const audience = await audienceOf(deps, event, request, now);
  let failed = 0;
  for (const { person: reader, channels } of audience) {
    try {
      const news = await loadUrgentNews(deps, eventId, reader.id);
      if (news) await tellPerson(deps, reader, channels, news, now);
    } catch (error) {
      failed += 1;
      deps.logger.error(
        { err: error, userId: reader.id, urgentEventId: eventId },
        'urgent request fan-out failed for one recipient',
      );
    }
  }
  if (failed === 0) {
    await deps.db
      .update(urgentRequestEvents)
      .set({ fannedOutAt: now })
      .where(eq(urgentRequestEvents.id, eventId));
  }
  if (audience.length > 0) {
    await publishEvent(deps.pool, {
      type: 'notification',
      userIds: audience.map((entry) => entry.person.id),
      tankId: request.tankId,
    });
  }
  if (failed > 0) {
    throw new Error(`urgent request fan-out failed for ${failed} of ${audience.length} recipients`);
  }
}

/**
 * After a change is committed: every screen showing the request refetches, and its notifications
 * are planned (through the job queue when one runs, in-process otherwise). The change stands
 * whatever happens here; an event left unannounced is picked up by the minute sweep.
 */
export async function announceUrgentEvent(deps: AppDeps, eventId: string) {
  try {
    const loaded = await loadEvent(deps, eventId);
    if (!loaded) return;
    const { event, request } = loaded;
    await publishEvent(deps.pool, {
      type: 'urgent',
      userIds: await watchers(deps, request, event.type !== 'escalated'),
      tankId: request.tankId,
      requestId: request.id,
    });
    if (deps.jobs) {
      await deps.jobs.send(queues.newsFanOut, { urgentEventId: eventId }, { singletonKey: eventId });
    } else {
      await fanOutUrgentEvent(deps, eventId);
    }
  } catch (error) {
    deps.logger.error({ err: error, urgentEventId: eventId }, 'announcing an urgent request change failed');
  }
}

/** Events whose notifications were never planned (the process stopped between commit and queueing). */
export async function unannouncedUrgentEvents(deps: Pick<AppDeps, 'db' | 'clock'>, olderThanMs: number) {
  const cutoff = new Date(deps.clock().getTime() - olderThanMs);
  const rows = await deps.db
    .select({ id: urgentRequestEvents.id })
    .from(urgentRequestEvents)
    .where(and(isNull(urgentRequestEvents.fannedOutAt), lte(urgentRequestEvents.at, cutoff)))
    .orderBy(asc(urgentRequestEvents.at))
    .limit(100);
  return rows.map((row) => row.id);
}

/**
 * Requests still waiting for an acknowledgement: at the company's target they go to the admins
 * (level 1), at twice the target to the admins and whoever is on call (level 2). One level per
 * request per run; the minute sweep calls it. Returns the escalation events written.
 */
export async function escalateOverdueRequests(deps: AppDeps): Promise<string[]> {
  const now = deps.clock();
  const waiting = await deps.db
    .select({
      id: urgentRequests.id,
      createdAt: urgentRequests.createdAt,
      level: urgentRequests.escalationLevel,
      target: sql<number>`coalesce(${urgentSettings.ackTargetMinutes}, ${defaultAckTargetMinutes})`.mapWith(
        Number,
      ),
    })
    .from(urgentRequests)
    .leftJoin(urgentSettings, eq(urgentSettings.companyId, urgentRequests.companyId))
    .where(and(eq(urgentRequests.status, 'requested'), lt(urgentRequests.escalationLevel, 2)));
  const written: string[] = [];
  for (const request of waiting) {
    const next = request.level + 1;
    const dueAt = request.createdAt.getTime() + next * request.target * 60_000;
    if (now.getTime() < dueAt) continue;
    const waitedMinutes = Math.floor((now.getTime() - request.createdAt.getTime()) / 60_000);
    const eventId = await deps.db.transaction(async (tx) => {
      // Acknowledged, or escalated by another process, since it was read: nothing to do.
      const [moved] = await tx
        .update(urgentRequests)
        .set({ escalationLevel: next })
        .where(
          and(
            eq(urgentRequests.id, request.id),
            eq(urgentRequests.status, 'requested'),
            eq(urgentRequests.escalationLevel, request.level),
          ),
        )
        .returning({ id: urgentRequests.id });
      if (!moved) return null;
      return recordUrgentEvent(tx, {
        requestId: request.id,
        type: 'escalated',
        actor: null,
        note: `Not acknowledged after ${waitedMinutes} minutes (target ${request.target}).`,
        at: now,
      });
    });
    if (!eventId) continue;
    written.push(eventId);
    await announceUrgentEvent(deps, eventId);
  }
  return written;
}

/**
 * An urgent visit's report published while its request is on site answers the request: it is
 * resolved, and the owners hear so with the report.
 */
export async function resolveRequestOfVisit(deps: AppDeps, actor: Actor, visitId: string) {
  const now = deps.clock();
  const eventId = await deps.db.transaction(async (tx) => {
    const [resolved] = await tx
      .update(urgentRequests)
      .set({ status: 'resolved', closedAt: now })
      .where(and(eq(urgentRequests.visitId, visitId), eq(urgentRequests.status, 'on-site')))
      .returning({ id: urgentRequests.id });
    if (!resolved) return null;
    return recordUrgentEvent(tx, {
      requestId: resolved.id,
      type: 'resolved',
      actor,
      note: 'The visit report is published.',
      at: now,
    });
  });
  if (eventId) await announceUrgentEvent(deps, eventId);
}

/* ------------------------------------------------------------------ the words */

/** Owner-typed text inside Markdown stays text: nothing in it turns into formatting or links. */
const asMarkdownText = (text: string) => text.replace(/([\\`*_{}[\]()#+\-.!|<>~])/g, '\\$1');

const technician = alias(users, 'urgent_technician');

/** Where a stopped item is plugged in, as the tank's power board map labels it. */
export function outletOf(item: { powerBoard: string | null; outlet: string | null }): string | null {
  if (item.powerBoard && item.outlet) return `Board ${item.powerBoard}, outlet ${item.outlet}`;
  if (item.powerBoard) return `Board ${item.powerBoard}`;
  return item.outlet ? `Outlet ${item.outlet}` : null;
}

async function newsFacts(deps: AppDeps, eventId: string) {
  const [row] = await deps.db
    .select({
      event: urgentRequestEvents,
      request: urgentRequests,
      tankName: tanks.name,
      siteLabel: tanks.siteLabel,
      zone: sql<string>`coalesce(${tanks.timeZone}, ${companies.timeZone})`,
      technicianName: technician.name,
      equipmentName: equipment.description,
      powerBoard: equipment.powerBoard,
      outlet: equipment.outlet,
    })
    .from(urgentRequestEvents)
    .innerJoin(urgentRequests, eq(urgentRequests.id, urgentRequestEvents.requestId))
    .innerJoin(tanks, eq(tanks.id, urgentRequests.tankId))
    .innerJoin(companies, eq(companies.id, tanks.companyId))
    .leftJoin(technician, eq(technician.id, urgentRequests.technicianId))
    .leftJoin(equipment, eq(equipment.id, urgentRequests.equipmentId))
    .where(eq(urgentRequestEvents.id, eventId));
  return row ?? null;
}

type Facts = NonNullable<Awaited<ReturnType<typeof newsFacts>>>;

/** What staff need to act: the category, the tank, what is happening and how to reach and get in. */
function staffNews(facts: Facts): News {
  const { event, request } = facts;
  const category = urgentCategoryNames[request.category].label;
  const place = facts.siteLabel ? `${facts.tankName} (${facts.siteLabel})` : facts.tankName;
  const titles: Partial<Record<EventType, string>> = {
    requested: `Urgent visit requested: ${category} at ${place}`,
    escalated: `Not yet acknowledged: ${category} at ${place}`,
    assigned: `Urgent visit for you: ${category} at ${place}`,
  };
  const title =
    titles[event.type] ??
    `Urgent visit ${urgentStatusNames[event.type as UrgentStatus].toLowerCase()}: ${category} at ${place}`;
  const waiting = event.type === 'escalated' ? `${event.note} ` : '';
  const outlet = outletOf(facts);
  const equipmentLine = facts.equipmentName
    ? [
        `- **Equipment:** ${asMarkdownText(outlet ? `${facts.equipmentName}, ${outlet}` : facts.equipmentName)}`,
      ]
    : [];
  return {
    subject: { urgentEventId: event.id },
    urgency: 'high',
    tag: `urgent-${request.id}`,
    tankId: request.tankId,
    title,
    body: firstWords(
      `${waiting}${request.requestedByName}, ${request.phone}. ${request.description}`,
      newsBodyLength,
    ),
    link: urgentLink(request.id),
    mailLead: `${waiting}${request.requestedByName} asked for an urgent visit to ${place} on ${formatDateTime(request.createdAt, facts.zone)}: ${category}.`,
    notes: [
      `- **Tank:** ${asMarkdownText(place)}`,
      `- **What is happening:** ${category}`,
      ...equipmentLine,
      `- **Phone:** ${asMarkdownText(request.phone)}`,
      `- **Someone on site:** ${request.someoneOnSite ? 'yes' : 'no'}`,
      `- **Access:** ${request.access ? asMarkdownText(request.access) : 'not given'}`,
      ...(request.bestTime ? [`- **Best time to call:** ${asMarkdownText(request.bestTime)}`] : []),
      '',
      asMarkdownText(request.description),
    ].join('\n'),
    notesHeading: 'The request',
    readLabel: 'Open the request',
    mailHeader: ['X-Brinewatch-Urgent', request.id],
  };
}

/** The status in words, with what the owner waits for: when, who, or why not and what to do. */
function ownerNews(facts: Facts): News {
  const { event, request } = facts;
  const category = urgentCategoryNames[request.category].label;
  const eta = event.eta ?? request.eta;
  const by = eta ? `, expected by ${formatDateTime(eta, facts.zone)}` : '';
  const who = facts.technicianName ?? 'Our technician';
  const type = event.type as UrgentStatus;
  const sentences: Record<UrgentStatus, string> = {
    requested: `${request.requestedByName} asked for an urgent visit to ${facts.tankName}: ${category}.`,
    acknowledged: `We have your request for ${facts.tankName} and are on it${by}.`,
    assigned: `${who} will come to ${facts.tankName}${by}.`,
    'on-the-way': `${who} is on the way to ${facts.tankName}${by}.`,
    'on-site': `${who} is at ${facts.tankName}.`,
    resolved: `Your urgent request for ${facts.tankName} is resolved. The visit report follows once it is published.`,
    declined: `We cannot come to ${facts.tankName} for this request. ${request.declineReason ?? ''}`.trim(),
  };
  const note = event.note && type !== 'declined' ? ` ${event.note}` : '';
  const advice = type === 'declined' && request.advice ? request.advice : '';
  return {
    subject: { urgentEventId: event.id },
    // The owner is waiting on this one; only the closing word may wait for the morning.
    urgency: type === 'resolved' ? 'normal' : 'high',
    tag: `urgent-${request.id}`,
    tankId: request.tankId,
    title:
      type === 'requested'
        ? `Urgent visit requested: ${category}`
        : `Urgent visit: ${urgentStatusNames[type]}`,
    body: firstWords(
      `${sentences[type]}${note}${advice ? ` What to do now: ${advice}` : ''}`,
      newsBodyLength,
    ),
    link: urgentLink(request.id),
    mailLead: `${sentences[type]}${note}`,
    notes: advice ? asMarkdownText(advice) : '',
    notesHeading: advice ? 'What to do now' : null,
    readLabel: 'Follow the request',
    mailHeader: ['X-Brinewatch-Urgent', request.id],
  };
}

/**
 * One event as one person reads it: staff get what they need to act on it, owners the status in
 * words. Null for an event that person is not told of (an escalation, for an owner) or one that is
 * gone.
 */
export async function loadUrgentNews(deps: AppDeps, eventId: string, userId: string): Promise<News | null> {
  const facts = await newsFacts(deps, eventId);
  const [reader] = await deps.db
    .select({ role: users.role, companyId: users.companyId })
    .from(users)
    .where(eq(users.id, userId));
  if (!facts || !reader || reader.companyId !== facts.request.companyId) return null;
  if (reader.role !== 'owner') return staffNews(facts);
  return facts.event.type === 'escalated' ? null : ownerNews(facts);
}

async function urgentDelivery(deps: AppDeps, deliveryId: string): Promise<NewsDelivery | null> {
  const [delivery] = await deps.db.select().from(deliveries).where(eq(deliveries.id, deliveryId));
  if (!delivery || delivery.status !== 'pending' || !delivery.urgentEventId) return null;
  const news = await loadUrgentNews(deps, delivery.urgentEventId, delivery.userId);
  return news ? { delivery, news } : null;
}

export async function deliverUrgentEmail(deps: AppDeps, deliveryId: string) {
  const planned = await urgentDelivery(deps, deliveryId);
  if (planned) await deliverNewsEmail(deps, planned);
}

export async function deliverUrgentPush(deps: AppDeps, deliveryId: string) {
  const planned = await urgentDelivery(deps, deliveryId);
  if (planned) await deliverNewsPush(deps, planned);
}
