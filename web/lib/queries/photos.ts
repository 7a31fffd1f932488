import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { PhotoItem } from '@shared/schemas/photos';
import { api } from '../api-client';
import { tankKeys } from '../query-keys';

/*
 * Uploading a photo: the tank's own photos and each animal's gallery both send them, so the call
 * lives here beside the shared uploader rather than in one feature. A tank's photos are listed
 * here too: its page shows them and the care tip composer picks one of them.
 */

export const getTankPhotos = (tankId: string, signal?: AbortSignal) =>
  api<PhotoItem[]>(`/tanks/${tankId}/photos`, { signal });

export const tankPhotosQueryOptions = (tankId: string) =>
  queryOptions({ queryKey: tankKeys.photos(tankId), queryFn: ({ signal }) => getTankPhotos(tankId, signal) });

export const useTankPhotos = (tankId: string, enabled = true) =>
  useQuery({ ...tankPhotosQueryOptions(tankId), enabled });

export interface PhotoUploadInput {
  file: File | Blob;
  caption?: string;
  livestockId?: string;
  cover?: boolean;
  /** "visit": taken for a visit report, shown to owners once the report is published. */
  subject?: 'tank' | 'visit';
}

export function uploadPhoto(tankId: string, input: PhotoUploadInput) {
  const form = new FormData();
  if (input.caption) form.append('caption', input.caption);
  if (input.livestockId) form.append('livestockId', input.livestockId);
  if (input.cover) form.append('cover', 'true');
  if (input.subject) form.append('subject', input.subject);
  form.append('photo', input.file);
  return api<PhotoItem>(`/tanks/${tankId}/photos`, { method: 'POST', body: form });
}

/** A new photo can change the tank's cover and an animal's gallery, so the whole tank refreshes. */
export function useUploadPhoto(tankId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: PhotoUploadInput) => uploadPhoto(tankId, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: tankKeys.detail(tankId) }),
  });
}
