import { queryOptions } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

/** The server's VAPID public key (base64url), or null when this server sends no web push. */
export const getPushPublicKey = (signal?: AbortSignal) =>
  api<{ publicKey: string | null }>('/push/public-key', { signal });

export const pushPublicKeyQueryOptions = () =>
  queryOptions({
    queryKey: ['push', 'public-key'],
    queryFn: ({ signal }) => getPushPublicKey(signal),
    staleTime: Infinity,
  });
