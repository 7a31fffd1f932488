import { infiniteQueryOptions, keepPreviousData, useInfiniteQuery } from '@tanstack/react-query';
import type { ConversationSummary } from '@shared/schemas/conversations';
import { api } from '../../../lib/api-client';
import { conversationKeys } from '../../../lib/query-keys';

export const inboxFilters = ['all', 'unanswered', 'unread'] as const;
export type InboxFilter = (typeof inboxFilters)[number];

const inboxPageSize = 50;

/** The staff inbox: unanswered first (longest waiting first), then the most recent activity. */
export const listInbox = (filter: InboxFilter, offset: number, signal?: AbortSignal) => {
  const params = new URLSearchParams({ filter, limit: String(inboxPageSize), offset: String(offset) });
  return api<ConversationSummary[]>(`/conversations?${params}`, { signal });
};

export const inboxQueryOptions = (filter: InboxFilter) =>
  infiniteQueryOptions({
    queryKey: conversationKeys.inbox({ filter }),
    queryFn: ({ pageParam, signal }) => listInbox(filter, pageParam, signal),
    initialPageParam: 0,
    // A page shorter than asked for is the last one.
    getNextPageParam: (page, pages): number | null =>
      page.length < inboxPageSize ? null : pages.length * inboxPageSize,
    // Changing the filter keeps the last list on screen until the new one arrives.
    placeholderData: keepPreviousData,
  });

export const useInbox = (filter: InboxFilter) => useInfiniteQuery(inboxQueryOptions(filter));
