import { useCallback, useEffect, useLayoutEffect, useMemo, useRef, useState, type ReactNode } from 'react';
import type { MessageView } from '@shared/schemas/conversations';
import { Button } from '../../../components/button';
import { EmptyState, ErrorState, LoadingState } from '../../../components/states';
import { can, useMe } from '../../../lib/auth';
import { dayIn, formatDayHeading } from '../../../lib/format';
import { useConversation } from '../api/get-conversation';
import { useThread } from '../api/get-thread';
import { messagesOf, readCovers, threadItems } from '../utils/thread-items';
import { MessageComposer } from './message-composer';
import { MessageItem } from './message-item';
import { useMarkReadWhenSeen } from './use-mark-read';

/** Within this many pixels of the end counts as "reading the latest", so new lines scroll into view. */
const nearEndPx = 120;

const listFormat = new Intl.ListFormat('en-GB', { style: 'long', type: 'conjunction' });

/**
 * A tank's conversation between its owners and the company, with the composer under it. New lines
 * arrive through the live event stream (it marks the thread stale; no polling here). Older pages
 * load on request above; the thread opens at the first unseen line, or at the end.
 *
 * `urgentRequestId`: shown beside that urgent visit request, whose lines are marked as about it.
 * `timeZone`: the tank's zone for times; the reader's own clock without it.
 */
export function ConversationThread(props: ThreadProps) {
  // Another tank is another thread: its own "New" mark, scroll place and draft.
  return <Thread key={props.tankId} {...props} />;
}

interface ThreadProps {
  tankId: string;
  urgentRequestId?: string;
  timeZone?: string;
}

function Thread({ tankId, urgentRequestId, timeZone }: ThreadProps) {
  const { data: me } = useMe();
  const thread = useThread(tankId);
  const summary = useConversation(tankId);
  const canWriteNotes = can(me, 'conversations:notes');
  const zone = timeZone ?? Intl.DateTimeFormat().resolvedOptions().timeZone;

  // The read position as the thread opened: the "New" mark stays put while the page is open.
  const firstPage = thread.data?.pages[0];
  const [readAtOpen, setReadAtOpen] = useState<{ value: string | null } | null>(null);
  if (firstPage && readAtOpen === null) setReadAtOpen({ value: firstPage.readThrough });

  const messages = useMemo(() => messagesOf(thread.data?.pages ?? []), [thread.data]);
  const items = useMemo(
    () =>
      threadItems(messages, {
        readThrough: readAtOpen?.value,
        meId: me?.id,
        dayOf: (at) => dayIn(at, zone),
      }),
    [messages, readAtOpen, me?.id, zone],
  );
  const newest = messages.at(-1);
  const oldestId = messages[0]?.id;

  const threadRef = useRef<HTMLDivElement>(null);
  const listRef = useRef<HTMLElement>(null);
  const endRef = useRef<HTMLDivElement>(null);
  const newestRef = useRef<HTMLLIElement>(null);
  const newMarkRef = useRef<HTMLLIElement>(null);
  const nearEnd = useRef(true);
  const shown = useRef<{ oldest?: string; newest?: string; height: number }>({ height: 0 });
  const pinToEnd = useRef(false);

  // The page scrolls, not a box inside it (one scroll on a phone), and the composer sticks to the
  // bottom of the screen while the thread is in view. "At the end" means the thread's end is on screen.
  useEffect(() => {
    const onScroll = () => {
      const box = threadRef.current?.getBoundingClientRect();
      if (box) nearEnd.current = box.bottom <= window.innerHeight + nearEndPx;
    };
    window.addEventListener('scroll', onScroll, { passive: true });
    return () => window.removeEventListener('scroll', onScroll);
  }, []);

  // Keep the reader's place: open at the "New" mark or the end (unless shown beside an urgent
  // request, whose page opens at its top); stay put when older lines are added above; follow new
  // lines when already at the end, or when the new line is one's own.
  useLayoutEffect(() => {
    const list = listRef.current;
    if (!list || !newest) return;
    const before = shown.current;
    if (before.newest === undefined) {
      if (urgentRequestId === undefined) {
        if (newMarkRef.current) newMarkRef.current.scrollIntoView({ block: 'start' });
        else endRef.current?.scrollIntoView({ block: 'end' });
      }
    } else if (before.oldest !== oldestId && before.newest === newest.id) {
      window.scrollBy(0, list.offsetHeight - before.height);
    } else if (before.newest !== newest.id && (nearEnd.current || pinToEnd.current)) {
      endRef.current?.scrollIntoView({ block: 'end', behavior: 'smooth' });
    }
    pinToEnd.current = false;
    shown.current = { oldest: oldestId, newest: newest.id, height: list.offsetHeight };
  }, [newest, oldestId, urgentRequestId]);

  useMarkReadWhenSeen({
    tankId,
    newestId: newest?.id,
    alreadyRead: newest !== undefined && readCovers(firstPage?.readThrough, newest),
    newestRef,
  });

  const onSent = useCallback((_message: MessageView) => {
    pinToEnd.current = true;
  }, []);

  const recipients = canWriteNotes
    ? summary.data && summary.data.ownerNames.length > 0
      ? listFormat.format(summary.data.ownerNames)
      : 'the owners'
    : (me?.company.name ?? 'your service company');
  const tankName = summary.data?.tankName;

  // Taken before the states below narrow `thread`: an older page can fail while the newest shows.
  const earlierError = thread.isFetchNextPageError ? thread.error : null;
  const loadEarlier = () => void thread.fetchNextPage();

  let body: ReactNode;
  if (thread.isPending) body = <LoadingState label="Loading messages…" />;
  else if (thread.isError)
    body = <ErrorState error={thread.error} what="the messages" onRetry={() => void thread.refetch()} />;
  else if (messages.length === 0)
    body = (
      <EmptyState title={`No messages yet — write to ${recipients}`}>
        {canWriteNotes
          ? 'Your message goes to the tank’s owners. Tick “Internal note” for a line only staff see.'
          : 'Ask a question, or send a photo of anything that looks wrong. The team answers here.'}
      </EmptyState>
    );
  else
    body = (
      <section
        ref={listRef}
        aria-label={tankName ? `Messages about ${tankName}` : 'Messages'}
        className="rounded-card bg-sand-100 p-2 [overflow-anchor:none] sm:p-4"
      >
        <div className="mb-2 flex justify-center">
          {thread.hasNextPage ? (
            <Button tone="secondary" onClick={loadEarlier} disabled={thread.isFetchingNextPage}>
              {thread.isFetchingNextPage ? 'Loading earlier messages…' : 'Show earlier messages'}
            </Button>
          ) : (
            <p className="py-2 text-sm text-ink-700">Start of the conversation</p>
          )}
        </div>
        {earlierError && (
          <div className="mb-2">
            <ErrorState error={earlierError} what="the earlier messages" onRetry={loadEarlier} />
          </div>
        )}
        <div role="log" aria-live="polite" aria-relevant="additions" aria-label="Conversation">
          <ol className="grid gap-2">
            {items.map((item) => {
              if (item.kind === 'day')
                return (
                  <li key={item.key} className="flex justify-center pt-2">
                    <span className="rounded-full bg-white px-3 py-0.5 text-sm font-bold text-ink-700 shadow-card">
                      {formatDayHeading(item.at, zone)}
                    </span>
                  </li>
                );
              if (item.kind === 'new')
                return (
                  <li key={item.key} ref={newMarkRef} className="flex items-center gap-2 py-1">
                    <span aria-hidden="true" className="h-0.5 flex-1 bg-alert-700" />
                    <span className="text-sm font-bold text-alert-700">New messages</span>
                    <span aria-hidden="true" className="h-0.5 flex-1 bg-alert-700" />
                  </li>
                );
              return (
                <li
                  key={item.key}
                  ref={item.message.id === newest?.id ? newestRef : undefined}
                  className="flex min-w-0"
                >
                  <MessageItem
                    message={item.message}
                    own={item.own}
                    timeZone={zone}
                    urgentRequestId={urgentRequestId}
                  />
                </li>
              );
            })}
          </ol>
        </div>
      </section>
    );

  return (
    <div ref={threadRef} className="grid grid-cols-[minmax(0,1fr)] gap-3">
      {body}
      {me && (
        <MessageComposer
          key={`${me.id}:${tankId}`}
          tankId={tankId}
          personId={me.id}
          canWriteNotes={canWriteNotes}
          recipients={recipients}
          urgentRequestId={urgentRequestId}
          onSent={onSent}
        />
      )}
      <div ref={endRef} aria-hidden="true" />
    </div>
  );
}
