import { queryOptions, useQuery } from '@tanstack/react-query';
import type { NotificationPreferences } from '@shared/schemas/notifications';
import { api } from '../../../lib/api-client';

export const getNotificationPreferences = (signal?: AbortSignal) =>
  api<NotificationPreferences>('/notifications/preferences', { signal });

/** Not under `['notifications']`: live events refresh the inbox, and must not reload a form being edited. */
export const notificationPreferencesQueryKey = ['notification-preferences'] as const;

export const notificationPreferencesQueryOptions = () =>
  queryOptions({
    queryKey: notificationPreferencesQueryKey,
    queryFn: ({ signal }) => getNotificationPreferences(signal),
    refetchOnWindowFocus: false,
  });

export const useNotificationPreferences = () => useQuery(notificationPreferencesQueryOptions());
