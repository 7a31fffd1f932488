import { filterSearch, type ReadingFilters } from './list-readings';

/** A plain link: the browser downloads the CSV with the session cookie, streamed by the API. */
export function exportReadingsUrl(tankId: string, filters: ReadingFilters): string {
  const search = filterSearch(filters).toString();
  return `/api/tanks/${tankId}/readings/export${search ? `?${search}` : ''}`;
}
