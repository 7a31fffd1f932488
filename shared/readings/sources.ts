import { z } from 'zod';

export const readingSources = ['visit', 'home-test', 'device'] as const;
export const readingSource = z.enum(readingSources);
export type ReadingSource = z.infer<typeof readingSource>;

/** Readings a person records: staff at a visit or as a home test, owners as home tests only. */
export const manualSources = ['visit', 'home-test'] as const;
export const manualSource = z.enum(manualSources, {
  error: 'use visit or home-test (device readings come only from a device)',
});
export type ManualSource = z.infer<typeof manualSource>;
