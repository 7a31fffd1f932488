import { bigint, index, inet, jsonb, pgEnum, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { auditActions, auditTargetKinds } from '@shared/audit/actions';
import { companies } from './companies';

export const auditAction = pgEnum('audit_action', auditActions);
export const auditTargetKind = pgEnum('audit_target_kind', auditTargetKinds);

/**
 * The audit trail. Append-only: a trigger (migration 0010) refuses UPDATE, DELETE and TRUNCATE,
 * except the retention purge's DELETE. So a row refers to no person or target by foreign key (a
 * cascade or "set null" would be an update): it keeps copies of the names it shows, and outlives
 * them. For the same reason it has no `updated_at`.
 */
export const auditEvents = pgTable(
  'audit_events',
  {
    id: bigint('id', { mode: 'number' }).primaryKey().generatedAlwaysAsIdentity(),
    companyId: uuid('company_id')
      .notNull()
      .references(() => companies.id, { onDelete: 'restrict' }),
    actorId: uuid('actor_id'),
    actorName: text('actor_name'),
    actorEmail: text('actor_email'),
    action: auditAction('action').notNull(),
    targetKind: auditTargetKind('target_kind'),
    targetId: text('target_id'),
    targetLabel: text('target_label'),
    at: timestamp('at', { withTimezone: true }).notNull(),
    ip: inet('ip'),
    userAgent: text('user_agent'),
    requestId: text('request_id'),
    before: jsonb('before'),
    after: jsonb('after'),
    details: jsonb('details'),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('audit_events_company_idx').on(t.companyId, t.at.desc(), t.id.desc()),
    index('audit_events_action_idx').on(t.companyId, t.action, t.at.desc()),
    index('audit_events_at_idx').on(t.at),
  ],
);
