import { queryOptions, useQuery } from '@tanstack/react-query';
import type { UnreadCounts } from '@shared/schemas/conversations';
import { api } from '../../../lib/api-client';
import { conversationKeys } from '../../../lib/query-keys';
import { apiPaths } from '@shared/first-load/api-paths';

/** Unread messages for the signed-in person: in all, and per tank (tanks with none are left out). */
export const getUnreadCounts = (signal?: AbortSignal) =>
  api<UnreadCounts>(apiPaths.unreadMessages(), { signal });

export const unreadCountsQueryOptions = () =>
  queryOptions({ queryKey: conversationKeys.unread(), queryFn: ({ signal }) => getUnreadCounts(signal) });

export const useUnreadCounts = (enabled = true) => useQuery({ ...unreadCountsQueryOptions(), enabled });
