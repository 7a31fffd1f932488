/** Everything readings-related hangs under the tank, so one invalidation refreshes the tank page. */
export const tankReadingsKey = (tankId: string) => ['tanks', tankId, 'readings'] as const;
