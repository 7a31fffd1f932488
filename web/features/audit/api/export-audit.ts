import type { AuditFilters } from '@shared/schemas/audit';
import { auditSearch } from './list-audit';

/** A plain link: the browser downloads the CSV with the session cookie, streamed by the API. */
export function exportAuditUrl(filters: AuditFilters): string {
  const search = auditSearch(filters).toString();
  return `/api/audit/export${search ? `?${search}` : ''}`;
}
