import { Link } from 'react-router';
import type { ConversationSummary } from '@shared/schemas/conversations';
import { Badge } from '../../../components/badge';
import { Button } from '../../../components/button';
import { StatusShape } from '../../../components/status-badges';
import { EmptyState, ErrorState, LoadingState } from '../../../components/states';
import { formatCount, formatDateTime, relativeTime, useNow } from '../../../lib/format';
import { inboxFilters, useInbox, type InboxFilter } from '../api/list-inbox';
import { previewLine, waitingLabel } from '../utils/inbox-text';

const filterLabels: Record<InboxFilter, string> = { all: 'All', unanswered: 'Unanswered', unread: 'Unread' };

const emptyWords: Record<InboxFilter, { title: string; text: string }> = {
  all: {
    title: 'No conversations yet',
    text: 'When an owner writes about a tank, or you write to one, the conversation shows here.',
  },
  unanswered: { title: 'Nothing waiting for an answer', text: 'Every owner’s message has a reply.' },
  unread: { title: 'All caught up', text: 'You have read every message.' },
};

function InboxRow({ conversation, now }: { conversation: ConversationSummary; now: number }) {
  const { lastMessage, awaitingReplySince, unread, openUrgentRequestId } = conversation;
  const note = lastMessage?.kind === 'internal-note';
  return (
    <article
      className={`relative grid gap-1 rounded-card border-l-8 bg-white p-3 shadow-card focus-within:outline-3 focus-within:outline-offset-2 focus-within:outline-brine-500 hover:shadow-lg sm:p-4 ${
        awaitingReplySince ? 'border-l-watch-700' : 'border-l-transparent'
      }`}
    >
      <div className="flex flex-wrap items-center justify-between gap-x-3 gap-y-1">
        <h2 className="min-w-0 text-lg font-bold text-ink-900">
          <Link
            to={`/tanks/${conversation.tankId}/messages`}
            className="text-ink-900 no-underline after:absolute after:inset-0 after:content-[''] focus:outline-none"
          >
            {conversation.tankName}
          </Link>
        </h2>
        <div className="flex flex-wrap items-center gap-2">
          {openUrgentRequestId && (
            <Link
              to={`/urgent/${openUrgentRequestId}`}
              className="relative z-10 inline-flex min-h-11 items-center no-underline"
            >
              <Badge
                tone="bg-alert-100 text-alert-700"
                mark={<StatusShape tone="alert" className="h-3.5 w-3.5" />}
              >
                Urgent request
              </Badge>
            </Link>
          )}
          {unread > 0 && (
            <Badge tone="bg-brine-700 text-white" mark={<span className="h-2 w-2 rounded-full bg-current" />}>
              {formatCount(unread)} unread
            </Badge>
          )}
        </div>
      </div>
      <p className="text-sm text-ink-700">
        {conversation.ownerNames.length > 0 ? conversation.ownerNames.join(', ') : 'No owner yet'}
      </p>
      <p className={`line-clamp-2 text-ink-950 ${unread > 0 ? 'font-bold' : ''}`}>
        {note && <span className="sr-only">Internal note. </span>}
        {previewLine(lastMessage)}
      </p>
      <p className="flex flex-wrap gap-x-3 text-sm text-ink-700">
        {lastMessage && (
          <span>
            {lastMessage.authorName},{' '}
            <time dateTime={lastMessage.at} title={formatDateTime(lastMessage.at)}>
              {relativeTime(lastMessage.at, now)}
            </time>
          </span>
        )}
        {awaitingReplySince && (
          <span className="inline-flex items-center gap-1 font-bold text-watch-700">
            <StatusShape tone="watch" className="h-3.5 w-3.5" />
            {waitingLabel(awaitingReplySince, now)}
          </span>
        )}
      </p>
    </article>
  );
}

/**
 * The staff inbox: every tank's conversation, the ones waiting for an answer first. The filter
 * lives in the address; the list refreshes from the live event stream.
 */
export function ConversationInbox({ filter }: { filter: InboxFilter }) {
  const inbox = useInbox(filter);
  const now = useNow();
  const conversations = inbox.data?.pages.flat() ?? [];
  return (
    <div className="grid gap-4">
      <nav aria-label="Show" className="-mx-4 overflow-x-auto px-4 sm:mx-0 sm:px-0">
        <ul className="flex w-max gap-2">
          {inboxFilters.map((key) => (
            <li key={key}>
              <Link
                to={{ search: key === 'all' ? '' : `?filter=${key}` }}
                replace
                preventScrollReset
                aria-current={key === filter ? 'page' : undefined}
                className={`inline-flex min-h-11 items-center rounded-lg border-2 px-4 font-bold no-underline ${
                  key === filter
                    ? 'border-ink-800 bg-ink-800 text-white'
                    : 'border-ink-300 bg-white text-ink-900 hover:border-ink-700'
                }`}
              >
                {filterLabels[key]}
              </Link>
            </li>
          ))}
        </ul>
      </nav>
      <div aria-live="polite" aria-busy={inbox.isPlaceholderData || undefined}>
        {inbox.isPending ? (
          <LoadingState label="Loading the inbox…" />
        ) : inbox.isError && !inbox.data ? (
          <ErrorState error={inbox.error} what="the inbox" onRetry={() => void inbox.refetch()} />
        ) : conversations.length === 0 ? (
          <EmptyState title={emptyWords[filter].title}>{emptyWords[filter].text}</EmptyState>
        ) : (
          <>
            <ul className="grid gap-3" aria-label={`${filterLabels[filter]} conversations`}>
              {conversations.map((conversation) => (
                <li key={conversation.id}>
                  <InboxRow conversation={conversation} now={now} />
                </li>
              ))}
            </ul>
            {inbox.hasNextPage && (
              <div className="mt-4 flex justify-center">
                <Button
                  tone="secondary"
                  onClick={() => void inbox.fetchNextPage()}
                  disabled={inbox.isFetchingNextPage}
                >
                  {inbox.isFetchingNextPage ? 'Loading…' : 'Show more conversations'}
                </Button>
              </div>
            )}
          </>
        )}
      </div>
    </div>
  );
}
