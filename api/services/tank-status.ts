import { sql } from 'drizzle-orm';
import type { TankStatus } from '@shared/parameters/health';
import type { Db } from '../db/client';
import { healthForTanks, type TankHealthSummary } from './tank-health';

/** Worst first: the order of the staff overview. */
export const statusRank: Readonly<Record<TankStatus, number>> = {
  alert: 0,
  watch: 1,
  'no-data': 2,
  healthy: 3,
};

/** How old a stored status may get before the minute sweep judges the tank again. */
export const statusRecheckMs = 5 * 60_000;
/** Tanks judged again per sweep: 2,000 tanks come round within the recheck period. */
const sweepBatch = 500;

/**
 * Judges these tanks now and stores what it found (`tank_status`); `since` moves only when the
 * status changes. Returns the health it judged, for a caller that shows it.
 */
export async function refreshTankStatus(
  db: Db,
  tankIds: readonly string[],
  now: Date,
): Promise<Map<string, TankHealthSummary>> {
  const health = await healthForTanks(db, [...new Set(tankIds)], now);
  if (health.size === 0) return health;
  const judged = [...health];
  await db.execute(sql`
    insert into tank_status as s (tank_id, company_id, status, rank, reason, since, judged_at)
    select j.tank_id, t.company_id, j.status, j.rank, j.reason, ${now.toISOString()}::timestamptz,
      ${now.toISOString()}::timestamptz
    from unnest(
      ${sql.param(judged.map(([id]) => id))}::uuid[],
      ${sql.param(judged.map(([, h]) => h.status))}::text[],
      ${sql.param(judged.map(([, h]) => statusRank[h.status]))}::int[],
      ${sql.param(judged.map(([, h]) => h.statusReason))}::text[]
    ) as j(tank_id, status, rank, reason)
    join tanks t on t.id = j.tank_id
    order by j.tank_id
    on conflict (tank_id) do update set
      status = excluded.status,
      rank = excluded.rank,
      reason = excluded.reason,
      since = case when s.status = excluded.status then s.since else excluded.since end,
      judged_at = excluded.judged_at`);
  return health;
}

/**
 * The minute sweep's share: tanks never judged, then those judged longest ago. A status can change
 * with time alone (a device falls silent, a home test comes due), and with a change of limits or
 * livestock; readings and alerts refresh it at once.
 */
export async function rejudgeStaleStatuses(db: Db, now: Date): Promise<number> {
  const due = await db.execute<{ id: string }>(sql`
    select t.id from tanks t
    left join tank_status s on s.tank_id = t.id
    where s.tank_id is null or s.judged_at < ${new Date(now.getTime() - statusRecheckMs).toISOString()}::timestamptz
    order by s.judged_at nulls first
    limit ${sweepBatch}`);
  const ids = due.rows.map((row) => row.id);
  await refreshTankStatus(db, ids, now);
  return ids.length;
}
