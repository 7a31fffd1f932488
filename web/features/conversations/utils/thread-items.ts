import type { MessagePage, MessageView } from '@shared/schemas/conversations';

/*
 * What the thread shows, in order: the loaded pages joined oldest first, a heading where the day
 * changes, and one "New" mark before the first line from someone else that the reader had not seen
 * when the thread opened.
 */

export type ThreadItem =
  | { kind: 'day'; key: string; day: string; at: string }
  | { kind: 'new'; key: 'new' }
  | { kind: 'message'; key: string; message: MessageView; own: boolean };

/** The pages as the API gives them (newest page first, oldest first within each) as one list. */
export function messagesOf(pages: readonly MessagePage[]): MessageView[] {
  const seen = new Set<string>();
  const messages: MessageView[] = [];
  for (const page of [...pages].reverse()) {
    for (const message of page.messages) {
      // A live refresh can move a page boundary while an older page is loaded: show each line once.
      if (seen.has(message.id)) continue;
      seen.add(message.id);
      messages.push(message);
    }
  }
  return messages;
}

const momentOf = (readThrough: string): number | null =>
  /^\d{4}-\d\d-\d\dT/.test(readThrough) ? Date.parse(readThrough) : null;

/** Whether a read position already covers `message` (it is that message, or a moment at or after it). */
export function readCovers(readThrough: string | null | undefined, message: MessageView): boolean {
  if (!readThrough) return false;
  if (readThrough === message.id) return true;
  const at = momentOf(readThrough);
  return at !== null && Date.parse(message.createdAt) <= at;
}

/**
 * Where the reader's unseen lines begin: the index of the first message after their read position.
 * The position is the last message they saw (its id) or the moment they read to; an id not among
 * the loaded messages is older than all of them, since the newest page is always loaded.
 */
export function firstUnseenIndex(messages: readonly MessageView[], readThrough: string | null): number {
  if (readThrough === null) return 0;
  const byId = messages.findIndex((message) => message.id === readThrough);
  if (byId >= 0) return byId + 1;
  const at = momentOf(readThrough);
  if (at === null) return 0;
  const after = messages.findIndex((message) => Date.parse(message.createdAt) > at);
  return after < 0 ? messages.length : after;
}

export function threadItems(
  messages: readonly MessageView[],
  {
    readThrough,
    meId,
    dayOf,
  }: {
    /** The read position when the thread opened; undefined shows no "New" mark. */
    readThrough: string | null | undefined;
    meId: string | undefined;
    /** The calendar day a moment falls on, on the clock the thread is read in. */
    dayOf: (at: string) => string;
  },
): ThreadItem[] {
  const own = (message: MessageView) => meId !== undefined && message.author.id === meId;
  let newAt = -1;
  if (readThrough !== undefined) {
    const from = firstUnseenIndex(messages, readThrough);
    newAt = messages.findIndex((message, index) => index >= from && !own(message));
  }
  const items: ThreadItem[] = [];
  let day: string | null = null;
  messages.forEach((message, index) => {
    const messageDay = dayOf(message.createdAt);
    if (messageDay !== day) {
      day = messageDay;
      items.push({ kind: 'day', key: `day:${messageDay}`, day: messageDay, at: message.createdAt });
    }
    if (index === newAt) items.push({ kind: 'new', key: 'new' });
    items.push({ kind: 'message', key: message.id, message, own: own(message) });
  });
  return items;
}
