import { and, desc, eq, gte, ilike, lte, or, sql, type SQL } from 'drizzle-orm';
import type { AuditAction, AuditTargetKind } from '@shared/audit/actions';
import { csvLine, guardText } from '@shared/readings/csv';
import type {
  AuditEntry,
  AuditExportQuery,
  AuditFilters,
  AuditListQuery,
  AuditPage,
  AuditValues,
} from '@shared/schemas/audit';
import type { Db } from '../db/client';
import { auditEvents } from '../db/schema/index';
import type { Clock } from '../lib/clock';
import { findTankFor } from '../policy/index';
import type { Actor } from './actors';

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

/** When and from where a change came: the request facts every audit entry is stamped with. */
export interface AuditSource {
  at: Date;
  ip: string | null;
  userAgent: string | null;
  requestId: string | null;
}

/** The source of a request, from the route context (services never see the request itself). */
export function auditSourceOf(ctx: {
  deps: { clock: Clock };
  ip: string | null;
  userAgent: string | null;
  requestId: string;
}): AuditSource {
  return { at: ctx.deps.clock(), ip: ctx.ip, userAgent: ctx.userAgent, requestId: ctx.requestId };
}

/** For changes made outside a request (the demo scenario, tests calling a service directly). */
export const noRequest = (at: Date): AuditSource => ({ at, ip: null, userAgent: null, requestId: null });

/** Who did it, as they were called at the time. */
export type AuditActor = Pick<Actor, 'id' | 'name' | 'email'>;

export interface NewAuditEntry {
  companyId: string;
  actor: AuditActor | null;
  action: AuditAction;
  target?: { kind: AuditTargetKind; id: string; label: string };
  /** Settings as they were and became. */
  before?: AuditValues;
  after?: AuditValues;
  /** Anything else worth knowing later: a refusal's reason, an export's filters. */
  details?: AuditValues;
  source: AuditSource;
}

/**
 * Appends one entry. Given the transaction of the change it records, the entry and the change
 * commit together or not at all.
 */
export async function recordAudit(db: Db | Tx, entry: NewAuditEntry): Promise<void> {
  const { source } = entry;
  await db.insert(auditEvents).values({
    companyId: entry.companyId,
    actorId: entry.actor?.id ?? null,
    actorName: entry.actor?.name ?? null,
    actorEmail: entry.actor?.email ?? null,
    action: entry.action,
    targetKind: entry.target?.kind ?? null,
    targetId: entry.target?.id ?? null,
    targetLabel: entry.target?.label ?? null,
    at: source.at,
    ip: source.ip,
    userAgent: source.userAgent?.slice(0, 500) ?? null,
    requestId: source.requestId,
    before: entry.before ?? null,
    after: entry.after ?? null,
    details: entry.details ?? null,
  });
}

type AuditRow = typeof auditEvents.$inferSelect;

function present(row: AuditRow): AuditEntry {
  return {
    id: row.id,
    at: row.at.toISOString(),
    action: row.action,
    actor:
      row.actorName === null && row.actorId === null
        ? null
        : { id: row.actorId, name: row.actorName ?? row.actorEmail ?? 'Unknown', email: row.actorEmail },
    target:
      row.targetKind && row.targetId
        ? { kind: row.targetKind, id: row.targetId, label: row.targetLabel ?? row.targetId }
        : null,
    ip: row.ip,
    userAgent: row.userAgent,
    requestId: row.requestId,
    before: (row.before as AuditValues | null) ?? null,
    after: (row.after as AuditValues | null) ?? null,
    details: (row.details as AuditValues | null) ?? null,
  };
}

const cursorOf = (entry: AuditEntry) => `${entry.at}_${entry.id}`;

const likePattern = (text: string) => `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

/** The company's entries matching the filters; nobody sees another company's trail. */
function whereOf(actor: Actor, filters: AuditFilters, before?: string): SQL {
  const conditions: SQL[] = [eq(auditEvents.companyId, actor.companyId)];
  if (filters.action) conditions.push(eq(auditEvents.action, filters.action));
  if (filters.targetKind) conditions.push(eq(auditEvents.targetKind, filters.targetKind));
  if (filters.from) conditions.push(gte(auditEvents.at, new Date(filters.from)));
  if (filters.to) conditions.push(lte(auditEvents.at, new Date(filters.to)));
  if (filters.actor) {
    const pattern = likePattern(filters.actor);
    conditions.push(or(ilike(auditEvents.actorName, pattern), ilike(auditEvents.actorEmail, pattern))!);
  }
  if (before) {
    const split = before.lastIndexOf('_');
    const at = before.slice(0, split);
    const id = Number(before.slice(split + 1));
    conditions.push(sql`(${auditEvents.at}, ${auditEvents.id}) < (${at}::timestamptz, ${id}::bigint)`);
  }
  return and(...conditions)!;
}

async function auditPage(
  db: Db,
  actor: Actor,
  filters: AuditFilters,
  before: string | undefined,
  limit: number,
) {
  const rows = await db
    .select()
    .from(auditEvents)
    .where(whereOf(actor, filters, before))
    .orderBy(desc(auditEvents.at), desc(auditEvents.id))
    .limit(limit);
  return rows.map(present);
}

/** Newest first, by keyset on (at, id), so a page costs the same however long the trail. */
export async function listAudit(db: Db, actor: Actor, query: AuditListQuery): Promise<AuditPage> {
  const { before, limit, ...filters } = query;
  const rows = await auditPage(db, actor, filters, before, limit + 1);
  const entries = rows.slice(0, limit);
  return { entries, next: rows.length > limit ? cursorOf(entries.at(-1)!) : null };
}

export const auditCsvColumns = [
  'at',
  'action',
  'actor_name',
  'actor_email',
  'target_kind',
  'target_id',
  'target_label',
  'ip',
  'user_agent',
  'request_id',
  'before',
  'after',
  'details',
] as const;

const jsonCell = (value: AuditValues | null) => (value === null ? '' : guardText(JSON.stringify(value)));

function auditCsvLine(entry: AuditEntry): string {
  return csvLine([
    entry.at,
    entry.action,
    guardText(entry.actor?.name ?? ''),
    guardText(entry.actor?.email ?? ''),
    entry.target?.kind ?? '',
    entry.target?.id ?? '',
    guardText(entry.target?.label ?? ''),
    entry.ip ?? '',
    guardText(entry.userAgent ?? ''),
    entry.requestId ?? '',
    jsonCell(entry.before),
    jsonCell(entry.after),
    jsonCell(entry.details),
  ]);
}

/** The filtered trail as CSV, newest first, a page at a time while the caller writes it. */
export function exportAuditCsv(db: Db, actor: Actor, query: AuditExportQuery, now: Date) {
  async function* lines() {
    yield csvLine(auditCsvColumns);
    const pageSize = 1000;
    let before: string | undefined;
    for (;;) {
      const page = await auditPage(db, actor, query, before, pageSize);
      if (page.length > 0) yield page.map(auditCsvLine).join('');
      if (page.length < pageSize) break;
      before = cursorOf(page.at(-1)!);
    }
  }
  return { fileName: `audit-trail-${now.toISOString().slice(0, 10)}.csv`, lines: lines() };
}

/** A readings download, recorded once access and range have been checked and before a line is sent. */
export async function recordReadingsExport(
  db: Db,
  actor: Actor,
  tankId: string,
  filters: Record<string, string | undefined>,
  source: AuditSource,
): Promise<void> {
  const tank = await findTankFor(db, actor, tankId, 'read');
  const given = Object.fromEntries(Object.entries(filters).filter(([, value]) => value !== undefined));
  await recordAudit(db, {
    companyId: tank.companyId,
    actor,
    action: 'readings.exported',
    target: { kind: 'tank', id: tank.id, label: tank.name },
    details: { filters: given },
    source,
  });
}
