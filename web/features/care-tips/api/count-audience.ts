import { keepPreviousData, useQuery } from '@tanstack/react-query';
import { useEffect, useState } from 'react';
import type { AudienceCount, TipAudience } from '@shared/schemas/care-tips';
import { api } from '../../../lib/api-client';
import { tipKeys } from '../../../lib/query-keys';

export const countAudience = (audience: TipAudience, signal?: AbortSignal) =>
  api<AudienceCount>('/care-tips/audience-count', { method: 'POST', body: { audience }, signal });

const settleMs = 400;

/**
 * How many tanks and owners an audience reaches, asked once the choice has stood still for a
 * moment (ticking through a list of tanks asks once, not once per tick). `settling` is true while
 * a newer choice waits for its count; null asks nothing (an audience not complete yet).
 */
export function useAudienceCount(audience: TipAudience | null) {
  const wanted = audience === null ? null : JSON.stringify(audience);
  const [settled, setSettled] = useState(wanted);
  useEffect(() => {
    const timer = window.setTimeout(() => setSettled(wanted), settleMs);
    return () => window.clearTimeout(timer);
  }, [wanted]);
  const asked = settled === null ? null : (JSON.parse(settled) as TipAudience);
  const count = useQuery({
    queryKey: tipKeys.audienceCount(asked ?? {}),
    queryFn: ({ signal }) => countAudience(asked!, signal),
    enabled: asked !== null,
    placeholderData: keepPreviousData,
    staleTime: 30_000,
  });
  return { ...count, settling: wanted !== settled || count.isFetching };
}
