import { infiniteQueryOptions, useInfiniteQuery } from '@tanstack/react-query';
import type { TimelineKind, TimelinePage } from '@shared/schemas/timeline';
import { api } from '../../../lib/api-client';
import { tankKeys } from '../../../lib/query-keys';

/** Entries per page: a few phone screens, so "Show older" stays rare but the first answer is quick. */
export const timelinePageSize = 20;

/** One page of a tank's timeline, newest first; `kinds` empty means every kind. */
export function getTimeline(
  tankId: string,
  kinds: readonly TimelineKind[],
  before?: string,
  signal?: AbortSignal,
) {
  const search = new URLSearchParams({ limit: String(timelinePageSize) });
  if (kinds.length > 0) search.set('kinds', kinds.join(','));
  if (before) search.set('before', before);
  return api<TimelinePage>(`/tanks/${tankId}/timeline?${search}`, { signal });
}

export const timelineQueryOptions = (tankId: string, kinds: readonly TimelineKind[]) =>
  infiniteQueryOptions({
    queryKey: tankKeys.timeline(tankId, kinds),
    queryFn: ({ pageParam, signal }) => getTimeline(tankId, kinds, pageParam, signal),
    initialPageParam: undefined as string | undefined,
    getNextPageParam: (page) => page.next ?? undefined,
  });

export const useTimeline = (tankId: string, kinds: readonly TimelineKind[]) =>
  useInfiniteQuery(timelineQueryOptions(tankId, kinds));
