import { z } from 'zod';
import { auditAction, auditTargetKind, type AuditAction, type AuditTargetKind } from '@shared/audit/actions';
import { instantWithin } from '@shared/time/plausible';

// A filter may look past today (nothing matches yet), but not before 1990, which no row can hold.
const filterInstant = instantWithin({});

/** A position in the trail, newest first: the `next` of the previous page. */
export const auditCursor = z
  .string()
  .regex(/^\d{4}-\d\d-\d\dT[\d:.]+Z_\d{1,15}$/, 'use the cursor the previous page gave');

export const auditFilters = z.object({
  action: auditAction.optional(),
  /** Part of the name or e-mail address of whoever did it. */
  actor: z.string().trim().min(1).max(200).optional(),
  targetKind: auditTargetKind.optional(),
  from: filterInstant.optional(),
  to: filterInstant.optional(),
});
export type AuditFilters = z.infer<typeof auditFilters>;

export const auditListQuery = auditFilters.extend({
  before: auditCursor.optional(),
  limit: z.coerce.number().int().min(1).max(200).default(50),
});
export type AuditListQuery = z.infer<typeof auditListQuery>;

export const auditExportQuery = auditFilters;
export type AuditExportQuery = z.infer<typeof auditExportQuery>;

/** Settings as they were and became, or what an action was given: plain JSON. */
export type AuditValues = Record<string, unknown>;

export interface AuditEntry {
  id: number;
  at: string;
  action: AuditAction;
  /** Null when nobody signed in did it. */
  actor: { id: string | null; name: string; email: string | null } | null;
  target: { kind: AuditTargetKind; id: string; label: string } | null;
  ip: string | null;
  userAgent: string | null;
  requestId: string | null;
  before: AuditValues | null;
  after: AuditValues | null;
  details: AuditValues | null;
}

export interface AuditPage {
  entries: AuditEntry[];
  next: string | null;
}
