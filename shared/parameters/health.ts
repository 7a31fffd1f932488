/*
 * Tank health from the latest reading of each parameter against its limits: the building blocks of
 * `judgeTank` (shared/tanks/status.ts), which adds the comfort range, open alerts and each device's
 * own reporting interval, and is the one rule every screen's status comes from:
 *
 * 1. A reading breaches a bound only when strictly beyond it (`value > critHigh`, `value < warnLow`);
 *    critical is checked before warning. A reading exactly on a bound is in range.
 * 2. A reading out of limits keeps its severity however old it is: bad news is not forgotten just
 *    because nothing newer has arrived (its alert also stays open until a reading says otherwise).
 * 3. An in-range reading is stale when `now − measuredAt > expectedIntervalMs(parameter, source)`;
 *    exactly at the interval it is still current. No reading at all is stale. A null interval
 *    (hand readings of a probe-only parameter such as ORP) never goes stale.
 * 4. Tank status, worst first: any critical → 'alert'; any warning → 'watch'; nothing tracked, or
 *    every parameter stale → 'no-data'; some stale and the rest in range → 'watch'; all in range
 *    → 'healthy'. "Healthy" is a claim about now, so it needs a current reading of everything the
 *    tank is watched for; a parameter gone quiet is worth a look but is not an alarm.
 */
import { z } from 'zod';
import type { ReadingSource } from '@shared/readings/sources';
import { parameterCatalogue } from './catalogue';
import { parameterKeys, type ParameterKey } from './keys';
import type { LimitDirection, LimitSeverity, ParameterLimits } from './limits';

export const parameterHealthValues = ['in-range', 'warning', 'critical', 'stale'] as const;
export const parameterHealthSchema = z.enum(parameterHealthValues);
export type ParameterHealth = z.infer<typeof parameterHealthSchema>;

export const tankStatusValues = ['healthy', 'watch', 'alert', 'no-data'] as const;
export const tankStatusSchema = z.enum(tankStatusValues);
export type TankStatus = z.infer<typeof tankStatusSchema>;

export interface LatestReading {
  readonly value: number;
  readonly measuredAt: Date;
  readonly source: ReadingSource;
}

export interface LimitBreach {
  readonly severity: LimitSeverity;
  readonly direction: LimitDirection;
  /** The bound crossed. */
  readonly limit: number;
}

/** Rule 1: the worst bound a value is strictly beyond, or null when it is within limits. */
export function limitBreach(value: number, limits: ParameterLimits | null): LimitBreach | null {
  if (limits === null) return null;
  const { warnLow, warnHigh, critLow, critHigh } = limits;
  if (critHigh !== null && value > critHigh)
    return { severity: 'critical', direction: 'high', limit: critHigh };
  if (critLow !== null && value < critLow) return { severity: 'critical', direction: 'low', limit: critLow };
  if (warnHigh !== null && value > warnHigh)
    return { severity: 'warning', direction: 'high', limit: warnHigh };
  if (warnLow !== null && value < warnLow) return { severity: 'warning', direction: 'low', limit: warnLow };
  return null;
}

/**
 * Per parameter: the interval after which a reading from a device, or from a person, counts as
 * stale. Devices report every few minutes; people test at the catalogue's home-test interval.
 */
export const expectedIntervalsMs: Readonly<
  Record<ParameterKey, { readonly device: number; readonly manual: number | null }>
> = Object.fromEntries(
  parameterKeys.map((key) => {
    const info = parameterCatalogue[key];
    return [key, { device: info.deviceStaleAfterMs, manual: info.homeTestIntervalMs }];
  }),
) as Record<ParameterKey, { device: number; manual: number | null }>;

export function expectedIntervalMs(parameter: ParameterKey, source: ReadingSource): number | null {
  const intervals = expectedIntervalsMs[parameter];
  return source === 'device' ? intervals.device : intervals.manual;
}

export function parameterHealth(
  latest: LatestReading | null,
  limits: ParameterLimits | null,
  expectedInterval: number | null,
  now: Date,
): ParameterHealth {
  if (latest === null) return 'stale';
  const breach = limitBreach(latest.value, limits);
  if (breach !== null) return breach.severity;
  const age = now.getTime() - latest.measuredAt.getTime();
  return expectedInterval !== null && age > expectedInterval ? 'stale' : 'in-range';
}

export function tankStatus(perParameter: readonly ParameterHealth[]): TankStatus {
  if (perParameter.includes('critical')) return 'alert';
  if (perParameter.includes('warning')) return 'watch';
  if (perParameter.every((health) => health === 'stale')) return 'no-data';
  return perParameter.includes('stale') ? 'watch' : 'healthy';
}
