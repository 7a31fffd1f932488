import type { PhotoItem } from '@shared/schemas/photos';
import { api } from '../../../lib/api-client';

/**
 * A photo for a request, sent before the request itself; the request then names it by id. It goes
 * where message photos go (the one upload owners may use), under the tank photos' field name.
 */
export function uploadUrgentPhoto(tankId: string, file: Blob, name = 'photo.jpg') {
  const form = new FormData();
  form.append('photo', file, name);
  return api<PhotoItem>(`/tanks/${tankId}/conversation/photos`, { method: 'POST', body: form });
}
