import { describe, expect, it } from 'vitest';
import type { MessagePage, MessageView } from '@shared/schemas/conversations';
import {
  firstUnseenIndex,
  messagesOf,
  readCovers,
  threadItems,
} from '../../../../web/features/conversations/utils/thread-items';

const me = crypto.randomUUID();
const staff = crypto.randomUUID();

const message = (at: string, authorId: string, body = 'A line'): MessageView => ({
  id: crypto.randomUUID(),
  conversationId: crypto.randomUUID(),
  tankId: crypto.randomUUID(),
  kind: 'message',
  body,
  photos: [],
  author: { id: authorId, name: authorId === me ? 'Kim' : 'Mara', side: authorId === me ? 'owner' : 'staff' },
  urgentRequestId: null,
  createdAt: at,
});

const page = (messages: MessageView[], next: string | null = null): MessagePage => ({
  messages,
  next,
  readThrough: null,
});

const utcDay = (at: string) => at.slice(0, 10);

describe('messagesOf', () => {
  it('puts the older pages first and shows a line on two pages once', () => {
    const [a, b, c, d] = [
      message('2026-12-01T09:00:00.000Z', me),
      message('2026-12-01T09:05:00.000Z', staff),
      message('2026-12-01T09:10:00.000Z', me),
      message('2026-12-01T09:15:00.000Z', staff),
    ];
    // Newest page first, as the API pages them; c sits on both after a live refresh.
    const pages = [page([c!, d!], 'cursor'), page([a!, b!, c!])];

    expect(messagesOf(pages).map((m) => m.id)).toEqual([a!.id, b!.id, c!.id, d!.id]);
  });
});

describe('the read position', () => {
  const lines = [
    message('2026-12-01T09:00:00.000Z', staff),
    message('2026-12-01T09:05:00.000Z', me),
    message('2026-12-01T09:10:00.000Z', staff),
  ];

  it('starts the unseen lines after the moment read to', () => {
    expect(firstUnseenIndex(lines, '2026-12-01T09:05:00.000Z')).toBe(2);
    expect(firstUnseenIndex(lines, '2026-12-01T09:30:00.000Z')).toBe(3);
    expect(firstUnseenIndex(lines, null)).toBe(0);
  });

  it('also takes a message id as the position', () => {
    expect(firstUnseenIndex(lines, lines[0]!.id)).toBe(1);
  });

  it('knows when the newest line is already read', () => {
    expect(readCovers('2026-12-01T09:10:00.000Z', lines[2]!)).toBe(true);
    expect(readCovers('2026-12-01T09:09:59.000Z', lines[2]!)).toBe(false);
    expect(readCovers(null, lines[2]!)).toBe(false);
  });
});

describe('threadItems', () => {
  it('marks the first unseen line from someone else as new, and heads each day', () => {
    const lines = [
      message('2026-11-30T18:00:00.000Z', staff),
      message('2026-12-01T09:00:00.000Z', me),
      message('2026-12-01T09:05:00.000Z', me),
      message('2026-12-01T09:10:00.000Z', staff),
    ];

    const items = threadItems(lines, { readThrough: '2026-11-30T18:00:00.000Z', meId: me, dayOf: utcDay });

    expect(
      items.map((item) =>
        item.kind === 'message' ? item.message.body + (item.own ? ' (mine)' : '') : item.kind,
      ),
    ).toEqual(['day', 'A line', 'day', 'A line (mine)', 'A line (mine)', 'new', 'A line']);
  });

  it('shows no new mark when everything from others was read', () => {
    const lines = [message('2026-12-01T09:00:00.000Z', staff), message('2026-12-01T09:05:00.000Z', me)];

    const items = threadItems(lines, { readThrough: '2026-12-01T09:00:00.000Z', meId: me, dayOf: utcDay });

    expect(items.some((item) => item.kind === 'new')).toBe(false);
  });
});
