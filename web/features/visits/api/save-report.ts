import type { SaveReportInput, VisitDetail } from '@shared/schemas/visits';
import { api } from '../../../lib/api-client';

/** One autosave; a 409 (`stale_version`) means another device saved first. */
export const saveReport = (visitId: string, input: SaveReportInput) =>
  api<VisitDetail>(`/visits/${visitId}/report`, { method: 'PUT', body: input });
