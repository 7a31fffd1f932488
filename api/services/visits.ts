import { and, asc, desc, eq, gt, gte, inArray, isNull, lt, lte, ne, or, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { roleCan } from '@shared/people/permissions';
import { futureToleranceMs } from '@shared/schemas/readings';
import {
  emptyReport,
  visitReportContent,
  type CarriedItem,
  type NextVisitEntry,
  type ScheduleQuery,
  type TankVisits,
  type VisitDetail,
  type VisitReportContent,
  type VisitSummary,
  type publishReportInput,
  type saveReportInput,
  type scheduleVisitInput,
  type updateVisitInput,
} from '@shared/schemas/visits';
import { addDays, formatISO } from 'date-fns';
import { occurrenceDays, routineRule, wallTimeOf, zonedWindow } from '@shared/visits/recurrence';
import type { z } from 'zod';
import type { AppDeps } from '../deps';
import type { Db } from '../db/client';
import {
  companies,
  equipment,
  livestock,
  photos,
  priceItems,
  tanks,
  users,
  visitItems,
  visitPhotos,
  visitReportVersions,
  visits,
  visitSeries,
} from '../db/schema/index';
import { badRequest, conflict, forbidden, notFound, type ErrorIssue } from '../lib/http-error';
import { queues } from '../lib/job-queue';
import { findTankFor, isStaff, visibleTanks } from '../policy/index';
import type { Actor } from './actors';
import {
  compatibilityFor,
  findLivestockIn,
  insertLivestock,
  recordLivestockStatus,
  type CompatibilityResult,
} from './livestock';
import { fanOutVisitReport } from './notify';
import { commitReadings, insertManualRows, manualTimeIssues, type Tx } from './readings';
import { resolveSpecies } from './species';
import { invalidFields } from './tanks';
import { resolveRequestOfVisit } from './urgent-notify';

type VisitRow = typeof visits.$inferSelect;
type TankRow = typeof tanks.$inferSelect;
type ScheduleVisit = z.output<typeof scheduleVisitInput>;
type UpdateVisit = z.output<typeof updateVisitInput>;
type SaveReport = z.output<typeof saveReportInput>;
type PublishReport = z.output<typeof publishReportInput>;

/** How far ahead a repeating service is written out when it is created (common practice: a quarter). */
const seriesHorizonDays = 91;
/** How far ahead anyone may look at, or write out, the schedule. */
const scheduleMaxAheadDays = 400;

const technician = alias(users, 'visit_technician');
const publisher = alias(users, 'visit_publisher');

const isoDay = (date: Date) => formatISO(date, { representation: 'date' });
const dayAfter = (day: string, days: number) => isoDay(addDays(new Date(`${day}T00:00:00Z`), days));

async function zoneOfTank(db: Db | Tx, tank: Pick<TankRow, 'timeZone' | 'companyId'>): Promise<string> {
  if (tank.timeZone) return tank.timeZone;
  const [company] = await db
    .select({ timeZone: companies.timeZone })
    .from(companies)
    .where(eq(companies.id, tank.companyId));
  return company!.timeZone;
}

/** A technician of the same company who is still active, or a 400 on the field that named them. */
async function checkTechnician(db: Db | Tx, actor: Actor, technicianId: string, path: string) {
  const [person] = await db
    .select({ id: users.id })
    .from(users)
    .where(
      and(
        eq(users.id, technicianId),
        eq(users.companyId, actor.companyId),
        eq(users.status, 'active'),
        ne(users.role, 'owner'),
      ),
    );
  if (!person) throw invalidFields([{ path, message: 'choose an active member of staff' }]);
}

/** Giving a visit to someone else is an admin's call; technicians plan their own. */
function checkMayAssign(actor: Actor, technicianId: string | null | undefined) {
  if (technicianId === undefined || technicianId === actor.id) return;
  if (!roleCan(actor.role, 'visits:assign')) {
    throw forbidden('Only an admin can give a visit to someone else.');
  }
}

const summaryColumns = {
  visit: visits,
  tankName: tanks.name,
  siteLabel: tanks.siteLabel,
  tankZone: sql<string>`coalesce(${tanks.timeZone}, ${companies.timeZone})`,
  technicianName: technician.name,
  publisherName: publisher.name,
};

type SummaryRow = {
  visit: VisitRow;
  tankName: string;
  siteLabel: string | null;
  tankZone: string;
  technicianName: string | null;
  publisherName: string | null;
};

function summaryQuery(db: Db) {
  return db
    .select(summaryColumns)
    .from(visits)
    .innerJoin(tanks, eq(tanks.id, visits.tankId))
    .innerJoin(companies, eq(companies.id, tanks.companyId))
    .leftJoin(technician, eq(technician.id, visits.technicianId))
    .leftJoin(publisher, eq(publisher.id, visits.publishedBy));
}

/** A planning note ("bring epoxy") is for staff; owners get the visit without it. */
function summaryOf(row: SummaryRow, forStaff = true): VisitSummary {
  const { visit } = row;
  return {
    id: visit.id,
    tankId: visit.tankId,
    tankName: row.tankName,
    siteLabel: row.siteLabel,
    timeZone: row.tankZone,
    kind: visit.kind,
    status: visit.status,
    technician:
      visit.technicianId && row.technicianName ? { id: visit.technicianId, name: row.technicianName } : null,
    windowStart: visit.windowStart.toISOString(),
    windowEnd: visit.windowEnd.toISOString(),
    repeats: visit.seriesId !== null,
    note: forStaff ? visit.note : null,
    publishedAt: visit.publishedAt?.toISOString() ?? null,
    editedAt: visit.editedAt?.toISOString() ?? null,
  };
}

/** Stored reports were checked when saved; parsing again fills defaults added since. */
const contentOf = (stored: unknown): VisitReportContent =>
  stored === null || stored === undefined ? emptyReport : visitReportContent.parse(stored);

function itemOf(row: typeof visitItems.$inferSelect): CarriedItem {
  return {
    id: row.id,
    text: row.text,
    fromVisitId: row.fromVisitId,
    openedAt: row.openedAt.toISOString(),
    closedInVisitId: row.closedInVisitId,
    closedAt: row.closedAt?.toISOString() ?? null,
  };
}

/** Items open on the tank, plus those this visit closed (so its checklist still shows them ticked). */
async function itemsFor(db: Db | Tx, tankId: string, visitId: string | null) {
  const rows = await db
    .select()
    .from(visitItems)
    .where(
      and(
        eq(visitItems.tankId, tankId),
        visitId
          ? and(
              or(isNull(visitItems.closedAt), eq(visitItems.closedInVisitId, visitId)),
              ne(visitItems.fromVisitId, visitId),
            )
          : isNull(visitItems.closedAt),
      ),
    )
    .orderBy(asc(visitItems.openedAt), asc(visitItems.id));
  return rows.map(itemOf);
}

/** A visit the actor may see: any of their company's for staff; a published one of their tank for owners. */
async function findVisitFor(db: Db, actor: Actor, visitId: string): Promise<SummaryRow> {
  const [row] = await summaryQuery(db).where(
    and(
      eq(visits.id, visitId),
      visibleTanks(db, actor),
      isStaff(actor) ? undefined : eq(visits.status, 'published'),
    ),
  );
  if (!row) throw notFound('visit');
  return row;
}

async function detailOf(db: Db, actor: Actor, row: SummaryRow): Promise<VisitDetail> {
  const { visit } = row;
  const [tank] = await db
    .select({ display: tanks.displayVolumeL, sump: tanks.sumpVolumeL, waterType: tanks.waterType })
    .from(tanks)
    .where(eq(tanks.id, visit.tankId));
  const versions = await db
    .select({ version: visitReportVersions.version, publishedAt: visitReportVersions.publishedAt })
    .from(visitReportVersions)
    .where(eq(visitReportVersions.visitId, visit.id))
    .orderBy(desc(visitReportVersions.version));
  const staff = isStaff(actor);
  const draft = staff ? contentOf(visit.draft) : null;
  const published = visit.published === null ? null : contentOf(visit.published);
  const usedIds = [
    ...new Set(
      [...(draft?.itemsUsed ?? []), ...(published?.itemsUsed ?? [])].map((item) => item.priceItemId),
    ),
  ];
  const usedItems =
    usedIds.length === 0
      ? []
      : await db
          .select({ id: priceItems.id, name: priceItems.name, unit: priceItems.unit })
          .from(priceItems)
          .where(and(eq(priceItems.companyId, visit.companyId), inArray(priceItems.id, usedIds)));
  return {
    ...summaryOf(row, staff),
    draft,
    version: visit.version,
    published,
    publishedBy:
      visit.publishedBy && row.publisherName ? { id: visit.publishedBy, name: row.publisherName } : null,
    carriedItems: staff ? await itemsFor(db, visit.tankId, visit.id) : [],
    systemVolumeL: tank!.display + tank!.sump,
    waterType: tank!.waterType,
    earlierVersions: versions.map((v) => ({ version: v.version, publishedAt: v.publishedAt.toISOString() })),
    usedItems,
  };
}

export async function getVisit(db: Db, actor: Actor, visitId: string): Promise<VisitDetail> {
  return detailOf(db, actor, await findVisitFor(db, actor, visitId));
}

/** An earlier published text of a report, for "edited" to show what changed. */
export async function getVisitVersion(
  db: Db,
  actor: Actor,
  visitId: string,
  version: number,
): Promise<VisitReportContent> {
  const { visit } = await findVisitFor(db, actor, visitId);
  const [row] = await db
    .select({ content: visitReportVersions.content })
    .from(visitReportVersions)
    .where(and(eq(visitReportVersions.visitId, visit.id), eq(visitReportVersions.version, version)));
  if (!row) throw notFound('report version');
  return contentOf(row.content);
}

/** Writes out a series' visits up to `until` (idempotent: one visit per series day). */
async function writeSeries(
  db: Db | Tx,
  series: typeof visitSeries.$inferSelect,
  zone: string,
  until: string,
) {
  if (series.endedAt || series.writtenUntil >= until) return;
  const days = occurrenceDays(series.rrule, series.firstDay, dayAfter(series.writtenUntil, 1), until);
  if (days.length > 0) {
    await db
      .insert(visits)
      .values(
        days.map((day) => {
          const window = zonedWindow(day, series.startTime, series.endTime, zone);
          return {
            companyId: series.companyId,
            tankId: series.tankId,
            seriesId: series.id,
            occurrenceDay: day,
            technicianId: series.technicianId,
            kind: 'routine' as const,
            windowStart: window.start,
            windowEnd: window.end,
          };
        }),
      )
      .onConflictDoNothing();
  }
  await db.update(visitSeries).set({ writtenUntil: until }).where(eq(visitSeries.id, series.id));
}

/** Makes sure every series of the company exists as visits up to `until` before the schedule is read. */
async function writeCompanySeries(db: Db, companyId: string, until: string) {
  const rows = await db
    .select({
      series: visitSeries,
      tankZone: sql<string>`coalesce(${tanks.timeZone}, ${companies.timeZone})`,
    })
    .from(visitSeries)
    .innerJoin(tanks, eq(tanks.id, visitSeries.tankId))
    .innerJoin(companies, eq(companies.id, tanks.companyId))
    .where(
      and(
        eq(visitSeries.companyId, companyId),
        isNull(visitSeries.endedAt),
        lt(visitSeries.writtenUntil, until),
      ),
    );
  for (const row of rows) await writeSeries(db, row.series, row.tankZone, until);
}

export async function scheduleVisit(
  deps: Pick<AppDeps, 'db' | 'clock'>,
  actor: Actor,
  input: ScheduleVisit,
): Promise<VisitSummary> {
  const { db } = deps;
  const tank = await findTankFor(db, actor, input.tankId, 'write');
  const technicianId = input.technicianId === undefined ? actor.id : input.technicianId;
  checkMayAssign(actor, technicianId);
  if (technicianId) await checkTechnician(db, actor, technicianId, 'body.technicianId');
  const zone = await zoneOfTank(db, tank);
  const window = zonedWindow(input.date, input.startTime, input.endTime, zone);
  // Past occurrences would be visits that never happened, written out all the way from the start.
  if (input.repeats && input.date < wallTimeOf(deps.clock(), zone).day) {
    throw invalidFields([{ path: 'body.date', message: 'a repeating service starts today or later' }]);
  }

  const id = await db.transaction(async (tx) => {
    if (!input.repeats) {
      const [created] = await tx
        .insert(visits)
        .values({
          companyId: tank.companyId,
          tankId: tank.id,
          technicianId,
          kind: input.kind,
          windowStart: window.start,
          windowEnd: window.end,
          note: input.note || null,
          createdBy: actor.id,
        })
        .returning({ id: visits.id });
      return created!.id;
    }
    const [series] = await tx
      .insert(visitSeries)
      .values({
        companyId: tank.companyId,
        tankId: tank.id,
        technicianId,
        rrule: routineRule(tank.serviceIntervalDays),
        firstDay: input.date,
        startTime: input.startTime,
        endTime: input.endTime,
        writtenUntil: dayAfter(input.date, -1),
      })
      .returning();
    // Written out a quarter ahead, and at least to its first day when that lies further out.
    const horizon = dayAfter(isoDay(deps.clock()), seriesHorizonDays);
    await writeSeries(tx, series!, zone, input.date > horizon ? input.date : horizon);
    const [first] = await tx
      .select({ id: visits.id })
      .from(visits)
      .where(and(eq(visits.seriesId, series!.id), eq(visits.occurrenceDay, input.date)));
    if (!first) {
      throw invalidFields([
        { path: 'body.date', message: 'a repeating service starts within the next quarter' },
      ]);
    }
    if (input.note) await tx.update(visits).set({ note: input.note }).where(eq(visits.id, first.id));
    return first.id;
  });
  return summaryOf((await summaryQuery(db).where(eq(visits.id, id)))[0]!);
}

export async function updateVisit(
  deps: Pick<AppDeps, 'db'>,
  actor: Actor,
  visitId: string,
  input: UpdateVisit,
): Promise<VisitSummary> {
  const { db } = deps;
  const { visit, tankZone } = await findVisitFor(db, actor, visitId);
  if (input.technicianId !== undefined && input.technicianId !== visit.technicianId) {
    checkMayAssign(actor, input.technicianId);
    if (input.technicianId) await checkTechnician(db, actor, input.technicianId, 'body.technicianId');
  }
  if (visit.status === 'published' && (input.date || input.cancelled)) {
    throw conflict('visit_published', 'This visit has a published report; it cannot be moved or cancelled.');
  }
  const window = input.date ? zonedWindow(input.date, input.startTime!, input.endTime!, tankZone) : null;
  const changes = {
    ...(input.kind !== undefined && { kind: input.kind }),
    ...(input.technicianId !== undefined && { technicianId: input.technicianId }),
    ...(window && { windowStart: window.start, windowEnd: window.end }),
    ...(input.note !== undefined && { note: input.note || null }),
    ...(input.cancelled === true && { status: 'cancelled' as const }),
    ...(input.cancelled === false &&
      visit.status === 'cancelled' && {
        status: visit.draft ? ('in-progress' as const) : ('scheduled' as const),
      }),
  };
  // An update with nothing to set ({} or restoring a visit that was never cancelled) is refused by Drizzle.
  if (Object.keys(changes).length > 0) await db.update(visits).set(changes).where(eq(visits.id, visit.id));
  return summaryOf((await summaryQuery(db).where(eq(visits.id, visit.id)))[0]!);
}

/** The schedule between two days (inclusive) in the reader's zone; technicians see their own. */
export async function listSchedule(
  deps: Pick<AppDeps, 'db' | 'clock'>,
  actor: Actor,
  query: ScheduleQuery,
): Promise<VisitSummary[]> {
  const { db } = deps;
  if (query.to < query.from) throw invalidFields([{ path: 'query.to', message: 'ends before it starts' }]);
  if (dayAfter(query.from, 62) < query.to) {
    throw invalidFields([{ path: 'query.to', message: 'show at most 62 days at a time' }]);
  }
  const seesEveryone = roleCan(actor.role, 'visits:assign');
  const asked = query.technicianId === 'me' ? actor.id : query.technicianId;
  if (!seesEveryone && asked !== undefined && asked !== actor.id) {
    throw forbidden('Technicians see their own schedule.');
  }
  const who = seesEveryone ? asked : actor.id;
  const until = dayAfter(isoDay(deps.clock()), scheduleMaxAheadDays);
  await writeCompanySeries(db, actor.companyId, query.to < until ? query.to : until);
  const [me] = await db
    .select({ zone: sql<string>`coalesce(${users.timeZone}, ${companies.timeZone})` })
    .from(users)
    .innerJoin(companies, eq(companies.id, users.companyId))
    .where(eq(users.id, actor.id));
  const from = zonedWindow(query.from, '00:00', '00:01', me!.zone).start;
  const to = zonedWindow(dayAfter(query.to, 1), '00:00', '00:01', me!.zone).start;
  const rows = await summaryQuery(db)
    .where(
      and(
        eq(visits.companyId, actor.companyId),
        lt(visits.windowStart, to),
        gte(visits.windowEnd, from),
        who ? eq(visits.technicianId, who) : undefined,
        query.tankId ? eq(visits.tankId, query.tankId) : undefined,
      ),
    )
    .orderBy(asc(visits.windowStart), asc(tanks.name), asc(visits.id));
  return rows.map((row) => summaryOf(row));
}

/** A tank's visits: the next one, the reports, and (for staff) the plan and the open items. */
export async function tankVisits(
  deps: Pick<AppDeps, 'db' | 'clock'>,
  actor: Actor,
  tankId: string,
): Promise<TankVisits> {
  const { db } = deps;
  const tank = await findTankFor(db, actor, tankId, 'read');
  const now = deps.clock();
  await writeCompanySeries(db, tank.companyId, dayAfter(isoDay(now), seriesHorizonDays));
  const staff = isStaff(actor);
  const [next] = await summaryQuery(db)
    .where(
      and(
        eq(visits.tankId, tank.id),
        inArray(visits.status, ['scheduled', 'in-progress']),
        gt(visits.windowEnd, now),
      ),
    )
    .orderBy(asc(visits.windowStart))
    .limit(1);
  const listed = await summaryQuery(db)
    .where(
      and(
        eq(visits.tankId, tank.id),
        staff
          ? or(
              eq(visits.status, 'published'),
              eq(visits.status, 'in-progress'),
              and(eq(visits.status, 'scheduled'), lte(visits.windowStart, addDays(now, 60))),
            )
          : eq(visits.status, 'published'),
      ),
    )
    .orderBy(desc(visits.windowStart), desc(visits.id))
    .limit(100);
  return {
    next: next ? summaryOf(next, staff) : null,
    visits: listed.map((row) => summaryOf(row, staff)),
    lastVisitAt: tank.lastVisitAt?.toISOString() ?? null,
    openItems: staff ? await itemsFor(db, tank.id, null) : [],
  };
}

/** Checks a report against the tank it is for; every problem comes back against its field. */
async function reportIssues(
  db: Db,
  tank: TankRow,
  visit: VisitRow,
  content: VisitReportContent,
): Promise<ErrorIssue[]> {
  const issues: ErrorIssue[] = [];
  const at = (path: string) => `body.content.${path}`;
  const systemL = tank.displayVolumeL + tank.sumpVolumeL;
  if (content.waterChange && systemL > 0) {
    if (content.waterChange.litres > systemL + 0.5) {
      issues.push({
        path: at('waterChange.litres'),
        message: `larger than the system volume (${Math.round(systemL)} L)`,
      });
    }
  }
  const equipmentIds = content.equipmentChecks.map((c) => c.equipmentId);
  if (equipmentIds.length > 0) {
    const found = new Set(
      (
        await db
          .select({ id: equipment.id })
          .from(equipment)
          .where(and(eq(equipment.tankId, tank.id), inArray(equipment.id, equipmentIds)))
      ).map((r) => r.id),
    );
    content.equipmentChecks.forEach((c, i) => {
      if (!found.has(c.equipmentId))
        issues.push({
          path: at(`equipmentChecks.${i}.equipmentId`),
          message: 'choose equipment of this tank',
        });
    });
  }
  const livestockIds = content.livestockChanges.flatMap((c) => (c.action === 'add' ? [] : [c.livestockId]));
  if (livestockIds.length > 0) {
    const found = new Set(
      (
        await db
          .select({ id: livestock.id })
          .from(livestock)
          .where(and(eq(livestock.tankId, tank.id), inArray(livestock.id, livestockIds)))
      ).map((r) => r.id),
    );
    content.livestockChanges.forEach((c, i) => {
      if (c.action !== 'add' && !found.has(c.livestockId))
        issues.push({
          path: at(`livestockChanges.${i}.livestockId`),
          message: 'choose livestock in this tank',
        });
    });
  }
  const addedSpecies = content.livestockChanges.flatMap((c) => (c.action === 'add' ? [c.speciesId] : []));
  if (addedSpecies.length > 0) {
    const known = await resolveSpecies(db, tank.companyId, addedSpecies);
    content.livestockChanges.forEach((c, i) => {
      if (c.action === 'add' && !known.has(c.speciesId))
        issues.push({
          path: at(`livestockChanges.${i}.speciesId`),
          message: 'choose a species from the catalogue or your own',
        });
    });
  }
  const photoIds = content.photos.map((p) => p.photoId);
  if (photoIds.length > 0) {
    const found = new Set(
      (
        await db
          .select({ id: photos.id })
          .from(photos)
          .where(and(eq(photos.tankId, tank.id), inArray(photos.id, photoIds)))
      ).map((r) => r.id),
    );
    content.photos.forEach((p, i) => {
      if (!found.has(p.photoId))
        issues.push({ path: at(`photos.${i}.photoId`), message: 'not a photo of this tank' });
    });
  }
  if (content.closedItemIds.length > 0) {
    const open = new Set((await itemsFor(db, tank.id, visit.id)).map((item) => item.id));
    content.closedItemIds.forEach((id, i) => {
      if (!open.has(id))
        issues.push({ path: at(`closedItemIds.${i}`), message: 'not an open item of this tank' });
    });
  }
  if (visit.published !== null) {
    // Applied at the first publishing; a correction after that belongs on the readings or livestock screen.
    const published = contentOf(visit.published);
    if (JSON.stringify(published.readings) !== JSON.stringify(content.readings)) {
      issues.push({
        path: at('readings'),
        message: 'readings were stored when the report was published; correct them on the readings screen',
      });
    }
    if (JSON.stringify(published.livestockChanges) !== JSON.stringify(content.livestockChanges)) {
      issues.push({
        path: at('livestockChanges'),
        message:
          'livestock changes were applied when the report was published; correct them on the livestock screen',
      });
    }
  }
  return issues;
}

async function findWritableVisit(db: Db, actor: Actor, visitId: string) {
  const row = await findVisitFor(db, actor, visitId);
  if (!isStaff(actor)) throw forbidden();
  if (row.visit.status === 'cancelled') {
    throw conflict('visit_cancelled', 'This visit was cancelled; restore it before writing its report.');
  }
  const [tank] = await db.select().from(tanks).where(eq(tanks.id, row.visit.tankId));
  return { row, tank: tank! };
}

const staleVersion = () =>
  conflict(
    'stale_version',
    'This report was changed elsewhere since you opened it. Choose which version to keep.',
  );

/** Links the report's photos to the visit, so owners see them only once a report using them is published. */
async function syncPhotos(
  tx: Tx,
  visitId: string,
  content: VisitReportContent,
  published: VisitReportContent | null,
) {
  const inPublished = new Set(published?.photos.map((p) => p.photoId) ?? []);
  const wanted = content.photos.map((p) => p.photoId);
  await tx
    .delete(visitPhotos)
    .where(
      and(
        eq(visitPhotos.visitId, visitId),
        wanted.length > 0 ? sql`${visitPhotos.photoId} <> all(${sql.param(wanted)}::uuid[])` : undefined,
        eq(visitPhotos.published, false),
      ),
    );
  for (const photo of content.photos) {
    await tx
      .insert(visitPhotos)
      .values({
        visitId,
        photoId: photo.photoId,
        phase: photo.phase,
        published: inPublished.has(photo.photoId),
      })
      .onConflictDoUpdate({
        target: [visitPhotos.visitId, visitPhotos.photoId],
        set: { phase: photo.phase },
      });
  }
}

/** One autosave: all or nothing, and only on top of the version the editor started from. */
export async function saveReport(
  deps: Pick<AppDeps, 'db'>,
  actor: Actor,
  visitId: string,
  input: SaveReport,
): Promise<VisitDetail> {
  const { db } = deps;
  const { row, tank } = await findWritableVisit(db, actor, visitId);
  if (row.visit.version !== input.version) throw staleVersion();
  const issues = await reportIssues(db, tank, row.visit, input.content);
  if (issues.length > 0)
    throw badRequest('invalid_request', 'Some parts of the report need attention.', issues);
  await db.transaction(async (tx) => {
    const updated = await tx
      .update(visits)
      .set({
        draft: input.content,
        version: input.version + 1,
        ...(row.visit.status === 'scheduled' && { status: 'in-progress' as const }),
      })
      .where(and(eq(visits.id, row.visit.id), eq(visits.version, input.version)))
      .returning({ id: visits.id });
    // Another save landed between the read above and this write.
    if (updated.length === 0) throw staleVersion();
    await syncPhotos(
      tx,
      row.visit.id,
      input.content,
      row.visit.published === null ? null : contentOf(row.visit.published),
    );
  });
  return getVisit(db, actor, visitId);
}

/** Moves the tank's next planned visit to the chosen time, or plans one with this technician. */
async function planNextVisit(tx: Tx, actor: Actor, visit: VisitRow, zone: string, next: NextVisitEntry) {
  const window = zonedWindow(next.date, next.startTime, next.endTime, zone);
  const [planned] = await tx
    .select({ id: visits.id })
    .from(visits)
    .where(
      and(
        eq(visits.tankId, visit.tankId),
        eq(visits.status, 'scheduled'),
        gt(visits.windowStart, visit.windowStart),
      ),
    )
    .orderBy(asc(visits.windowStart))
    .limit(1);
  if (planned) {
    await tx
      .update(visits)
      .set({ windowStart: window.start, windowEnd: window.end })
      .where(eq(visits.id, planned.id));
    return;
  }
  await tx.insert(visits).values({
    companyId: visit.companyId,
    tankId: visit.tankId,
    technicianId: visit.technicianId ?? actor.id,
    kind: 'routine',
    windowStart: window.start,
    windowEnd: window.end,
    createdBy: actor.id,
  });
}

/** Items this report carries forward: new ones opened, ones it no longer lists (still open) removed. */
async function syncItems(tx: Tx, visit: VisitRow, content: VisitReportContent, now: Date) {
  const existing = await tx.select().from(visitItems).where(eq(visitItems.fromVisitId, visit.id));
  const texts = new Set(content.nextItems);
  const stale = existing.filter((item) => !texts.has(item.text) && item.closedAt === null).map((i) => i.id);
  if (stale.length > 0) await tx.delete(visitItems).where(inArray(visitItems.id, stale));
  const known = new Set(existing.map((item) => item.text));
  const fresh = content.nextItems.filter((text) => !known.has(text));
  if (fresh.length > 0) {
    await tx.insert(visitItems).values(
      fresh.map((text, index) => ({
        companyId: visit.companyId,
        tankId: visit.tankId,
        fromVisitId: visit.id,
        text,
        // A millisecond apart, so the next checklist lists them in the order they were written.
        openedAt: new Date(now.getTime() + index),
      })),
    );
  }
  // Ticks: close what this report ticks, reopen what it no longer ticks.
  await tx
    .update(visitItems)
    .set({ closedAt: null, closedInVisitId: null })
    .where(
      and(
        eq(visitItems.closedInVisitId, visit.id),
        content.closedItemIds.length > 0
          ? sql`${visitItems.id} <> all(${sql.param(content.closedItemIds)}::uuid[])`
          : undefined,
      ),
    );
  if (content.closedItemIds.length > 0) {
    await tx
      .update(visitItems)
      .set({ closedAt: now, closedInVisitId: visit.id })
      .where(
        and(
          eq(visitItems.tankId, visit.tankId),
          inArray(visitItems.id, content.closedItemIds),
          isNull(visitItems.closedAt),
        ),
      );
  }
}

/**
 * Publishes the working copy: on the first publishing its readings are stored (source "visit",
 * through the same conversions and alert evaluation as any reading) and its livestock changes
 * written; items, the next visit and the tank's last visit are updated; owners are told. A later
 * publishing keeps the earlier text as a version and marks the report edited.
 */
export async function publishReport(
  deps: AppDeps,
  actor: Actor,
  visitId: string,
  input: PublishReport,
): Promise<VisitDetail> {
  const { db } = deps;
  const { row, tank } = await findWritableVisit(db, actor, visitId);
  const { visit } = row;
  if (visit.version !== input.version) throw staleVersion();
  // This very version is already published (a retried request): keeping it again as an earlier
  // version would take its number, and the next edit could then never be published.
  if (visit.publishedVersion === visit.version) return getVisit(db, actor, visitId);
  if (visit.draft === null) {
    throw badRequest('invalid_request', 'Write the report before publishing it.', [
      { path: 'body.version', message: 'the report is empty' },
    ]);
  }
  const content = contentOf(visit.draft);
  const now = deps.clock();
  const firstPublish = visit.published === null;
  const issues = await reportIssues(db, tank, visit, content);
  if (firstPublish) issues.push(...manualTimeIssues(tank, content.readings, now, 'body.content.readings'));
  if (!content.arrivedAt) issues.push({ path: 'body.content.arrivedAt', message: 'say when you arrived' });
  // The arrival becomes the tank's last visit, which a time in the future would keep from ever being overdue.
  for (const field of ['arrivedAt', 'departedAt'] as const) {
    const at = content[field];
    if (at && Date.parse(at) > now.getTime() + futureToleranceMs) {
      issues.push({
        path: `body.content.${field}`,
        message: 'this time is in the future; check the date and time',
      });
    }
  }
  // Compatibility is judged against the tank as it is now, as the livestock screen does.
  const checks = new Map<number, CompatibilityResult>();
  if (firstPublish) {
    for (const [index, change] of content.livestockChanges.entries()) {
      if (
        change.action !== 'add' ||
        issues.some((i) => i.path === `body.content.livestockChanges.${index}.speciesId`)
      ) {
        continue;
      }
      const check = await compatibilityFor(db, tank, change.speciesId);
      checks.set(index, check);
      if (check.warnings.length > 0 && !change.acknowledgeWarnings) {
        issues.push({
          path: `body.content.livestockChanges.${index}.acknowledgeWarnings`,
          message: `${check.species.commonName}: ${check.warnings.map((w) => w.message).join(' ')}`,
        });
      }
    }
  }
  if (issues.length > 0) {
    throw badRequest(
      'invalid_request',
      'Some parts of the report need attention; nothing was published.',
      issues,
    );
  }
  const zone = await zoneOfTank(db, tank);
  const visitedAt = new Date(content.arrivedAt!);

  await commitReadings(deps, tank.id, async (tx) => {
    const [locked] = await tx
      .select({ version: visits.version })
      .from(visits)
      .where(eq(visits.id, visit.id))
      .for('update');
    if (locked!.version !== input.version) throw staleVersion();
    const stored = firstPublish
      ? await insertManualRows(
          tx,
          tank,
          actor,
          content.readings.map((reading) => ({ ...reading, source: 'visit' as const })),
        )
      : [];
    if (firstPublish) {
      for (const [index, change] of content.livestockChanges.entries()) {
        const note = `At the visit of ${wallTimeOf(visitedAt, zone).day}.`;
        if (change.action === 'add') {
          await insertLivestock(
            tx,
            tank,
            checks.get(index)!,
            {
              nickname: change.nickname ?? null,
              quantity: change.quantity,
              addedOn: wallTimeOf(visitedAt, zone).day,
              source: null,
              placement: change.placement ?? null,
              status: 'stable',
              note: `Added ${note.charAt(0).toLowerCase()}${note.slice(1)}`,
            },
            actor,
            visitedAt,
          );
        } else if (change.action === 'remove') {
          await findLivestockIn(tx as unknown as Db, tank, change.livestockId);
          await recordLivestockStatus(
            tx,
            change.livestockId,
            { status: 'removed', note: change.note || `Removed ${note.toLowerCase()}`, changedAt: visitedAt },
            actor,
          );
        } else {
          await tx
            .update(livestock)
            .set({ placement: change.placement })
            .where(and(eq(livestock.id, change.livestockId), eq(livestock.tankId, tank.id)));
        }
      }
    } else {
      await tx.insert(visitReportVersions).values({
        visitId: visit.id,
        version: visit.publishedVersion!,
        content: visit.published,
        publishedAt: visit.editedAt ?? visit.publishedAt!,
        publishedBy: visit.publishedBy,
      });
    }
    await syncItems(tx, visit, content, now);
    if (content.nextVisit) await planNextVisit(tx, actor, visit, zone, content.nextVisit);
    await tx
      .update(visits)
      .set({
        published: content,
        publishedVersion: visit.version,
        status: 'published',
        publishedBy: actor.id,
        ...(firstPublish ? { publishedAt: now } : { editedAt: now }),
      })
      .where(eq(visits.id, visit.id));
    await tx
      .update(visitPhotos)
      .set({ published: true })
      .where(
        and(
          eq(visitPhotos.visitId, visit.id),
          inArray(
            visitPhotos.photoId,
            content.photos.length > 0 ? content.photos.map((p) => p.photoId) : [visit.id],
          ),
        ),
      );
    await tx
      .update(tanks)
      .set({ lastVisitAt: sql`greatest(${tanks.lastVisitAt}, ${visitedAt.toISOString()}::timestamptz)` })
      .where(eq(tanks.id, tank.id));
    return { stored, result: null };
  });
  if (firstPublish) {
    // The report is published whatever happens here; owners not told now are told by the sweep.
    try {
      if (deps.jobs) await deps.jobs.send(queues.newsFanOut, { visitId: visit.id });
      // Without a job queue (tests, tools) owners are told in-process, as alert fan-out does.
      else await fanOutVisitReport(deps, visit.id);
    } catch (error) {
      deps.logger.error(
        { err: error, visitId: visit.id },
        'telling owners of a published visit report failed',
      );
    }
  }
  if (firstPublish && visit.kind === 'urgent') {
    // The report answers the urgent request; should this fail, staff resolve the request by hand.
    try {
      await resolveRequestOfVisit(deps, actor, visit.id);
    } catch (error) {
      deps.logger.error({ err: error, visitId: visit.id }, 'resolving the urgent request of a visit failed');
    }
  }
  return getVisit(db, actor, visitId);
}

/** Visits whose publishing was never announced (the process stopped between commit and queueing). */
export async function unannouncedVisits(deps: Pick<AppDeps, 'db' | 'clock'>, olderThanMs: number) {
  const cutoff = new Date(deps.clock().getTime() - olderThanMs);
  const rows = await deps.db
    .select({ id: visits.id })
    .from(visits)
    .where(and(isNull(visits.announcedAt), lte(visits.publishedAt, cutoff)))
    .limit(100);
  return rows.map((r) => r.id);
}
