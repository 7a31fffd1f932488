import { and, desc, eq, inArray } from 'drizzle-orm';
import { catalogueSource } from '@shared/livestock/catalogue';
import { parameterCatalogue, parametersFor } from '@shared/parameters/catalogue';
import { parameterKeys, type ParameterKey } from '@shared/parameters/keys';
import { limitTemplates, limitTemplatesSource } from '@shared/parameters/limit-templates';
import { limitsInForce } from '@shared/parameters/limits-in-force';
import {
  rateRuleInHours,
  type ParameterLimitsView,
  type TankLimitsView,
  type TankRateRule,
  type UpdateLimitsInput,
} from '@shared/schemas/limits';
import type { ParameterLimits } from '@shared/parameters/limits';
import type { LimitsInForce } from '@shared/schemas/readings';
import type { AppDeps } from '../deps';
import type { Db } from '../db/client';
import { readings, tankLimits, type tanks } from '../db/schema/index';
import { findTankFor } from '../policy/index';
import type { Actor } from './actors';
import { rejudgeAfterLimitsChange } from './alerts';
import { recordAudit, type AuditSource } from './audit';
import { tankComfortRange } from './livestock';

type TankRow = typeof tanks.$inferSelect;
type LimitRow = typeof tankLimits.$inferSelect;

const boundsOf = (row: LimitRow): ParameterLimits => ({
  warnLow: row.warnLow,
  warnHigh: row.warnHigh,
  critLow: row.critLow,
  critHigh: row.critHigh,
});

const unwatched: ParameterLimits = { warnLow: null, warnHigh: null, critLow: null, critHigh: null };

const sameBounds = (row: LimitRow, limits: ParameterLimits): boolean =>
  row.warnLow === limits.warnLow &&
  row.warnHigh === limits.warnHigh &&
  row.critLow === limits.critLow &&
  row.critHigh === limits.critHigh;

const rateOf = (row: LimitRow): TankRateRule | null =>
  row.rateMaxChange === null || row.ratePerHours === null
    ? null
    : { maxChange: row.rateMaxChange, perHours: row.ratePerHours };

/** A parameter's own row as the audit trail keeps it; null while it follows its style's template. */
const settingsOf = (row: LimitRow | undefined) => (row ? { ...boundsOf(row), rate: rateOf(row) } : null);

const defaultRateOf = (parameter: ParameterKey): TankRateRule | null => {
  const rule = parameterCatalogue[parameter].rateOfChange;
  return rule ? rateRuleInHours(rule) : null;
};

/** The limits in force for one parameter of a tank (see `limitsInForce`), or none. */
export async function parameterLimitsInForce(
  db: Db,
  tank: TankRow,
  parameter: ParameterKey,
): Promise<LimitsInForce> {
  const rows = await db
    .select()
    .from(tankLimits)
    .where(and(eq(tankLimits.tankId, tank.id), eq(tankLimits.parameter, parameter)));
  return limitsInForce(tank.style, rows)[parameter] ?? { limits: null, source: null };
}

export async function getLimits(db: Db, actor: Actor, tankId: string): Promise<TankLimitsView> {
  const tank = await findTankFor(db, actor, tankId, 'read');
  const [rows, comfort] = await Promise.all([
    db.select().from(tankLimits).where(eq(tankLimits.tankId, tank.id)),
    tankComfortRange(db, actor, tank.id),
  ]);
  const own = new Map(rows.map((row) => [row.parameter, row]));
  const template = limitTemplates[tank.style];
  const inForce = limitsInForce(tank.style, rows);
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
        limits: inForce[parameter]?.limits ?? null,
        source: inForce[parameter]?.source ?? null,
        template: fromTemplate,
        comfort: band
          ? {
              min: band.min,
              max: band.max,
              limitedBy: { low: named(band.limitedBy.low), high: named(band.limitedBy.high) },
            }
          : null,
        comfortConflict: comfort.conflicts.find((c) => c.parameter === parameter)?.message ?? null,
        rate: row ? rateOf(row) : null,
        defaultRate: defaultRateOf(parameter),
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

/**
 * One transaction. Limits set to null go back to the template, rates set to null go back to the
 * catalogue default; the others are replaced, and a parameter left out of either is unchanged.
 */
export async function updateLimits(
  deps: AppDeps,
  actor: Actor,
  tankId: string,
  input: UpdateLimitsInput,
  source: AuditSource,
): Promise<TankLimitsView> {
  const { db } = deps;
  const tank = await findTankFor(db, actor, tankId, 'write');
  const limits = input.limits ?? {};
  const rates = input.rates ?? {};
  const touched = [...new Set([...Object.keys(limits), ...Object.keys(rates)])] as ParameterKey[];
  const template = limitTemplates[tank.style];
  if (touched.length > 0) {
    await db.transaction(async (tx) => {
      const rows = await tx
        .select()
        .from(tankLimits)
        .where(and(eq(tankLimits.tankId, tank.id), inArray(tankLimits.parameter, touched)))
        .for('update');
      const own = new Map(rows.map((row) => [row.parameter, row]));
      for (const parameter of touched) {
        const row = own.get(parameter);
        const given = limits[parameter];
        const givenRate = rates[parameter];
        const templateBounds = template[parameter] ?? unwatched;
        const rate = givenRate !== undefined ? givenRate : row ? rateOf(row) : null;
        // null: the parameter follows its style's template.
        let bounds: ParameterLimits | null;
        if (given !== undefined) bounds = given;
        else if (!row) bounds = null;
        // Clearing a rate rule also drops the copy of the template it was kept with (see below).
        else if (givenRate === null && sameBounds(row, templateBounds)) bounds = null;
        else bounds = boundsOf(row);
        if (bounds === null && rate === null) {
          if (row) {
            await tx
              .delete(tankLimits)
              .where(and(eq(tankLimits.tankId, tank.id), eq(tankLimits.parameter, parameter)));
          }
          continue;
        }
        // Tank health, history and the alert engine read any row's bounds as the tank's own, so a
        // rate rule on a parameter that follows its template is kept with a copy of the template.
        const values = {
          ...(bounds ?? templateBounds),
          rateMaxChange: rate?.maxChange ?? null,
          ratePerHours: rate?.perHours ?? null,
          updatedBy: actor.id,
        };
        await tx
          .insert(tankLimits)
          .values({ ...values, tankId: tank.id, parameter })
          .onConflictDoUpdate({
            target: [tankLimits.tankId, tankLimits.parameter],
            set: { ...values, updatedAt: new Date() },
          });
      }
      const after = await tx
        .select()
        .from(tankLimits)
        .where(and(eq(tankLimits.tankId, tank.id), inArray(tankLimits.parameter, touched)));
      const saved = new Map(after.map((row) => [row.parameter, row]));
      await recordAudit(tx, {
        companyId: tank.companyId,
        actor,
        action: 'limits.changed',
        target: { kind: 'tank', id: tank.id, label: tank.name },
        before: Object.fromEntries(touched.map((p) => [p, settingsOf(own.get(p))])),
        after: Object.fromEntries(touched.map((p) => [p, settingsOf(saved.get(p))])),
        source,
      });
    });
    // New limits apply at once: the latest readings are judged again, so an alert the old limits
    // opened closes (or one the new limits call for opens) without waiting for the next reading.
    const latest = await db
      .selectDistinctOn([readings.parameter], {
        parameter: readings.parameter,
        value: readings.value,
        measuredAt: readings.measuredAt,
        source: readings.source,
      })
      .from(readings)
      .where(and(eq(readings.tankId, tank.id), inArray(readings.parameter, touched)))
      .orderBy(readings.parameter, desc(readings.measuredAt));
    await rejudgeAfterLimitsChange(deps, tank.id, latest);
  }
  return getLimits(db, actor, tank.id);
}
