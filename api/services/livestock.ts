import { and, asc, desc, eq, inArray } from 'drizzle-orm';
import { comfortRange, type ComfortRange } from '@shared/livestock/comfort-range';
import { parametersFor } from '@shared/parameters/catalogue';
import {
  checkCompatibility,
  type CompatibilityWarning,
  type Inhabitant,
} from '@shared/livestock/compatibility';
import type {
  addLivestockInput,
  LivestockItem,
  SpeciesEntry,
  StatusEvent,
  updateLivestockInput,
} from '@shared/schemas/livestock';
import { presentStatuses } from '@shared/schemas/livestock-status';
import type { z } from 'zod';
import type { Db } from '../db/client';
import { livestock, livestockStatusEvents, photos, users, type tanks } from '../db/schema/index';
import { notFound } from '../lib/http-error';
import { findTankFor } from '../policy/index';
import type { Actor } from './actors';
import { companySpeciesId, companySpeciesRowId, resolveSpecies } from './species';
import { invalidFields, photoRefOf } from './tanks';

type AddLivestock = z.output<typeof addLivestockInput>;
type UpdateLivestock = z.output<typeof updateLivestockInput>;
type LivestockRow = typeof livestock.$inferSelect;
type TankRow = typeof tanks.$inferSelect;

function speciesIdOf(row: LivestockRow): string {
  return row.catalogueSpeciesId ?? companySpeciesId(row.companySpeciesId!);
}

async function describe(db: Db, companyId: string, rows: LivestockRow[]): Promise<LivestockItem[]> {
  if (rows.length === 0) return [];
  const ids = rows.map((row) => row.id);
  const [speciesById, events, photoRows] = await Promise.all([
    resolveSpecies(db, companyId, rows.map(speciesIdOf)),
    db
      .select({ event: livestockStatusEvents, changedByName: users.name })
      .from(livestockStatusEvents)
      .leftJoin(users, eq(users.id, livestockStatusEvents.changedBy))
      .where(inArray(livestockStatusEvents.livestockId, ids))
      .orderBy(desc(livestockStatusEvents.changedAt), desc(livestockStatusEvents.createdAt)),
    db
      .select()
      .from(photos)
      .where(inArray(photos.livestockId, ids))
      .orderBy(asc(photos.createdAt), asc(photos.id)),
  ]);
  return rows.map((row) => ({
    id: row.id,
    tankId: row.tankId,
    species: speciesById.get(speciesIdOf(row))!,
    nickname: row.nickname,
    quantity: row.quantity,
    addedOn: row.addedOn,
    source: row.source,
    placement: row.placement,
    status: row.status,
    history: events
      .filter(({ event }) => event.livestockId === row.id)
      .map(({ event, changedByName }): StatusEvent => ({
        id: event.id,
        status: event.status,
        note: event.note,
        changedAt: event.changedAt.toISOString(),
        changedBy: event.changedBy && changedByName ? { id: event.changedBy, name: changedByName } : null,
      })),
    photos: photoRows.filter((photo) => photo.livestockId === row.id).map(photoRefOf),
  }));
}

const presentFirst = (a: LivestockItem, b: LivestockItem) =>
  Number(!presentStatuses.includes(a.status)) - Number(!presentStatuses.includes(b.status)) ||
  a.species.commonName.localeCompare(b.species.commonName, 'en') ||
  a.id.localeCompare(b.id);

export async function listLivestock(db: Db, actor: Actor, tankId: string): Promise<LivestockItem[]> {
  const tank = await findTankFor(db, actor, tankId, 'read');
  const rows = await db.select().from(livestock).where(eq(livestock.tankId, tank.id));
  return (await describe(db, tank.companyId, rows)).sort(presentFirst);
}

export async function findLivestockIn(db: Db, tank: TankRow, livestockId: string): Promise<LivestockRow> {
  const [row] = await db
    .select()
    .from(livestock)
    .where(and(eq(livestock.id, livestockId), eq(livestock.tankId, tank.id)));
  if (!row) throw notFound('livestock');
  return row;
}

export async function getLivestock(db: Db, actor: Actor, tankId: string, livestockId: string) {
  const tank = await findTankFor(db, actor, tankId, 'read');
  const [item] = await describe(db, tank.companyId, [await findLivestockIn(db, tank, livestockId)]);
  return item!;
}

/** What lives in the tank now, with species resolved; removed and dead animals are left out. */
async function presentInhabitants(
  db: Db,
  tank: TankRow,
): Promise<{ row: LivestockRow; species: SpeciesEntry }[]> {
  const rows = await db
    .select()
    .from(livestock)
    .where(and(eq(livestock.tankId, tank.id), inArray(livestock.status, [...presentStatuses])))
    .orderBy(asc(livestock.createdAt), asc(livestock.id));
  const speciesById = await resolveSpecies(db, tank.companyId, rows.map(speciesIdOf));
  return rows.flatMap((row) => {
    const species = speciesById.get(speciesIdOf(row));
    return species ? [{ row, species }] : [];
  });
}

export interface CompatibilityResult {
  species: SpeciesEntry;
  warnings: CompatibilityWarning[];
}

export async function compatibilityFor(
  db: Db,
  tank: TankRow,
  speciesId: string,
): Promise<CompatibilityResult> {
  const candidate = (await resolveSpecies(db, tank.companyId, [speciesId])).get(speciesId);
  if (!candidate) {
    throw invalidFields([
      { path: 'body.speciesId', message: 'choose a species from the catalogue or your own' },
    ]);
  }
  const inhabitants: Inhabitant[] = (await presentInhabitants(db, tank)).map(({ row, species }) => ({
    species,
    quantity: row.quantity,
    ...(row.nickname ? { nickname: row.nickname } : {}),
  }));
  return {
    species: candidate,
    warnings: checkCompatibility(candidate, inhabitants, { waterType: tank.waterType }),
  };
}

export async function checkLivestock(
  db: Db,
  actor: Actor,
  tankId: string,
  input: AddLivestock,
): Promise<CompatibilityResult> {
  const tank = await findTankFor(db, actor, tankId, 'write');
  return compatibilityFor(db, tank, input.speciesId);
}

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

/** Writes an animal and its first status event inside the caller's transaction. */
export async function insertLivestock(
  tx: Tx,
  tank: TankRow,
  check: CompatibilityResult,
  input: Pick<AddLivestock, 'nickname' | 'quantity' | 'addedOn' | 'source' | 'placement' | 'status' | 'note'>,
  actor: Actor,
  now: Date,
): Promise<LivestockRow> {
  const fromCompany = check.species.source === 'company';
  const [created] = await tx
    .insert(livestock)
    .values({
      companyId: tank.companyId,
      tankId: tank.id,
      catalogueSpeciesId: fromCompany ? null : check.species.id,
      companySpeciesId: fromCompany ? companySpeciesRowId(check.species.id) : null,
      nickname: input.nickname ?? null,
      quantity: input.quantity,
      addedOn: input.addedOn ?? null,
      source: input.source ?? null,
      placement: input.placement ?? null,
      status: input.status,
    })
    .returning();
  await tx.insert(livestockStatusEvents).values({
    livestockId: created!.id,
    status: input.status,
    note:
      input.note ??
      (check.warnings.length > 0 ? 'Added with compatibility warnings acknowledged.' : 'Added to the tank.'),
    changedBy: actor.id,
    changedAt: now,
  });
  return created!;
}

/**
 * Records a status change in the animal's history and sets its status to the newest one (a change
 * written up later may be older than one already recorded), inside the caller's transaction.
 */
export async function recordLivestockStatus(
  tx: Tx,
  livestockId: string,
  change: { status: LivestockRow['status']; note: string | null; changedAt: Date },
  actor: Actor,
): Promise<void> {
  await tx.insert(livestockStatusEvents).values({
    livestockId,
    status: change.status,
    note: change.note,
    changedBy: actor.id,
    changedAt: change.changedAt,
  });
  const [latest] = await tx
    .select({ status: livestockStatusEvents.status })
    .from(livestockStatusEvents)
    .where(eq(livestockStatusEvents.livestockId, livestockId))
    .orderBy(desc(livestockStatusEvents.changedAt), desc(livestockStatusEvents.createdAt))
    .limit(1);
  await tx.update(livestock).set({ status: latest!.status }).where(eq(livestock.id, livestockId));
}

export type AddLivestockResult = { added: LivestockItem } | { blocked: CompatibilityResult };

/**
 * Adds an animal after checking it against the tank's inhabitants. With warnings it is added
 * only when the person has acknowledged them; otherwise the warnings come back unsaved.
 */
export async function addLivestock(
  db: Db,
  actor: Actor,
  tankId: string,
  input: AddLivestock,
  now: Date,
): Promise<AddLivestockResult> {
  const tank = await findTankFor(db, actor, tankId, 'write');
  const check = await compatibilityFor(db, tank, input.speciesId);
  if (check.warnings.length > 0 && !input.acknowledgeWarnings) return { blocked: check };

  const row = await db.transaction((tx) => insertLivestock(tx, tank, check, input, actor, now));
  const [item] = await describe(db, tank.companyId, [row]);
  return { added: item! };
}

export async function updateLivestock(
  db: Db,
  actor: Actor,
  tankId: string,
  livestockId: string,
  input: UpdateLivestock,
  now: Date,
): Promise<LivestockItem> {
  const tank = await findTankFor(db, actor, tankId, 'write');
  const existing = await findLivestockIn(db, tank, livestockId);
  const changedAt = input.statusChangedAt ? new Date(input.statusChangedAt) : now;
  if (changedAt.getTime() > now.getTime()) {
    throw invalidFields([{ path: 'body.statusChangedAt', message: 'cannot be in the future' }]);
  }
  const recordsStatus =
    input.status !== undefined && (input.status !== existing.status || Boolean(input.statusNote));

  await db.transaction(async (tx) => {
    const fields = {
      ...(input.nickname !== undefined && { nickname: input.nickname }),
      ...(input.quantity !== undefined && { quantity: input.quantity }),
      ...(input.addedOn !== undefined && { addedOn: input.addedOn }),
      ...(input.source !== undefined && { source: input.source }),
      ...(input.placement !== undefined && { placement: input.placement }),
    };
    if (Object.keys(fields).length > 0) {
      await tx.update(livestock).set(fields).where(eq(livestock.id, existing.id));
    }
    if (recordsStatus) {
      await recordLivestockStatus(
        tx,
        existing.id,
        { status: input.status!, note: input.statusNote ?? null, changedAt },
        actor,
      );
    }
  });
  const [item] = await describe(db, tank.companyId, [await findLivestockIn(db, tank, livestockId)]);
  return item!;
}

/**
 * For an entry made by mistake; an animal that left the tank gets the status "removed" instead,
 * which keeps its history. Returns the storage keys of its photos, whose rows go with it.
 */
export async function deleteLivestock(
  db: Db,
  actor: Actor,
  tankId: string,
  livestockId: string,
): Promise<string[]> {
  const tank = await findTankFor(db, actor, tankId, 'write');
  const existing = await findLivestockIn(db, tank, livestockId);
  const keys = await db
    .select({ objectKey: photos.objectKey, thumbnailKey: photos.thumbnailKey })
    .from(photos)
    .where(eq(photos.livestockId, existing.id));
  await db.delete(livestock).where(eq(livestock.id, existing.id));
  return keys.flatMap((key) => [key.objectKey, key.thumbnailKey]);
}

export interface TankComfortRange extends ComfortRange {
  /** The species it was worked out from, so ids in `limitedBy` can be named. */
  species: { id: string; commonName: string; scientificName: string }[];
}

export async function tankComfortRange(db: Db, actor: Actor, tankId: string): Promise<TankComfortRange> {
  const tank = await findTankFor(db, actor, tankId, 'read');
  const present = (await presentInhabitants(db, tank)).map(({ species }) => species);
  const distinct = [...new Map(present.map((entry) => [entry.id, entry])).values()];
  return {
    ...comfortRange(distinct, parametersFor(tank.waterType)),
    species: distinct.map(({ id, commonName, scientificName }) => ({ id, commonName, scientificName })),
  };
}
