import {
  infiniteQueryOptions,
  useInfiniteQuery,
  useMutation,
  useQueryClient,
  type InfiniteData,
} from '@tanstack/react-query';
import { tipFeedCursorOf, type TipFeedItem } from '@shared/schemas/care-tips';
import { api } from '../../../lib/api-client';
import { tipKeys } from '../../../lib/query-keys';
import { apiPaths } from '@shared/first-load/api-paths';

/** A page of the tips a person's tanks received (one tank's with `tankId`), newest first. */
export const getTipFeed = (
  { tankId, cursor, limit }: { tankId: string | null; cursor: string | null; limit: number },
  signal?: AbortSignal,
) => api<TipFeedItem[]>(apiPaths.tipFeed({ tankId, cursor, limit }), { signal });

export const tipFeedQueryOptions = (tankId: string | null, limit: number) =>
  infiniteQueryOptions({
    queryKey: [...tipKeys.feed(tankId), limit] as const,
    queryFn: ({ pageParam, signal }) => getTipFeed({ tankId, cursor: pageParam, limit }, signal),
    initialPageParam: null as string | null,
    // A page shorter than asked for is the last one; the next starts after a page's last item.
    getNextPageParam: (last): string | null => {
      const end = last.at(-1);
      return last.length < limit || !end ? null : tipFeedCursorOf(end);
    },
  });

export const useTipFeed = (tankId: string | null, limit = 5) =>
  useInfiniteQuery(tipFeedQueryOptions(tankId, limit));

type FeedData = InfiniteData<TipFeedItem[], string | null>;

const markedIn = (data: FeedData | undefined, tipId: string, helpful: boolean): FeedData | undefined =>
  data && {
    ...data,
    pages: data.pages.map((page) => page.map((item) => (item.tipId === tipId ? { ...item, helpful } : item))),
  };

export const markTipHelpful = (tipId: string, helpful: boolean) =>
  api<unknown>(`/care-tips/${tipId}/helpful`, { method: helpful ? 'PUT' : 'DELETE' });

/**
 * "Helpful", shown at once in every feed the tip is in (the dashboard's and the tank's) and put
 * back as it was if the server refuses.
 */
export function useMarkTipHelpful() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ tipId, helpful }: { tipId: string; helpful: boolean }) => markTipHelpful(tipId, helpful),
    onMutate: async ({ tipId, helpful }) => {
      await queryClient.cancelQueries({ queryKey: tipKeys.feeds() });
      const before = queryClient.getQueriesData<FeedData>({ queryKey: tipKeys.feeds() });
      queryClient.setQueriesData<FeedData>({ queryKey: tipKeys.feeds() }, (data) =>
        markedIn(data, tipId, helpful),
      );
      return { before };
    },
    onError: (_error, _variables, context) => {
      for (const [key, data] of context?.before ?? []) queryClient.setQueryData(key, data);
    },
  });
}
