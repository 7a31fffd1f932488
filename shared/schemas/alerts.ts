import { z } from 'zod';
import { alertKind, alertSeverity, alertStatus } from '@shared/alerts/kinds';
import { parameterKey } from '@shared/parameters/keys';

export const alertListQuery = z.object({
  status: z.enum(['active', 'open', 'acknowledged', 'resolved', 'all']).default('active'),
  severity: alertSeverity.optional(),
  tankId: z.uuid().optional(),
  limit: z.coerce.number().int().min(1).max(200).default(100),
});
export type AlertListQuery = z.infer<typeof alertListQuery>;

export const alertIdParams = z.object({ alertId: z.uuid() });

export const acknowledgeInput = z.object({ note: z.string().trim().max(1000).optional() });
export const resolveInput = z.object({ note: z.string().trim().min(1, 'Say what was done.').max(1000) });

export const alertEventView = z.object({
  id: z.uuid(),
  type: z.enum(['opened', 'escalated', 'de-escalated', 'acknowledged', 'resolved']),
  severity: alertSeverity,
  value: z.number().nullable(),
  note: z.string().nullable(),
  actorName: z.string().nullable(),
  at: z.iso.datetime(),
});

export const alertView = z.object({
  id: z.uuid(),
  tank: z.object({ id: z.uuid(), name: z.string(), siteLabel: z.string().nullable() }),
  kind: alertKind,
  parameter: parameterKey.nullable(),
  severity: alertSeverity,
  status: alertStatus,
  title: z.string(),
  body: z.string(),
  value: z.number().nullable(),
  limitValue: z.number().nullable(),
  direction: z.string().nullable(),
  openedAt: z.iso.datetime(),
  lastSeenAt: z.iso.datetime(),
  acknowledgedAt: z.iso.datetime().nullable(),
  acknowledgedBy: z.string().nullable(),
  resolvedAt: z.iso.datetime().nullable(),
  events: z.array(alertEventView).optional(),
});
export type AlertView = z.infer<typeof alertView>;
export type AlertEventView = z.infer<typeof alertEventView>;

export const notificationView = z.object({
  id: z.uuid(),
  severity: alertSeverity,
  title: z.string(),
  body: z.string(),
  link: z.string(),
  readAt: z.iso.datetime().nullable(),
  createdAt: z.iso.datetime(),
});
export type NotificationView = z.infer<typeof notificationView>;

export const markReadInput = z.object({ ids: z.array(z.uuid()).max(200).optional() });
