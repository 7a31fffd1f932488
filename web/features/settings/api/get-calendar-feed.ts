import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CalendarFeedStatus } from '@shared/schemas/calendar-feed';
import { api } from '../../../lib/api-client';
import { calendarKeys } from '../../../lib/query-keys';

export const getCalendarFeed = (signal?: AbortSignal) =>
  api<CalendarFeedStatus>('/me/calendar-feed', { signal });

export const calendarFeedQueryOptions = () =>
  queryOptions({
    queryKey: calendarKeys.status(),
    queryFn: ({ signal }) => getCalendarFeed(signal),
  });

export const useCalendarFeed = () => useQuery(calendarFeedQueryOptions());
