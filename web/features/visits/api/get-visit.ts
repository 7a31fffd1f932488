import { queryOptions, useQuery } from '@tanstack/react-query';
import type { VisitDetail, VisitReportContent } from '@shared/schemas/visits';
import { api } from '../../../lib/api-client';
import { visitKeys } from '../../../lib/query-keys';

export const getVisit = (visitId: string, signal?: AbortSignal) =>
  api<VisitDetail>(`/visits/${visitId}`, { signal });

export const visitQueryOptions = (visitId: string) =>
  queryOptions({ queryKey: visitKeys.detail(visitId), queryFn: ({ signal }) => getVisit(visitId, signal) });

export const useVisit = (visitId: string) => useQuery(visitQueryOptions(visitId));

export const getVisitVersion = (visitId: string, version: number, signal?: AbortSignal) =>
  api<VisitReportContent>(`/visits/${visitId}/versions/${version}`, { signal });

export const useVisitVersion = (visitId: string, version: number | null) =>
  useQuery({
    queryKey: visitKeys.version(visitId, version ?? -1),
    queryFn: ({ signal }) => getVisitVersion(visitId, version!, signal),
    enabled: version !== null,
  });
