import { sql } from 'drizzle-orm';
import {
  check,
  doublePrecision,
  index,
  integer,
  jsonb,
  pgEnum,
  pgTable,
  primaryKey,
  text,
  timestamp,
  uniqueIndex,
  uuid,
} from 'drizzle-orm/pg-core';
import { alertKinds, alertSeverities, alertStatuses } from '@shared/alerts/kinds';
import { notificationChannels } from '@shared/schemas/notifications';
import { id, timestamps } from './columns';
import { companies } from './companies';
import { parameterKey } from './readings';
import { tanks } from './tanks';
import { users } from './users';
import { careTips } from './care-tips';
import { visits } from './visits';
import { conversationMessages, conversations } from './conversations';
import { urgentRequestEvents } from './urgent-requests';
import { invoiceEvents } from './billing';

export const alertKind = pgEnum('alert_kind', alertKinds);
export const alertSeverity = pgEnum('alert_severity', alertSeverities);
export const alertStatus = pgEnum('alert_status', alertStatuses);

/**
 * One row per problem. `rule_key` names the rule and its subject (e.g. `limit:temperature`,
 * `device-stale:<device id>`), so "one open alert per tank, rule and parameter" is a unique index.
 */
export const alerts = pgTable(
  'alerts',
  {
    id: id(),
    companyId: uuid('company_id')
      .notNull()
      .references(() => companies.id, { onDelete: 'cascade' }),
    tankId: uuid('tank_id')
      .notNull()
      .references(() => tanks.id, { onDelete: 'cascade' }),
    kind: alertKind('kind').notNull(),
    ruleKey: text('rule_key').notNull(),
    parameter: parameterKey('parameter'),
    severity: alertSeverity('severity').notNull(),
    status: alertStatus('status').notNull().default('open'),
    title: text('title').notNull(),
    body: text('body').notNull(),
    value: doublePrecision('value'),
    limitValue: doublePrecision('limit_value'),
    direction: text('direction'),
    openedAt: timestamp('opened_at', { withTimezone: true }).notNull(),
    lastSeenAt: timestamp('last_seen_at', { withTimezone: true }).notNull(),
    acknowledgedAt: timestamp('acknowledged_at', { withTimezone: true }),
    acknowledgedBy: uuid('acknowledged_by').references(() => users.id, { onDelete: 'set null' }),
    resolvedAt: timestamp('resolved_at', { withTimezone: true }),
    resolvedBy: uuid('resolved_by').references(() => users.id, { onDelete: 'set null' }),
    ...timestamps,
  },
  (t) => [
    uniqueIndex('alerts_one_open_key')
      .on(t.tankId, t.ruleKey)
      .where(sql`${t.status} <> 'resolved'`),
    index('alerts_board_idx').on(t.companyId, t.status, t.severity, t.openedAt),
    index('alerts_tank_idx').on(t.tankId, t.openedAt),
  ],
);

export const alertEventType = pgEnum('alert_event_type', [
  'opened',
  'escalated',
  'de-escalated',
  'acknowledged',
  'resolved',
]);

/** Every transition, in order; also the outbox that notification fan-out reads from. */
export const alertEvents = pgTable(
  'alert_events',
  {
    id: id(),
    alertId: uuid('alert_id')
      .notNull()
      .references(() => alerts.id, { onDelete: 'cascade' }),
    type: alertEventType('type').notNull(),
    severity: alertSeverity('severity').notNull(),
    value: doublePrecision('value'),
    note: text('note'),
    actorId: uuid('actor_id').references(() => users.id, { onDelete: 'set null' }),
    at: timestamp('at', { withTimezone: true }).notNull(),
    /** Set once notifications for this event have been planned; a sweeper finds any left behind. */
    fannedOutAt: timestamp('fanned_out_at', { withTimezone: true }),
    ...timestamps,
  },
  (t) => [
    index('alert_events_alert_idx').on(t.alertId, t.at),
    index('alert_events_pending_idx')
      .on(t.createdAt)
      .where(sql`${t.fannedOutAt} is null`),
  ],
);

/** Evaluation memory per tank and rule (dwell counts, hysteresis), kept even when no alert is open. */
export const alertRuleStates = pgTable(
  'alert_rule_states',
  {
    tankId: uuid('tank_id')
      .notNull()
      .references(() => tanks.id, { onDelete: 'cascade' }),
    ruleKey: text('rule_key').notNull(),
    state: jsonb('state').notNull(),
    ...timestamps,
  },
  (t) => [primaryKey({ columns: [t.tankId, t.ruleKey] })],
);

export const notificationPreferences = pgTable('notification_preferences', {
  userId: uuid('user_id')
    .primaryKey()
    .references(() => users.id, { onDelete: 'cascade' }),
  preferences: jsonb('preferences').notNull(),
  ...timestamps,
});

/** One per browser and person (the endpoint identifies the browser's subscription). */
export const pushSubscriptions = pgTable(
  'push_subscriptions',
  {
    id: id(),
    userId: uuid('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    endpoint: text('endpoint').notNull(),
    p256dh: text('p256dh').notNull(),
    auth: text('auth').notNull(),
    userAgent: text('user_agent'),
    lastSuccessAt: timestamp('last_success_at', { withTimezone: true }),
    ...timestamps,
  },
  (t) => [
    uniqueIndex('push_subscriptions_endpoint_key').on(t.endpoint),
    index('push_subscriptions_user_idx').on(t.userId),
  ],
);

export const notificationChannel = pgEnum('notification_channel', notificationChannels);
export const deliveryStatus = pgEnum('delivery_status', ['pending', 'sent', 'gone', 'failed']);

/** The idempotency record: one row per (alert event, channel, destination), sent at most once. */
export const deliveries = pgTable(
  'deliveries',
  {
    id: id(),
    /**
     * What is being told (exactly one): an alert event, a published visit report, a care tip, a
     * conversation message (a push per message; the unread e-mail names the newest it covers) or a
     * change of an urgent visit request.
     */
    alertEventId: uuid('alert_event_id').references(() => alertEvents.id, { onDelete: 'cascade' }),
    visitId: uuid('visit_id').references(() => visits.id, { onDelete: 'cascade' }),
    tipId: uuid('tip_id').references(() => careTips.id, { onDelete: 'cascade' }),
    messageId: uuid('message_id').references(() => conversationMessages.id, { onDelete: 'cascade' }),
    urgentEventId: uuid('urgent_event_id').references(() => urgentRequestEvents.id, { onDelete: 'cascade' }),
    invoiceEventId: uuid('invoice_event_id').references(() => invoiceEvents.id, { onDelete: 'cascade' }),
    userId: uuid('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    channel: notificationChannel('channel').notNull(),
    destination: text('destination').notNull(),
    status: deliveryStatus('status').notNull().default('pending'),
    attempts: integer('attempts').notNull().default(0),
    lastError: text('last_error'),
    sentAt: timestamp('sent_at', { withTimezone: true }),
    ...timestamps,
  },
  (t) => [
    uniqueIndex('deliveries_once_key').on(t.alertEventId, t.channel, t.destination),
    uniqueIndex('deliveries_visit_once_key').on(t.visitId, t.channel, t.destination),
    uniqueIndex('deliveries_tip_once_key').on(t.tipId, t.channel, t.destination),
    uniqueIndex('deliveries_message_once_key').on(t.messageId, t.channel, t.destination),
    uniqueIndex('deliveries_urgent_once_key').on(t.urgentEventId, t.channel, t.destination),
    uniqueIndex('deliveries_invoice_once_key').on(t.invoiceEventId, t.channel, t.destination),
    check(
      'deliveries_one_subject',
      sql`num_nonnulls(${t.alertEventId}, ${t.visitId}, ${t.tipId}, ${t.messageId}, ${t.urgentEventId}, ${t.invoiceEventId}) = 1`,
    ),
    index('deliveries_status_idx').on(t.status, t.createdAt),
  ],
);

/** The in-app notification centre. */
export const notifications = pgTable(
  'notifications',
  {
    id: id(),
    userId: uuid('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    alertId: uuid('alert_id').references(() => alerts.id, { onDelete: 'cascade' }),
    alertEventId: uuid('alert_event_id').references(() => alertEvents.id, { onDelete: 'cascade' }),
    visitId: uuid('visit_id').references(() => visits.id, { onDelete: 'cascade' }),
    tipId: uuid('tip_id').references(() => careTips.id, { onDelete: 'cascade' }),
    /** One per person and conversation, brought back to unread by each new message. */
    conversationId: uuid('conversation_id').references(() => conversations.id, { onDelete: 'cascade' }),
    urgentEventId: uuid('urgent_event_id').references(() => urgentRequestEvents.id, { onDelete: 'cascade' }),
    invoiceEventId: uuid('invoice_event_id').references(() => invoiceEvents.id, { onDelete: 'cascade' }),
    severity: alertSeverity('severity').notNull(),
    title: text('title').notNull(),
    body: text('body').notNull(),
    link: text('link').notNull(),
    readAt: timestamp('read_at', { withTimezone: true }),
    ...timestamps,
  },
  (t) => [
    index('notifications_user_idx').on(t.userId, t.createdAt),
    uniqueIndex('notifications_once_key').on(t.userId, t.alertEventId),
    uniqueIndex('notifications_visit_once_key').on(t.userId, t.visitId),
    uniqueIndex('notifications_tip_once_key').on(t.userId, t.tipId),
    uniqueIndex('notifications_conversation_key').on(t.userId, t.conversationId),
    uniqueIndex('notifications_urgent_once_key').on(t.userId, t.urgentEventId),
    uniqueIndex('notifications_invoice_once_key').on(t.userId, t.invoiceEventId),
  ],
);

/** Who answers out of hours: critical alerts and urgent visit requests go to whoever is on call now. */
export const onCallShifts = pgTable(
  'on_call_shifts',
  {
    id: id(),
    companyId: uuid('company_id')
      .notNull()
      .references(() => companies.id, { onDelete: 'cascade' }),
    userId: uuid('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    startsAt: timestamp('starts_at', { withTimezone: true }).notNull(),
    endsAt: timestamp('ends_at', { withTimezone: true }).notNull(),
    ...timestamps,
  },
  (t) => [index('on_call_shifts_company_idx').on(t.companyId, t.startsAt)],
);
