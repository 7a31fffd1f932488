import { z } from 'zod';

/**
 * What an alert is about:
 * - `limit`: a reading beyond the tank's warning or critical limits;
 * - `rate`: a parameter moving faster than the tank's rate-of-change rule;
 * - `device-stale`: a device has sent nothing for longer than expected;
 * - `test-overdue`: a home test is due and nothing has been recorded;
 * - `livestock`: a reading outside what a particular inhabitant tolerates;
 * - `free-ammonia`: total ammonia that, at the tank's pH and temperature, holds harmful free NH3.
 */
export const alertKinds = [
  'limit',
  'rate',
  'device-stale',
  'test-overdue',
  'livestock',
  'free-ammonia',
] as const;
export const alertKind = z.enum(alertKinds);
export type AlertKind = z.infer<typeof alertKind>;

/** `notice` is low urgency: shown in the app, not pushed unless a person asks for it. */
export const alertSeverities = ['notice', 'warning', 'critical'] as const;
export const alertSeverity = z.enum(alertSeverities);
export type AlertSeverity = z.infer<typeof alertSeverity>;

export const alertStatuses = ['open', 'acknowledged', 'resolved'] as const;
export const alertStatus = z.enum(alertStatuses);
export type AlertStatus = z.infer<typeof alertStatus>;
