import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { NotificationPreferences } from '@shared/schemas/notifications';
import { api } from '../../../lib/api-client';
import { notificationKeys } from '../../../lib/query-keys';

export const saveNotificationPreferences = (preferences: NotificationPreferences) =>
  api<NotificationPreferences>('/notifications/preferences', { method: 'PUT', body: preferences });

export const useSaveNotificationPreferences = () => {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: saveNotificationPreferences,
    onSuccess: (saved) => queryClient.setQueryData(notificationKeys.preferences, saved),
  });
};
