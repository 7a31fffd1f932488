import { and, asc, desc, eq, inArray, sql, type SQL } from 'drizzle-orm';
import { fromDrizzle } from 'pg-boss';
import { staffRoles, type Role } from '@shared/people/permissions';
import { unreadEmailAfterMinutes } from '@shared/schemas/conversations';
import { formatDayMonthTime } from '@shared/text/dates';
import type { AppDeps } from '../deps';
import {
  companies,
  conversationMessages,
  conversationReads,
  conversations,
  deliveries,
  notificationPreferences,
  tankMembers,
  tanks,
  users,
} from '../db/schema/index';
import { publishEvent } from '../lib/event-bus';
import { queues } from '../lib/job-queue';
import {
  deliverNewsEmail,
  deliverNewsPush,
  firstWords,
  newsBodyLength,
  ownersOf,
  readPreferences,
  tellPerson,
  type News,
  type NewsReader,
} from './notify';

/*
 * Telling the other side of a conversation: owners hear of the staff's messages; the tank's
 * technician (or, with none assigned, the company's admins) of the owners' messages; internal
 * notes reach nobody. By each person's "messages" preference: one in-app notification per
 * conversation brought back by each message, a push per message (one entry per conversation on a
 * phone), and one e-mail once a message has waited unread for ten minutes, covering every unread
 * message rather than one e-mail each.
 */

type Lines = typeof conversationMessages;

/** The lines a person is told of: the other side's messages, never a note. */
function toldTo(role: Role, m: Lines = conversationMessages): SQL {
  return and(eq(m.kind, 'message'), eq(m.side, role === 'owner' ? 'staff' : 'owner'))!;
}

const readerColumns = {
  id: users.id,
  email: users.email,
  name: users.name,
  timeZone: sql<string>`coalesce(${users.timeZone}, ${companies.timeZone})`,
  preferences: notificationPreferences.preferences,
};

function readers(deps: AppDeps, where: SQL) {
  return deps.db
    .select(readerColumns)
    .from(users)
    .innerJoin(companies, eq(companies.id, users.companyId))
    .leftJoin(notificationPreferences, eq(notificationPreferences.userId, users.id))
    .where(and(eq(users.status, 'active'), where))
    .orderBy(asc(users.name), asc(users.id));
}

/** Who answers an owner: the tank's technician, or the company's admins when it has none. */
async function staffToTell(
  deps: AppDeps,
  tank: { companyId: string; assignedTechnicianId: string | null },
): Promise<NewsReader[]> {
  const ofCompany = eq(users.companyId, tank.companyId);
  if (tank.assignedTechnicianId) {
    const technician = await readers(
      deps,
      and(ofCompany, eq(users.id, tank.assignedTechnicianId), inArray(users.role, [...staffRoles]))!,
    );
    if (technician.length > 0) return technician;
  }
  return readers(deps, and(ofCompany, eq(users.role, 'admin'))!);
}

async function activeStaffIds(deps: AppDeps, companyId: string): Promise<string[]> {
  const rows = await deps.db
    .select({ id: users.id })
    .from(users)
    .where(
      and(eq(users.companyId, companyId), eq(users.status, 'active'), inArray(users.role, [...staffRoles])),
    );
  return rows.map((row) => row.id);
}

const singletonKeyOf = (conversationId: string, userId: string) => `${conversationId}:${userId}`;

/**
 * Queues the unread check for a person: one waits per conversation and person (the queue lets one
 * job per key wait), so a run of messages makes one check, not one each.
 */
async function scheduleUnreadEmail(deps: AppDeps, conversationId: string, userId: string, afterS: number) {
  if (!deps.jobs) return;
  await deps.jobs.send(
    queues.conversationUnreadEmail,
    { conversationId, userId },
    { startAfter: afterS, singletonKey: singletonKeyOf(conversationId, userId) },
  );
}

/**
 * After a line is stored: every open screen of the conversation refreshes (all the company's staff,
 * and the tank's owners unless it is a note), and the other side is told by their preferences.
 */
export async function announceMessage(deps: AppDeps, messageId: string) {
  const [row] = await deps.db
    .select({
      message: conversationMessages,
      companyId: tanks.companyId,
      assignedTechnicianId: tanks.assignedTechnicianId,
    })
    .from(conversationMessages)
    .innerJoin(tanks, eq(tanks.id, conversationMessages.tankId))
    .where(eq(conversationMessages.id, messageId));
  if (!row) return;
  const { message } = row;
  const note = message.kind === 'internal-note';
  const owners = await ownersOf(deps, message.tankId);
  await publishEvent(deps.pool, {
    type: 'conversation',
    userIds: [...(await activeStaffIds(deps, row.companyId)), ...(note ? [] : owners.map((o) => o.id))],
    tankId: message.tankId,
    conversationId: message.conversationId,
  });
  if (note) return;
  const audience = (message.side === 'owner' ? await staffToTell(deps, row) : owners).filter(
    (person) => person.id !== message.authorId,
  );
  const now = deps.clock();
  for (const person of audience) {
    try {
      const news = await loadMessageNews(deps, message.id, person.id);
      if (!news) continue;
      const { preferences } = readPreferences(person.preferences, person.timeZone);
      // The e-mail waits for the unread check, so it is left out of what is told now.
      await tellPerson(
        deps,
        person,
        preferences.messages.filter((channel) => channel !== 'email'),
        news,
        now,
      );
      if (preferences.messages.includes('email')) {
        await scheduleUnreadEmail(deps, message.conversationId, person.id, unreadEmailAfterMinutes * 60);
      }
    } catch (error) {
      // The others are still told; the message itself is stored and on every screen.
      deps.logger.error(
        { err: error, userId: person.id, messageId },
        'message notification failed for one recipient',
      );
    }
  }
}

/** The e-mail lists at most this many of the unread messages, the newest ones. */
const maxListed = 20;

/** Backslash-escapes what Markdown would read as markup (CommonMark 0.31, "Backslash escapes"). */
function escapeMarkdownText(text: string): string {
  return text.replace(/[\\`*_{}[\]<>()#+\-.!|~&=:]/g, (char) => `\\${char}`);
}

/**
 * A plain-text message as Markdown that renders back to exactly its words (the e-mail's one
 * renderer is Markdown): markup characters escaped, web addresses kept whole as autolinks, each
 * line break kept, and leading spaces kept as non-breaking ones so no line becomes code.
 */
function plainTextAsMarkdown(text: string): string {
  return text
    .split('\n')
    .map((line) => {
      const indent = /^[ \t]*/.exec(line)![0];
      const rest = line.slice(indent.length);
      const parts = rest.split(/(https?:\/\/[^\s<>]+)/g);
      const body = parts
        .map((part, index) => (index % 2 === 1 ? `<${part}>` : escapeMarkdownText(part)))
        .join('');
      return '\u00a0'.repeat(indent.replace(/\t/g, '    ').length) + body;
    })
    .join('\n');
}

/**
 * A message as one person hears of it: for the push and the in-app notification its first words;
 * for the e-mail, every message of the other side up to this one that they have not read (the
 * newest `maxListed`). Null when it is no news to them any more: they read it, or can no longer
 * see it (an owner never hears of a note, or left the tank).
 */
export async function loadMessageNews(
  deps: AppDeps,
  messageId: string,
  userId: string,
): Promise<News | null> {
  const [row] = await deps.db
    .select({
      message: conversationMessages,
      tankName: tanks.name,
      tankCompanyId: tanks.companyId,
      role: users.role,
      companyId: users.companyId,
      status: users.status,
      timeZone: sql<string>`coalesce(${users.timeZone}, ${companies.timeZone})`,
      member: sql<boolean>`exists (select 1 from ${tankMembers} where ${tankMembers.tankId} = ${conversationMessages.tankId}
        and ${tankMembers.userId} = ${users.id})`,
      read: sql<boolean>`coalesce(${conversationReads.readThrough} >= ${conversationMessages.createdAt}, false)`,
    })
    .from(conversationMessages)
    .innerJoin(tanks, eq(tanks.id, conversationMessages.tankId))
    .innerJoin(users, eq(users.id, userId))
    .innerJoin(companies, eq(companies.id, users.companyId))
    .leftJoin(
      conversationReads,
      and(
        eq(conversationReads.conversationId, conversationMessages.conversationId),
        eq(conversationReads.userId, users.id),
      ),
    )
    .where(eq(conversationMessages.id, messageId));
  if (!row || row.status !== 'active' || row.read) return null;
  const { message } = row;
  const told = message.kind === 'message' && message.side === (row.role === 'owner' ? 'staff' : 'owner');
  const sees = row.role === 'owner' ? row.member : row.companyId === row.tankCompanyId;
  if (!told || !sees) return null;

  const m = conversationMessages;
  const unread = await deps.db
    .select({
      authorName: m.authorName,
      body: m.body,
      createdAt: m.createdAt,
      total: sql<number>`count(*) over ()`.mapWith(Number),
    })
    .from(m)
    .leftJoin(
      conversationReads,
      and(eq(conversationReads.conversationId, m.conversationId), eq(conversationReads.userId, userId)),
    )
    .where(
      and(
        eq(m.conversationId, message.conversationId),
        toldTo(row.role),
        sql`${m.createdAt} <= (select c.created_at from ${conversationMessages} c where c.id = ${message.id})`,
        sql`${m.createdAt} > coalesce(${conversationReads.readThrough}, '-infinity'::timestamptz)`,
      ),
    )
    .orderBy(desc(m.createdAt), desc(m.id))
    .limit(maxListed);
  const total = Math.max(unread[0]?.total ?? 1, 1);
  const listed = unread
    .reverse()
    .map(
      (line) =>
        `**${escapeMarkdownText(line.authorName)}**, ${formatDayMonthTime(line.createdAt, row.timeZone)}\n${plainTextAsMarkdown(line.body)}`,
    );
  if (total > listed.length)
    listed.unshift(`_${total - listed.length} earlier unread messages are in the app._`);
  const lead = `${message.authorName}: `;
  return {
    subject: { messageId: message.id },
    conversationId: message.conversationId,
    tag: `conversation-${message.conversationId}`,
    tankId: message.tankId,
    title: total === 1 ? `New message: ${row.tankName}` : `${total} new messages: ${row.tankName}`,
    body: `${lead}${firstWords(message.body, Math.max(newsBodyLength - lead.length, 80))}`,
    link: `/tanks/${message.tankId}/messages`,
    mailLead:
      total === 1
        ? `A message about ${row.tankName} is waiting for you:`
        : `${total} messages about ${row.tankName} are waiting for you:`,
    notes: listed.join('\n\n'),
    notesHeading: null,
    readLabel: 'Read and reply',
    mailHeader: ['X-Brinewatch-Conversation', message.conversationId],
  };
}

export interface UnreadEmailCheck {
  conversationId: string;
  userId: string;
}

export type UnreadEmailOutcome =
  | { outcome: 'nothing-unread' }
  /** The oldest unread message has not waited long enough; checked again after `retryInS`. */
  | { outcome: 'waiting'; retryInS: number }
  /** One e-mail planned (its delivery), naming the newest message it covers. */
  | { outcome: 'emailed'; deliveryId: string | null; newestMessageId: string };

/**
 * The unread check behind the one e-mail (the queued job runs it; tests call it with their clock).
 * It looks at the messages the person is told of that are newer than both what they read and what
 * an earlier e-mail covered. None: done. The oldest younger than the wait: check again when it is
 * due. Otherwise one e-mail covering all of them, recorded with how far it covered, in one
 * transaction with its queued delivery job.
 */
export async function checkUnreadEmail(deps: AppDeps, check: UnreadEmailCheck): Promise<UnreadEmailOutcome> {
  const { conversationId, userId } = check;
  const now = deps.clock();
  const [person] = await deps.db
    .select({
      ...readerColumns,
      role: users.role,
      companyId: users.companyId,
      member: sql<boolean>`exists (select 1 from ${tankMembers} where ${tankMembers.tankId} = ${conversations.tankId}
        and ${tankMembers.userId} = ${users.id})`,
      conversationCompanyId: conversations.companyId,
    })
    .from(users)
    .innerJoin(companies, eq(companies.id, users.companyId))
    .innerJoin(conversations, eq(conversations.id, conversationId))
    .leftJoin(notificationPreferences, eq(notificationPreferences.userId, users.id))
    .where(and(eq(users.id, userId), eq(users.status, 'active')));
  if (!person) return { outcome: 'nothing-unread' };
  const sees = person.role === 'owner' ? person.member : person.companyId === person.conversationCompanyId;
  const { preferences } = readPreferences(person.preferences, person.timeZone);
  if (!sees || !preferences.messages.includes('email')) return { outcome: 'nothing-unread' };

  const m = conversationMessages;
  const waiting = () =>
    deps.db
      .select({ id: m.id, createdAt: m.createdAt })
      .from(m)
      .leftJoin(
        conversationReads,
        and(eq(conversationReads.conversationId, m.conversationId), eq(conversationReads.userId, userId)),
      )
      .where(
        and(
          eq(m.conversationId, conversationId),
          toldTo(person.role),
          sql`${m.createdAt} > coalesce(greatest(${conversationReads.readThrough}, ${conversationReads.emailedThrough}), '-infinity'::timestamptz)`,
        ),
      );
  const [oldest] = await waiting().orderBy(asc(m.createdAt), asc(m.id)).limit(1);
  if (!oldest) return { outcome: 'nothing-unread' };
  const dueMs = oldest.createdAt.getTime() + unreadEmailAfterMinutes * 60_000 - now.getTime();
  if (dueMs > 0) {
    const retryInS = Math.ceil(dueMs / 1000);
    await scheduleUnreadEmail(deps, conversationId, userId, retryInS);
    return { outcome: 'waiting', retryInS };
  }
  const [newest] = await waiting().orderBy(desc(m.createdAt), desc(m.id)).limit(1);
  const deliveryId = await deps.db.transaction(async (tx) => {
    const [planned] = await tx
      .insert(deliveries)
      .values({ messageId: newest!.id, userId, channel: 'email', destination: person.email })
      .onConflictDoNothing()
      .returning({ id: deliveries.id });
    const through = sql`(select ${m.createdAt} from ${m} where ${m.id} = ${newest!.id})`;
    await tx
      .insert(conversationReads)
      .values({ conversationId, userId, emailedThrough: through })
      .onConflictDoUpdate({
        target: [conversationReads.conversationId, conversationReads.userId],
        set: { emailedThrough: sql`greatest(${conversationReads.emailedThrough}, excluded.emailed_through)` },
      });
    if (planned && deps.jobs) {
      await deps.jobs.send(queues.email, { deliveryId: planned.id }, { db: fromDrizzle(tx, sql) });
    }
    return planned?.id ?? null;
  });
  return { outcome: 'emailed', deliveryId, newestMessageId: newest!.id };
}

async function messageDelivery(deps: AppDeps, deliveryId: string) {
  const [delivery] = await deps.db.select().from(deliveries).where(eq(deliveries.id, deliveryId));
  if (!delivery?.messageId || delivery.status !== 'pending') return null;
  const news = await loadMessageNews(deps, delivery.messageId, delivery.userId);
  return news ? { delivery, news } : null;
}

/** The e-mail and push jobs of a message's delivery (deliver.ts hands them here). */
export async function deliverMessageEmail(deps: AppDeps, deliveryId: string) {
  const planned = await messageDelivery(deps, deliveryId);
  if (planned) await deliverNewsEmail(deps, planned);
}

export async function deliverMessagePush(deps: AppDeps, deliveryId: string) {
  const planned = await messageDelivery(deps, deliveryId);
  if (planned) await deliverNewsPush(deps, planned);
}
