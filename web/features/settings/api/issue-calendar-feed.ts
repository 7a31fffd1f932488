import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CalendarFeedAddress, CalendarFeedStatus } from '@shared/schemas/calendar-feed';
import { api } from '../../../lib/api-client';
import { calendarKeys } from '../../../lib/query-keys';

/** A new address for the feed; any earlier one stops working. */
export const issueCalendarFeed = () => api<CalendarFeedAddress>('/me/calendar-feed', { method: 'POST' });

export const useIssueCalendarFeed = () => {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: issueCalendarFeed,
    onSuccess: () => queryClient.setQueryData<CalendarFeedStatus>(calendarKeys.status(), { active: true }),
  });
};
