import { and, asc, desc, eq, inArray, isNull, ne, sql, type SQL } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import type { z } from 'zod';
import { parameterCatalogue } from '@shared/parameters/catalogue';
import { photoUrls } from '@shared/photos/urls';
import {
  urgentSettingsInput,
  type UrgentRequestView,
  type UrgentSettingsInput,
  type UrgentSettingsView,
  type UrgentSnapshot,
  type urgentBoardQuery,
  type urgentMoveInput,
  type urgentRequestInput,
} from '@shared/schemas/urgent-requests';
import { scheduleVisitInput } from '@shared/schemas/visits';
import {
  urgentCategories,
  urgentCategoryNames,
  defaultFirstAid,
  type FirstAid,
} from '@shared/urgent/categories';
import {
  canMove,
  defaultAckTargetMinutes,
  openUrgentStatuses,
  urgentStatusNames,
  urgentTransitions,
  type UrgentStatus,
} from '@shared/urgent/lifecycle';
import { wallTimeOf } from '@shared/visits/recurrence';
import { formatMoney } from '@shared/billing/money';
import type { AppDeps } from '../deps';
import type { Db } from '../db/client';
import {
  alerts,
  companies,
  equipment,
  photos,
  tanks,
  urgentRequestEvents,
  urgentRequestPhotos,
  urgentRequests,
  urgentSettings,
  users,
  visits,
} from '../db/schema/index';
import { conflict, notFound, type ErrorIssue } from '../lib/http-error';
import { findTankFor, isStaff, visibleTanks } from '../policy/index';
import type { Actor } from './actors';
import { recordAudit, type AuditSource } from './audit';
import { latestReadings } from './readings';
import { callOutFeeOf } from './price-list';
import { unattachedPhoto } from './photos';
import { invalidFields } from './tanks';
import { announceUrgentEvent, outletOf, recordUrgentEvent } from './urgent-notify';
import { scheduleVisit, updateVisit } from './visits';

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];
type SettingsRow = typeof urgentSettings.$inferSelect;
type NewRequest = z.output<typeof urgentRequestInput>;
type Move = z.output<typeof urgentMoveInput>;
type BoardQuery = z.output<typeof urgentBoardQuery>;
type UrgentCategory = (typeof urgentCategories)[number];

/** How long an urgent visit is planned for (common practice: most emergencies take up to two hours). */
const urgentVisitMs = 2 * 3_600_000;
/** The staff board's closed list: the latest ones, not the whole history. */
const closedBoardLimit = 100;

/* ------------------------------------------------------------------ settings */

async function settingsRowOf(db: Db | Tx, companyId: string): Promise<SettingsRow | undefined> {
  const [row] = await db.select().from(urgentSettings).where(eq(urgentSettings.companyId, companyId));
  return row;
}

/** Stored first aid was checked when saved; one that no longer reads (a schema change) keeps the defaults. */
function storedFirstAid(row: SettingsRow | undefined): Partial<Record<UrgentCategory, FirstAid>> {
  const parsed = urgentSettingsInput.shape.firstAid.safeParse(row?.firstAid ?? {});
  if (!parsed.success) return {};
  return Object.fromEntries(Object.entries(parsed.data).filter(([, text]) => text)) as Partial<
    Record<UrgentCategory, FirstAid>
  >;
}

type CallOutFee = Awaited<ReturnType<typeof callOutFeeOf>>;

function settingsViewOf(row: SettingsRow | undefined, fee: CallOutFee): UrgentSettingsView {
  const own = storedFirstAid(row);
  const firstAid = Object.fromEntries(
    urgentCategories.map((category) => {
      const text = own[category];
      return [
        category,
        text
          ? { steps: text.steps, cautions: text.cautions, custom: true }
          : { ...defaultFirstAid[category], custom: false },
      ];
    }),
  ) as UrgentSettingsView['firstAid'];
  return {
    ackTargetMinutes: row?.ackTargetMinutes ?? defaultAckTargetMinutes,
    callOutFeeCents: fee.callOutFeeMinor,
    currency: fee.currency,
    firstAid,
  };
}

export async function getUrgentSettings(db: Db, actor: Actor): Promise<UrgentSettingsView> {
  const [row, fee] = await Promise.all([
    settingsRowOf(db, actor.companyId),
    callOutFeeOf(db, actor.companyId),
  ]);
  return settingsViewOf(row, fee);
}

/** What the audit trail keeps of the settings: the numbers, and which categories have the company's own text. */
function auditValuesOf(view: UrgentSettingsView) {
  return {
    ackTargetMinutes: view.ackTargetMinutes,
    ownFirstAid: urgentCategories.filter((category) => view.firstAid[category].custom),
  };
}

/**
 * Replaces the company's settings; a category left out or given null keeps the default text. The
 * change and its audit entry commit together.
 */
export async function saveUrgentSettings(
  db: Db,
  actor: Actor,
  input: UrgentSettingsInput,
  source: AuditSource,
): Promise<UrgentSettingsView> {
  const firstAid = Object.fromEntries(Object.entries(input.firstAid).filter(([, text]) => text));
  const values = {
    ackTargetMinutes: input.ackTargetMinutes,
    firstAid,
  };
  return db.transaction(async (tx) => {
    const fee = await callOutFeeOf(tx, actor.companyId);
    const before = settingsViewOf(await settingsRowOf(tx, actor.companyId), fee);
    const [saved] = await tx
      .insert(urgentSettings)
      .values({ companyId: actor.companyId, ...values })
      .onConflictDoUpdate({ target: urgentSettings.companyId, set: values })
      .returning();
    const after = settingsViewOf(saved, fee);
    await recordAudit(tx, {
      companyId: actor.companyId,
      actor,
      action: 'urgent-settings.changed',
      before: auditValuesOf(before),
      after: auditValuesOf(after),
      source,
    });
    return after;
  });
}

/* ------------------------------------------------------------------ reading requests */

const technician = alias(users, 'urgent_request_technician');

function requestsQuery(db: Db) {
  return db
    .select({
      request: urgentRequests,
      tankName: tanks.name,
      timeZone: sql<string>`coalesce(${tanks.timeZone}, ${companies.timeZone})`,
      technicianName: technician.name,
      equipmentName: equipment.description,
      powerBoard: equipment.powerBoard,
      outlet: equipment.outlet,
    })
    .from(urgentRequests)
    .innerJoin(tanks, eq(tanks.id, urgentRequests.tankId))
    .innerJoin(companies, eq(companies.id, tanks.companyId))
    .leftJoin(technician, eq(technician.id, urgentRequests.technicianId))
    .leftJoin(equipment, eq(equipment.id, urgentRequests.equipmentId));
}

type ListedRow = Awaited<ReturnType<ReturnType<typeof requestsQuery>['where']>>[number];

/**
 * The requests as the actor reads them. Owners never see an escalation: not its events, not the
 * level (always 0 for them); what they follow is the status.
 */
async function viewsOf(db: Db, actor: Actor, rows: ListedRow[]): Promise<UrgentRequestView[]> {
  if (rows.length === 0) return [];
  const ids = rows.map((row) => row.request.id);
  const staff = isStaff(actor);
  const events = await db
    .select()
    .from(urgentRequestEvents)
    .where(
      and(
        inArray(urgentRequestEvents.requestId, ids),
        staff ? undefined : ne(urgentRequestEvents.type, 'escalated'),
      ),
    )
    .orderBy(asc(urgentRequestEvents.at), asc(urgentRequestEvents.createdAt), asc(urgentRequestEvents.id));
  const attached = await db
    .select()
    .from(urgentRequestPhotos)
    .where(inArray(urgentRequestPhotos.requestId, ids))
    .orderBy(asc(urgentRequestPhotos.position));
  const target = (await settingsRowOf(db, actor.companyId))?.ackTargetMinutes ?? defaultAckTargetMinutes;
  return rows.map((row) => {
    const { request } = row;
    return {
      id: request.id,
      tankId: request.tankId,
      tankName: row.tankName,
      timeZone: row.timeZone,
      category: request.category,
      equipment:
        request.equipmentId && row.equipmentName !== null
          ? { id: request.equipmentId, name: row.equipmentName, outlet: outletOf(row) }
          : null,
      description: request.description,
      photos: attached
        .filter((photo) => photo.requestId === request.id)
        .map((photo) => ({ id: photo.photoId, ...photoUrls(photo.photoId) })),
      someoneOnSite: request.someoneOnSite,
      access: request.access,
      phone: request.phone,
      bestTime: request.bestTime,
      status: request.status,
      eta: request.eta?.toISOString() ?? null,
      technician:
        request.technicianId && row.technicianName !== null
          ? { id: request.technicianId, name: row.technicianName }
          : null,
      requestedBy: { id: request.requestedBy, name: request.requestedByName },
      declineReason: request.declineReason,
      advice: request.advice,
      visitId: request.visitId,
      callOutFeeCents: request.callOutFeeCents,
      currency: request.currency,
      snapshot: request.snapshot as UrgentSnapshot,
      ackTargetMinutes: target,
      escalationLevel: staff ? request.escalationLevel : 0,
      acknowledgedAt: request.acknowledgedAt?.toISOString() ?? null,
      closedAt: request.closedAt?.toISOString() ?? null,
      createdAt: request.createdAt.toISOString(),
      events: events
        .filter((event) => event.requestId === request.id)
        .map((event) => ({
          id: event.id,
          type: event.type,
          at: event.at.toISOString(),
          actorName: event.actorName,
          note: event.note,
          eta: event.eta?.toISOString() ?? null,
        })),
    };
  });
}

async function findRequestFor(db: Db, actor: Actor, requestId: string): Promise<ListedRow> {
  const [row] = await requestsQuery(db).where(and(eq(urgentRequests.id, requestId), visibleTanks(db, actor)));
  if (!row) throw notFound('urgent request');
  return row;
}

export async function getUrgentRequest(db: Db, actor: Actor, requestId: string): Promise<UrgentRequestView> {
  const [view] = await viewsOf(db, actor, [await findRequestFor(db, actor, requestId)]);
  return view!;
}

/** A tank's requests, newest first. */
export async function tankUrgentRequests(db: Db, actor: Actor, tankId: string): Promise<UrgentRequestView[]> {
  const tank = await findTankFor(db, actor, tankId, 'read');
  const rows = await requestsQuery(db)
    .where(eq(urgentRequests.tankId, tank.id))
    .orderBy(desc(urgentRequests.createdAt), desc(urgentRequests.id));
  return viewsOf(db, actor, rows);
}

/** The staff board: open requests oldest first (the longest waiting on top); closed ones latest first. */
export async function urgentBoard(db: Db, actor: Actor, query: BoardQuery): Promise<UrgentRequestView[]> {
  const open = query.state === 'open';
  const statuses: UrgentStatus[] = open ? [...openUrgentStatuses] : ['resolved', 'declined'];
  const rows = await requestsQuery(db)
    .where(and(eq(urgentRequests.companyId, actor.companyId), inArray(urgentRequests.status, statuses)))
    .orderBy(
      ...(open
        ? [asc(urgentRequests.createdAt), asc(urgentRequests.id)]
        : [desc(urgentRequests.closedAt), desc(urgentRequests.id)]),
    )
    .limit(open ? 1000 : closedBoardLimit);
  return viewsOf(db, actor, rows);
}

/* ------------------------------------------------------------------ asking for an urgent visit */

/** The latest reading of each parameter and the alerts still open, as they stand when the owner asks. */
async function snapshotOf(db: Db, actor: Actor, tankId: string, now: Date): Promise<UrgentSnapshot> {
  const health = await latestReadings(db, actor, tankId, now);
  const open = await db
    .select({ id: alerts.id, title: alerts.title, severity: alerts.severity, openedAt: alerts.openedAt })
    .from(alerts)
    .where(and(eq(alerts.tankId, tankId), ne(alerts.status, 'resolved')))
    .orderBy(asc(alerts.openedAt), asc(alerts.id));
  return {
    readings: health.parameters.flatMap((parameter) =>
      parameter.latest
        ? [
            {
              parameter: parameter.parameter,
              label: parameterCatalogue[parameter.parameter].label,
              value: parameter.latest.value,
              unit: parameterCatalogue[parameter.parameter].unit,
              at: parameter.latest.measuredAt,
            },
          ]
        : [],
    ),
    openAlerts: open.map((alert) => ({ ...alert, openedAt: alert.openedAt.toISOString() })),
  };
}

async function requestIssues(db: Db, actor: Actor, tankId: string, input: NewRequest): Promise<ErrorIssue[]> {
  const issues: ErrorIssue[] = [];
  if (input.equipmentId) {
    const [item] = await db
      .select({ id: equipment.id })
      .from(equipment)
      .where(and(eq(equipment.id, input.equipmentId), eq(equipment.tankId, tankId)));
    if (!item) issues.push({ path: 'body.equipmentId', message: 'choose equipment of this tank' });
  }
  if (input.photoIds.length > 0) {
    // Photos taken for this request: uploaded by this person for this tank, through the form's upload.
    const own = new Set(
      (
        await db
          .select({ id: photos.id })
          .from(photos)
          .where(
            and(
              inArray(photos.id, input.photoIds),
              eq(photos.tankId, tankId),
              eq(photos.subject, 'message'),
              eq(photos.uploadedBy, actor.id),
              unattachedPhoto(),
            ),
          )
      ).map((row) => row.id),
    );
    input.photoIds.forEach((id, index) => {
      if (input.photoIds.indexOf(id) !== index) {
        issues.push({ path: `body.photoIds.${index}`, message: 'this photo is listed twice' });
      } else if (!own.has(id)) {
        issues.push({ path: `body.photoIds.${index}`, message: 'add a photo you took for this request' });
      }
    });
  }
  return issues;
}

/**
 * Asks for an urgent visit: checks what it names, that the owner saw the call-out fee now in force,
 * attaches what the tank looks like right now, and writes the request, its photos and its first
 * event at once. Whoever is on call hears of it straight after.
 */
export async function createUrgentRequest(
  deps: AppDeps,
  actor: Actor,
  tankId: string,
  input: NewRequest,
): Promise<UrgentRequestView> {
  const { db } = deps;
  const tank = await findTankFor(db, actor, tankId, 'read');
  const issues = await requestIssues(db, actor, tank.id, input);
  if (issues.length > 0) throw invalidFields(issues);
  const [settingsRow, fee] = await Promise.all([
    settingsRowOf(db, tank.companyId),
    callOutFeeOf(db, tank.companyId),
  ]);
  const settings = settingsViewOf(settingsRow, fee);
  if (input.acceptedCallOutFeeCents !== settings.callOutFeeCents) {
    throw conflict(
      'fee_changed',
      settings.callOutFeeCents === null
        ? 'There is no call-out fee for urgent visits any more. Check the request and send it again.'
        : `The call-out fee for urgent visits is now ${formatMoney(settings.callOutFeeCents, settings.currency)}. Check the request and send it again.`,
    );
  }
  const now = deps.clock();
  const snapshot = await snapshotOf(db, actor, tank.id, now);
  const { requestId, eventId } = await db.transaction(async (tx) => {
    const [created] = await tx
      .insert(urgentRequests)
      .values({
        companyId: tank.companyId,
        tankId: tank.id,
        requestedBy: actor.id,
        requestedByName: actor.name,
        category: input.category,
        equipmentId: input.equipmentId,
        description: input.description,
        someoneOnSite: input.someoneOnSite,
        access: input.access,
        phone: input.phone,
        bestTime: input.bestTime,
        callOutFeeCents: settings.callOutFeeCents,
        currency: settings.currency,
        snapshot,
        // On the app's clock: the acknowledgement target and its escalations count from here.
        createdAt: now,
      })
      .returning({ id: urgentRequests.id });
    if (input.photoIds.length > 0) {
      await tx
        .insert(urgentRequestPhotos)
        .values(input.photoIds.map((photoId, position) => ({ requestId: created!.id, photoId, position })));
    }
    const firstEvent = await recordUrgentEvent(tx, {
      requestId: created!.id,
      type: 'requested',
      actor,
      at: now,
    });
    return { requestId: created!.id, eventId: firstEvent };
  });
  await announceUrgentEvent(deps, eventId);
  return getUrgentRequest(db, actor, requestId);
}

/* ------------------------------------------------------------------ moving a request on */

function invalidTransition(status: UrgentStatus) {
  const next = urgentTransitions[status];
  const words = (s: UrgentStatus) => `“${urgentStatusNames[s]}”`;
  return conflict(
    'invalid_transition',
    next.length === 0
      ? `This request is ${words(status)} and cannot change any more.`
      : `This request is ${words(status)}; it can move to ${next.map(words).join(' or ')} only.`,
  );
}

/** An active member of staff of the company, or a 400 on the field that named them. */
async function checkTechnician(db: Db, actor: Actor, technicianId: string) {
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
  if (!person) {
    throw invalidFields([{ path: 'body.technicianId', message: 'choose an active member of staff' }]);
  }
}

/**
 * The urgent visit behind an assigned request, planned through the schedule's own rules (who may
 * give a visit to whom, an active technician): a new one, or the one planned before given to the
 * new technician. The schedule plans on the wall clock within one day; an urgent visit starts when
 * the technician can be there, midnight or not, so its window is then set from the instant itself.
 */
async function planUrgentVisit(
  tx: Tx,
  deps: AppDeps,
  actor: Actor,
  row: ListedRow,
  technicianId: string,
  start: Date,
  moveWindow: boolean,
): Promise<string> {
  const { request } = row;
  const scoped = { db: tx as unknown as Db, clock: deps.clock };
  const window = { windowStart: start, windowEnd: new Date(start.getTime() + urgentVisitMs) };
  if (request.visitId) {
    const [planned] = await tx
      .select({ status: visits.status })
      .from(visits)
      .where(eq(visits.id, request.visitId));
    if (planned && (planned.status === 'scheduled' || planned.status === 'in-progress')) {
      await updateVisit(scoped, actor, request.visitId, { technicianId });
      if (moveWindow) await tx.update(visits).set(window).where(eq(visits.id, request.visitId));
      return request.visitId;
    }
  }
  const wall = wallTimeOf(start, row.timeZone);
  const endWall = wallTimeOf(window.windowEnd, row.timeZone);
  const startTime = wall.time === '23:59' ? '23:58' : wall.time;
  const endTime = endWall.day === wall.day && endWall.time > startTime ? endWall.time : '23:59';
  const category = urgentCategoryNames[request.category].label;
  const visit = await scheduleVisit(
    scoped,
    actor,
    scheduleVisitInput.parse({
      tankId: request.tankId,
      kind: 'urgent',
      technicianId,
      date: wall.day,
      startTime,
      endTime,
      note: `Urgent request: ${category}. ${request.requestedByName}, ${request.phone}.`.slice(0, 1000),
    }),
  );
  await tx.update(visits).set(window).where(eq(visits.id, visit.id));
  return visit.id;
}

/** A declined request leaves no visit on the schedule; one whose report is published stays as it is. */
async function cancelUrgentVisit(tx: Tx, actor: Actor, visitId: string) {
  const [planned] = await tx.select({ status: visits.status }).from(visits).where(eq(visits.id, visitId));
  if (planned && (planned.status === 'scheduled' || planned.status === 'in-progress')) {
    await updateVisit({ db: tx as unknown as Db }, actor, visitId, { cancelled: true });
  }
}

/** The columns one move sets besides the status. */
function changesOf(move: Move, now: Date): Partial<typeof urgentRequests.$inferInsert> {
  switch (move.to) {
    case 'acknowledged':
      return { eta: new Date(move.eta), acknowledgedAt: now };
    case 'assigned':
      return { technicianId: move.technicianId, ...(move.eta && { eta: new Date(move.eta) }) };
    case 'on-the-way':
      return move.eta ? { eta: new Date(move.eta) } : {};
    case 'on-site':
      return {};
    case 'resolved':
      return { closedAt: now };
    case 'declined':
      return { declineReason: move.reason, advice: move.advice, closedAt: now };
  }
}

/**
 * Moves a request on in its lifecycle (shared/urgent/lifecycle.ts). The write is conditional on the
 * status (and technician) it was read with, so of two staff moving it at once one wins and the
 * other gets 409. Each move writes an event; everyone watching is told after the commit.
 */
export async function moveUrgentRequest(
  deps: AppDeps,
  actor: Actor,
  requestId: string,
  move: Move,
): Promise<UrgentRequestView> {
  const { db } = deps;
  const row = await findRequestFor(db, actor, requestId);
  const { request } = row;
  if (!canMove(request.status, move.to)) throw invalidTransition(request.status);
  if (move.to === 'assigned') await checkTechnician(db, actor, move.technicianId);
  const now = deps.clock();
  const eta = 'eta' in move && move.eta ? new Date(move.eta) : null;

  const eventId = await db.transaction(async (tx) => {
    const sameAsRead: SQL[] = [
      eq(urgentRequests.id, request.id),
      eq(urgentRequests.status, request.status),
      request.technicianId === null
        ? isNull(urgentRequests.technicianId)
        : eq(urgentRequests.technicianId, request.technicianId),
    ];
    const [moved] = await tx
      .update(urgentRequests)
      .set({ status: move.to, ...changesOf(move, now) })
      .where(and(...sameAsRead))
      .returning({ id: urgentRequests.id });
    if (!moved) {
      const [current] = await tx
        .select({ status: urgentRequests.status })
        .from(urgentRequests)
        .where(eq(urgentRequests.id, request.id));
      if (!current || !canMove(current.status, move.to))
        throw invalidTransition(current?.status ?? request.status);
      throw conflict(
        'request_changed',
        'Someone else changed this request just now. Look at it again first.',
      );
    }
    if (move.to === 'assigned') {
      const visitId = await planUrgentVisit(
        tx,
        deps,
        actor,
        row,
        move.technicianId,
        eta ?? request.eta ?? now,
        eta !== null,
      );
      if (visitId !== request.visitId) {
        await tx.update(urgentRequests).set({ visitId }).where(eq(urgentRequests.id, request.id));
      }
    }
    if (move.to === 'declined' && request.visitId) await cancelUrgentVisit(tx, actor, request.visitId);
    return recordUrgentEvent(tx, {
      requestId: request.id,
      type: move.to,
      actor,
      note: move.to === 'declined' ? move.reason : move.note,
      eta,
      at: now,
    });
  });
  await announceUrgentEvent(deps, eventId);
  return getUrgentRequest(db, actor, requestId);
}
