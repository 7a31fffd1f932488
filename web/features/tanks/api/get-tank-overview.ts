import {
  infiniteQueryOptions,
  keepPreviousData,
  useInfiniteQuery,
  type InfiniteData,
} from '@tanstack/react-query';
import { tankStatusValues, type TankStatus } from '@shared/parameters/health';
import type { TankOverviewPage, TankOverviewQuery, TankSummary } from '@shared/schemas/tanks';
import { api } from '../../../lib/api-client';
import { tankKeys } from '../../../lib/query-keys';

/** The overview's filters as the API reads them; the cursor belongs to each page, not to the list. */
export type TankOverviewFilters = Omit<TankOverviewQuery, 'after'>;

export function tankOverviewSearch(filters: TankOverviewFilters, after?: string): URLSearchParams {
  const search = new URLSearchParams();
  if (filters.q) search.set('q', filters.q);
  if (filters.technicianId) search.set('technicianId', filters.technicianId);
  if (filters.status && filters.status.length > 0) search.set('status', filters.status.join(','));
  if (filters.style) search.set('style', filters.style);
  if (after) search.set('after', after);
  return search;
}

export function getTankOverview(filters: TankOverviewFilters, after?: string, signal?: AbortSignal) {
  const search = tankOverviewSearch(filters, after);
  return api<TankOverviewPage>(`/tanks/overview${search.size > 0 ? `?${search}` : ''}`, { signal });
}

/** The pages loaded so far, read as one list. */
export interface TankOverviewList {
  tanks: TankSummary[];
  /** Tanks per status under the other filters, from the newest page read. */
  counts: Record<TankStatus, number>;
  /** Every page is loaded: the list is the whole answer. */
  complete: boolean;
}

const noCounts = Object.fromEntries(tankStatusValues.map((status) => [status, 0])) as Record<
  TankStatus,
  number
>;

/**
 * Pages are read at different moments, so a tank whose status changed in between can come back on
 * a later page too; it is shown once, where it was first seen.
 */
export function mergeTankOverviewPages(data: InfiniteData<TankOverviewPage, unknown>): TankOverviewList {
  const seen = new Set<string>();
  const tanks: TankSummary[] = [];
  for (const page of data.pages) {
    for (const tank of page.tanks) {
      if (seen.has(tank.id)) continue;
      seen.add(tank.id);
      tanks.push(tank);
    }
  }
  const last = data.pages.at(-1);
  return { tanks, counts: last?.counts ?? noCounts, complete: last !== undefined && last.next === null };
}

/** How many tanks the filters match in all: the counts of the statuses asked for, or of every one. */
export function matchingTankCount(counts: Record<TankStatus, number>, status?: readonly TankStatus[]) {
  const counted = status && status.length > 0 ? status : tankStatusValues;
  return counted.reduce((sum, one) => sum + counts[one], 0);
}

export const tankOverviewQueryOptions = (filters: TankOverviewFilters) =>
  infiniteQueryOptions({
    queryKey: tankKeys.overview(filters),
    queryFn: ({ pageParam, signal }) => getTankOverview(filters, pageParam, signal),
    initialPageParam: undefined as string | undefined,
    getNextPageParam: (page) => page.next ?? undefined,
    select: mergeTankOverviewPages,
    // While new filters load, the last list stays on screen instead of a spinner.
    placeholderData: keepPreviousData,
  });

export const useTankOverview = (filters: TankOverviewFilters, { enabled = true } = {}) =>
  useInfiniteQuery({ ...tankOverviewQueryOptions(filters), enabled });
