import { and, asc, eq, gte, sql } from 'drizzle-orm';
import { addDays } from '@shared/schemas/equipment';
import { tankStyleWaterType } from '@shared/parameters/limit-templates';
import { demoPeople } from '../demo-people';
import type { ObjectStorage } from '../../lib/object-storage';
import type { Db } from '../../db/client';
import { evaluateNewReadings } from '../../services/alert-engine';
import { demoId, demoLivestockId, demoTankId } from './ids';
import { seedDemoReadings } from './readings';
import {
  alerts,
  companies,
  equipment,
  livestock,
  livestockStatusEvents,
  readings,
  tankMembers,
  tanks,
  users,
} from '../../db/schema/index';
import { seedDemoPhotos } from './photos';
import { seedDemoCareTips } from './care-tips';
import { seedDemoVisits } from './visits';
import { seedDemoBilling } from './billing';
import { seedDemoUrgent } from './urgent';
import { demoEquipment, demoLivestock, demoTanks } from './scenario';

export { demoTanks } from './scenario';

export { demoId, demoLivestockId, demoTankId } from './ids';

export const demoCompanies = [
  { slug: 'driftglass', name: 'Driftglass Aquatic Care', timeZone: 'Europe/London' },
  { slug: 'northpool', name: 'Northpool Aquaria', timeZone: 'Europe/Dublin' },
] as const;

export interface SeedOptions {
  issuer: string;
  /** Where the demo photos go; without it the scenario is written without photos. */
  storage?: ObjectStorage;
  /** The day the story is told from; dates in the scenario count back from it. */
  now?: Date;
  /**
   * Run the alert rules over the last two days of the story, so the demo opens with the
   * alerts its episodes would have raised. Off where a test wants a quiet alerts board.
   */
  raiseAlerts?: boolean;
}

/** Updates every column but the key on conflict, so a second run leaves each row as the first did. */
function excludedAll(columns: string[]) {
  return Object.fromEntries(columns.map((column) => [column, sql.raw(`excluded.${toSnake(column)}`)]));
}

function toSnake(name: string): string {
  return name.replace(/[A-Z]/g, (c) => `_${c.toLowerCase()}`);
}

/**
 * Writes the invented demo scenario. Idempotent: rows are keyed by natural keys (company slug,
 * identity) or by `demoId`, and updated in place, so running it twice changes nothing.
 */
export async function seedDemo(db: Db, options: SeedOptions): Promise<void> {
  const now = options.now ?? new Date();
  const today = now.toISOString().slice(0, 10);
  const daysAgo = (days: number) => addDays(today, -days);
  const momentDaysAgo = (days: number) => new Date(now.getTime() - days * 86_400_000);

  const { driftglass, userId } = await db.transaction(async (tx) => {
    const companyRows = await tx
      .insert(companies)
      .values([...demoCompanies])
      .onConflictDoUpdate({
        target: companies.slug,
        set: { name: sql`excluded.name`, timeZone: sql`excluded.time_zone` },
      })
      .returning({ id: companies.id, slug: companies.slug });
    const companyId = new Map(companyRows.map((row) => [row.slug, row.id]));

    const userRows = await tx
      .insert(users)
      .values(
        demoPeople.map((person) => ({
          companyId: companyId.get(person.company)!,
          issuer: options.issuer,
          subject: person.sub,
          email: person.email,
          name: person.name,
          role: person.role,
        })),
      )
      .onConflictDoUpdate({
        target: [users.issuer, users.subject],
        set: { email: sql`excluded.email`, name: sql`excluded.name`, role: sql`excluded.role` },
      })
      .returning({ id: users.id, subject: users.subject });
    const userId = new Map(userRows.map((row) => [row.subject, row.id]));
    const driftglass = companyId.get('driftglass')!;

    const tankRows = demoTanks.map((t) => ({
      id: demoTankId(t.key),
      companyId: driftglass,
      name: t.name,
      siteLabel: t.siteLabel,
      style: t.style,
      waterType: tankStyleWaterType[t.style],
      displayVolumeL: t.displayVolumeL,
      sumpVolumeL: t.sumpVolumeL,
      lengthCm: t.dimensionsCm.length,
      widthCm: t.dimensionsCm.width,
      heightCm: t.dimensionsCm.height,
      setUpOn: daysAgo(t.setUpDaysAgo),
      assignedTechnicianId: userId.get(t.technician)!,
      serviceIntervalDays: t.serviceIntervalDays,
      notes: t.notes,
    }));
    await tx
      .insert(tanks)
      .values(tankRows)
      .onConflictDoUpdate({
        target: tanks.id,
        set: excludedAll(Object.keys(tankRows[0]!).filter((k) => k !== 'id')),
      });
    await tx
      .insert(tankMembers)
      .values(
        demoTanks.flatMap((t) =>
          t.owners.map((sub) => ({ tankId: demoTankId(t.key), userId: userId.get(sub)! })),
        ),
      )
      .onConflictDoNothing();

    const equipmentRows = demoTanks.flatMap((t) =>
      demoEquipment[t.key].map((item) => ({
        id: demoId(`equipment:${t.key}:${item.key}`),
        companyId: driftglass,
        tankId: demoTankId(t.key),
        kind: item.kind,
        description: item.description,
        installedOn: item.installedDaysAgo === undefined ? null : daysAgo(item.installedDaysAgo),
        maintenanceIntervalDays: item.maintenanceIntervalDays ?? null,
        lastServicedOn: item.lastServicedDaysAgo === undefined ? null : daysAgo(item.lastServicedDaysAgo),
        powerBoard: item.powerBoard ?? null,
        outlet: item.outlet ?? null,
        notes: item.notes ?? null,
      })),
    );
    await tx
      .insert(equipment)
      .values(equipmentRows)
      .onConflictDoUpdate({
        target: equipment.id,
        set: excludedAll(Object.keys(equipmentRows[0]!).filter((k) => k !== 'id')),
      });

    const livestockRows = demoTanks.flatMap((t) =>
      demoLivestock[t.key].map((animal) => ({
        id: demoLivestockId(t.key, animal.key),
        companyId: driftglass,
        tankId: demoTankId(t.key),
        catalogueSpeciesId: animal.speciesId,
        nickname: animal.nickname ?? null,
        quantity: animal.quantity ?? 1,
        addedOn: daysAgo(animal.addedDaysAgo),
        source: animal.source ?? null,
        placement: animal.placement ?? null,
        status: animal.history.at(-1)!.status,
      })),
    );
    await tx
      .insert(livestock)
      .values(livestockRows)
      .onConflictDoUpdate({
        target: livestock.id,
        set: excludedAll(Object.keys(livestockRows[0]!).filter((k) => k !== 'id')),
      });

    const eventRows = demoTanks.flatMap((t) =>
      demoLivestock[t.key].flatMap((animal) =>
        animal.history.map((change, index) => ({
          id: demoId(`livestock-event:${t.key}:${animal.key}:${index}`),
          livestockId: demoLivestockId(t.key, animal.key),
          status: change.status,
          note: change.note,
          changedBy: userId.get(change.by)!,
          changedAt: momentDaysAgo(change.daysAgo),
        })),
      ),
    );
    await tx
      .insert(livestockStatusEvents)
      .values(eventRows)
      .onConflictDoUpdate({
        target: livestockStatusEvents.id,
        set: excludedAll(Object.keys(eventRows[0]!).filter((k) => k !== 'id')),
      });

    // A status someone recorded in the running demo is newer than the scenario's: it stays current.
    await tx.execute(sql`
      update livestock set status = latest.status
      from (
        select distinct on (livestock_id) livestock_id, status
        from livestock_status_events
        order by livestock_id, changed_at desc, created_at desc
      ) as latest
      where latest.livestock_id = livestock.id
        and livestock.id in (${sql.join(
          livestockRows.map((row) => sql`${row.id}::uuid`),
          sql`, `,
        )})`);

    return { driftglass, userId };
  });

  if (options.storage) {
    await seedDemoPhotos(db, options.storage, {
      companyId: driftglass,
      tankId: demoTankId,
      livestockId: demoLivestockId,
      photoId: (key) => demoId(`photo:${key}`),
      uploadedBy: userId.get('u-tomas')!,
    });
  }
  // A year of readings; it needs the tanks, owners and staff above, and skips itself once done.
  await seedDemoReadings(db, now);
  // The visit reports reuse the readings taken at visits, and take the anemone out before alerts are judged.
  await seedDemoVisits(db, { companyId: driftglass, people: userId, now });
  await seedDemoCareTips(db, { companyId: driftglass, people: userId, now });
  if (options.raiseAlerts !== false) await raiseDemoAlerts(db, driftglass, now);
  // After the alerts: the open request's snapshot lists the ones open now.
  await seedDemoUrgent(db, { companyId: driftglass, people: userId, now });
  // The price list and the invoices for visits already reported.
  await seedDemoBilling(db, { companyId: driftglass, people: userId, now });
}

/**
 * The demo's alerts come from its own readings, through the same engine as live ones. Their
 * notifications are planned by the server's sweep once it runs. Only on a company with none yet.
 */
async function raiseDemoAlerts(db: Db, companyId: string, now: Date) {
  const [existing] = await db
    .select({ id: alerts.id })
    .from(alerts)
    .where(eq(alerts.companyId, companyId))
    .limit(1);
  if (existing) return;
  const since = new Date(now.getTime() - 2 * 86_400_000);
  for (const tank of demoTanks) {
    const recent = await db
      .select({
        parameter: readings.parameter,
        value: readings.value,
        measuredAt: readings.measuredAt,
        source: readings.source,
      })
      .from(readings)
      .where(and(eq(readings.tankId, demoId(tank.key)), gte(readings.measuredAt, since)))
      .orderBy(asc(readings.measuredAt));
    await evaluateNewReadings(db, demoId(tank.key), recent);
  }
  // Only the latest word on each alert still open is news; the rest of the story is history.
  await db.execute(sql`
    update alert_events set fanned_out_at = ${now}
    where fanned_out_at is null and id not in (
      select distinct on (e.alert_id) e.id
      from alert_events e join alerts a on a.id = e.alert_id
      where a.status <> 'resolved' and a.company_id = ${companyId}
      order by e.alert_id, e.at desc)`);
}
