import { queryOptions, useQuery } from '@tanstack/react-query';
import { openUrgentStatuses, type UrgentStatus } from '@shared/urgent/lifecycle';
import type { UrgentRequestView } from '@shared/schemas/urgent-requests';
import { api } from '../../../lib/api-client';
import { urgentKeys } from '../../../lib/query-keys';
import { apiPaths } from '@shared/first-load/api-paths';

export type UrgentBoardState = 'open' | 'closed';

/** The staff board: open requests oldest first, or the closed ones. */
export const listUrgentBoard = (state: UrgentBoardState, signal?: AbortSignal) =>
  api<UrgentRequestView[]>(`/urgent-requests?state=${state}`, { signal });

export const urgentBoardQueryOptions = (state: UrgentBoardState) =>
  queryOptions({
    queryKey: urgentKeys.board({ state }),
    queryFn: ({ signal }) => listUrgentBoard(state, signal),
  });

export const useUrgentBoard = (state: UrgentBoardState, enabled = true) =>
  useQuery({ ...urgentBoardQueryOptions(state), enabled });

/** How many requests are open, for the console's navigation; null while unknown or not staff. */
export function useOpenUrgentCount(enabled: boolean): number | null {
  const board = useUrgentBoard('open', enabled);
  return enabled && board.data ? board.data.length : null;
}

/** A tank's requests, newest first. */
export const listTankUrgentRequests = (tankId: string, signal?: AbortSignal) =>
  api<UrgentRequestView[]>(apiPaths.tankUrgentRequests(tankId), { signal });

export const tankUrgentRequestsQueryOptions = (tankId: string) =>
  queryOptions({
    queryKey: urgentKeys.tank(tankId),
    queryFn: ({ signal }) => listTankUrgentRequests(tankId, signal),
  });

/** The tank's newest request still open, if any: its page links to it instead of asking again. */
export function useOpenTankUrgentRequest(tankId: string) {
  const requests = useQuery(tankUrgentRequestsQueryOptions(tankId));
  const open: readonly UrgentStatus[] = openUrgentStatuses;
  return requests.data?.find((request) => open.includes(request.status)) ?? null;
}
