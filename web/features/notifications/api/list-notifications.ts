import { queryOptions, useQuery } from '@tanstack/react-query';
import type { NotificationView } from '@shared/schemas/alerts';
import { api } from '../../../lib/api-client';
import { notificationKeys } from '../../../lib/query-keys';
import { apiPaths } from '@shared/first-load/api-paths';

export interface NotificationInbox {
  unread: number;
  items: NotificationView[];
}

/** The latest 50 in-app notifications, newest first, and how many of all of them are unread. */
export const listNotifications = (signal?: AbortSignal) =>
  api<NotificationInbox>(apiPaths.notifications(), { signal });

export const notificationsQueryOptions = () =>
  queryOptions({
    queryKey: notificationKeys.inbox,
    queryFn: ({ signal }) => listNotifications(signal),
    // Live events keep this fresh; the slow poll only covers a stream that has quietly dropped.
    refetchInterval: 5 * 60_000,
  });

export const useNotifications = (enabled = true) => useQuery({ ...notificationsQueryOptions(), enabled });
