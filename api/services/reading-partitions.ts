import { sql } from 'drizzle-orm';
import type { AppDeps } from '../deps';

/** Months made ahead of today; readings cannot be dated further ahead than minutes. */
const monthsAhead = 3;

const partitionName = /^readings_y(\d{4})m(\d{2})$/;

/**
 * The daily upkeep of the monthly partitions of `readings` (drizzle/0020): the months ahead are
 * made, and with READINGS_DEVICE_RETENTION_MONTHS set, device readings of months wholly older than
 * that are deleted. People's readings (home tests, visits) are kept, and so are the hourly and
 * daily rollups: the delete runs on the month's own table, which fires none of the parent's
 * summary triggers. Returns what it did, for the log.
 */
export async function maintainReadingPartitions(deps: AppDeps): Promise<{ made: number; trimmed: number }> {
  const now = deps.clock();
  const ahead = new Date(now);
  ahead.setUTCMonth(ahead.getUTCMonth() + monthsAhead);
  const made = await deps.db.execute<{ made: number }>(
    sql`select ensure_reading_partitions(${now.toISOString()}::timestamptz, ${ahead.toISOString()}::timestamptz) as made`,
  );
  let trimmed = 0;
  const months = deps.env.READINGS_DEVICE_RETENTION_MONTHS;
  if (months !== undefined) {
    const cutoff = Date.UTC(now.getUTCFullYear(), now.getUTCMonth() - months, 1);
    const partitions = await deps.db.execute<{ name: string }>(sql`
      select c.relname as name from pg_inherits i
      join pg_class c on c.oid = i.inhrelid
      where i.inhparent = 'readings'::regclass`);
    for (const { name } of partitions.rows) {
      const match = partitionName.exec(name);
      if (!match) continue;
      const monthEnd = Date.UTC(Number(match[1]), Number(match[2]), 1);
      if (monthEnd > cutoff) continue;
      const deleted = await deps.db.execute(sql`delete from ${sql.identifier(name)} where source = 'device'`);
      trimmed += deleted.rowCount ?? 0;
    }
    const older = await deps.db.execute(
      sql`delete from readings_older where source = 'device' and measured_at < ${new Date(cutoff).toISOString()}::timestamptz`,
    );
    trimmed += older.rowCount ?? 0;
  }
  const result = { made: Number(made.rows[0]?.made ?? 0), trimmed };
  if (result.made > 0 || result.trimmed > 0) deps.logger.info(result, 'reading partitions maintained');
  return result;
}
