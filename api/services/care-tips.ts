import { and, asc, desc, eq, exists, inArray, lte, ne, notExists, sql, type SQL } from 'drizzle-orm';
import { fromDrizzle } from 'pg-boss';
import { z } from 'zod';
import {
  tipAudience,
  tipTrigger,
  type AudienceCount,
  type CareTip,
  type TipAudience,
  type TipFeedItem,
  type TipReach,
  type TipSuggestion,
  type TipTrigger,
  type audienceCountInput,
  type careTipInput,
  type careTipPatch,
  type sendTipInput,
  type sendToTankInput,
  type tipFeedQuery,
} from '@shared/schemas/care-tips';
import type { LivestockGroup } from '@shared/livestock/species';
import { presentStatuses } from '@shared/schemas/livestock-status';
import { visitReportContent, visitTaskLabels, type VisitTask } from '@shared/schemas/visits';
import type { AppDeps } from '../deps';
import type { Db } from '../db/client';
import {
  careTipHelpful,
  careTipReaders,
  careTips,
  careTipTanks,
  deliveries,
  equipment,
  livestock,
  livestockStatusEvents,
  photos,
  tankMembers,
  tanks,
  users,
  visits,
} from '../db/schema/index';
import { badRequest, conflict, forbidden, notFound, type ErrorIssue } from '../lib/http-error';
import { queues } from '../lib/job-queue';
import { findTankFor, isStaff, visibleTanks } from '../policy/index';
import type { Actor } from './actors';
import { fanOutCareTip } from './notify';
import { companySpeciesId, companySpeciesRowId, resolveSpecies } from './species';
import { invalidFields } from './tanks';

type TipRow = typeof careTips.$inferSelect;
type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];
type NewTip = z.output<typeof careTipInput>;
type TipChange = z.output<typeof careTipPatch>;
type SendTip = z.output<typeof sendTipInput>;
type SendToTank = z.output<typeof sendToTankInput>;
type FeedQuery = z.output<typeof tipFeedQuery>;

/** How recent an added animal or a published visit must be for its tips to be offered (common practice: two weeks). */
const suggestionWindowMs = 14 * 86_400_000;

const pending = ['draft', 'scheduled'] as const;
const triggers = z.array(tipTrigger);

const emptyAudience = () =>
  badRequest('empty_audience', 'This audience matches no tank today. Choose another before sending.');

const notPending = () =>
  conflict('tip_not_pending', 'This tip has already been sent or withdrawn; it can no longer change.');

/* ------------------------------------------------------------------ who a tip is for */

/** The tanks an audience names, among the company's, as a condition on `tanks` (one SQL for counts and sends). */
function audienceWhere(companyId: string, audience: TipAudience): SQL {
  const ofCompany = eq(tanks.companyId, companyId);
  switch (audience.kind) {
    case 'all':
      return ofCompany;
    case 'style':
      return and(ofCompany, eq(tanks.style, audience.style))!;
    case 'species': {
      // Catalogue species are stored by their id, the company's own by the row id inside "company-<uuid>".
      const rowId = companySpeciesRowId(audience.speciesId);
      const keeps = rowId
        ? sql`${livestock.companySpeciesId} = ${rowId}::uuid`
        : sql`${livestock.catalogueSpeciesId} = ${audience.speciesId}`;
      return and(
        ofCompany,
        sql`exists (select 1 from ${livestock} where ${livestock.tankId} = ${tanks.id}
          and ${livestock.status} in (${sql.join(
            presentStatuses.map((status) => sql`${status}`),
            sql`, `,
          )}) and ${keeps})`,
      )!;
    }
    case 'equipment':
      return and(
        ofCompany,
        sql`exists (select 1 from ${equipment} where ${equipment.tankId} = ${tanks.id}
          and ${equipment.kind} = ${audience.equipmentKind})`,
      )!;
    case 'tanks':
      return and(ofCompany, inArray(tanks.id, audience.tankIds))!;
  }
}

/** Owners as the sending counts them: members of the tank whose accounts are active. */
const activeMember = and(eq(users.id, tankMembers.userId), eq(users.status, 'active'));

async function countAudience(db: Db | Tx, companyId: string, audience: TipAudience): Promise<AudienceCount> {
  const [tankCount] = await db
    .select({ n: sql<number>`count(*)`.mapWith(Number) })
    .from(tanks)
    .where(audienceWhere(companyId, audience));
  const [ownerCount] = await db
    .select({ n: sql<number>`count(distinct ${tankMembers.userId})`.mapWith(Number) })
    .from(tankMembers)
    .innerJoin(tanks, eq(tanks.id, tankMembers.tankId))
    .innerJoin(users, activeMember)
    .where(audienceWhere(companyId, audience));
  return { tanks: tankCount?.n ?? 0, owners: ownerCount?.n ?? 0 };
}

/** The live count staff see before sending; an audience that matches nothing is an answer here, not an error. */
export async function audienceCount(
  db: Db,
  actor: Actor,
  input: z.output<typeof audienceCountInput>,
): Promise<AudienceCount> {
  return countAudience(db, actor.companyId, input.audience);
}

/* ------------------------------------------------------------------ reading tips */

const tipColumns = {
  tip: careTips,
  creatorName: users.name,
  reachedTanks:
    sql<number>`(select count(*) from ${careTipTanks} where ${careTipTanks.tipId} = ${careTips.id})`.mapWith(
      Number,
    ),
  reachedOwners: sql<number>`(select count(distinct ${careTipReaders.userId}) from ${careTipReaders}
    where ${careTipReaders.tipId} = ${careTips.id})`.mapWith(Number),
  helpfulCount:
    sql<number>`(select count(*) from ${careTipHelpful} where ${careTipHelpful.tipId} = ${careTips.id})`.mapWith(
      Number,
    ),
};

type TipListRow = {
  tip: TipRow;
  creatorName: string | null;
  reachedTanks: number;
  reachedOwners: number;
  helpfulCount: number;
};

const tipQuery = (db: Db) =>
  db.select(tipColumns).from(careTips).leftJoin(users, eq(users.id, careTips.createdBy));

function present(row: TipListRow): CareTip {
  const { tip } = row;
  return {
    id: tip.id,
    title: tip.title,
    body: tip.body,
    category: tip.category,
    photoId: tip.photoId,
    // Written through the same schemas; reading them back only fills defaults.
    audience: tipAudience.parse(tip.audience),
    suggestWhen: triggers.parse(tip.suggestWhen),
    status: tip.status,
    sendAt: tip.sendAt?.toISOString() ?? null,
    sentAt: tip.sentAt?.toISOString() ?? null,
    withdrawnAt: tip.withdrawnAt?.toISOString() ?? null,
    createdBy: tip.createdBy && row.creatorName ? { id: tip.createdBy, name: row.creatorName } : null,
    reached: { tanks: row.reachedTanks, owners: row.reachedOwners },
    helpfulCount: row.helpfulCount,
    createdAt: tip.createdAt.toISOString(),
  };
}

/** The company's tips, newest first, whatever their state. */
export async function listTips(db: Db, actor: Actor): Promise<CareTip[]> {
  const rows = await tipQuery(db)
    .where(eq(careTips.companyId, actor.companyId))
    .orderBy(desc(careTips.createdAt), desc(careTips.id));
  return rows.map(present);
}

/** A tip of the actor's company, or a 404 exactly as for one that does not exist. */
async function findTipFor(db: Db | Tx, actor: Actor, tipId: string): Promise<TipRow> {
  const [tip] = await db
    .select()
    .from(careTips)
    .where(and(eq(careTips.id, tipId), eq(careTips.companyId, actor.companyId)));
  if (!tip) throw notFound('care tip');
  return tip;
}

export async function getTip(db: Db, actor: Actor, tipId: string): Promise<CareTip> {
  const [row] = await tipQuery(db).where(
    and(eq(careTips.id, tipId), eq(careTips.companyId, actor.companyId)),
  );
  if (!row) throw notFound('care tip');
  return present(row);
}

/** Who a tip reached: each tank once, each owner of each tank as they were then, and who found it helpful. */
export async function tipReach(db: Db, actor: Actor, tipId: string): Promise<TipReach> {
  const tip = await findTipFor(db, actor, tipId);
  const reachedTanks = await db
    .select({ id: tanks.id, name: tanks.name, deliveredAt: careTipTanks.deliveredAt })
    .from(careTipTanks)
    .innerJoin(tanks, eq(tanks.id, careTipTanks.tankId))
    .where(eq(careTipTanks.tipId, tip.id))
    .orderBy(asc(careTipTanks.deliveredAt), asc(tanks.name), asc(tanks.id));
  const owners = await db
    .select({
      id: users.id,
      name: users.name,
      tankName: tanks.name,
      helpful: sql<boolean>`exists (select 1 from ${careTipHelpful} where ${careTipHelpful.tipId} = ${careTipReaders.tipId}
        and ${careTipHelpful.userId} = ${careTipReaders.userId})`,
    })
    .from(careTipReaders)
    .innerJoin(users, eq(users.id, careTipReaders.userId))
    .innerJoin(tanks, eq(tanks.id, careTipReaders.tankId))
    .where(eq(careTipReaders.tipId, tip.id))
    .orderBy(asc(users.name), asc(tanks.name), asc(users.id));
  return {
    tanks: reachedTanks.map((t) => ({ id: t.id, name: t.name, deliveredAt: t.deliveredAt.toISOString() })),
    owners,
  };
}

/* ------------------------------------------------------------------ writing tips */

/** What a tip names must be the company's: its photo, its species, its chosen tanks. */
async function checkReferences(
  db: Db,
  actor: Actor,
  input: Pick<TipChange, 'photoId' | 'audience'>,
): Promise<void> {
  const issues: ErrorIssue[] = [];
  if (input.photoId) {
    const [photo] = await db
      .select({ id: photos.id })
      .from(photos)
      .where(
        and(
          eq(photos.id, input.photoId),
          eq(photos.companyId, actor.companyId),
          // A tip shows its photo to every owner it reaches: a tank's or an animal's picture, never
          // one from a visit report or a conversation with one client.
          inArray(photos.subject, ['tank', 'livestock']),
        ),
      );
    if (!photo) {
      issues.push({
        path: 'body.photoId',
        message: 'choose a photo of one of your company’s tanks or animals',
      });
    }
  }
  const audience = input.audience;
  if (audience?.kind === 'species') {
    const found = await resolveSpecies(db, actor.companyId, [audience.speciesId]);
    if (!found.has(audience.speciesId)) {
      issues.push({
        path: 'body.audience.speciesId',
        message: 'choose a species from the catalogue or your own',
      });
    }
  }
  if (audience?.kind === 'tanks') {
    const known = await db
      .select({ id: tanks.id })
      .from(tanks)
      .where(and(eq(tanks.companyId, actor.companyId), inArray(tanks.id, audience.tankIds)));
    if (known.length !== audience.tankIds.length) {
      issues.push({ path: 'body.audience.tankIds', message: 'choose tanks your company looks after' });
    }
  }
  if (issues.length > 0) throw invalidFields(issues);
}

export async function createTip(db: Db, actor: Actor, input: NewTip): Promise<CareTip> {
  await checkReferences(db, actor, input);
  const [created] = await db
    .insert(careTips)
    .values({
      companyId: actor.companyId,
      title: input.title,
      body: input.body,
      category: input.category,
      photoId: input.photoId,
      audience: input.audience,
      suggestWhen: input.suggestWhen,
      createdBy: actor.id,
    })
    .returning({ id: careTips.id });
  return getTip(db, actor, created!.id);
}

/** A draft or a scheduled tip may change; once sent (or withdrawn) its words are what owners read. */
export async function updateTip(db: Db, actor: Actor, tipId: string, input: TipChange): Promise<CareTip> {
  const tip = await findTipFor(db, actor, tipId);
  if (!(pending as readonly string[]).includes(tip.status)) throw notPending();
  await checkReferences(db, actor, input);
  const fields: Partial<typeof careTips.$inferInsert> = {
    ...(input.title !== undefined && { title: input.title }),
    ...(input.body !== undefined && { body: input.body }),
    ...(input.category !== undefined && { category: input.category }),
    ...(input.photoId !== undefined && { photoId: input.photoId }),
    ...(input.audience !== undefined && { audience: input.audience }),
    ...(input.suggestWhen !== undefined && { suggestWhen: input.suggestWhen }),
  };
  if (Object.keys(fields).length > 0) {
    const [changed] = await db
      .update(careTips)
      .set(fields)
      .where(and(eq(careTips.id, tip.id), inArray(careTips.status, [...pending])))
      .returning({ id: careTips.id });
    // Sent by someone else (or by its schedule) between the read and the write.
    if (!changed) throw notPending();
  }
  return getTip(db, actor, tip.id);
}

/**
 * Sends a tip now (`at` null) or at a set time. A time in the past by the server's clock, or an
 * audience that matches no tank today, is refused; a scheduled tip whose audience has emptied by
 * its time goes to nobody and says so in its reach.
 */
export async function sendTip(deps: AppDeps, actor: Actor, tipId: string, input: SendTip): Promise<CareTip> {
  const { db } = deps;
  const tip = await findTipFor(db, actor, tipId);
  if (!(pending as readonly string[]).includes(tip.status)) throw notPending();
  if (input.at === null) {
    const sent = await deliverTip(deps, tip.id, undefined, { sentBy: actor.id, refuseEmpty: true });
    if (!sent) throw notPending();
    return getTip(db, actor, tip.id);
  }
  const at = new Date(input.at);
  if (at.getTime() <= deps.clock().getTime()) {
    throw invalidFields([{ path: 'body.at', message: 'choose a time in the future, or send it now' }]);
  }
  if ((await countAudience(db, tip.companyId, tipAudience.parse(tip.audience))).tanks === 0) {
    throw emptyAudience();
  }
  await db.transaction(async (tx) => {
    const [scheduled] = await tx
      .update(careTips)
      .set({ status: 'scheduled', sendAt: at })
      .where(and(eq(careTips.id, tip.id), inArray(careTips.status, [...pending])))
      .returning({ id: careTips.id });
    if (!scheduled) throw notPending();
    // Queued in the same transaction, so the job exists exactly when the schedule does. A job of an
    // earlier time finds the tip not yet due and does nothing; the minute sweep covers a lost one.
    if (deps.jobs) {
      await deps.jobs.send(queues.tipSend, { tipId: tip.id }, { startAfter: at, db: fromDrizzle(tx, sql) });
    }
  });
  return getTip(db, actor, tip.id);
}

export interface DeliverOptions {
  /** Who sent it; none for a send at its set time. */
  sentBy?: string | null;
  /** Only a scheduled tip whose time has come (the scheduled job and the minute sweep). */
  dueOnly?: boolean;
  /** A whole send whose audience matches no tank is refused (400) instead of going to nobody. */
  refuseEmpty?: boolean;
}

/**
 * Delivers a tip, in one transaction: to its whole audience (without `tankIds`), claiming the tip
 * first so that of two workers or requests exactly one sends it; or to chosen tanks of its company,
 * for a tip already sent or scheduled. Each tank and each of its active owners is recorded once (a
 * second delivery to a tank is a no-op), and the owners are told after the commit. Returns the
 * tanks newly reached, or null when there was nothing to send (already sent, withdrawn, not due).
 */
export async function deliverTip(
  deps: AppDeps,
  tipId: string,
  tankIds?: string[],
  options: DeliverOptions = {},
): Promise<string[] | null> {
  const now = deps.clock();
  const reached = await deps.db.transaction(async (tx) => {
    const [tip] =
      tankIds === undefined
        ? await tx
            .update(careTips)
            .set({ status: 'sent', sentAt: now, ...(options.dueOnly ? {} : { sendAt: null }) })
            .where(
              and(
                eq(careTips.id, tipId),
                options.dueOnly
                  ? and(eq(careTips.status, 'scheduled'), lte(careTips.sendAt, now))
                  : inArray(careTips.status, [...pending]),
              ),
            )
            .returning()
        : // Held against a withdrawal (an update) until these rows are in.
          await tx
            .select()
            .from(careTips)
            .where(and(eq(careTips.id, tipId), inArray(careTips.status, ['sent', 'scheduled'])))
            .for('share');
    if (!tip) return null;
    const where =
      tankIds === undefined
        ? audienceWhere(tip.companyId, tipAudience.parse(tip.audience))
        : and(eq(tanks.companyId, tip.companyId), inArray(tanks.id, tankIds));
    const targets = await tx.select({ id: tanks.id }).from(tanks).where(where);
    if (targets.length === 0) {
      if (tankIds === undefined && options.refuseEmpty) throw emptyAudience();
      return [];
    }
    const inserted = await tx
      .insert(careTipTanks)
      .values(
        targets.map((t) => ({
          tipId: tip.id,
          tankId: t.id,
          deliveredAt: now,
          sentBy: options.sentBy ?? null,
        })),
      )
      .onConflictDoNothing()
      .returning({ tankId: careTipTanks.tankId });
    if (inserted.length === 0) return [];
    const newTanks = inserted.map((row) => row.tankId);
    // The owners of each newly reached tank as they are now; a tank reached before keeps its readers.
    await tx.execute(sql`
      insert into ${careTipReaders} (tip_id, tank_id, user_id)
      select ${tip.id}::uuid, ${tankMembers.tankId}, ${tankMembers.userId}
      from ${tankMembers} join ${users} on ${activeMember}
      where ${tankMembers.tankId} in (${sql.join(
        newTanks.map((id) => sql`${id}::uuid`),
        sql`, `,
      )})
      on conflict do nothing`);
    // The fan-out job commits with the rows it announces, so a crash in between loses nothing.
    if (deps.jobs) await deps.jobs.send(queues.newsFanOut, { tipId: tip.id }, { db: fromDrizzle(tx, sql) });
    return newTanks;
  });
  if (reached && reached.length > 0 && !deps.jobs) {
    // Without a job queue (tests, tools) owners are told in-process, as visit reports are.
    try {
      await fanOutCareTip(deps, tipId);
    } catch (error) {
      deps.logger.error({ err: error, tipId }, 'telling owners of a care tip failed');
    }
  }
  return reached;
}

/** Scheduled tips whose time has passed: what the job would have sent, for a job lost on the way. */
export async function sendDueTips(deps: AppDeps): Promise<number> {
  const due = await deps.db
    .select({ id: careTips.id })
    .from(careTips)
    .where(and(eq(careTips.status, 'scheduled'), lte(careTips.sendAt, deps.clock())))
    .orderBy(asc(careTips.sendAt))
    .limit(100);
  let sent = 0;
  for (const { id } of due) {
    if (await deliverTip(deps, id, undefined, { dueOnly: true })) sent += 1;
  }
  return sent;
}

/** One tap from a suggestion: the tip reaches this tank now; a second tap changes nothing. */
export async function sendTipToTank(
  deps: AppDeps,
  actor: Actor,
  tipId: string,
  input: SendToTank,
): Promise<CareTip> {
  const tip = await findTipFor(deps.db, actor, tipId);
  const tank = await findTankFor(deps.db, actor, input.tankId, 'write');
  if (tip.status !== 'sent' && tip.status !== 'scheduled') {
    throw conflict(
      'tip_not_sent',
      tip.status === 'withdrawn'
        ? 'This tip was withdrawn; it cannot be sent again.'
        : 'Send this draft to its audience (or schedule it) before sending it to one tank.',
    );
  }
  const sent = await deliverTip(deps, tip.id, [tank.id], { sentBy: actor.id });
  if (!sent) throw conflict('tip_not_sent', 'This tip was withdrawn; it cannot be sent again.');
  return getTip(deps.db, actor, tip.id);
}

/**
 * Takes a tip out of every feed and out of its schedule. What was delivered stays recorded; e-mails
 * and pushes not yet sent are dropped. Withdrawing again changes nothing.
 */
export async function withdrawTip(deps: AppDeps, actor: Actor, tipId: string): Promise<CareTip> {
  const tip = await findTipFor(deps.db, actor, tipId);
  if (tip.status !== 'withdrawn') {
    await deps.db.transaction(async (tx) => {
      await tx
        .update(careTips)
        .set({ status: 'withdrawn', withdrawnAt: deps.clock() })
        .where(and(eq(careTips.id, tip.id), ne(careTips.status, 'withdrawn')));
      await tx
        .update(deliveries)
        .set({ status: 'gone', lastError: 'the care tip was withdrawn' })
        .where(and(eq(deliveries.tipId, tip.id), eq(deliveries.status, 'pending')));
    });
  }
  return getTip(deps.db, actor, tip.id);
}

/* ------------------------------------------------------------------ reading them as an owner */

// Delivery times are written from the app's clock (milliseconds); compared at that precision, so a
// cursor written from an item always names the item's own place.
const deliveredMs = sql`date_trunc('milliseconds', ${careTipTanks.deliveredAt})`;

/** Tips delivered to the tanks the actor sees (owners: their own), newest first, by cursor. */
export async function tipFeed(db: Db, actor: Actor, query: FeedQuery): Promise<TipFeedItem[]> {
  if (query.tankId) await findTankFor(db, actor, query.tankId, 'read');
  let after: SQL | undefined;
  if (query.cursor) {
    const [at, tipId, tankId] = query.cursor.split('_');
    after = sql`(${deliveredMs}, ${careTipTanks.tipId}, ${careTipTanks.tankId}) < (${at}::timestamptz, ${tipId}::uuid, ${tankId}::uuid)`;
  }
  const rows = await db
    .select({
      tipId: careTips.id,
      tankId: tanks.id,
      tankName: tanks.name,
      title: careTips.title,
      body: careTips.body,
      category: careTips.category,
      photoId: careTips.photoId,
      deliveredAt: careTipTanks.deliveredAt,
      helpful: sql<boolean>`exists (select 1 from ${careTipHelpful} where ${careTipHelpful.tipId} = ${careTips.id}
        and ${careTipHelpful.userId} = ${actor.id})`,
    })
    .from(careTipTanks)
    .innerJoin(careTips, eq(careTips.id, careTipTanks.tipId))
    .innerJoin(tanks, eq(tanks.id, careTipTanks.tankId))
    .where(
      and(
        visibleTanks(db, actor),
        ne(careTips.status, 'withdrawn'),
        query.tankId ? eq(careTipTanks.tankId, query.tankId) : undefined,
        after,
      ),
    )
    .orderBy(desc(deliveredMs), desc(careTipTanks.tipId), desc(careTipTanks.tankId))
    .limit(query.limit);
  return rows.map((row) => ({ ...row, deliveredAt: row.deliveredAt.toISOString() }));
}

/**
 * Owners mark tips delivered to one of their tanks; anyone else gets the answer a stranger would
 * (404), and staff of the company, who read tips rather than receive them, a 403.
 */
async function findReceivedTip(db: Db, actor: Actor, tipId: string): Promise<string> {
  if (isStaff(actor)) {
    await findTipFor(db, actor, tipId);
    throw forbidden('Owners mark the tips they received as helpful.');
  }
  const delivered = db
    .select({ one: sql`1` })
    .from(careTipTanks)
    .innerJoin(tanks, eq(tanks.id, careTipTanks.tankId))
    .where(and(eq(careTipTanks.tipId, careTips.id), visibleTanks(db, actor)));
  const [tip] = await db
    .select({ id: careTips.id })
    .from(careTips)
    .where(and(eq(careTips.id, tipId), ne(careTips.status, 'withdrawn'), exists(delivered)));
  if (!tip) throw notFound('care tip');
  return tip.id;
}

export async function markHelpful(db: Db, actor: Actor, tipId: string): Promise<void> {
  const id = await findReceivedTip(db, actor, tipId);
  await db.insert(careTipHelpful).values({ tipId: id, userId: actor.id }).onConflictDoNothing();
}

export async function unmarkHelpful(db: Db, actor: Actor, tipId: string): Promise<void> {
  const id = await findReceivedTip(db, actor, tipId);
  await db
    .delete(careTipHelpful)
    .where(and(eq(careTipHelpful.tipId, id), eq(careTipHelpful.userId, actor.id)));
}

/* ------------------------------------------------------------------ suggestions */

/** A group as it reads after "a" or "an" in a suggestion's reason. */
const groupWords: Readonly<Record<LivestockGroup, string>> = {
  fish: 'fish',
  'sps-coral': 'small-polyp stony coral',
  'lps-coral': 'large-polyp stony coral',
  'soft-coral': 'soft coral',
  zoanthid: 'zoanthid',
  mushroom: 'mushroom coral',
  anemone: 'anemone',
  clam: 'clam',
  shrimp: 'shrimp',
  snail: 'snail',
  crab: 'crab',
  urchin: 'urchin',
  starfish: 'starfish',
  plant: 'plant',
  'other-invertebrate': 'invertebrate',
};

function reasonFor(trigger: TipTrigger): string {
  if (trigger.on === 'visit-task') return `A visit recorded “${visitTaskLabels[trigger.task]}”`;
  const words = groupWords[trigger.group];
  return `${/^[aeiou]/.test(words) ? 'An' : 'A'} ${words} was added`;
}

/** What happened to the tank lately: groups of animals added, and tasks of visits published. */
async function recentEvents(deps: AppDeps, tank: { id: string; companyId: string }) {
  const since = new Date(deps.clock().getTime() - suggestionWindowMs);
  // An animal's first line of history is when it was added (the row itself where it has none).
  const addedAt = sql`coalesce(min(${livestockStatusEvents.changedAt}), ${livestock.createdAt})`;
  const added = await deps.db
    .select({
      catalogueSpeciesId: livestock.catalogueSpeciesId,
      companySpeciesId: livestock.companySpeciesId,
    })
    .from(livestock)
    .leftJoin(livestockStatusEvents, eq(livestockStatusEvents.livestockId, livestock.id))
    .where(and(eq(livestock.tankId, tank.id), inArray(livestock.status, [...presentStatuses])))
    .groupBy(livestock.id)
    .having(sql`${addedAt} >= ${since.toISOString()}::timestamptz`);
  const speciesIds = added.map((row) => row.catalogueSpeciesId ?? companySpeciesId(row.companySpeciesId!));
  const species = await resolveSpecies(deps.db, tank.companyId, speciesIds);
  const groups = new Set(speciesIds.flatMap((id) => species.get(id)?.profile.group ?? []));

  const published = await deps.db
    .select({ report: visits.published })
    .from(visits)
    .where(
      and(
        eq(visits.tankId, tank.id),
        eq(visits.status, 'published'),
        sql`${visits.publishedAt} >= ${since.toISOString()}::timestamptz`,
      ),
    );
  const tasks = new Set<VisitTask>(
    published.flatMap(({ report }) => visitReportContent.safeParse(report).data?.tasksDone ?? []),
  );
  return { groups, tasks };
}

/**
 * Tips (sent or scheduled, not withdrawn) this tank has not received whose triggers match what
 * happened to it in the last two weeks: an animal of the group added, or a visit that did the task.
 */
export async function tipSuggestions(deps: AppDeps, actor: Actor, tankId: string): Promise<TipSuggestion[]> {
  const tank = await findTankFor(deps.db, actor, tankId, 'write');
  const { groups, tasks } = await recentEvents(deps, tank);
  if (groups.size === 0 && tasks.size === 0) return [];
  const received = deps.db
    .select({ one: sql`1` })
    .from(careTipTanks)
    .where(and(eq(careTipTanks.tipId, careTips.id), eq(careTipTanks.tankId, tank.id)));
  const candidates = await deps.db
    .select({
      id: careTips.id,
      title: careTips.title,
      category: careTips.category,
      suggestWhen: careTips.suggestWhen,
    })
    .from(careTips)
    .where(
      and(
        eq(careTips.companyId, tank.companyId),
        inArray(careTips.status, ['sent', 'scheduled']),
        notExists(received),
      ),
    )
    .orderBy(desc(careTips.createdAt), desc(careTips.id));
  return candidates.flatMap((tip) => {
    const match = triggers
      .parse(tip.suggestWhen)
      .find((t) => (t.on === 'livestock-added' ? groups.has(t.group) : tasks.has(t.task)));
    return match
      ? [{ tip: { id: tip.id, title: tip.title, category: tip.category }, reason: reasonFor(match) }]
      : [];
  });
}
