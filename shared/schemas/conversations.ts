import { z } from 'zod';

/*
 * One conversation per tank between its owners and the company's staff. Messages are plain text
 * (links are made clickable on screen, never HTML). Staff may add internal notes: lines in the same
 * conversation that owners never see, in any response, notification, e-mail or export.
 */

export const maxMessageLength = 4000;
export const maxMessagePhotos = 5;
/** Messages per person per minute (rate limit, 429 beyond it). */
export const messagesPerMinute = 60;
/** An unread message waits this long before the other side is e-mailed (once for a run of messages). */
export const unreadEmailAfterMinutes = 10;
export const maxMessagePage = 100;

export const messageKinds = ['message', 'internal-note'] as const;
export const messageKind = z.enum(messageKinds);
export type MessageKind = z.infer<typeof messageKind>;

export const messageInput = z.object({
  body: z
    .string()
    .trim()
    .min(1, 'Write a message.')
    .max(maxMessageLength, `A message is at most ${maxMessageLength} characters.`),
  /** Photos uploaded first through POST /api/tanks/:tankId/conversation/photos. */
  photoIds: z.array(z.uuid()).max(maxMessagePhotos, `At most ${maxMessagePhotos} photos.`).default([]),
  /** Staff only: an internal note owners never see. */
  internal: z.boolean().default(false),
  /** Written about this urgent visit request of the same tank (from the request's page). */
  urgentRequestId: z.uuid().nullable().default(null),
});
export type MessageInput = z.input<typeof messageInput>;

export const messageAuthor = z.object({
  id: z.uuid().nullable(),
  name: z.string(),
  /** 'owner' or 'staff': which side of the conversation wrote it. */
  side: z.enum(['owner', 'staff']),
});

export const messagePhoto = z.object({ id: z.uuid(), url: z.string(), thumbnailUrl: z.string() });

export const messageView = z.object({
  id: z.uuid(),
  conversationId: z.uuid(),
  tankId: z.uuid(),
  kind: messageKind,
  body: z.string(),
  photos: z.array(messagePhoto),
  author: messageAuthor,
  /** Set when the message was written about an urgent visit request. */
  urgentRequestId: z.uuid().nullable(),
  createdAt: z.iso.datetime(),
});
export type MessageView = z.infer<typeof messageView>;

/** `before`: the opaque cursor a previous page gave; pages go from newest to oldest. */
export const messagePageQuery = z.object({
  before: z
    .string()
    .max(200)
    .regex(/^[A-Za-z0-9_-]+$/, 'use the cursor the previous page gave')
    .optional(),
  limit: z.coerce.number().int().min(1).max(maxMessagePage).default(30),
});

export interface MessagePage {
  /** Oldest first within the page, so a screen appends them in order. */
  messages: MessageView[];
  /** Pass as `before` for the next older page; null at the start of the conversation. */
  next: string | null;
  /** The reader's own read position (last message they have seen), for a "new" divider. */
  readThrough: string | null;
}

export const markReadInput = z.object({
  /** The newest message the reader has now seen. */
  messageId: z.uuid(),
});

export const conversationSummary = z.object({
  id: z.uuid(),
  tankId: z.uuid(),
  tankName: z.string(),
  /** The tank's owners' names, for staff lists. */
  ownerNames: z.array(z.string()),
  /** The newest line the reader may see, or null when the conversation is empty. */
  lastMessage: z
    .object({ body: z.string(), kind: messageKind, authorName: z.string(), at: z.iso.datetime() })
    .nullable(),
  unread: z.int().nonnegative(),
  /** Since when an owner's message has waited for a staff answer; null when answered (staff only). */
  awaitingReplySince: z.iso.datetime().nullable(),
  /** An open urgent visit request of this tank, if any. */
  openUrgentRequestId: z.uuid().nullable(),
});
export type ConversationSummary = z.infer<typeof conversationSummary>;

/** The staff inbox: unanswered first (longest waiting first), then the most recent. */
export const inboxQuery = z.object({
  filter: z.enum(['all', 'unanswered', 'unread']).default('all'),
  limit: z.coerce.number().int().min(1).max(200).default(50),
  offset: z.coerce.number().int().min(0).max(100_000).default(0),
});

export const unreadCounts = z.object({
  total: z.int().nonnegative(),
  byTank: z.record(z.uuid(), z.int().nonnegative()),
});
export type UnreadCounts = z.infer<typeof unreadCounts>;
