import { z } from 'zod';
import { alertSeverity } from '@shared/alerts/kinds';
import { quietHours } from '@shared/alerts/quiet-hours';
import { distinctList } from '@shared/lists/distinct';
import { timeZone } from '@shared/time/time-zones';

export const notificationChannels = ['push', 'email', 'in-app'] as const;
export const notificationChannel = z.enum(notificationChannels);
export type NotificationChannel = z.infer<typeof notificationChannel>;

// Room for each severity twice; repeats are dropped.
const severities = distinctList(alertSeverity, 2 * alertSeverity.options.length);

/** Which severities reach a person on each channel, and when to stay quiet (critical always passes). */
export const notificationPreferences = z.object({
  push: severities,
  email: severities,
  inApp: severities,
  quietHours: quietHours.nullable(),
  timeZone,
  /** Where news from the company reaches a person: a published visit report. */
  visitReports: distinctList(notificationChannel, 2 * notificationChannels.length).default([
    'in-app',
    'email',
    'push',
  ]),
  /** Where care tips the company sends for a person's tanks reach them. */
  careTips: distinctList(notificationChannel, 2 * notificationChannels.length).default(['in-app', 'email']),
  /**
   * Where a new message in a tank's conversation reaches a person: in the app, a push per message,
   * and one e-mail once a message has waited unread for 10 minutes.
   */
  messages: distinctList(notificationChannel, 2 * notificationChannels.length).default([
    'in-app',
    'email',
    'push',
  ]),
  /** Where each change of an urgent visit request reaches the owners who follow it. */
  urgentUpdates: distinctList(notificationChannel, 2 * notificationChannels.length).default([
    'in-app',
    'email',
    'push',
  ]),
});
export type NotificationPreferences = z.infer<typeof notificationPreferences>;

export const defaultNotificationPreferences: NotificationPreferences = {
  push: ['warning', 'critical'],
  email: ['critical'],
  inApp: ['notice', 'warning', 'critical'],
  quietHours: { start: '22:00', end: '07:00' },
  timeZone: 'UTC',
  visitReports: ['in-app', 'email', 'push'],
  careTips: ['in-app', 'email'],
  messages: ['in-app', 'email', 'push'],
  urgentUpdates: ['in-app', 'email', 'push'],
};

export const pushSubscriptionInput = z.object({
  endpoint: z.url().startsWith('https://', 'A push endpoint must use https.').max(2048),
  keys: z.object({
    p256dh: z.string().regex(/^[\w-]{80,100}$/, 'Not a P-256 public key.'),
    auth: z.string().regex(/^[\w-]{16,32}$/, 'Not a push auth secret.'),
  }),
});
export type PushSubscriptionInput = z.infer<typeof pushSubscriptionInput>;
