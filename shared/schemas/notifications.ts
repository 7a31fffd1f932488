import { z } from 'zod';
import { alertSeverity } from '@shared/alerts/kinds';
import { quietHours } from '@shared/alerts/quiet-hours';

export const notificationChannels = ['push', 'email', 'in-app'] as const;
export const notificationChannel = z.enum(notificationChannels);
export type NotificationChannel = z.infer<typeof notificationChannel>;

/** Which severities reach a person on each channel, and when to stay quiet (critical always passes). */
export const notificationPreferences = z.object({
  push: z.array(alertSeverity),
  email: z.array(alertSeverity),
  inApp: z.array(alertSeverity),
  quietHours: quietHours.nullable(),
  timeZone: z.string().min(1).max(64),
});
export type NotificationPreferences = z.infer<typeof notificationPreferences>;

export const defaultNotificationPreferences: NotificationPreferences = {
  push: ['warning', 'critical'],
  email: ['critical'],
  inApp: ['notice', 'warning', 'critical'],
  quietHours: { start: '22:00', end: '07:00' },
  timeZone: 'UTC',
};

export const pushSubscriptionInput = z.object({
  endpoint: z.url().startsWith('https://', 'A push endpoint must use https.').max(2048),
  keys: z.object({
    p256dh: z.string().regex(/^[\w-]{80,100}$/, 'Not a P-256 public key.'),
    auth: z.string().regex(/^[\w-]{16,32}$/, 'Not a push auth secret.'),
  }),
});
export type PushSubscriptionInput = z.infer<typeof pushSubscriptionInput>;
