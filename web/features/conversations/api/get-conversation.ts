import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ConversationSummary } from '@shared/schemas/conversations';
import { api } from '../../../lib/api-client';
import { conversationKeys } from '../../../lib/query-keys';
import { apiPaths } from '@shared/first-load/api-paths';

/** A tank's conversation at a glance: who is in it, the newest line and how many are unread for me. */
export const getConversation = (tankId: string, signal?: AbortSignal) =>
  api<ConversationSummary>(apiPaths.tankConversation(tankId), { signal });

export const conversationQueryOptions = (tankId: string) =>
  queryOptions({
    queryKey: conversationKeys.summary(tankId),
    queryFn: ({ signal }) => getConversation(tankId, signal),
  });

export const useConversation = (tankId: string) => useQuery(conversationQueryOptions(tankId));
