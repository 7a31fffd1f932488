import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { tankKeys } from '../../../lib/query-keys';

export const deletePhoto = (photoId: string) => api<void>(`/photos/${photoId}`, { method: 'DELETE' });

export function useDeletePhoto() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: deletePhoto,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: tankKeys.all }),
  });
}
