import { and, asc, eq } from 'drizzle-orm';
import {
  compareOutlets,
  equipmentIssues,
  maintenanceDueOn,
  type EquipmentItem,
  type equipmentInput,
  type equipmentPatch,
} from '@shared/schemas/equipment';
import type { z } from 'zod';
import type { Db } from '../db/client';
import { equipment } from '../db/schema/index';
import { notFound } from '../lib/http-error';
import { findTankFor } from '../policy/index';
import type { Actor } from './actors';
import { invalidFields } from './tanks';

type EquipmentRow = typeof equipment.$inferSelect;

function itemOf(row: EquipmentRow): EquipmentItem {
  return {
    id: row.id,
    tankId: row.tankId,
    kind: row.kind,
    description: row.description,
    installedOn: row.installedOn,
    maintenanceIntervalDays: row.maintenanceIntervalDays,
    lastServicedOn: row.lastServicedOn,
    maintenanceDueOn: maintenanceDueOn(row),
    powerBoard: row.powerBoard,
    outlet: row.outlet,
    notes: row.notes,
  };
}

/** Board by board, outlet by outlet, so the list reads like the labels under the cabinet. */
function byBoardAndOutlet(a: EquipmentItem, b: EquipmentItem): number {
  if ((a.powerBoard === null) !== (b.powerBoard === null)) return a.powerBoard === null ? 1 : -1;
  return (
    compareOutlets(a.powerBoard, b.powerBoard) ||
    compareOutlets(a.outlet, b.outlet) ||
    a.description.localeCompare(b.description, 'en')
  );
}

export async function listEquipment(db: Db, actor: Actor, tankId: string): Promise<EquipmentItem[]> {
  const tank = await findTankFor(db, actor, tankId, 'read');
  const rows = await db
    .select()
    .from(equipment)
    .where(eq(equipment.tankId, tank.id))
    .orderBy(asc(equipment.id));
  return rows.map(itemOf).sort(byBoardAndOutlet);
}

async function findEquipmentIn(db: Db, tankId: string, equipmentId: string): Promise<EquipmentRow> {
  const [row] = await db
    .select()
    .from(equipment)
    .where(and(eq(equipment.id, equipmentId), eq(equipment.tankId, tankId)));
  if (!row) throw notFound('equipment');
  return row;
}

export async function getEquipment(db: Db, actor: Actor, tankId: string, equipmentId: string) {
  const tank = await findTankFor(db, actor, tankId, 'read');
  return itemOf(await findEquipmentIn(db, tank.id, equipmentId));
}

export async function createEquipment(
  db: Db,
  actor: Actor,
  tankId: string,
  input: z.output<typeof equipmentInput>,
): Promise<EquipmentItem> {
  const tank = await findTankFor(db, actor, tankId, 'write');
  const [row] = await db
    .insert(equipment)
    .values({
      companyId: tank.companyId,
      tankId: tank.id,
      kind: input.kind,
      description: input.description,
      installedOn: input.installedOn ?? null,
      maintenanceIntervalDays: input.maintenanceIntervalDays ?? null,
      lastServicedOn: input.lastServicedOn ?? null,
      powerBoard: input.powerBoard ?? null,
      outlet: input.outlet ?? null,
      notes: input.notes ?? null,
    })
    .returning();
  return itemOf(row!);
}

export async function updateEquipment(
  db: Db,
  actor: Actor,
  tankId: string,
  equipmentId: string,
  input: z.output<typeof equipmentPatch>,
): Promise<EquipmentItem> {
  const tank = await findTankFor(db, actor, tankId, 'write');
  const existing = await findEquipmentIn(db, tank.id, equipmentId);
  const changes = Object.fromEntries(Object.entries(input).filter(([, value]) => value !== undefined));
  // Rules across fields hold for the row as it will be, not only for the fields sent.
  const issues = equipmentIssues({ ...existing, ...changes });
  if (issues.length > 0) {
    throw invalidFields(issues.map((issue) => ({ path: `body.${issue.path}`, message: issue.message })));
  }
  if (Object.keys(changes).length === 0) return itemOf(existing);
  const [row] = await db.update(equipment).set(changes).where(eq(equipment.id, existing.id)).returning();
  return itemOf(row!);
}

export async function deleteEquipment(
  db: Db,
  actor: Actor,
  tankId: string,
  equipmentId: string,
): Promise<void> {
  const tank = await findTankFor(db, actor, tankId, 'write');
  const existing = await findEquipmentIn(db, tank.id, equipmentId);
  await db.delete(equipment).where(eq(equipment.id, existing.id));
}
