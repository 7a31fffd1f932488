import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PhotoItem } from '@shared/schemas/photos';
import { api } from '../../../lib/api-client';
import { tankKeys } from '../../../lib/query-keys';

export const getTankPhotos = (tankId: string, signal?: AbortSignal) =>
  api<PhotoItem[]>(`/tanks/${tankId}/photos`, { signal });

export const tankPhotosQueryOptions = (tankId: string) =>
  queryOptions({ queryKey: tankKeys.photos(tankId), queryFn: ({ signal }) => getTankPhotos(tankId, signal) });

export const useTankPhotos = (tankId: string) => useQuery(tankPhotosQueryOptions(tankId));
