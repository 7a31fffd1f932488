import { and, eq, inArray, ne, sql } from 'drizzle-orm';
import type { AlertKind, AlertSeverity } from '@shared/alerts/kinds';
import type { ParameterKey } from '@shared/parameters/keys';
import type { Db } from '../db/client';
import { alertEvents, alerts } from '../db/schema/index';

export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];
export type AlertRow = typeof alerts.$inferSelect;

/** What a rule says about a problem at one moment; written onto the alert and into its event. */
export interface AlertChange {
  severity: AlertSeverity;
  title: string;
  body: string;
  value: number | null;
  limitValue: number | null;
  at: Date;
}

export interface NewAlert extends AlertChange {
  companyId: string;
  kind: AlertKind;
  /** The rule and its subject (`limit:ph`, `device-stale:<id>`): one open alert per tank and key. */
  ruleKey: string;
  parameter: ParameterKey | null;
  direction: string | null;
}

export interface Resolution {
  at: Date;
  /** The rule's latest word, when the rule itself closes the alert. */
  change?: AlertChange;
  /** The value that closed it, when it differs from the change's (or there is no change). */
  value?: number | null;
  actorId?: string | null;
  note?: string | null;
}

/**
 * Every change to a tank's alerts, each with its alert_events row (the outbox notifications are
 * planned from). Only `withTankAlerts` hands one out, so no alert changes outside the tank's lock.
 * Each write returns the new event's id; callers pass committed ids to `afterAlertEvents`.
 */
export interface TankAlertStore {
  /** The locked transaction, for the caller's own reads and writes that belong with the change. */
  readonly tx: Tx;
  readonly tankId: string;
  findOpen(ruleKey: string): Promise<AlertRow | null>;
  find(alertId: string): Promise<AlertRow | null>;
  /** Null when an alert for the same rule key is already open. */
  open(alert: NewAlert): Promise<string | null>;
  escalate(alert: AlertRow, change: AlertChange): Promise<string>;
  deEscalate(alert: AlertRow, change: AlertChange): Promise<string>;
  resolve(alert: AlertRow, resolution: Resolution): Promise<string>;
  acknowledge(alert: AlertRow, by: { actorId: string; note: string | null; at: Date }): Promise<string>;
}

/**
 * Runs `work` in one transaction holding the tank's advisory lock, so two writers (a reading
 * batch, a sweep, a person) can neither open the same alert twice nor close one another is changing.
 */
export function withTankAlerts<T>(
  db: Db,
  tankId: string,
  work: (store: TankAlertStore) => Promise<T>,
): Promise<T> {
  return withTanksAlerts(db, [tankId], (stores) => work(stores.of(tankId)));
}

/** The stores of several tanks in one locked transaction; see `withTanksAlerts`. */
export interface TankAlertStores {
  readonly tx: Tx;
  of(tankId: string): TankAlertStore;
}

/**
 * `withTankAlerts` for several tanks at once (the alert pass of a group of device batches): one
 * transaction takes every tank's lock, in the order of the lock keys so two such passes cannot
 * deadlock, and reads all their open alerts in one statement.
 */
export function withTanksAlerts<T>(
  db: Db,
  tankIds: readonly string[],
  work: (stores: TankAlertStores) => Promise<T>,
): Promise<T> {
  const ids = [...new Set(tankIds)];
  return db.transaction(async (tx) => {
    // Nothing but rule state written (a reading that changed no alert, the common case on every
    // device batch): that commit need not wait for the disk. A crash in the next moment loses at
    // most that state's last step, which only delays an alert by a reading; the readings themselves
    // are already durable. So the transaction starts without waiting (set with the locks, in the
    // same statement) and asks for a durable commit again as soon as it changes an alert.
    await tx.execute(sql`
      select set_config('synchronous_commit', 'off', true),
        (select count(pg_advisory_xact_lock(l.key)) from (
          select distinct hashtext(t.id) as key from unnest(${sql.param(ids)}::text[]) as t(id) order by key
        ) l)`);
    const open = new Map<string, AlertRow[]>(ids.map((id) => [id, []]));
    if (ids.length > 1) {
      // One tank's open alerts are read when a rule first asks (most single-tank work never does).
      const rows = await tx
        .select()
        .from(alerts)
        .where(and(inArray(alerts.tankId, ids), ne(alerts.status, 'resolved')))
        .for('update');
      for (const row of rows) open.get(row.tankId)!.push(row);
    }
    const stores = new Map(ids.map((id) => [id, storeFor(tx, id, ids.length > 1 ? open.get(id)! : null)]));
    const result = await work({
      tx,
      of(tankId) {
        const entry = stores.get(tankId);
        if (!entry) throw new Error(`tank ${tankId} is not locked by this alert pass`);
        return entry.store;
      },
    });
    if ([...stores.values()].some((entry) => entry.recordedEvents()))
      await tx.execute(sql`set local synchronous_commit = on`);
    return result;
  });
}

function storeFor(
  tx: Tx,
  tankId: string,
  /** The tank's open alerts, when already read and locked with other tanks'. */
  preloaded: AlertRow[] | null,
): { store: TankAlertStore; recordedEvents: () => boolean } {
  let events = 0;
  const record = async (
    alert: AlertRow,
    event: Omit<typeof alertEvents.$inferInsert, 'alertId' | 'id'>,
  ): Promise<string> => {
    const [row] = await tx
      .insert(alertEvents)
      .values({ ...event, alertId: alert.id })
      .returning({ id: alertEvents.id });
    events += 1;
    return row!.id;
  };

  /*
   * The tank's alerts not resolved, read once (locked) and kept up to date by the writes below:
   * every rule of a batch asks for its open alert, and under the tank's lock nobody else changes them.
   */
  let openByRule: Map<string, AlertRow> | null = preloaded
    ? new Map(preloaded.map((row) => [row.ruleKey, row]))
    : null;
  const openAlerts = async () => {
    openByRule ??= new Map(
      (
        await tx
          .select()
          .from(alerts)
          .where(and(eq(alerts.tankId, tankId), ne(alerts.status, 'resolved')))
          .for('update')
      ).map((row) => [row.ruleKey, row]),
    );
    return openByRule;
  };
  const remember = (alert: AlertRow, changes: Partial<AlertRow>) => {
    const known = openByRule?.get(alert.ruleKey);
    if (known?.id === alert.id) openByRule!.set(alert.ruleKey, { ...known, ...changes });
  };

  const change = async (alert: AlertRow, next: AlertChange, type: 'escalated' | 'de-escalated') => {
    await tx
      .update(alerts)
      .set({
        severity: next.severity,
        title: next.title,
        body: next.body,
        value: next.value,
        limitValue: next.limitValue,
        lastSeenAt: next.at,
      })
      .where(eq(alerts.id, alert.id));
    remember(alert, {
      severity: next.severity,
      title: next.title,
      body: next.body,
      value: next.value,
      limitValue: next.limitValue,
      lastSeenAt: next.at,
    });
    return record(alert, { type, severity: next.severity, value: next.value, at: next.at });
  };

  const findOpen = async (ruleKey: string) => (await openAlerts()).get(ruleKey) ?? null;

  const store: TankAlertStore = {
    tx,
    tankId,
    findOpen,

    find: (alertId) =>
      tx
        .select()
        .from(alerts)
        .where(and(eq(alerts.id, alertId), eq(alerts.tankId, tankId)))
        .for('update')
        .then((rows) => rows[0] ?? null),

    async open(alert) {
      if (await findOpen(alert.ruleKey)) return null;
      const [created] = await tx
        .insert(alerts)
        .values({
          companyId: alert.companyId,
          tankId,
          kind: alert.kind,
          ruleKey: alert.ruleKey,
          parameter: alert.parameter,
          severity: alert.severity,
          title: alert.title,
          body: alert.body,
          value: alert.value,
          limitValue: alert.limitValue,
          direction: alert.direction,
          openedAt: alert.at,
          lastSeenAt: alert.at,
        })
        .returning();
      (await openAlerts()).set(created!.ruleKey, created!);
      return record(created!, { type: 'opened', severity: alert.severity, value: alert.value, at: alert.at });
    },

    escalate: (alert, next) => change(alert, next, 'escalated'),
    deEscalate: (alert, next) => change(alert, next, 'de-escalated'),

    async resolve(alert, { at, change: last, value, actorId, note }) {
      await tx
        .update(alerts)
        .set({
          ...(last
            ? {
                severity: last.severity,
                title: last.title,
                body: last.body,
                value: last.value,
                limitValue: last.limitValue,
                lastSeenAt: last.at,
              }
            : {}),
          status: 'resolved',
          resolvedAt: at,
          ...(actorId ? { resolvedBy: actorId } : {}),
        })
        .where(eq(alerts.id, alert.id));
      if (openByRule?.get(alert.ruleKey)?.id === alert.id) openByRule.delete(alert.ruleKey);
      return record(alert, {
        type: 'resolved',
        severity: last?.severity ?? alert.severity,
        value: value !== undefined ? value : (last?.value ?? null),
        note: note ?? null,
        actorId: actorId ?? null,
        at,
      });
    },

    async acknowledge(alert, { actorId, note, at }) {
      await tx
        .update(alerts)
        .set({ status: 'acknowledged', acknowledgedAt: at, acknowledgedBy: actorId })
        .where(eq(alerts.id, alert.id));
      remember(alert, { status: 'acknowledged', acknowledgedAt: at, acknowledgedBy: actorId });
      // Acknowledging tells nobody new; it is recorded, and the board updates live.
      return record(alert, {
        type: 'acknowledged',
        severity: alert.severity,
        note,
        actorId,
        at,
        fannedOutAt: at,
      });
    },
  };
  return { store, recordedEvents: () => events > 0 };
}
