import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { notificationKeys } from '../../../lib/query-keys';

/** Without ids, every unread notification of the signed-in person is marked read. */
export const markNotificationsRead = (ids?: string[]) =>
  api<void>('/notifications/read', { method: 'POST', body: ids ? { ids } : {} });

export const useMarkNotificationsRead = () => {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: markNotificationsRead,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: notificationKeys.inbox }),
  });
};
