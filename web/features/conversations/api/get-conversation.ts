import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ConversationSummary } from '@shared/schemas/conversations';
import { api } from '../../../lib/api-client';
import { conversationKeys } from '../../../lib/query-keys';

/** A tank's conversation at a glance: who is in it, the newest line and how many are unread for me. */
export const getConversation = (tankId: string, signal?: AbortSignal) =>
  api<ConversationSummary>(`/tanks/${tankId}/conversation`, { signal });

export const conversationQueryOptions = (tankId: string) =>
  queryOptions({
    queryKey: conversationKeys.summary(tankId),
    queryFn: ({ signal }) => getConversation(tankId, signal),
  });

export const useConversation = (tankId: string) => useQuery(conversationQueryOptions(tankId));
