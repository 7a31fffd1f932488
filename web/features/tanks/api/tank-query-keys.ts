import type { TankListQuery } from '@shared/schemas/tanks';

/** Every tank query starts with 'tanks', so one invalidation refreshes lists and pages alike. */
export const tankKeys = {
  all: ['tanks'] as const,
  list: (query: TankListQuery) => ['tanks', 'list', query] as const,
  detail: (tankId: string) => ['tanks', 'detail', tankId] as const,
  photos: (tankId: string) => ['tanks', 'detail', tankId, 'photos'] as const,
  technicians: ['tanks', 'technicians'] as const,
};
