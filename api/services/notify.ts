import { and, asc, eq, gt, inArray, isNull, lte, ne, sql } from 'drizzle-orm';
import { firstSteps } from '@shared/alerts/first-steps';
import { inQuietHours, localClockTime } from '@shared/alerts/quiet-hours';
import type { AlertSeverity } from '@shared/alerts/kinds';
import {
  defaultNotificationPreferences,
  notificationPreferences as preferencesSchema,
  type NotificationChannel,
  type NotificationPreferences,
} from '@shared/schemas/notifications';
import type { LimitDirection } from '@shared/parameters/limits';
import { isKnownTimeZone } from '@shared/time/time-zones';
import { visitReportContent } from '@shared/schemas/visits';
import { formatDate } from '@shared/text/dates';
import { markdownToPlainText, renderMarkdown } from '@shared/text/markdown';
import { reportSummary } from '@shared/schemas/visit-summary';
import type { AppDeps } from '../deps';
import {
  alertEvents,
  alerts,
  careTipReaders,
  careTips,
  careTipTanks,
  companies,
  deliveries,
  notificationPreferences,
  notifications,
  onCallShifts,
  pushSubscriptions,
  tankMembers,
  tanks,
  users,
  visits,
} from '../db/schema/index';
import { appOrigin } from '../env';
import { publishEvent } from '../lib/event-bus';
import { escapeHtml } from '../lib/html';
import { alertJobPriority, queues } from '../lib/job-queue';
import { alertTopic, type PushOutcome } from '../lib/web-push-sender';

/** Who hears about an alert: the tank's owners and technician; for critical ones, whoever is on call. */
async function recipientsFor(
  deps: AppDeps,
  tankId: string,
  companyId: string,
  severity: AlertSeverity,
  now: Date,
) {
  const members = deps.db
    .select({ userId: tankMembers.userId })
    .from(tankMembers)
    .where(eq(tankMembers.tankId, tankId));
  const technician = deps.db
    .select({ userId: sql<string>`${tanks.assignedTechnicianId}`.as('user_id') })
    .from(tanks)
    .where(and(eq(tanks.id, tankId), sql`${tanks.assignedTechnicianId} is not null`));
  const ids = new Set<string>([
    ...(await members).map((r) => r.userId),
    ...(await technician).map((r) => r.userId),
  ]);
  if (severity === 'critical') {
    const onCall = await deps.db
      .select({ userId: onCallShifts.userId })
      .from(onCallShifts)
      .where(
        and(
          eq(onCallShifts.companyId, companyId),
          lte(onCallShifts.startsAt, now),
          gt(onCallShifts.endsAt, now),
        ),
      );
    for (const row of onCall) ids.add(row.userId);
  }
  if (ids.size === 0) return [];
  return deps.db
    .select({
      id: users.id,
      email: users.email,
      name: users.name,
      role: users.role,
      timeZone: sql<string>`coalesce(${users.timeZone}, ${companies.timeZone})`,
      preferences: notificationPreferences.preferences,
    })
    .from(users)
    .innerJoin(companies, eq(companies.id, users.companyId))
    .leftJoin(notificationPreferences, eq(notificationPreferences.userId, users.id))
    .where(and(inArray(users.id, [...ids]), eq(users.status, 'active')));
}

export interface ReadPreferences {
  preferences: NotificationPreferences;
  /** Why stored or inherited settings were set aside; null when they were usable as they are. */
  problem: string | null;
}

/**
 * A person's preferences as the fan-out can use them. A zone the runtime does not know (saved
 * before zones were checked, or written straight into the database) gives way to their own or
 * their company's zone, else UTC, keeping their channel choices; anything else unusable gives the
 * defaults. Either way the caller learns why, so one person's settings never stop an alert.
 */
export function readPreferences(stored: unknown, fallbackZone: string): ReadPreferences {
  const zoneUsable = isKnownTimeZone(fallbackZone);
  const zone = zoneUsable ? fallbackZone : defaultNotificationPreferences.timeZone;
  const zoneProblem = zoneUsable ? null : 'their own or their company time zone is unknown';
  if (stored === null || stored === undefined) {
    return { preferences: { ...defaultNotificationPreferences, timeZone: zone }, problem: zoneProblem };
  }
  const parsed = preferencesSchema.safeParse(stored);
  if (parsed.success) return { preferences: parsed.data, problem: null };
  const withZone = preferencesSchema.safeParse({ ...(stored as object), timeZone: zone });
  if (withZone.success) return { preferences: withZone.data, problem: 'their saved time zone is unknown' };
  return {
    preferences: { ...defaultNotificationPreferences, timeZone: zone },
    problem: 'their saved preferences cannot be read',
  };
}

export function preferencesOf(stored: unknown, timeZone: string): NotificationPreferences {
  return readPreferences(stored, timeZone).preferences;
}

/** Every browser where a person turned push on: one delivery each. */
async function pushDestinations(deps: AppDeps, userId: string) {
  const subscriptions = await deps.db
    .select({ id: pushSubscriptions.id })
    .from(pushSubscriptions)
    .where(eq(pushSubscriptions.userId, userId));
  return subscriptions.map((s) => ({ channel: 'push' as const, destination: s.id }));
}

/**
 * Plans the notifications for one alert event: an in-app notification for each person who wants
 * one, and a delivery record plus a queued job per e-mail and push destination. Every record is
 * keyed by (event, channel, destination), so planning twice sends nothing twice.
 */
export async function fanOutAlertEvent(deps: AppDeps, eventId: string) {
  const [row] = await deps.db
    .select({ event: alertEvents, alert: alerts, tankName: tanks.name })
    .from(alertEvents)
    .innerJoin(alerts, eq(alerts.id, alertEvents.alertId))
    .innerJoin(tanks, eq(tanks.id, alerts.tankId))
    .where(eq(alertEvents.id, eventId));
  if (!row) return;
  const { event, alert } = row;
  const now = deps.clock();
  const audience = await recipientsFor(deps, alert.tankId, alert.companyId, event.severity, now);
  const announce = event.type === 'opened' || event.type === 'escalated';
  const link = `/tanks/${alert.tankId}`;
  const title = event.type === 'resolved' ? `Resolved: ${alert.title}` : alert.title;

  async function notifyPerson(person: (typeof audience)[number]) {
    const { preferences, problem } = readPreferences(person.preferences, person.timeZone);
    if (problem) {
      deps.logger.warn(
        { userId: person.id, eventId: event.id, problem },
        'notification preferences unusable; notifying with the defaults',
      );
    }
    const quiet = event.severity !== 'critical' && inQuietHours(preferences, now);
    if (preferences.inApp.includes(event.severity)) {
      await deps.db
        .insert(notifications)
        .values({
          userId: person.id,
          alertId: alert.id,
          alertEventId: event.id,
          severity: event.severity,
          title,
          body: alert.body,
          link,
        })
        .onConflictDoNothing();
    }
    if (quiet) return;
    const planned: Array<{ channel: 'email' | 'push'; destination: string }> = [];
    if (announce && preferences.email.includes(event.severity))
      planned.push({ channel: 'email', destination: person.email });
    if (preferences.push.includes(event.severity)) planned.push(...(await pushDestinations(deps, person.id)));
    for (const delivery of planned) {
      const [created] = await deps.db
        .insert(deliveries)
        .values({
          alertEventId: event.id,
          userId: person.id,
          channel: delivery.channel,
          destination: delivery.destination,
        })
        .onConflictDoNothing()
        .returning({ id: deliveries.id });
      if (created && deps.jobs) {
        await deps.jobs.send(
          delivery.channel === 'email' ? queues.email : queues.push,
          { deliveryId: created.id },
          { priority: alertJobPriority[event.severity] },
        );
      }
    }
  }
  let failed = 0;
  for (const person of audience) {
    try {
      await notifyPerson(person);
    } catch (error) {
      // The others are still told; the job fails afterwards and is retried, which plans nothing twice.
      failed += 1;
      deps.logger.error(
        { err: error, userId: person.id, eventId: event.id },
        'alert fan-out failed for one recipient',
      );
    }
  }

  if (failed === 0) {
    await deps.db.update(alertEvents).set({ fannedOutAt: now }).where(eq(alertEvents.id, event.id));
  }
  await publishEvent(deps.pool, {
    type: 'notification',
    userIds: audience.map((p) => p.id),
    tankId: alert.tankId,
    alertId: alert.id,
  });
  if (failed > 0) throw new Error(`alert fan-out failed for ${failed} of ${audience.length} recipients`);
}

/** Everything a message about one delivery needs, loaded fresh (the alert may have moved on). */
async function loadDelivery(deps: AppDeps, deliveryId: string) {
  const [row] = await deps.db
    .select({
      delivery: deliveries,
      event: alertEvents,
      alert: alerts,
      tankName: tanks.name,
      userName: users.name,
    })
    .from(deliveries)
    .innerJoin(alertEvents, eq(alertEvents.id, deliveries.alertEventId))
    .innerJoin(alerts, eq(alerts.id, alertEvents.alertId))
    .innerJoin(tanks, eq(tanks.id, alerts.tankId))
    .innerJoin(users, eq(users.id, deliveries.userId))
    .where(eq(deliveries.id, deliveryId));
  return row ?? null;
}

function stepsFor(alert: typeof alerts.$inferSelect, severity: AlertSeverity) {
  if (
    severity !== 'critical' ||
    !alert.parameter ||
    (alert.direction !== 'low' && alert.direction !== 'high')
  )
    return null;
  return firstSteps(alert.parameter, alert.direction as LimitDirection, 'critical');
}

export async function markSent(deps: AppDeps, deliveryId: string) {
  await deps.db
    .update(deliveries)
    .set({ status: 'sent', sentAt: deps.clock(), attempts: sql`${deliveries.attempts} + 1` })
    .where(eq(deliveries.id, deliveryId));
}

export async function markAttempt(deps: AppDeps, deliveryId: string, error: string) {
  await deps.db
    .update(deliveries)
    .set({ attempts: sql`${deliveries.attempts} + 1`, lastError: error.slice(0, 500) })
    .where(eq(deliveries.id, deliveryId));
}

/** Header values never carry a line break, whatever a tank is called. */
export const headerSafe = (value: string) => value.replace(/[\r\n]+/g, ' ').slice(0, 200);

export async function deliverEmail(deps: AppDeps, deliveryId: string) {
  const news = await loadNewsDelivery(deps, deliveryId);
  if (news) return deliverNewsEmail(deps, news);
  const row = await loadDelivery(deps, deliveryId);
  if (!row || row.delivery.status !== 'pending') return;
  const { alert, event, delivery } = row;
  const origin = appOrigin(deps.env);
  const link = `${origin}/tanks/${alert.tankId}`;
  const preferencesLink = `${origin}/settings/notifications`;
  const steps = stepsFor(alert, event.severity);
  const text = [
    alert.title,
    '',
    alert.body,
    ...(steps ? ['', 'First steps:', ...steps.steps.map((s) => `- ${s}`), '', ...steps.cautions] : []),
    '',
    `Open the tank: ${link}`,
    '',
    `Change which alerts you get: ${preferencesLink}`,
  ].join('\n');
  const html = `<h1 style="font-size:18px">${escapeHtml(alert.title)}</h1>
<p>${escapeHtml(alert.body)}</p>
${steps ? `<h2 style="font-size:16px">First steps</h2><ol>${steps.steps.map((s) => `<li>${escapeHtml(s)}</li>`).join('')}</ol>${steps.cautions.map((c) => `<p><strong>${escapeHtml(c)}</strong></p>`).join('')}` : ''}
<p><a href="${escapeHtml(link)}">Open the tank in Brinewatch</a></p>
<p style="font-size:12px;color:#555"><a href="${escapeHtml(preferencesLink)}">Change which alerts you get</a></p>`;
  try {
    await deps.mailer.send({
      to: delivery.destination,
      subject: headerSafe(`${event.severity === 'critical' ? 'Critical: ' : ''}${alert.title}`),
      text,
      html,
      headers: { 'List-Unsubscribe': `<${preferencesLink}>`, 'X-Brinewatch-Alert': alert.id },
    });
  } catch (error) {
    await markAttempt(deps, deliveryId, error instanceof Error ? error.message : String(error));
    throw error;
  }
  await markSent(deps, deliveryId);
}

export class RetryLater extends Error {}

export async function deliverPush(deps: AppDeps, deliveryId: string) {
  const news = await loadNewsDelivery(deps, deliveryId);
  if (news) return deliverNewsPush(deps, news);
  const row = await loadDelivery(deps, deliveryId);
  if (!row || row.delivery.status !== 'pending' || !deps.push) return;
  const { alert, event, delivery } = row;
  const subscription = await subscriptionFor(deps, delivery);
  if (!subscription) return;
  const steps = stepsFor(alert, event.severity);
  const payload = {
    alertId: alert.id,
    tankId: alert.tankId,
    severity: event.severity,
    status: event.type === 'resolved' ? 'resolved' : 'open',
    title: event.type === 'resolved' ? `Resolved: ${alert.title}` : alert.title,
    body: steps ? `${alert.body} ${steps.steps[0] ?? ''}`.trim() : alert.body,
    url: `/tanks/${alert.tankId}`,
  };
  const outcome = await deps.push.send(
    { endpoint: subscription.endpoint, keys: { p256dh: subscription.p256dh, auth: subscription.auth } },
    payload,
    {
      ttlSeconds: event.severity === 'critical' ? 24 * 3600 : 6 * 3600,
      urgency: event.severity === 'critical' ? 'high' : 'normal',
      topic: alertTopic(alert.id),
    },
  );
  await settlePush(deps, deliveryId, subscription.id, outcome);
}

/** The subscription a push delivery goes to; a forgotten one marks the delivery gone. */
async function subscriptionFor(deps: AppDeps, delivery: typeof deliveries.$inferSelect) {
  const [subscription] = await deps.db
    .select()
    .from(pushSubscriptions)
    .where(eq(pushSubscriptions.id, delivery.destination));
  if (!subscription) {
    await deps.db.update(deliveries).set({ status: 'gone' }).where(eq(deliveries.id, delivery.id));
    return null;
  }
  return subscription;
}

async function settlePush(deps: AppDeps, deliveryId: string, subscriptionId: string, outcome: PushOutcome) {
  const subscription = { id: subscriptionId };
  switch (outcome.outcome) {
    case 'delivered':
      await markSent(deps, deliveryId);
      await deps.db
        .update(pushSubscriptions)
        .set({ lastSuccessAt: deps.clock() })
        .where(eq(pushSubscriptions.id, subscription.id));
      return;
    case 'gone':
      // RFC 8030 §7.3: the subscription has expired; forget it.
      await deps.db.delete(pushSubscriptions).where(eq(pushSubscriptions.id, subscription.id));
      await deps.db.update(deliveries).set({ status: 'gone' }).where(eq(deliveries.id, deliveryId));
      return;
    case 'rejected':
      await deps.db
        .update(deliveries)
        .set({ status: 'failed', lastError: outcome.detail })
        .where(eq(deliveries.id, deliveryId));
      return;
    case 'retry':
      await markAttempt(deps, deliveryId, outcome.reason);
      if (outcome.afterMs && deps.jobs) {
        // 429: wait exactly as long as the push service asked, then try once more.
        await deps.jobs.sendAfter(queues.push, { deliveryId }, null, Math.ceil(outcome.afterMs / 1000));
        return;
      }
      throw new RetryLater(outcome.reason);
  }
}

/** Events whose fan-out never ran (the process stopped between commit and queueing). */
export async function pendingFanOuts(deps: AppDeps, olderThanMs: number) {
  const cutoff = new Date(deps.clock().getTime() - olderThanMs);
  const rows = await deps.db
    .select({ id: alertEvents.id })
    .from(alertEvents)
    .where(
      and(
        isNull(alertEvents.fannedOutAt),
        lte(alertEvents.createdAt, cutoff),
        ne(alertEvents.type, 'acknowledged'),
      ),
    )
    .limit(100);
  return rows.map((r) => r.id);
}

/*
 * News from the company (a published visit report, a care tip) travels the same path as alerts: an
 * in-app notification, and a delivery record plus a queued job per e-mail and push destination,
 * keyed so that planning twice sends nothing twice. Who hears it and on which channels is the
 * person's "visit reports" or "care tips" preference; in quiet hours the e-mail goes and the push waits.
 */

/** The tank's owners (the people a report is written for), active ones only. */
export async function ownersOf(deps: AppDeps, tankId: string) {
  return deps.db
    .select({
      id: users.id,
      email: users.email,
      name: users.name,
      timeZone: sql<string>`coalesce(${users.timeZone}, ${companies.timeZone})`,
      preferences: notificationPreferences.preferences,
    })
    .from(tankMembers)
    .innerJoin(users, eq(users.id, tankMembers.userId))
    .innerJoin(companies, eq(companies.id, users.companyId))
    .leftJoin(notificationPreferences, eq(notificationPreferences.userId, users.id))
    .where(and(eq(tankMembers.tankId, tankId), eq(users.status, 'active')));
}

export type NewsReader = Awaited<ReturnType<typeof ownersOf>>[number];

/** Seconds from `now` until the person's quiet hours end, on their own clock. */
function secondsUntilQuietEnd(preferences: NotificationPreferences, now: Date): number {
  const minutes = (clock: string) => Number(clock.slice(0, 2)) * 60 + Number(clock.slice(3, 5));
  const local = minutes(localClockTime(now, preferences.timeZone));
  const end = minutes(preferences.quietHours!.end);
  return ((end - local + 1440) % 1440 || 1440) * 60;
}

/** One piece of news as each channel tells it. */
export interface News {
  /** The row it is about, as deliveries (and, but for a message, notifications) name it. */
  subject: { visitId: string } | { tipId: string } | { messageId: string } | { urgentEventId: string };
  /**
   * A conversation's news shares one in-app notification per person and conversation, brought back
   * to unread (with the newest words) by each message, instead of one per message.
   */
  conversationId?: string;
  /**
   * 'high' (an urgent visit request): the push goes at once with RFC 8030 Urgency high, whatever
   * the quiet hours, and the in-app notification is critical. Default: news, which never rings at night.
   */
  urgency?: 'high' | 'normal';
  /** Names it in push tags and topics ("visit-…", "tip-…"). */
  tag: string;
  tankId: string;
  title: string;
  /** What the notification and the push say. */
  body: string;
  link: string;
  /** The e-mail opens with this in place of the body, where the Markdown under it says the rest. */
  mailLead?: string;
  /** Markdown the e-mail carries whole (a report's notes, a tip), under its heading if it has one. */
  notes: string;
  notesHeading: string | null;
  /** What the e-mail's link offers ("Read the report"). */
  readLabel: string;
  mailHeader: readonly [name: string, value: string];
}

async function loadVisitNews(deps: AppDeps, visitId: string): Promise<News | null> {
  const [row] = await deps.db
    .select({
      visit: visits,
      tankName: tanks.name,
      tankZone: sql<string>`coalesce(${tanks.timeZone}, ${companies.timeZone})`,
      technicianName: users.name,
    })
    .from(visits)
    .innerJoin(tanks, eq(tanks.id, visits.tankId))
    .innerJoin(companies, eq(companies.id, tanks.companyId))
    // The technician of the visit; whoever published it when none is named.
    .leftJoin(users, eq(users.id, sql`coalesce(${visits.technicianId}, ${visits.publishedBy})`))
    .where(eq(visits.id, visitId));
  if (!row || row.visit.published === null) return null;
  const report = visitReportContent.parse(row.visit.published);
  const when = formatDate(new Date(report.arrivedAt ?? row.visit.windowStart), row.tankZone);
  const summary = reportSummary(report);
  return {
    subject: { visitId: row.visit.id },
    tag: `visit-${row.visit.id}`,
    tankId: row.visit.tankId,
    title: `Visit report: ${row.tankName}`,
    body: `${row.technicianName ?? 'Your technician'} visited on ${when}. ${summary}`.trim(),
    link: `/tanks/${row.visit.tankId}?section=visits&visit=${row.visit.id}`,
    notes: report.notes.trim(),
    notesHeading: 'Notes',
    readLabel: 'Read the report',
    mailHeader: ['X-Brinewatch-Visit', row.visit.id],
  };
}

/**
 * Tells one person a piece of news on the channels they chose for its kind. Every row is keyed
 * (notification per person and subject, delivery per subject, channel and destination), so telling
 * them again sends nothing twice.
 */
export async function tellPerson(
  deps: AppDeps,
  person: NewsReader,
  channels: readonly NotificationChannel[],
  news: News,
  now: Date,
) {
  const { preferences } = readPreferences(person.preferences, person.timeZone);
  const urgent = news.urgency === 'high';
  if (channels.includes('in-app')) {
    const notice = {
      userId: person.id,
      severity: urgent ? ('critical' as const) : ('notice' as const),
      title: news.title,
      body: news.body,
      link: news.link,
    };
    if (news.conversationId) {
      await deps.db
        .insert(notifications)
        .values({ ...notice, conversationId: news.conversationId })
        .onConflictDoUpdate({
          target: [notifications.userId, notifications.conversationId],
          set: { title: notice.title, body: notice.body, link: notice.link, readAt: null, createdAt: now },
        });
    } else if (!('messageId' in news.subject)) {
      await deps.db
        .insert(notifications)
        .values({ ...notice, ...news.subject })
        .onConflictDoNothing();
    }
  }
  // News is rarely urgent: in quiet hours the e-mail still goes (it rings nothing), and the push
  // waits until the quiet hours end. An urgent request's push goes at once.
  const holdPushS = !urgent && inQuietHours(preferences, now) ? secondsUntilQuietEnd(preferences, now) : 0;
  const planned: Array<{ channel: 'email' | 'push'; destination: string }> = [];
  if (channels.includes('email')) planned.push({ channel: 'email', destination: person.email });
  if (channels.includes('push')) planned.push(...(await pushDestinations(deps, person.id)));
  for (const delivery of planned) {
    const [created] = await deps.db
      .insert(deliveries)
      .values({ ...news.subject, userId: person.id, ...delivery })
      .onConflictDoNothing()
      .returning({ id: deliveries.id });
    if (created && deps.jobs) {
      if (delivery.channel === 'push' && holdPushS > 0) {
        await deps.jobs.sendAfter(queues.push, { deliveryId: created.id }, null, holdPushS);
      } else {
        await deps.jobs.send(
          delivery.channel === 'email' ? queues.email : queues.push,
          { deliveryId: created.id },
          // An urgent request is told as soon as a critical alert; other news after both.
          { priority: urgent ? alertJobPriority.critical : alertJobPriority.notice },
        );
      }
    }
  }
}

export async function fanOutVisitReport(deps: AppDeps, visitId: string) {
  const news = await loadVisitNews(deps, visitId);
  if (!news) return;
  const now = deps.clock();
  const audience = await ownersOf(deps, news.tankId);
  let failed = 0;
  for (const person of audience) {
    try {
      const { preferences } = readPreferences(person.preferences, person.timeZone);
      await tellPerson(deps, person, preferences.visitReports, news, now);
    } catch (error) {
      failed += 1;
      deps.logger.error(
        { err: error, userId: person.id, visitId },
        'visit report fan-out failed for one recipient',
      );
    }
  }
  if (failed === 0) await deps.db.update(visits).set({ announcedAt: now }).where(eq(visits.id, visitId));
  await publishEvent(deps.pool, {
    type: 'notification',
    userIds: audience.map((p) => p.id),
    tankId: news.tankId,
  });
  if (failed > 0)
    throw new Error(`visit report fan-out failed for ${failed} of ${audience.length} recipients`);
}

/** Short enough for a notification list and a push payload (RFC 8291 leaves about 3,900 bytes). */
export const newsBodyLength = 280;

export function firstWords(text: string, max: number): string {
  const flat = text.replace(/\s+/g, ' ').trim();
  if (flat.length <= max) return flat;
  const cut = flat.slice(0, max - 1);
  const lastSpace = cut.lastIndexOf(' ');
  return `${(lastSpace > max / 2 ? cut.slice(0, lastSpace) : cut).replace(/[\s,;:.–-]+$/, '')}…`;
}

/**
 * A delivered tip as one reader hears of it (sent, or one-tapped to their tank before its set time):
 * the link opens the first of their tanks it reached. A withdrawn tip is no news any more, so its
 * pending e-mails and pushes are not sent.
 */
async function loadTipNews(deps: AppDeps, tipId: string, userId: string): Promise<News | null> {
  const [tip] = await deps.db
    .select({ tip: careTips, companyName: companies.name })
    .from(careTips)
    .innerJoin(companies, eq(companies.id, careTips.companyId))
    .where(eq(careTips.id, tipId));
  if (!tip || tip.tip.status === 'withdrawn' || tip.tip.status === 'draft') return null;
  const [tank] = await deps.db
    .select({ id: tanks.id, name: tanks.name })
    .from(careTipTanks)
    .innerJoin(tanks, eq(tanks.id, careTipTanks.tankId))
    .where(
      and(
        eq(careTipTanks.tipId, tipId),
        sql`exists (select 1 from ${careTipReaders} r where r.tip_id = ${careTipTanks.tipId}
          and r.tank_id = ${careTipTanks.tankId} and r.user_id = ${userId})`,
      ),
    )
    .orderBy(asc(careTipTanks.deliveredAt), asc(tanks.name), asc(tanks.id))
    .limit(1);
  if (!tank) return null;
  return {
    subject: { tipId },
    tag: `tip-${tipId}`,
    tankId: tank.id,
    title: `Care tip: ${tip.tip.title}`,
    body: firstWords(markdownToPlainText(tip.tip.body), newsBodyLength),
    link: `/tanks/${tank.id}?section=timeline&tip=${tipId}`,
    mailLead: `${tip.companyName} sent this care tip for ${tank.name}.`,
    notes: tip.tip.body,
    notesHeading: null,
    readLabel: 'Read the tip',
    mailHeader: ['X-Brinewatch-Tip', tipId],
  };
}

/**
 * Tells everyone a tip reached, once per person however many of their tanks it reached (the
 * notification's once-key is person and tip), by their "care tips" preference. Run again after a
 * later delivery, it tells only the people new to it.
 */
export async function fanOutCareTip(deps: AppDeps, tipId: string) {
  const now = deps.clock();
  const readers = await deps.db
    .selectDistinct({
      id: users.id,
      email: users.email,
      name: users.name,
      timeZone: sql<string>`coalesce(${users.timeZone}, ${companies.timeZone})`,
      preferences: notificationPreferences.preferences,
    })
    .from(careTipReaders)
    .innerJoin(careTips, eq(careTips.id, careTipReaders.tipId))
    .innerJoin(users, eq(users.id, careTipReaders.userId))
    .innerJoin(companies, eq(companies.id, users.companyId))
    .leftJoin(notificationPreferences, eq(notificationPreferences.userId, users.id))
    .where(
      and(eq(careTipReaders.tipId, tipId), ne(careTips.status, 'withdrawn'), eq(users.status, 'active')),
    );
  let failed = 0;
  for (const person of readers) {
    try {
      const news = await loadTipNews(deps, tipId, person.id);
      if (!news) continue;
      const { preferences } = readPreferences(person.preferences, person.timeZone);
      await tellPerson(deps, person, preferences.careTips, news, now);
    } catch (error) {
      failed += 1;
      deps.logger.error(
        { err: error, userId: person.id, tipId },
        'care tip fan-out failed for one recipient',
      );
    }
  }
  if (readers.length > 0) {
    await publishEvent(deps.pool, { type: 'notification', userIds: readers.map((p) => p.id) });
  }
  if (failed > 0) throw new Error(`care tip fan-out failed for ${failed} of ${readers.length} recipients`);
}

async function loadNewsDelivery(deps: AppDeps, deliveryId: string) {
  const [delivery] = await deps.db
    .select()
    .from(deliveries)
    .where(
      and(
        eq(deliveries.id, deliveryId),
        sql`(${deliveries.visitId} is not null or ${deliveries.tipId} is not null)`,
      ),
    );
  if (!delivery || delivery.status !== 'pending') return null;
  const news = delivery.visitId
    ? await loadVisitNews(deps, delivery.visitId)
    : await loadTipNews(deps, delivery.tipId!, delivery.userId);
  return news ? { delivery, news } : null;
}

export interface NewsDelivery {
  delivery: typeof deliveries.$inferSelect;
  news: News;
}

export async function deliverNewsEmail(deps: AppDeps, { delivery, news }: NewsDelivery) {
  const origin = appOrigin(deps.env);
  const link = `${origin}${news.link}`;
  const preferencesLink = `${origin}/settings/notifications`;
  // A mail client has no session for our photos, and no page to resolve a relative link against.
  const forMail = { origin };
  const lead = news.mailLead ?? news.body;
  const heading = news.notesHeading;
  try {
    await deps.mailer.send({
      to: delivery.destination,
      subject: headerSafe(news.title),
      text: [
        news.title,
        '',
        lead,
        '',
        ...(news.notes
          ? [...(heading ? [`${heading}:`, ''] : []), markdownToPlainText(news.notes, forMail), '']
          : []),
        `${news.readLabel}: ${link}`,
        '',
        `Change what you hear about: ${preferencesLink}`,
      ].join('\n'),
      html: `<h1 style="font-size:18px">${escapeHtml(news.title)}</h1>
<p>${escapeHtml(lead)}</p>
${news.notes ? `${heading ? `<h2 style="font-size:16px">${escapeHtml(heading)}</h2>\n` : ''}${renderMarkdown(news.notes, forMail)}` : ''}
<p><a href="${escapeHtml(link)}">${escapeHtml(news.readLabel)} in Brinewatch</a></p>
<p style="font-size:12px;color:#555"><a href="${escapeHtml(preferencesLink)}">Change what you hear about</a></p>`,
      headers: { 'List-Unsubscribe': `<${preferencesLink}>`, [news.mailHeader[0]]: news.mailHeader[1] },
    });
  } catch (error) {
    await markAttempt(deps, delivery.id, error instanceof Error ? error.message : String(error));
    throw error;
  }
  await markSent(deps, delivery.id);
}

/** "visit-<id>" as a push topic: RFC 8030 §5.4 allows at most 32 URL-safe characters. */
function topicOf(tag: string): string {
  const [kind, ...id] = tag.split('-');
  return `${kind}-${id.join('')}`.slice(0, 32);
}

export async function deliverNewsPush(deps: AppDeps, { delivery, news }: NewsDelivery) {
  if (!deps.push) return;
  const subscription = await subscriptionFor(deps, delivery);
  if (!subscription) return;
  const outcome = await deps.push.send(
    { endpoint: subscription.endpoint, keys: { p256dh: subscription.p256dh, auth: subscription.auth } },
    {
      tag: news.tag,
      tankId: news.tankId,
      title: news.title,
      body: news.body,
      url: news.link,
    },
    news.urgency === 'high'
      ? { ttlSeconds: 24 * 3600, urgency: 'high', topic: topicOf(news.tag) }
      : { ttlSeconds: 3 * 24 * 3600, urgency: 'normal', topic: topicOf(news.tag) },
  );
  await settlePush(deps, delivery.id, subscription.id, outcome);
}
