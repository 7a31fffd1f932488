import { useQuery } from '@tanstack/react-query';
import type { CompatibilityCheck, SpeciesEntry } from '@shared/schemas/livestock';
import { api } from '../../../lib/api-client';
import { speciesKeys, tankKeys } from '../../../lib/query-keys';

/*
 * Adding an animal in a report: the species catalogue to pick from, and the compatibility
 * warnings the addition would bring (the tank's equipment and livestock come from web/lib/queries).
 */

export const useSpeciesSearch = (q: string, waterType: string) =>
  useQuery({
    queryKey: speciesKeys.search({ q, waterType, limit: 8 }),
    queryFn: ({ signal }) =>
      api<SpeciesEntry[]>(`/species?${new URLSearchParams({ q, waterType, limit: '8' }).toString()}`, {
        signal,
      }),
    enabled: q.trim().length >= 2,
  });

/** The compatibility warnings an addition would bring, without adding anything. */
export const useCompatibility = (tankId: string, speciesId: string | null) =>
  useQuery({
    queryKey: tankKeys.livestockCheck(tankId, speciesId ?? ''),
    queryFn: ({ signal }) =>
      api<CompatibilityCheck>(`/tanks/${tankId}/livestock?dryRun=true`, {
        method: 'POST',
        body: { speciesId, quantity: 1 },
        signal,
      }),
    enabled: speciesId !== null,
  });
