import { asc } from 'drizzle-orm';
import type { Db } from '../db/client';
import { tanks } from '../db/schema/index';
import { findTankFor, visibleTanks } from '../policy/index';
import type { TankSummary } from '@shared/schemas/tanks';
import type { Actor } from './actors';

export function listTanks(db: Db, actor: Actor): Promise<TankSummary[]> {
  return db
    .select({ id: tanks.id, name: tanks.name, siteLabel: tanks.siteLabel })
    .from(tanks)
    .where(visibleTanks(db, actor))
    .orderBy(asc(tanks.name));
}

export async function getTank(db: Db, actor: Actor, tankId: string): Promise<TankSummary> {
  const tank = await findTankFor(db, actor, tankId, 'read');
  return { id: tank.id, name: tank.name, siteLabel: tank.siteLabel };
}
