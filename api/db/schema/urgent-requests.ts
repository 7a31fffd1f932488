import {
  boolean,
  index,
  integer,
  jsonb,
  pgEnum,
  pgTable,
  primaryKey,
  text,
  timestamp,
  uuid,
} from 'drizzle-orm/pg-core';
import { urgentCategories } from '@shared/urgent/categories';
import { urgentStatuses } from '@shared/urgent/lifecycle';
import { urgentEventTypes } from '@shared/schemas/urgent-requests';
import { id, timestamps } from './columns';
import { companies } from './companies';
import { equipment } from './equipment';
import { photos, tanks } from './tanks';
import { users } from './users';
import { visits } from './visits';

export const urgentCategory = pgEnum('urgent_category', urgentCategories);
export const urgentStatus = pgEnum('urgent_status', urgentStatuses);
export const urgentEventType = pgEnum('urgent_event_type', urgentEventTypes);

export const urgentRequests = pgTable(
  'urgent_requests',
  {
    id: id(),
    companyId: uuid('company_id')
      .notNull()
      .references(() => companies.id, { onDelete: 'cascade' }),
    tankId: uuid('tank_id')
      .notNull()
      .references(() => tanks.id, { onDelete: 'cascade' }),
    requestedBy: uuid('requested_by').references(() => users.id, { onDelete: 'set null' }),
    requestedByName: text('requested_by_name').notNull(),
    category: urgentCategory('category').notNull(),
    equipmentId: uuid('equipment_id').references(() => equipment.id, { onDelete: 'set null' }),
    description: text('description').notNull(),
    someoneOnSite: boolean('someone_on_site').notNull(),
    access: text('access').notNull().default(''),
    phone: text('phone').notNull(),
    bestTime: text('best_time').notNull().default(''),
    status: urgentStatus('status').notNull().default('requested'),
    eta: timestamp('eta', { withTimezone: true }),
    technicianId: uuid('technician_id').references(() => users.id, { onDelete: 'set null' }),
    declineReason: text('decline_reason'),
    advice: text('advice'),
    visitId: uuid('visit_id').references(() => visits.id, { onDelete: 'set null' }),
    /** The fee shown to the owner when they sent it (the billing issue charges it). */
    callOutFeeCents: integer('call_out_fee_cents'),
    currency: text('currency').notNull().default('EUR'),
    /** shared/schemas/urgent-requests.ts urgentSnapshot: latest readings and open alerts when asked. */
    snapshot: jsonb('snapshot').notNull(),
    /** 0 none yet; 1 after the target passed unacknowledged; 2 after twice the target. */
    escalationLevel: integer('escalation_level').notNull().default(0),
    acknowledgedAt: timestamp('acknowledged_at', { withTimezone: true }),
    closedAt: timestamp('closed_at', { withTimezone: true }),
    ...timestamps,
  },
  (t) => [
    index('urgent_requests_board_idx').on(t.companyId, t.status, t.createdAt),
    index('urgent_requests_tank_idx').on(t.tankId, t.createdAt),
  ],
);

/** Every change of a request, in order: what the owner follows, the timeline shows and notifications tell. */
export const urgentRequestEvents = pgTable(
  'urgent_request_events',
  {
    id: id(),
    requestId: uuid('request_id')
      .notNull()
      .references(() => urgentRequests.id, { onDelete: 'cascade' }),
    type: urgentEventType('type').notNull(),
    actorId: uuid('actor_id').references(() => users.id, { onDelete: 'set null' }),
    actorName: text('actor_name'),
    note: text('note').notNull().default(''),
    eta: timestamp('eta', { withTimezone: true }),
    at: timestamp('at', { withTimezone: true }).notNull(),
    /** Set once its notifications were planned; the sweep finds any left behind. */
    fannedOutAt: timestamp('fanned_out_at', { withTimezone: true }),
    ...timestamps,
  },
  (t) => [index('urgent_request_events_request_idx').on(t.requestId, t.at)],
);

export const urgentRequestPhotos = pgTable(
  'urgent_request_photos',
  {
    requestId: uuid('request_id')
      .notNull()
      .references(() => urgentRequests.id, { onDelete: 'cascade' }),
    photoId: uuid('photo_id')
      .notNull()
      .references(() => photos.id, { onDelete: 'cascade' }),
    position: integer('position').notNull(),
  },
  (t) => [
    primaryKey({ columns: [t.requestId, t.photoId] }),
    index('urgent_request_photos_photo_idx').on(t.photoId),
  ],
);

/**
 * One row per company that changed its urgent-visit settings; none means the defaults. The call-out
 * fee is on the price list (billing_settings).
 */
export const urgentSettings = pgTable('urgent_settings', {
  companyId: uuid('company_id')
    .primaryKey()
    .references(() => companies.id, { onDelete: 'cascade' }),
  ackTargetMinutes: integer('ack_target_minutes').notNull().default(30),
  /** Partial record category → { steps, cautions }; a missing category keeps the default text. */
  firstAid: jsonb('first_aid').notNull().default({}),
  ...timestamps,
});
