import { and, asc, eq, exists, gt, ilike, inArray, isNull, ne, or, sql, type SQL } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { tankStatusValues, type TankStatus } from '@shared/parameters/health';
import { tankStyleWaterType } from '@shared/parameters/limit-templates';
import { encodeTankOverviewCursor, tankOverviewPageSize } from '@shared/schemas/tanks';
import { photoUrls } from '@shared/schemas/photos';
import { visitOverdue } from '@shared/visits/overdue';
import type {
  AssignableStaff,
  createTankInput,
  PersonRef,
  PhotoRef,
  TankChoice,
  TankDetail,
  TankListQuery,
  TankOverviewPage,
  TankOverviewQuery,
  TankSummary,
  updateTankInput,
} from '@shared/schemas/tanks';
import type { z } from 'zod';
import type { Db } from '../db/client';
import { companies, photos, tankMembers, tankStatuses, tanks, users, visits } from '../db/schema/index';
import { HttpError, type ErrorIssue } from '../lib/http-error';
import { findTankFor, isStaff, visibleTanks } from '../policy/index';
import type { Actor } from './actors';
import { healthForTanks, type TankHealthSummary } from './tank-health';
import { refreshTankStatus } from './tank-status';

type CreateTank = z.output<typeof createTankInput>;
type UpdateTank = z.output<typeof updateTankInput>;
type TankRow = typeof tanks.$inferSelect;
type PhotoRow = typeof photos.$inferSelect;
export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

const technician = alias(users, 'technician');

export function photoRefOf(photo: Pick<PhotoRow, 'id' | 'width' | 'height' | 'caption'>): PhotoRef {
  return {
    id: photo.id,
    ...photoUrls(photo.id),
    width: photo.width,
    height: photo.height,
    caption: photo.caption,
  };
}

/** A 400 naming the fields at fault, in the same shape `validate` gives. */
export function invalidFields(issues: ErrorIssue[]): HttpError {
  return new HttpError(400, 'invalid_request', 'Some fields need attention.', issues);
}

/** `%` and `_` in a search box are letters, not wildcards. */
export function containsPattern(text: string): string {
  return `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}

async function ownersOf(db: Db, tankIds: string[]): Promise<Map<string, PersonRef[]>> {
  const byTank = new Map<string, PersonRef[]>(tankIds.map((id) => [id, []]));
  if (tankIds.length === 0) return byTank;
  const rows = await listStatements(db).owners.execute({ ids: tankIds });
  for (const row of rows) byTank.get(row.tankId)?.push({ id: row.id, name: row.name });
  return byTank;
}

const summaryColumns = {
  tank: tanks,
  technicianName: technician.name,
  cover: { id: photos.id, width: photos.width, height: photos.height, caption: photos.caption },
};

function summaryQuery(db: Db) {
  return db
    .select(summaryColumns)
    .from(tanks)
    .leftJoin(technician, eq(technician.id, tanks.assignedTechnicianId))
    .leftJoin(photos, eq(photos.id, tanks.coverPhotoId));
}

type SummaryRow = Awaited<ReturnType<ReturnType<typeof summaryQuery>['execute']>>[number];

/** Any of these tanks, by id: a prepared statement's placeholder holding an array of uuids. */
const amongTanks = (column: typeof tankMembers.tankId | typeof visits.tankId) =>
  sql`${column} = any(${sql.placeholder('ids')}::uuid[])`;

/**
 * The tank list's statements, opened with every dashboard: built once per database and sent by
 * name, so each connection parses and plans them once and no request pays for building them. The
 * list without filters uses them; a search or a technician filter is built per request.
 */
function prepareListStatements(db: Db) {
  const ordered = [asc(tanks.name), asc(tanks.id)];
  const viewer = (role: 'owner' | 'admin') => ({
    role,
    id: sql.placeholder('actorId'),
    companyId: sql.placeholder('companyId'),
  });
  return {
    ownerList: summaryQuery(db)
      .where(visibleTanks(db, viewer('owner')))
      .orderBy(...ordered)
      .prepare('tank_list_owner'),
    staffList: summaryQuery(db)
      .where(visibleTanks(db, viewer('admin')))
      .orderBy(...ordered)
      .prepare('tank_list_staff'),
    owners: db
      .select({ tankId: tankMembers.tankId, id: users.id, name: users.name })
      .from(tankMembers)
      .innerJoin(users, eq(users.id, tankMembers.userId))
      .where(amongTanks(tankMembers.tankId))
      .orderBy(asc(users.name))
      .prepare('tank_list_owners'),
    nextVisits: db
      .selectDistinctOn([visits.tankId], {
        tankId: visits.tankId,
        windowStart: visits.windowStart,
        windowEnd: visits.windowEnd,
        timeZone: sql<string>`coalesce(${tanks.timeZone}, ${companies.timeZone})`,
      })
      .from(visits)
      .innerJoin(tanks, eq(tanks.id, visits.tankId))
      .innerJoin(companies, eq(companies.id, tanks.companyId))
      .where(
        and(
          amongTanks(visits.tankId),
          inArray(visits.status, ['scheduled', 'in-progress']),
          gt(visits.windowEnd, sql`${sql.placeholder('now')}::timestamptz`),
        ),
      )
      .orderBy(visits.tankId, asc(visits.windowStart))
      .prepare('tank_list_next_visits'),
  };
}

const preparedLists = new WeakMap<Db, ReturnType<typeof prepareListStatements>>();
function listStatements(db: Db) {
  let statements = preparedLists.get(db);
  if (!statements) preparedLists.set(db, (statements = prepareListStatements(db)));
  return statements;
}

/** Every tank gets a row from `healthForTanks`; this only covers one deleted mid-request. */
const unknownHealth = { status: 'no-data', statusReason: 'No readings yet' } as const;

type NextVisit = TankSummary['nextVisit'];

/** Each tank's next planned visit (one statement for the whole list). */
async function nextVisitsOf(db: Db, tankIds: string[], now: Date): Promise<Map<string, NextVisit>> {
  if (tankIds.length === 0) return new Map();
  const rows = await listStatements(db).nextVisits.execute({ ids: tankIds, now: now.toISOString() });
  return new Map(
    rows.map((row) => [
      row.tankId,
      {
        windowStart: row.windowStart.toISOString(),
        windowEnd: row.windowEnd.toISOString(),
        timeZone: row.timeZone,
      },
    ]),
  );
}

function toSummary(
  row: SummaryRow,
  owners: PersonRef[],
  now: Date,
  { status, statusReason }: Pick<TankSummary, 'status' | 'statusReason'> = unknownHealth,
  nextVisit: NextVisit = null,
): TankSummary {
  const { tank } = row;
  return {
    id: tank.id,
    name: tank.name,
    siteLabel: tank.siteLabel,
    waterType: tank.waterType,
    style: tank.style,
    displayVolumeL: tank.displayVolumeL,
    sumpVolumeL: tank.sumpVolumeL,
    serviceIntervalDays: tank.serviceIntervalDays,
    assignedTechnician:
      tank.assignedTechnicianId && row.technicianName
        ? { id: tank.assignedTechnicianId, name: row.technicianName }
        : null,
    owners,
    coverPhoto: row.cover ? photoRefOf(row.cover) : null,
    status,
    statusReason,
    lastVisitAt: tank.lastVisitAt?.toISOString() ?? null,
    visitOverdue: visitOverdue(tank, now),
    nextVisit,
  };
}

/** The tank list's filters: a name, site or owner's name, and who looks after the tank. */
function listFilters(db: Db, query: TankListQuery): SQL[] {
  const conditions: SQL[] = [];
  if (query.q) {
    const pattern = containsPattern(query.q);
    const ownerNamed = db
      .select({ one: tankMembers.userId })
      .from(tankMembers)
      .innerJoin(users, eq(users.id, tankMembers.userId))
      .where(and(eq(tankMembers.tankId, tanks.id), ilike(users.name, pattern)));
    conditions.push(or(ilike(tanks.name, pattern), ilike(tanks.siteLabel, pattern), exists(ownerNamed))!);
  }
  if (query.technicianId === 'none') conditions.push(isNull(tanks.assignedTechnicianId));
  else if (query.technicianId) conditions.push(eq(tanks.assignedTechnicianId, query.technicianId));
  return conditions;
}

/** Summaries of these tanks, in this order, with the health given (or judged now). */
async function summariesOf(
  db: Db,
  rows: SummaryRow[],
  now: Date,
  judged?: Map<string, TankHealthSummary>,
): Promise<TankSummary[]> {
  if (rows.length === 0) return [];
  const ids = rows.map((row) => row.tank.id);
  const [owners, health, next] = await Promise.all([
    ownersOf(db, ids),
    judged ?? healthForTanks(db, ids, now),
    nextVisitsOf(db, ids, now),
  ]);
  return rows.map((row) =>
    toSummary(
      row,
      owners.get(row.tank.id) ?? [],
      now,
      health.get(row.tank.id),
      next.get(row.tank.id) ?? null,
    ),
  );
}

export async function listTanks(
  db: Db,
  actor: Actor,
  query: TankListQuery,
  now: Date,
): Promise<TankSummary[]> {
  const filters = listFilters(db, query);
  const statements = listStatements(db);
  const rows =
    filters.length > 0
      ? await summaryQuery(db)
          .where(and(visibleTanks(db, actor), ...filters))
          .orderBy(asc(tanks.name), asc(tanks.id))
      : await (isStaff(actor) ? statements.staffList : statements.ownerList).execute({
          actorId: actor.id,
          companyId: actor.companyId,
        });
  return summariesOf(db, rows, now);
}

/** Every tank the actor may see, for pickers and labels: one statement, owners' names folded in. */
export function listTankChoices(db: Db, actor: Actor): Promise<TankChoice[]> {
  const owners = db
    .select({
      names: sql<string[]>`array_agg(${users.name} order by ${users.name}, ${users.id})`.as('names'),
    })
    .from(tankMembers)
    .innerJoin(users, eq(users.id, tankMembers.userId))
    .where(eq(tankMembers.tankId, tanks.id))
    .as('owners');
  return db
    .select({
      id: tanks.id,
      name: tanks.name,
      siteLabel: tanks.siteLabel,
      serviceIntervalDays: tanks.serviceIntervalDays,
      ownerNames: sql<string[]>`coalesce(${owners.names}, '{}')`,
    })
    .from(tanks)
    .leftJoinLateral(owners, sql`true`)
    .where(visibleTanks(db, actor))
    .orderBy(asc(tanks.name), asc(tanks.id));
}

/**
 * The staff overview, a page at a time: worst status first, then the longest in it (the stored
 * statuses of `tank_status` decide the order and the cursor), so a company with thousands of tanks
 * costs what one page costs. The page's tanks are judged again as they are shown, and any status
 * that moved is stored, so a row never says something older than the moment it was read.
 */
export async function tankOverview(
  db: Db,
  actor: Actor,
  query: TankOverviewQuery,
  now: Date,
): Promise<TankOverviewPage> {
  await judgeUnjudgedTanks(db, actor.companyId, now);
  const filters = and(eq(tankStatuses.companyId, actor.companyId), ...listFilters(db, query))!;
  const styled = query.style ? and(filters, eq(tanks.style, query.style))! : filters;
  const { after } = query;
  const page = await db
    .select({ id: tanks.id, rank: tankStatuses.rank, since: tankStatuses.since })
    .from(tankStatuses)
    .innerJoin(tanks, eq(tanks.id, tankStatuses.tankId))
    .where(
      and(
        styled,
        query.status ? inArray(tankStatuses.status, query.status) : undefined,
        after
          ? sql`(${tankStatuses.rank}, ${tankStatuses.since}, ${tankStatuses.tankId}) > (${after.rank}, ${after.since}::timestamptz, ${after.id}::uuid)`
          : undefined,
      ),
    )
    .orderBy(asc(tankStatuses.rank), asc(tankStatuses.since), asc(tankStatuses.tankId))
    .limit(tankOverviewPageSize + 1);
  const shown = page.slice(0, tankOverviewPageSize);
  const last = shown.at(-1);
  const ids = shown.map((row) => row.id);
  const [counted, judged] = await Promise.all([
    db
      .select({ status: tankStatuses.status, count: sql<number>`count(*)::int` })
      .from(tankStatuses)
      .innerJoin(tanks, eq(tanks.id, tankStatuses.tankId))
      .where(styled)
      .groupBy(tankStatuses.status),
    refreshTankStatus(db, ids, now),
  ]);
  const counts = Object.fromEntries(tankStatusValues.map((status) => [status, 0])) as Record<
    TankStatus,
    number
  >;
  for (const row of counted) counts[row.status] = row.count;
  const byId = new Map(
    ids.length === 0
      ? []
      : (await summaryQuery(db).where(inArray(tanks.id, ids))).map((row) => [row.tank.id, row]),
  );
  const rows = ids.flatMap((id) => byId.get(id) ?? []);
  return {
    tanks: await summariesOf(db, rows, now, judged),
    next:
      page.length > tankOverviewPageSize && last
        ? encodeTankOverviewCursor({ rank: last.rank, since: last.since.toISOString(), id: last.id })
        : null,
    counts,
  };
}

/** Tanks the overview has never ordered (new, or from before statuses were stored) are judged first. */
async function judgeUnjudgedTanks(db: Db, companyId: string, now: Date) {
  for (;;) {
    const missing = await db
      .select({ id: tanks.id })
      .from(tanks)
      .leftJoin(tankStatuses, eq(tankStatuses.tankId, tanks.id))
      .where(and(eq(tanks.companyId, companyId), isNull(tankStatuses.tankId)))
      .limit(500);
    if (missing.length === 0) return;
    const judged = await refreshTankStatus(
      db,
      missing.map((row) => row.id),
      now,
    );
    // Only a tank removed in the meantime goes unjudged; never loop on it.
    if (judged.size === 0) return;
  }
}

export async function getTankDetail(db: Db, actor: Actor, tankId: string, now: Date): Promise<TankDetail> {
  await findTankFor(db, actor, tankId, 'read');
  const [row] = await db
    .select({
      ...summaryColumns,
      company: { id: companies.id, name: companies.name, timeZone: companies.timeZone },
    })
    .from(tanks)
    .innerJoin(companies, eq(companies.id, tanks.companyId))
    .leftJoin(technician, eq(technician.id, tanks.assignedTechnicianId))
    .leftJoin(photos, eq(photos.id, tanks.coverPhotoId))
    .where(eq(tanks.id, tankId));
  const [owners, health, next] = await Promise.all([
    ownersOf(db, [tankId]),
    healthForTanks(db, [tankId], now),
    nextVisitsOf(db, [tankId], now),
  ]);
  const tank = row!.tank;
  return {
    ...toSummary(row!, owners.get(tankId) ?? [], now, health.get(tankId), next.get(tankId) ?? null),
    dimensions:
      tank.lengthCm !== null && tank.widthCm !== null && tank.heightCm !== null
        ? { lengthCm: tank.lengthCm, widthCm: tank.widthCm, heightCm: tank.heightCm }
        : null,
    setUpOn: tank.setUpOn,
    notes: tank.notes,
    timeZone: tank.timeZone,
    effectiveTimeZone: tank.timeZone ?? row!.company.timeZone,
    company: { id: row!.company.id, name: row!.company.name },
    createdAt: tank.createdAt.toISOString(),
    updatedAt: tank.updatedAt.toISOString(),
  };
}

/** Staff who can be put in charge of a tank: active technicians and admins of the company. */
export function listAssignableStaff(db: Db, actor: Actor): Promise<AssignableStaff[]> {
  return db
    .select({ id: users.id, name: users.name, role: users.role })
    .from(users)
    .where(and(eq(users.companyId, actor.companyId), ne(users.role, 'owner'), eq(users.status, 'active')))
    .orderBy(asc(users.name)) as Promise<AssignableStaff[]>;
}

/** People and photos a tank refers to must belong to the same company (and photo to the tank). */
async function checkReferences(
  db: Db,
  actor: Actor,
  input: { assignedTechnicianId?: string | null; ownerIds?: string[]; coverPhotoId?: string | null },
  tankId: string | null,
): Promise<void> {
  const issues: ErrorIssue[] = [];
  if (input.assignedTechnicianId) {
    const [person] = await db
      .select({ id: users.id })
      .from(users)
      .where(
        and(
          eq(users.id, input.assignedTechnicianId),
          eq(users.companyId, actor.companyId),
          ne(users.role, 'owner'),
          eq(users.status, 'active'),
        ),
      );
    if (!person)
      issues.push({ path: 'body.assignedTechnicianId', message: 'choose one of your active staff' });
  }
  if (input.ownerIds && input.ownerIds.length > 0) {
    const distinct = [...new Set(input.ownerIds)];
    const found = await db
      .select({ id: users.id })
      .from(users)
      .where(and(inArray(users.id, distinct), eq(users.companyId, actor.companyId), eq(users.role, 'owner')));
    if (found.length !== distinct.length) {
      issues.push({ path: 'body.ownerIds', message: 'choose owners from your own clients' });
    }
  }
  if (input.coverPhotoId) {
    const [photo] = tankId
      ? await db
          .select({ id: photos.id })
          .from(photos)
          .where(and(eq(photos.id, input.coverPhotoId), eq(photos.tankId, tankId)))
      : [];
    if (!photo) issues.push({ path: 'body.coverPhotoId', message: 'choose a photo of this tank' });
  }
  if (issues.length > 0) throw invalidFields(issues);
}

function dimensionColumns(dimensions: CreateTank['dimensions']) {
  if (dimensions === undefined) return {};
  return {
    lengthCm: dimensions?.lengthCm ?? null,
    widthCm: dimensions?.widthCm ?? null,
    heightCm: dimensions?.heightCm ?? null,
  };
}

async function replaceOwners(db: Db | Tx, tankId: string, ownerIds: string[]) {
  await db.delete(tankMembers).where(eq(tankMembers.tankId, tankId));
  const distinct = [...new Set(ownerIds)];
  if (distinct.length > 0) {
    await db.insert(tankMembers).values(distinct.map((userId) => ({ tankId, userId })));
  }
}

export async function createTank(db: Db, actor: Actor, input: CreateTank, now: Date): Promise<TankDetail> {
  await checkReferences(db, actor, input, null);
  const tankId = await db.transaction(async (tx) => {
    const [tank] = await tx
      .insert(tanks)
      .values({
        companyId: actor.companyId,
        name: input.name,
        siteLabel: input.siteLabel ?? null,
        style: input.style,
        waterType: tankStyleWaterType[input.style],
        displayVolumeL: input.displayVolume,
        sumpVolumeL: input.sumpVolume ?? 0,
        ...dimensionColumns(input.dimensions ?? null),
        setUpOn: input.setUpOn ?? null,
        assignedTechnicianId: input.assignedTechnicianId ?? null,
        serviceIntervalDays: input.serviceIntervalDays,
        notes: input.notes ?? null,
        timeZone: input.timeZone ?? null,
      })
      .returning({ id: tanks.id });
    await replaceOwners(tx, tank!.id, input.ownerIds ?? []);
    return tank!.id;
  });
  return getTankDetail(db, actor, tankId, now);
}

export async function updateTank(
  db: Db,
  actor: Actor,
  tankId: string,
  input: UpdateTank,
  now: Date,
): Promise<TankDetail> {
  const existing: TankRow = await findTankFor(db, actor, tankId, 'write');
  const style = input.style ?? existing.style;
  if (input.waterType && input.waterType !== tankStyleWaterType[style]) {
    throw invalidFields([
      { path: 'body.waterType', message: `this tank's style is for ${tankStyleWaterType[style]} water` },
    ]);
  }
  await checkReferences(db, actor, input, tankId);
  await db.transaction(async (tx) => {
    const changes = {
      ...(input.name !== undefined && { name: input.name }),
      ...(input.siteLabel !== undefined && { siteLabel: input.siteLabel }),
      ...(input.style !== undefined && { style: input.style, waterType: tankStyleWaterType[input.style] }),
      ...(input.displayVolume !== undefined && { displayVolumeL: input.displayVolume }),
      ...(input.sumpVolume !== undefined && { sumpVolumeL: input.sumpVolume }),
      ...dimensionColumns(input.dimensions),
      ...(input.setUpOn !== undefined && { setUpOn: input.setUpOn }),
      ...(input.assignedTechnicianId !== undefined && { assignedTechnicianId: input.assignedTechnicianId }),
      ...(input.serviceIntervalDays !== undefined && { serviceIntervalDays: input.serviceIntervalDays }),
      ...(input.notes !== undefined && { notes: input.notes }),
      ...(input.timeZone !== undefined && { timeZone: input.timeZone }),
      ...(input.coverPhotoId !== undefined && { coverPhotoId: input.coverPhotoId }),
    };
    if (Object.keys(changes).length > 0) {
      await tx.update(tanks).set(changes).where(eq(tanks.id, tankId));
    }
    if (input.ownerIds !== undefined) await replaceOwners(tx, tankId, input.ownerIds);
  });
  return getTankDetail(db, actor, tankId, now);
}
