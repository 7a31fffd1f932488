import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CompatibilityCheck } from '@shared/schemas/livestock';
import { api } from '../../../lib/api-client';
import { tankKeys } from '../../../lib/query-keys';

/** A dry run of adding the species: the warnings against what lives in the tank now; nothing is saved. */
export const checkLivestock = (tankId: string, speciesId: string, signal?: AbortSignal) =>
  api<CompatibilityCheck>(`/tanks/${tankId}/livestock?dryRun=true`, {
    method: 'POST',
    body: { speciesId },
    signal,
  });

export const livestockCheckQueryOptions = (tankId: string, speciesId: string | null) =>
  queryOptions({
    queryKey: tankKeys.livestockCheck(tankId, speciesId ?? ''),
    queryFn: ({ signal }) => checkLivestock(tankId, speciesId!, signal),
    enabled: speciesId !== null,
    staleTime: 0,
  });

export const useLivestockCheck = (tankId: string, speciesId: string | null) =>
  useQuery(livestockCheckQueryOptions(tankId, speciesId));
