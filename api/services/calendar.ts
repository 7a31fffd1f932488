import { TZDate } from '@date-fns/tz';
import { and, asc, eq, exists, gte, lte } from 'drizzle-orm';
import ical, { ICalEventStatus } from 'ical-generator';
import { isStaffRole } from '@shared/people/permissions';
import type { CalendarFeedAddress, CalendarFeedStatus } from '@shared/schemas/calendar-feed';
import { visitKindLabels } from '@shared/schemas/visits';
import { isKnownTimeZone } from '@shared/time/time-zones';
import type { Db } from '../db/client';
import { companies, tankMembers, tanks, users, visits } from '../db/schema/index';
import { notFound } from '../lib/http-error';
import { hashToken, newSecretToken } from '../lib/tokens';
import { vtimezone } from '../lib/vtimezone';
import type { Actor } from './actors';

/*
 * A person's schedule as an iCalendar feed (RFC 5545) that calendar apps poll without signing in:
 * the secret in the address is the credential, so only its hash is kept, issuing a new address
 * retires the old one, and the person's status and role are read at every poll.
 */

/** How much of the schedule a feed holds: recent visits for reference, and the season ahead. */
export const calendarPastDays = 30;
export const calendarAheadDays = 180;

const dayMs = 86_400_000;

export function calendarFeedUrl(appOrigin: string, token: string): string {
  return `${appOrigin}/api/calendar/${token}.ics`;
}

export async function calendarFeedStatus(db: Db, actor: Actor): Promise<CalendarFeedStatus> {
  const [row] = await db
    .select({ tokenHash: users.calendarTokenHash })
    .from(users)
    .where(eq(users.id, actor.id));
  return { active: Boolean(row?.tokenHash) };
}

/** A new address for the person's feed; the one before stops working at once. */
export async function issueCalendarFeed(
  db: Db,
  actor: Actor,
  appOrigin: string,
): Promise<CalendarFeedAddress> {
  const token = newSecretToken();
  await db
    .update(users)
    .set({ calendarTokenHash: hashToken(token) })
    .where(eq(users.id, actor.id));
  return { url: calendarFeedUrl(appOrigin, token) };
}

export async function revokeCalendarFeed(db: Db, actor: Actor): Promise<void> {
  await db.update(users).set({ calendarTokenHash: null }).where(eq(users.id, actor.id));
}

/** The person a feed address belongs to, while their account is active. */
async function feedOwner(db: Db, token: string) {
  // Our tokens are 256 bits in base64url; anything else cannot match and needs no look-up.
  if (!/^[\w-]{43}$/.test(token)) return null;
  const [row] = await db
    .select({ id: users.id, role: users.role, companyId: users.companyId, companyName: companies.name })
    .from(users)
    .innerJoin(companies, eq(companies.id, users.companyId))
    .where(and(eq(users.calendarTokenHash, hashToken(token)), eq(users.status, 'active')));
  return row ?? null;
}

/**
 * The feed behind `token`, as iCalendar text: for staff the visits given to them, for owners the
 * visits to their tanks, from `calendarPastDays` back to `calendarAheadDays` ahead of `now`.
 * Cancelled visits stay in, marked CANCELLED, so calendar apps take them off rather than keep a
 * stale copy. Times are written in the tank's zone (else its company's) with a VTIMEZONE for each.
 */
export async function calendarFor(db: Db, token: string, now: Date, appOrigin: string): Promise<string> {
  const person = await feedOwner(db, token);
  if (!person) throw notFound('calendar feed');
  const staff = isStaffRole(person.role);
  const from = new Date(now.getTime() - calendarPastDays * dayMs);
  const to = new Date(now.getTime() + calendarAheadDays * dayMs);
  const whose = staff
    ? eq(visits.technicianId, person.id)
    : exists(
        db
          .select({ one: tankMembers.userId })
          .from(tankMembers)
          .where(and(eq(tankMembers.tankId, visits.tankId), eq(tankMembers.userId, person.id))),
      );
  const rows = await db
    .select({
      id: visits.id,
      tankId: visits.tankId,
      kind: visits.kind,
      status: visits.status,
      windowStart: visits.windowStart,
      windowEnd: visits.windowEnd,
      updatedAt: visits.updatedAt,
      tankName: tanks.name,
      siteLabel: tanks.siteLabel,
      tankZone: tanks.timeZone,
      companyZone: companies.timeZone,
    })
    .from(visits)
    .innerJoin(tanks, eq(tanks.id, visits.tankId))
    .innerJoin(companies, eq(companies.id, tanks.companyId))
    .where(
      and(
        eq(visits.companyId, person.companyId),
        gte(visits.windowStart, from),
        lte(visits.windowStart, to),
        whose,
      ),
    )
    .orderBy(asc(visits.windowStart), asc(visits.id));

  // The zone rules cover a day either side, so a window ending after `to` is still described.
  const zoneFrom = new Date(from.getTime() - dayMs);
  const zoneTo = new Date(to.getTime() + 2 * dayMs);
  const calendar = ical({
    name: staff ? `My visits — ${person.companyName}` : `Visits to my tanks — ${person.companyName}`,
    prodId: { company: 'Brinewatch', product: 'Visits', language: 'EN' },
    // A hint for apps that honour it; the response itself may be cached for 5 minutes.
    ttl: 60 * 60,
    timezone: { name: null, generator: (zone) => vtimezone(zone, zoneFrom, zoneTo) },
  });
  for (const row of rows) {
    // A zone stored before zones were checked must not stop the whole feed.
    const zone = [row.tankZone, row.companyZone].find((z) => z && isKnownTimeZone(z)) ?? 'UTC';
    calendar.createEvent({
      id: `${row.id}@brinewatch`,
      start: new TZDate(row.windowStart.getTime(), zone),
      end: new TZDate(row.windowEnd.getTime(), zone),
      timezone: zone,
      stamp: now,
      lastModified: row.updatedAt,
      summary: `${visitKindLabels[row.kind]} — ${row.tankName}`,
      location: row.siteLabel,
      url: staff ? `${appOrigin}/visits/${row.id}` : `${appOrigin}/tanks/${row.tankId}?section=visits`,
      status: row.status === 'cancelled' ? ICalEventStatus.CANCELLED : null,
    });
  }
  // Every content line ends in CRLF, the last one too (RFC 5545 §3.1); ical-generator stops short of it.
  return calendar.toString().replace(/(\r\n)?$/, '\r\n');
}
