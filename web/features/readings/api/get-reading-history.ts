import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ParameterKey } from '@shared/parameters/keys';
import type { ReadingHistory } from '@shared/schemas/readings';
import { api } from '../../../lib/api-client';
import { chartRanges, type ChartRange } from '../utils/chart-ranges';
import { tankKeys } from '../../../lib/query-keys';

export interface HistoryRequest {
  tankId: string;
  parameter: ParameterKey;
  range: ChartRange;
  points?: number;
}

/** The window ends now, at the moment of fetching, so a refetch moves it along. */
export function getReadingHistory(
  { tankId, parameter, range, points = 500 }: HistoryRequest,
  signal?: AbortSignal,
) {
  const to = new Date();
  const from = new Date(to.getTime() - chartRanges[range].ms);
  const search = new URLSearchParams({
    parameter,
    from: from.toISOString(),
    to: to.toISOString(),
    points: String(points),
  });
  return api<ReadingHistory>(`/tanks/${tankId}/readings?${search}`, { signal });
}

export const readingHistoryQueryOptions = (request: HistoryRequest) =>
  queryOptions({
    queryKey: tankKeys.readingHistory(request.tankId, {
      parameter: request.parameter,
      range: request.range,
      points: request.points ?? 500,
    }),
    queryFn: ({ signal }) => getReadingHistory(request, signal),
    // Switching range keeps the old chart on screen until the new one arrives; another
    // parameter's chart is never shown under this one's name.
    placeholderData: (previous) =>
      previous?.parameter === request.parameter ? keepPreviousData(previous) : undefined,
  });

export const useReadingHistory = (request: HistoryRequest) => useQuery(readingHistoryQueryOptions(request));
