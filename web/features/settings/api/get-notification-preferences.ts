import { queryOptions, useQuery } from '@tanstack/react-query';
import type { NotificationPreferences } from '@shared/schemas/notifications';
import { api } from '../../../lib/api-client';
import { notificationKeys } from '../../../lib/query-keys';

export const getNotificationPreferences = (signal?: AbortSignal) =>
  api<NotificationPreferences>('/notifications/preferences', { signal });

export const notificationPreferencesQueryOptions = () =>
  queryOptions({
    // Apart from the inbox: live events refresh that, and must not reload a form being edited.
    queryKey: notificationKeys.preferences,
    queryFn: ({ signal }) => getNotificationPreferences(signal),
    refetchOnWindowFocus: false,
  });

export const useNotificationPreferences = () => useQuery(notificationPreferencesQueryOptions());
