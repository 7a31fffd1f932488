export const equipmentKeys = {
  list: (tankId: string) => ['tanks', 'detail', tankId, 'equipment'] as const,
};
