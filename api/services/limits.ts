import { and, eq, inArray } from 'drizzle-orm';
import { catalogueSource } from '@shared/livestock/catalogue';
import { parametersFor } from '@shared/parameters/catalogue';
import { parameterKeys, type ParameterKey } from '@shared/parameters/keys';
import { limitTemplates, limitTemplatesSource } from '@shared/parameters/limit-templates';
import type {
  ParameterLimits,
  ParameterLimitsView,
  TankLimitsView,
  UpdateLimitsInput,
} from '@shared/schemas/limits';
import type { LimitsInForce } from '@shared/schemas/readings';
import type { Db } from '../db/client';
import { tankLimits, type tanks } from '../db/schema/index';
import { findTankFor } from '../policy/index';
import type { Actor } from './actors';
import { tankComfortRange } from './livestock';

type TankRow = typeof tanks.$inferSelect;
type LimitRow = typeof tankLimits.$inferSelect;

const boundsOf = (row: LimitRow): ParameterLimits => ({
  warnLow: row.warnLow,
  warnHigh: row.warnHigh,
  critLow: row.critLow,
  critHigh: row.critHigh,
});

/** The tank's own limits for a parameter, else its style's template, else none. */
export async function limitsInForce(db: Db, tank: TankRow, parameter: ParameterKey): Promise<LimitsInForce> {
  const [row] = await db
    .select()
    .from(tankLimits)
    .where(and(eq(tankLimits.tankId, tank.id), eq(tankLimits.parameter, parameter)));
  if (row) return { limits: boundsOf(row), source: 'tank' };
  const template = limitTemplates[tank.style][parameter];
  return template ? { limits: template, source: 'template' } : { limits: null, source: null };
}

export async function getLimits(db: Db, actor: Actor, tankId: string): Promise<TankLimitsView> {
  const tank = await findTankFor(db, actor, tankId, 'read');
  const [rows, comfort] = await Promise.all([
    db.select().from(tankLimits).where(eq(tankLimits.tankId, tank.id)),
    tankComfortRange(db, actor, tank.id),
  ]);
  const own = new Map(rows.map((row) => [row.parameter, row]));
  const template = limitTemplates[tank.style];
  const names = new Map(comfort.species.map((s) => [s.id, s.commonName]));
  const named = (ids: string[]) => ids.map((id) => names.get(id) ?? id);
  // The water type's parameters, plus any the tank has limits for anyway.
  const shown = new Set<ParameterKey>([...parametersFor(tank.waterType), ...own.keys()]);
  const parameters = parameterKeys
    .filter((key) => shown.has(key))
    .map((parameter): ParameterLimitsView => {
      const row = own.get(parameter);
      const fromTemplate = template[parameter] ?? null;
      const band = comfort.ranges[parameter];
      return {
        parameter,
        limits: row ? boundsOf(row) : fromTemplate,
        source: row ? 'tank' : fromTemplate ? 'template' : null,
        template: fromTemplate,
        comfort: band
          ? {
              min: band.min,
              max: band.max,
              limitedBy: { low: named(band.limitedBy.low), high: named(band.limitedBy.high) },
            }
          : null,
        comfortConflict: comfort.conflicts.find((c) => c.parameter === parameter)?.message ?? null,
        updatedAt: row?.updatedAt.toISOString() ?? null,
      };
    });
  return {
    style: tank.style,
    templateSource: limitTemplatesSource,
    comfortSource: catalogueSource,
    inhabitants: comfort.species.length,
    parameters,
  };
}

/** One transaction: a parameter set to null goes back to the template, the others are replaced. */
export async function updateLimits(
  db: Db,
  actor: Actor,
  tankId: string,
  input: UpdateLimitsInput,
): Promise<TankLimitsView> {
  const tank = await findTankFor(db, actor, tankId, 'write');
  const entries = Object.entries(input.limits) as [ParameterKey, ParameterLimits | null][];
  const cleared = entries.filter(([, limits]) => limits === null).map(([parameter]) => parameter);
  const set = entries.flatMap(([parameter, limits]) => (limits ? [{ parameter, ...limits }] : []));
  await db.transaction(async (tx) => {
    if (cleared.length > 0) {
      await tx
        .delete(tankLimits)
        .where(and(eq(tankLimits.tankId, tank.id), inArray(tankLimits.parameter, cleared)));
    }
    for (const limits of set) {
      const values = { ...limits, tankId: tank.id, updatedBy: actor.id };
      await tx
        .insert(tankLimits)
        .values(values)
        .onConflictDoUpdate({
          target: [tankLimits.tankId, tankLimits.parameter],
          set: {
            warnLow: limits.warnLow,
            warnHigh: limits.warnHigh,
            critLow: limits.critLow,
            critHigh: limits.critHigh,
            updatedBy: actor.id,
            updatedAt: new Date(),
          },
        });
    }
  });
  return getLimits(db, actor, tank.id);
}
