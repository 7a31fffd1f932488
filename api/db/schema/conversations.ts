import { sql } from 'drizzle-orm';
import {
  check,
  index,
  integer,
  pgEnum,
  pgTable,
  primaryKey,
  text,
  timestamp,
  uniqueIndex,
  uuid,
} from 'drizzle-orm/pg-core';
import { messageKinds } from '@shared/schemas/conversations';
import { id, timestamps } from './columns';
import { companies } from './companies';
import { photos, tanks } from './tanks';
import { users } from './users';
import { urgentRequests } from './urgent-requests';

export const messageKind = pgEnum('message_kind', messageKinds);
export const messageSide = pgEnum('message_side', ['owner', 'staff']);

/** One per tank, made with its first message. */
export const conversations = pgTable(
  'conversations',
  {
    id: id(),
    companyId: uuid('company_id')
      .notNull()
      .references(() => companies.id, { onDelete: 'cascade' }),
    tankId: uuid('tank_id')
      .notNull()
      .references(() => tanks.id, { onDelete: 'cascade' }),
    /** The newest line of any kind (staff order their inbox by it). */
    lastActivityAt: timestamp('last_activity_at', { withTimezone: true }),
    /** The newest line owners may see. */
    lastPublicAt: timestamp('last_public_at', { withTimezone: true }),
    /** The first owner message since staff last answered; null when answered. */
    awaitingReplySince: timestamp('awaiting_reply_since', { withTimezone: true }),
    ...timestamps,
  },
  (t) => [
    uniqueIndex('conversations_tank_key').on(t.tankId),
    index('conversations_inbox_idx').on(t.companyId, t.awaitingReplySince, t.lastActivityAt),
  ],
);

export const conversationMessages = pgTable(
  'conversation_messages',
  {
    id: id(),
    conversationId: uuid('conversation_id')
      .notNull()
      .references(() => conversations.id, { onDelete: 'cascade' }),
    companyId: uuid('company_id')
      .notNull()
      .references(() => companies.id, { onDelete: 'cascade' }),
    tankId: uuid('tank_id')
      .notNull()
      .references(() => tanks.id, { onDelete: 'cascade' }),
    kind: messageKind('kind').notNull(),
    side: messageSide('side').notNull(),
    authorId: uuid('author_id').references(() => users.id, { onDelete: 'set null' }),
    /** The author's name as it was, so a removed person's lines still read. */
    authorName: text('author_name').notNull(),
    body: text('body').notNull(),
    urgentRequestId: uuid('urgent_request_id').references(() => urgentRequests.id, { onDelete: 'set null' }),
    /** The client's idempotency key: a retried send after a lost connection is stored once. */
    clientKey: text('client_key'),
    ...timestamps,
  },
  (t) => [
    index('conversation_messages_page_idx').on(t.conversationId, t.createdAt, t.id),
    uniqueIndex('conversation_messages_client_key').on(t.authorId, t.clientKey),
    check('conversation_messages_body_length', sql`char_length(${t.body}) between 1 and 4000`),
    check('conversation_messages_notes_are_staff', sql`${t.kind} = 'message' or ${t.side} = 'staff'`),
  ],
);

export const messagePhotos = pgTable(
  'message_photos',
  {
    messageId: uuid('message_id')
      .notNull()
      .references(() => conversationMessages.id, { onDelete: 'cascade' }),
    photoId: uuid('photo_id')
      .notNull()
      .references(() => photos.id, { onDelete: 'cascade' }),
    position: integer('position').notNull(),
  },
  (t) => [primaryKey({ columns: [t.messageId, t.photoId] }), index('message_photos_photo_idx').on(t.photoId)],
);

/** Each person's read position in a conversation, and how far the unread e-mail has told them. */
export const conversationReads = pgTable(
  'conversation_reads',
  {
    conversationId: uuid('conversation_id')
      .notNull()
      .references(() => conversations.id, { onDelete: 'cascade' }),
    userId: uuid('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    readThrough: timestamp('read_through', { withTimezone: true }),
    emailedThrough: timestamp('emailed_through', { withTimezone: true }),
    ...timestamps,
  },
  (t) => [
    primaryKey({ columns: [t.conversationId, t.userId] }),
    index('conversation_reads_user_idx').on(t.userId),
  ],
);
