import { infiniteQueryOptions, useInfiniteQuery } from '@tanstack/react-query';
import type { MessagePage } from '@shared/schemas/conversations';
import { api } from '../../../lib/api-client';
import { conversationKeys } from '../../../lib/query-keys';

/** Messages per page: a phone screen or two of conversation. */
export const threadPageSize = 30;

/** One page of a tank's conversation, newest page first; `before` is the cursor the previous page gave. */
export const getMessagePage = (tankId: string, before: string | null, signal?: AbortSignal) => {
  const params = new URLSearchParams({ limit: String(threadPageSize) });
  if (before) params.set('before', before);
  return api<MessagePage>(`/tanks/${tankId}/conversation/messages?${params}`, { signal });
};

export const threadQueryOptions = (tankId: string) =>
  infiniteQueryOptions({
    queryKey: conversationKeys.thread(tankId),
    queryFn: ({ pageParam, signal }) => getMessagePage(tankId, pageParam, signal),
    initialPageParam: null as string | null,
    getNextPageParam: (page): string | null => page.next,
  });

export const useThread = (tankId: string) => useInfiniteQuery(threadQueryOptions(tankId));
