import { and, count, desc, eq, inArray, isNull } from 'drizzle-orm';
import {
  defaultNotificationPreferences,
  type NotificationPreferences,
  type PushSubscriptionInput,
} from '@shared/schemas/notifications';
import type { NotificationView } from '@shared/schemas/alerts';
import type { Db } from '../db/client';
import {
  companies,
  notificationPreferences,
  notifications,
  pushSubscriptions,
  users,
} from '../db/schema/index';
import type { Actor } from './actors';
import { preferencesOf } from './notify';

export async function listNotifications(
  db: Db,
  actor: Actor,
): Promise<{ unread: number; items: NotificationView[] }> {
  const rows = await db
    .select()
    .from(notifications)
    .where(eq(notifications.userId, actor.id))
    .orderBy(desc(notifications.createdAt))
    .limit(50);
  const [unread] = await db
    .select({ n: count() })
    .from(notifications)
    .where(and(eq(notifications.userId, actor.id), isNull(notifications.readAt)));
  return {
    unread: unread?.n ?? 0,
    items: rows.map((row) => ({
      id: row.id,
      severity: row.severity,
      title: row.title,
      body: row.body,
      link: row.link,
      readAt: row.readAt?.toISOString() ?? null,
      createdAt: row.createdAt.toISOString(),
    })),
  };
}

export async function markNotificationsRead(db: Db, actor: Actor, now: Date, ids?: string[]) {
  await db
    .update(notifications)
    .set({ readAt: now })
    .where(
      and(
        eq(notifications.userId, actor.id),
        isNull(notifications.readAt),
        ids ? inArray(notifications.id, ids) : undefined,
      ),
    );
}

export async function getPreferences(db: Db, actor: Actor): Promise<NotificationPreferences> {
  const [row] = await db
    .select({
      preferences: notificationPreferences.preferences,
      zone: companies.timeZone,
      own: users.timeZone,
    })
    .from(users)
    .innerJoin(companies, eq(companies.id, users.companyId))
    .leftJoin(notificationPreferences, eq(notificationPreferences.userId, users.id))
    .where(eq(users.id, actor.id));
  const zone = row?.own ?? row?.zone ?? defaultNotificationPreferences.timeZone;
  return preferencesOf(row?.preferences, zone);
}

export async function savePreferences(db: Db, actor: Actor, preferences: NotificationPreferences) {
  await db
    .insert(notificationPreferences)
    .values({ userId: actor.id, preferences })
    .onConflictDoUpdate({ target: notificationPreferences.userId, set: { preferences } });
  return preferences;
}

/** One subscription per browser: the same endpoint re-subscribing replaces its keys and owner. */
export async function savePushSubscription(
  db: Db,
  actor: Actor,
  input: PushSubscriptionInput,
  userAgent?: string,
) {
  const [row] = await db
    .insert(pushSubscriptions)
    .values({
      userId: actor.id,
      endpoint: input.endpoint,
      p256dh: input.keys.p256dh,
      auth: input.keys.auth,
      userAgent,
    })
    .onConflictDoUpdate({
      target: pushSubscriptions.endpoint,
      set: { userId: actor.id, p256dh: input.keys.p256dh, auth: input.keys.auth, userAgent },
    })
    .returning({ id: pushSubscriptions.id });
  return { id: row!.id };
}

export async function deletePushSubscription(db: Db, actor: Actor, endpoint: string) {
  await db
    .delete(pushSubscriptions)
    .where(and(eq(pushSubscriptions.userId, actor.id), eq(pushSubscriptions.endpoint, endpoint)));
}
