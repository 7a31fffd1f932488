import { and, asc, desc, eq, inArray, isNotNull, isNull, sql, type SQL } from 'drizzle-orm';
import { alias, type AnyPgColumn } from 'drizzle-orm/pg-core';
import { z } from 'zod';
import { roleCan } from '@shared/people/permissions';
import { photoUrls } from '@shared/photos/urls';
import type {
  ConversationSummary,
  MessagePage,
  MessageView,
  UnreadCounts,
  inboxQuery,
  messageInput,
  messagePageQuery,
} from '@shared/schemas/conversations';
import type { PhotoItem } from '@shared/schemas/photos';
import { openUrgentStatuses } from '@shared/urgent/lifecycle';
import type { AppDeps } from '../deps';
import type { Db } from '../db/client';
import {
  conversationMessages,
  conversationReads,
  conversations,
  messagePhotos,
  notifications,
  photos,
  tankMembers,
  tanks,
  urgentRequests,
  users,
} from '../db/schema/index';
import { publishEvent } from '../lib/event-bus';
import { conflict, HttpError, notFound, type ErrorIssue } from '../lib/http-error';
import { findTankFor, isStaff, visibleTanks } from '../policy/index';
import type { Actor } from './actors';
import { announceMessage } from './conversation-notify';
import { unattachedPhoto, uploadPhoto } from './photos';
import { invalidFields } from './tanks';

/*
 * One conversation per tank between its owners and the company's staff, made with its first line.
 * Staff may add internal notes to it: owners never get one from any answer here, and the unread
 * counts, notifications and e-mails leave them out too (conversation-notify.ts).
 */

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];
type MessageRow = typeof conversationMessages.$inferSelect;
type NewMessage = Omit<z.output<typeof messageInput>, 'urgentRequestId'>;
type PageQuery = z.output<typeof messagePageQuery>;
type InboxQuery = z.output<typeof inboxQuery>;
/** conversation_messages, or an alias of it in a subquery. */
type Lines = Record<'kind' | 'side' | 'authorId' | 'createdAt', AnyPgColumn>;

const sideOf = (actor: Actor) => (isStaff(actor) ? ('staff' as const) : ('owner' as const));

/** The lines the reader may see: owners never see internal notes. */
function visibleLines(actor: Actor, m: Lines = conversationMessages): SQL | undefined {
  return isStaff(actor) ? undefined : eq(m.kind, 'message');
}

/**
 * The lines that count as unread for the reader once past their read position: for owners the
 * staff's messages (never a note, never a fellow owner's line); for staff everything they did not
 * write themselves. Nobody's own lines are ever unread to them.
 */
function countedLines(actor: Actor, m: Lines = conversationMessages): SQL {
  return isStaff(actor)
    ? sql`${m.authorId} is distinct from ${actor.id}::uuid`
    : and(eq(m.kind, 'message'), eq(m.side, 'staff'))!;
}

/** Where the reader's read position is joined as `conversation_reads`. */
const pastReadPosition = (m: Lines = conversationMessages) =>
  sql`${m.createdAt} > coalesce(${conversationReads.readThrough}, '-infinity'::timestamptz)`;

const readsOf = (actor: Actor) =>
  and(eq(conversationReads.conversationId, conversations.id), eq(conversationReads.userId, actor.id));

/* ------------------------------------------------------------------ cursors */

/*
 * A page cursor is the oldest line of the page as (created_at in microseconds since 1970, id), so
 * the next page continues exactly below it however many lines share a millisecond. Clients treat
 * it as opaque: base64url, and only this module reads it.
 */
const cursorText = z.string().regex(/^\d{1,19}\|[0-9a-f-]{36}$/);
const cursorId = z.uuid();

function encodeCursor(micros: string, id: string): string {
  return Buffer.from(`${micros}|${id}`, 'utf8').toString('base64url');
}

function decodeCursor(cursor: string): { micros: string; id: string } {
  const text = Buffer.from(cursor, 'base64url').toString('utf8');
  const [micros, id] = text.split('|');
  if (!cursorText.safeParse(text).success || !cursorId.safeParse(id).success) {
    throw invalidFields([{ path: 'query.before', message: 'use the cursor the previous page gave' }]);
  }
  return { micros: micros!, id: id! };
}

const microsOf = (m: Lines) =>
  sql<string>`(extract(epoch from ${m.createdAt}) * 1000000)::bigint::text`.as('cursor_micros');

/* ------------------------------------------------------------------ reading */

function viewOf(row: MessageRow, photoIds: string[]): MessageView {
  return {
    id: row.id,
    conversationId: row.conversationId,
    tankId: row.tankId,
    kind: row.kind,
    body: row.body,
    photos: photoIds.map((id) => ({ id, ...photoUrls(id) })),
    author: { id: row.authorId, name: row.authorName, side: row.side },
    urgentRequestId: row.urgentRequestId,
    createdAt: row.createdAt.toISOString(),
  };
}

async function viewsOf(db: Db | Tx, rows: MessageRow[]): Promise<MessageView[]> {
  const ids = rows.map((row) => row.id);
  const attached =
    ids.length === 0
      ? []
      : await db
          .select({ messageId: messagePhotos.messageId, photoId: messagePhotos.photoId })
          .from(messagePhotos)
          .where(inArray(messagePhotos.messageId, ids))
          .orderBy(asc(messagePhotos.position));
  const byMessage = new Map<string, string[]>();
  for (const { messageId, photoId } of attached) {
    byMessage.set(messageId, [...(byMessage.get(messageId) ?? []), photoId]);
  }
  return rows.map((row) => viewOf(row, byMessage.get(row.id) ?? []));
}

async function conversationOfTank(db: Db | Tx, tankId: string) {
  const [conversation] = await db.select().from(conversations).where(eq(conversations.tankId, tankId));
  return conversation ?? null;
}

/** A page of the tank's conversation, newest page first, oldest line first within the page. */
export async function messagePage(
  db: Db,
  actor: Actor,
  tankId: string,
  query: PageQuery,
): Promise<MessagePage> {
  const tank = await findTankFor(db, actor, tankId, 'read');
  const before = query.before === undefined ? null : decodeCursor(query.before);
  const conversation = await conversationOfTank(db, tank.id);
  if (!conversation) return { messages: [], next: null, readThrough: null };
  const cm = conversationMessages;
  const rows = await db
    .select({ line: cm, micros: microsOf(cm) })
    .from(cm)
    .where(
      and(
        eq(cm.conversationId, conversation.id),
        visibleLines(actor),
        before
          ? sql`(${cm.createdAt}, ${cm.id}) < (timestamptz 'epoch' + ${before.micros}::bigint * interval '1 microsecond', ${before.id}::uuid)`
          : undefined,
      ),
    )
    .orderBy(desc(cm.createdAt), desc(cm.id))
    .limit(query.limit + 1);
  const page = rows.slice(0, query.limit);
  const oldest = page.at(-1);
  const [read] = await db
    .select({ readThrough: conversationReads.readThrough })
    .from(conversationReads)
    .where(
      and(eq(conversationReads.conversationId, conversation.id), eq(conversationReads.userId, actor.id)),
    );
  return {
    messages: await viewsOf(db, page.map((row) => row.line).reverse()),
    next: rows.length > query.limit && oldest ? encodeCursor(oldest.micros, oldest.line.id) : null,
    readThrough: read?.readThrough?.toISOString() ?? null,
  };
}

/* ------------------------------------------------------------------ summaries */

const lastLine = alias(conversationMessages, 'last_line');
const m = alias(conversationMessages, 'm');

function summaryQuery(db: Db, actor: Actor) {
  const unread = sql<number>`(select count(*) from ${conversationMessages} "m"
    where ${m.conversationId} = ${conversations.id} and ${pastReadPosition(m)} and ${countedLines(actor, m)})`;
  const newestVisible = sql`(select ${m.id} from ${conversationMessages} "m"
    where ${and(eq(m.conversationId, conversations.id), visibleLines(actor, m))}
    order by ${m.createdAt} desc, ${m.id} desc limit 1)`;
  const query = db
    .select({
      id: conversations.id,
      tankId: conversations.tankId,
      tankName: tanks.name,
      ownerNames: sql<string[]>`coalesce((select array_agg(${users.name} order by ${users.name}, ${users.id})
        from ${tankMembers} join ${users} on ${users.id} = ${tankMembers.userId}
        where ${tankMembers.tankId} = ${conversations.tankId}), '{}')`,
      lastBody: lastLine.body,
      lastKind: lastLine.kind,
      lastAuthorName: lastLine.authorName,
      lastAt: lastLine.createdAt,
      unread: unread.mapWith(Number),
      awaitingReplySince: conversations.awaitingReplySince,
      openUrgentRequestId: sql<string | null>`(select ${urgentRequests.id} from ${urgentRequests}
        where ${urgentRequests.tankId} = ${conversations.tankId}
        and ${inArray(urgentRequests.status, [...openUrgentStatuses])}
        order by ${urgentRequests.createdAt} desc, ${urgentRequests.id} desc limit 1)`,
    })
    .from(conversations)
    .innerJoin(tanks, eq(tanks.id, conversations.tankId))
    .leftJoin(conversationReads, readsOf(actor))
    .leftJoin(lastLine, eq(lastLine.id, newestVisible));
  return { query, unread };
}

type SummaryRow = Awaited<ReturnType<typeof summaryQuery>['query']>[number];

function summaryOf(actor: Actor, row: SummaryRow): ConversationSummary {
  return {
    id: row.id,
    tankId: row.tankId,
    tankName: row.tankName,
    ownerNames: row.ownerNames,
    lastMessage:
      row.lastBody !== null && row.lastKind !== null && row.lastAuthorName !== null && row.lastAt !== null
        ? {
            body: row.lastBody,
            kind: row.lastKind,
            authorName: row.lastAuthorName,
            at: row.lastAt.toISOString(),
          }
        : null,
    unread: row.unread,
    // Owners see that staff answer, not how long they have waited for it.
    awaitingReplySince: isStaff(actor) ? (row.awaitingReplySince?.toISOString() ?? null) : null,
    openUrgentRequestId: row.openUrgentRequestId,
  };
}

/**
 * The tank's conversation at a glance. A tank that has none yet gets it here (as with its first
 * message), so the screen always has a conversation to show, if an empty one.
 */
export async function conversationSummary(
  db: Db,
  actor: Actor,
  tankId: string,
): Promise<ConversationSummary> {
  const tank = await findTankFor(db, actor, tankId, 'read');
  await db
    .insert(conversations)
    .values({ companyId: tank.companyId, tankId: tank.id })
    .onConflictDoNothing({ target: conversations.tankId });
  const [row] = await summaryQuery(db, actor).query.where(eq(conversations.tankId, tank.id));
  if (!row) throw notFound('conversation');
  return summaryOf(actor, row);
}

/**
 * The staff inbox: the company's conversations with at least one line, unanswered first (the
 * longest waiting first), then by latest activity.
 */
export async function inbox(db: Db, actor: Actor, query: InboxQuery): Promise<ConversationSummary[]> {
  const { query: summaries, unread } = summaryQuery(db, actor);
  const rows = await summaries
    .where(
      and(
        eq(conversations.companyId, actor.companyId),
        isNotNull(conversations.lastActivityAt),
        query.filter === 'unanswered' ? isNotNull(conversations.awaitingReplySince) : undefined,
        query.filter === 'unread' ? sql`${unread} > 0` : undefined,
      ),
    )
    .orderBy(
      sql`${conversations.awaitingReplySince} asc nulls last`,
      sql`${conversations.lastActivityAt} desc nulls last`,
      asc(conversations.id),
    )
    .limit(query.limit)
    .offset(query.offset);
  return rows.map((row) => summaryOf(actor, row));
}

/** Unread lines for the header badge and each tank (tanks with none are left out). */
export async function unreadCounts(db: Db, actor: Actor): Promise<UnreadCounts> {
  const cm = conversationMessages;
  const rows = await db
    .select({ tankId: conversations.tankId, n: sql<number>`count(*)`.mapWith(Number) })
    .from(cm)
    .innerJoin(conversations, eq(conversations.id, cm.conversationId))
    .innerJoin(tanks, eq(tanks.id, conversations.tankId))
    .leftJoin(conversationReads, readsOf(actor))
    .where(and(visibleTanks(db, actor), pastReadPosition(), countedLines(actor)))
    .groupBy(conversations.tankId);
  return {
    total: rows.reduce((sum, row) => sum + row.n, 0),
    byTank: Object.fromEntries(rows.map((row) => [row.tankId, row.n])),
  };
}

/* ------------------------------------------------------------------ writing */

/** Moves a person's read position forward to a line's time (never back). */
async function readThrough(db: Db | Tx, conversationId: string, userId: string, messageId: string) {
  const at = sql`(select ${conversationMessages.createdAt} from ${conversationMessages} where ${conversationMessages.id} = ${messageId})`;
  await db
    .insert(conversationReads)
    .values({ conversationId, userId, readThrough: at })
    .onConflictDoUpdate({
      target: [conversationReads.conversationId, conversationReads.userId],
      set: { readThrough: sql`greatest(${conversationReads.readThrough}, excluded.read_through)` },
    });
}

const photoProblem = 'choose a photo you added to this conversation that is not in another message';

/** Photos a line may carry: 'message' photos of this tank, uploaded by its author, in no other line. */
async function checkPhotos(tx: Tx, actor: Actor, tankId: string, photoIds: string[]) {
  if (photoIds.length === 0) return;
  const usable = await tx
    .select({ id: photos.id })
    .from(photos)
    .where(
      and(
        inArray(photos.id, photoIds),
        eq(photos.tankId, tankId),
        eq(photos.subject, 'message'),
        eq(photos.uploadedBy, actor.id),
        unattachedPhoto(),
      ),
    );
  const ok = new Set(usable.map((row) => row.id));
  const issues: ErrorIssue[] = [];
  photoIds.forEach((id, index) => {
    if (photoIds.indexOf(id) !== index) {
      issues.push({ path: `body.photoIds.${index}`, message: 'this photo is already in the message' });
    } else if (!ok.has(id)) {
      issues.push({ path: `body.photoIds.${index}`, message: photoProblem });
    }
  });
  if (issues.length > 0) throw invalidFields(issues);
}

const notesAreStaffOnly = () =>
  new HttpError(
    403,
    'internal_notes_staff_only',
    'Only staff write internal notes. Send it as a message, which the company reads.',
  );

/** A line can be about an urgent visit request of its own tank only. */
async function checkUrgentRequest(tx: Tx, tankId: string, requestId: string) {
  const [request] = await tx
    .select({ id: urgentRequests.id })
    .from(urgentRequests)
    .where(and(eq(urgentRequests.id, requestId), eq(urgentRequests.tankId, tankId)));
  if (!request)
    throw invalidFields([
      { path: 'body.urgentRequestId', message: 'Not an urgent visit request of this tank.' },
    ]);
}

export interface SendOptions {
  /** The client's Idempotency-Key: a retry with the same key returns the line already stored. */
  clientKey?: string | null;
  /** Set when the line is about an urgent visit request of the same tank. */
  urgentRequestId?: string | null;
}

/**
 * Adds a line to the tank's conversation (making the conversation with its first line), in one
 * transaction with the conversation's state: its latest activity, and since when an owner has
 * waited for an answer (set by an owner's line, cleared by a staff message, untouched by a note).
 * The conversation row is locked for it, so lines of one conversation are stored one at a time,
 * each later than the one before. The other side is told afterwards (conversation-notify.ts).
 */
export async function sendMessage(
  deps: AppDeps,
  actor: Actor,
  tankId: string,
  input: NewMessage,
  options: SendOptions = {},
): Promise<{ message: MessageView; created: boolean }> {
  const tank = await findTankFor(deps.db, actor, tankId, 'read');
  if (input.internal && !roleCan(actor.role, 'conversations:notes')) throw notesAreStaffOnly();
  const clientKey = options.clientKey ?? null;
  const outcome = await deps.db.transaction(async (tx) => {
    await tx
      .insert(conversations)
      .values({ companyId: tank.companyId, tankId: tank.id })
      .onConflictDoNothing({ target: conversations.tankId });
    const [conversation] = await tx
      .select()
      .from(conversations)
      .where(eq(conversations.tankId, tank.id))
      .for('update');
    if (clientKey !== null) {
      const [earlier] = await tx
        .select()
        .from(conversationMessages)
        .where(
          and(eq(conversationMessages.authorId, actor.id), eq(conversationMessages.clientKey, clientKey)),
        );
      if (earlier) {
        if (earlier.tankId !== tank.id) {
          throw conflict(
            'idempotency_key_reused',
            'This Idempotency-Key was used for a message to another tank. Send with a new key.',
          );
        }
        return { row: earlier, photoIds: null, created: false };
      }
    }
    await checkPhotos(tx, actor, tank.id, input.photoIds);
    if (options.urgentRequestId) await checkUrgentRequest(tx, tank.id, options.urgentRequestId);
    const kind = input.internal ? ('internal-note' as const) : ('message' as const);
    const side = sideOf(actor);
    // A millisecond after the line before, should the clock say otherwise: the thread's order is
    // the order the lines were stored in.
    const last = conversation!.lastActivityAt?.getTime() ?? 0;
    const at = new Date(Math.max(deps.clock().getTime(), last + 1));
    const [row] = await tx
      .insert(conversationMessages)
      .values({
        conversationId: conversation!.id,
        companyId: tank.companyId,
        tankId: tank.id,
        kind,
        side,
        authorId: actor.id,
        authorName: actor.name,
        body: input.body,
        urgentRequestId: options.urgentRequestId ?? null,
        clientKey,
        createdAt: at,
        updatedAt: at,
      })
      .returning();
    if (input.photoIds.length > 0) {
      await tx
        .insert(messagePhotos)
        .values(input.photoIds.map((photoId, position) => ({ messageId: row!.id, photoId, position })));
    }
    const awaiting =
      side === 'owner'
        ? {
            awaitingReplySince: sql`coalesce(${conversations.awaitingReplySince}, ${at.toISOString()}::timestamptz)`,
          }
        : kind === 'message'
          ? { awaitingReplySince: null }
          : {};
    await tx
      .update(conversations)
      .set({ lastActivityAt: at, ...(kind === 'message' && { lastPublicAt: at }), ...awaiting })
      .where(eq(conversations.id, conversation!.id));
    // Whoever writes has read what came before.
    await readThrough(tx, conversation!.id, actor.id, row!.id);
    return { row: row!, photoIds: input.photoIds, created: true };
  });
  if (!outcome.created) {
    const [message] = await viewsOf(deps.db, [outcome.row]);
    return { message: message!, created: false };
  }
  try {
    await announceMessage(deps, outcome.row.id);
  } catch (error) {
    // The line is stored and the sender's screen shows it; the others still see it on their next look.
    deps.logger.error(
      { err: error, messageId: outcome.row.id },
      'telling the conversation about a message failed',
    );
  }
  return { message: viewOf(outcome.row, outcome.photoIds ?? []), created: true };
}

/**
 * Moves the reader's position forward to a line they can see (never back). Once nothing is left
 * unread, their notification for the conversation is read too; their other tabs hear of it live.
 */
export async function markRead(
  deps: AppDeps,
  actor: Actor,
  tankId: string,
  messageId: string,
): Promise<void> {
  const tank = await findTankFor(deps.db, actor, tankId, 'read');
  const [line] = await deps.db
    .select({ id: conversationMessages.id, conversationId: conversationMessages.conversationId })
    .from(conversationMessages)
    .where(
      and(
        eq(conversationMessages.id, messageId),
        eq(conversationMessages.tankId, tank.id),
        visibleLines(actor),
      ),
    );
  if (!line) throw notFound('message');
  await readThrough(deps.db, line.conversationId, actor.id, line.id);
  const [left] = await deps.db
    .select({ n: sql<number>`count(*)`.mapWith(Number) })
    .from(conversationMessages)
    .innerJoin(conversations, eq(conversations.id, conversationMessages.conversationId))
    .leftJoin(conversationReads, readsOf(actor))
    .where(
      and(
        eq(conversationMessages.conversationId, line.conversationId),
        pastReadPosition(),
        countedLines(actor),
      ),
    );
  if (left?.n === 0) {
    await deps.db
      .update(notifications)
      .set({ readAt: deps.clock() })
      .where(
        and(
          eq(notifications.userId, actor.id),
          eq(notifications.conversationId, line.conversationId),
          isNull(notifications.readAt),
        ),
      );
  }
  await publishEvent(deps.pool, {
    type: 'conversation',
    userIds: [actor.id],
    tankId: tank.id,
    conversationId: line.conversationId,
  });
}

/**
 * A photo for a message or an urgent request, uploaded before either is sent. Everyone in the
 * conversation may add one; owners see it once it is in a message or a request (photos.ts).
 */
export function uploadMessagePhoto(
  deps: Pick<AppDeps, 'db' | 'storage' | 'clock'>,
  actor: Actor,
  tankId: string,
  upload: { bytes: Buffer; caption?: string },
): Promise<PhotoItem> {
  return uploadPhoto(deps, actor, tankId, { ...upload, cover: false, subject: 'message' });
}
