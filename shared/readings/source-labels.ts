import type { ReadingSource } from './sources';

/** Where a reading came from, in people's words. Apart from sources.ts so showing one does not load zod. */
export const readingSourceLabels: Readonly<Record<ReadingSource, string>> = {
  visit: 'Visit',
  'home-test': 'Home test',
  device: 'Device',
};
