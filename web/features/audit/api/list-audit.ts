import { infiniteQueryOptions, useInfiniteQuery } from '@tanstack/react-query';
import type { AuditFilters, AuditPage } from '@shared/schemas/audit';
import { api } from '../../../lib/api-client';
import { auditKeys } from '../../../lib/query-keys';

export function auditSearch(filters: AuditFilters): URLSearchParams {
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries(filters)) if (value) search.set(key, value);
  return search;
}

export function listAudit(filters: AuditFilters, before?: string, signal?: AbortSignal) {
  const search = auditSearch(filters);
  search.set('limit', '50');
  if (before) search.set('before', before);
  return api<AuditPage>(`/audit?${search}`, { signal });
}

export const listAuditQueryOptions = (filters: AuditFilters) =>
  infiniteQueryOptions({
    queryKey: auditKeys.list(filters),
    queryFn: ({ pageParam, signal }) => listAudit(filters, pageParam, signal),
    initialPageParam: undefined as string | undefined,
    getNextPageParam: (page) => page.next ?? undefined,
  });

export const useListAudit = (filters: AuditFilters) => useInfiniteQuery(listAuditQueryOptions(filters));
