import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CalendarFeedStatus } from '@shared/schemas/calendar-feed';
import { api } from '../../../lib/api-client';
import { calendarKeys } from '../../../lib/query-keys';

export const revokeCalendarFeed = () => api<void>('/me/calendar-feed', { method: 'DELETE' });

export const useRevokeCalendarFeed = () => {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: revokeCalendarFeed,
    onSuccess: () => queryClient.setQueryData<CalendarFeedStatus>(calendarKeys.status(), { active: false }),
  });
};
