/*
 * A year of invented water history for the demo tanks: a device on two of them, visits every
 * two weeks, home tests by the owners, and three stories worth finding on the charts —
 * a heater failing at the dental waiting room, salinity creeping up from evaporation in the
 * restaurant lagoon (still going on: that tank is on watch), and an alkalinity swing in the
 * living-room reef after its doser ran dry and was then over-corrected.
 */
import { and, eq, inArray, ne, sql } from 'drizzle-orm';
import { dayMs, hourMs, minuteMs, parameterCatalogue } from '@shared/parameters/catalogue';
import { parameterKeys, type ParameterKey } from '@shared/parameters/keys';
import { limitTemplates, type TankStyle } from '@shared/parameters/limit-templates';
import { limitsInForce, type OwnLimits } from '@shared/parameters/limits-in-force';
import { fromStored, toStored, unitDecimals, type UnitContext } from '@shared/parameters/units';
import type { ParameterLimits } from '@shared/parameters/limits';
import type { ManualSource } from '@shared/readings/sources';
import type { Db } from '../../db/client';
import { devices, readings, tankLimits, tankMembers, tanks, users } from '../../db/schema/index';
import { issueDeviceToken } from '../../services/devices';
import { demoId } from './ids';
import { demoTanks } from './scenario';

type DemoTankKey = 'ashdown-reef' | 'ashdown-river' | 'quayside-reef' | 'saltfig-lagoon' | 'ferrous-planted';
type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

const historyDays = 365;
const withDevice: readonly DemoTankKey[] = ['quayside-reef', 'saltfig-lagoon'];

/** How each owner writes their home tests down, so the demo shows the conversions at work. */
const ownerUnits: Partial<
  Record<DemoTankKey, Partial<Record<ParameterKey, { unit: string } & UnitContext>>>
> = {
  'ashdown-reef': { salinity: { unit: 'specific gravity', sampleTempC: 25, referenceTempC: 25 } },
  'saltfig-lagoon': { alkalinity: { unit: 'meq/L' } },
  'ferrous-planted': { temperature: { unit: '°F' } },
};

/** Typical water of a well-kept tank, in stored units (common practice, invented for the demo). */
const typical: Record<'marine' | 'fresh', Partial<Record<ParameterKey, number>>> = {
  marine: {
    temperature: 25.6,
    salinity: 35,
    ph: 8.15,
    alkalinity: 8.4,
    calcium: 425,
    magnesium: 1340,
    nitrate: 6,
    phosphate: 0.06,
    ammonia: 0,
    nitrite: 0,
    orp: 360,
  },
  fresh: {
    temperature: 24.8,
    ph: 6.9,
    gh: 7,
    kh: 4,
    nitrate: 15,
    phosphate: 0.6,
    ammonia: 0,
    nitrite: 0,
  },
};

const scatter: Record<ParameterKey, number> = {
  temperature: 0.15,
  salinity: 0.12,
  ph: 0.04,
  alkalinity: 0.2,
  calcium: 8,
  magnesium: 20,
  nitrate: 0.8,
  phosphate: 0.01,
  ammonia: 0,
  nitrite: 0,
  orp: 10,
  gh: 0.3,
  kh: 0.2,
};

/** What a home tester checks, and how often (days); temperature is a glance at the thermometer. */
const homeTestEvery: Partial<Record<ParameterKey, number>> = {
  temperature: 1,
  salinity: 7,
  ph: 7,
  alkalinity: 7,
  nitrate: 7,
  phosphate: 7,
  kh: 7,
  calcium: 14,
  gh: 14,
  ammonia: 14,
  nitrite: 14,
  magnesium: 30,
};

const deviceParameters = ['temperature', 'salinity', 'ph', 'orp'] as const;

/** The heater story, in days before now; the water cools with a 9-hour time constant. */
const heater = { failedAt: 41, fixedAt: 41 - 20 / 24, warmedAt: 41 - 26 / 24, fall: 25.6 - 21, hours: 9 };
const heaterDropAtFix =
  heater.fall * (1 - Math.exp(-((heater.failedAt - heater.fixedAt) * 24) / heater.hours));

function heaterDrop(daysAgo: number): number {
  if (daysAgo > heater.fixedAt && daysAgo <= heater.failedAt) {
    return heater.fall * (1 - Math.exp(-((heater.failedAt - daysAgo) * 24) / heater.hours));
  }
  if (daysAgo > heater.warmedAt && daysAgo <= heater.fixedAt) {
    return (heaterDropAtFix * (daysAgo - heater.warmedAt)) / (heater.fixedAt - heater.warmedAt);
  }
  return 0;
}

/** mulberry32, so the demo is the same every time it is seeded. */
function seededRandom(seed: number) {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const watched = (limits: ParameterLimits | undefined): limits is ParameterLimits =>
  limits !== undefined && Object.values(limits).some((bound) => bound !== null);

/** The typical value, moved to the middle of the warning band when the style wants other water. */
function nominalFor(parameter: ParameterKey, limits: ParameterLimits, water: 'marine' | 'fresh'): number {
  const value = typical[water][parameter] ?? typical.marine[parameter] ?? 0;
  const low = limits.warnLow ?? -Infinity;
  const high = limits.warnHigh ?? Infinity;
  if (value >= low && value <= high) return value;
  if (Number.isFinite(low) && Number.isFinite(high)) return (low + high) / 2;
  return Number.isFinite(low) ? low * 1.1 : high * 0.5;
}

interface DemoTank {
  key: DemoTankKey;
  id: string;
  companyId: string;
  style: TankStyle;
  water: 'marine' | 'fresh';
  ownerId: string | null;
  technicianId: string | null;
  /** Days of history: a year, or since the tank was set up when that is more recent. */
  historyDays: number;
}

/**
 * Idempotent: limit rows and devices are written once (by key), and the history only when the
 * demo tanks have no readings yet. Device data (about 840,000 rows) is generated inside
 * PostgreSQL with generate_series, so seeding takes seconds.
 */
export async function seedDemoReadings(db: Db, now: Date): Promise<void> {
  const ids = demoTanks.map((t) => demoId(t.key));
  const tankRows = await db.select().from(tanks).where(inArray(tanks.id, ids));
  if (tankRows.length === 0) return;
  const members = await db
    .select({ tankId: tankMembers.tankId, userId: tankMembers.userId })
    .from(tankMembers)
    .where(inArray(tankMembers.tankId, ids));
  const staff = await db
    .select({ id: users.id, companyId: users.companyId })
    .from(users)
    .where(
      and(inArray(users.companyId, [...new Set(tankRows.map((t) => t.companyId))]), ne(users.role, 'owner')),
    );
  const demo: DemoTank[] = tankRows.flatMap((row) => {
    const spec = demoTanks.find((t) => demoId(t.key) === row.id);
    if (!spec) return [];
    const setUp = row.setUpOn ? Date.parse(`${row.setUpOn}T00:00:00Z`) : null;
    const days =
      setUp === null ? historyDays : Math.min(historyDays, Math.floor((now.getTime() - setUp) / dayMs));
    return [
      {
        key: spec.key as DemoTankKey,
        id: row.id,
        companyId: row.companyId,
        style: row.style,
        water: row.waterType === 'fresh' ? 'fresh' : 'marine',
        ownerId: members.find((m) => m.tankId === row.id)?.userId ?? null,
        technicianId:
          row.assignedTechnicianId ?? staff.find((u) => u.companyId === row.companyId)?.id ?? null,
        historyDays: Math.max(days, 0),
      },
    ];
  });

  await db.transaction(async (tx) => {
    await seedLimits(tx, demo);
    const deviceIds = await seedDevices(tx, demo, now);
    const [existing] = await tx
      .select({ id: readings.id })
      .from(readings)
      .where(inArray(readings.tankId, ids))
      .limit(1);
    if (existing) return;
    for (const tank of demo) {
      const deviceId = deviceIds.get(tank.key);
      if (deviceId) await seedDeviceHistory(tx, tank, deviceId, now);
    }
    const manual = demo.flatMap((tank) => manualHistory(tank, now, Boolean(deviceIds.get(tank.key))));
    await insertManualReadings(tx, manual);
  });
}

/** All the hand readings in one INSERT over unnest(): one statement and 13 parameters, not one per value. */
async function insertManualReadings(tx: Tx, rows: ManualReading[]) {
  if (rows.length === 0) return;
  const column = <T>(pick: (row: ManualReading) => T) => sql.param(rows.map(pick));
  await tx.execute(sql`
    insert into readings
      (company_id, tank_id, parameter, value, entered_value, entered_unit, measured_at, source,
       recorded_by, method, note, sample_temp_c, reference_temp_c)
    select * from unnest(
      ${column((r) => r.companyId)}::uuid[],
      ${column((r) => r.tankId)}::uuid[],
      ${column((r) => r.parameter)}::parameter_key[],
      ${column((r) => r.value)}::float8[],
      ${column((r) => r.enteredValue)}::float8[],
      ${column((r) => r.enteredUnit)}::text[],
      ${column((r) => r.measuredAt.toISOString())}::timestamptz[],
      ${column((r) => r.source)}::reading_source[],
      ${column((r) => r.recordedBy)}::uuid[],
      ${column((r) => r.method)}::text[],
      ${column((r) => r.note)}::text[],
      ${column((r) => r.sampleTempC)}::float8[],
      ${column((r) => r.referenceTempC)}::float8[]
    )`);
}

/** The scenario's own limit rows: no probe, no ORP, so a tank nobody measures it on is not watched for it. */
function overridesOf(tank: DemoTank): OwnLimits[] {
  if (withDevice.includes(tank.key) || !limitTemplates[tank.style].orp) return [];
  return [{ parameter: 'orp', warnLow: null, warnHigh: null, critLow: null, critHigh: null }];
}

function limitsOf(tank: DemoTank): Partial<Record<ParameterKey, ParameterLimits>> {
  const limits: Partial<Record<ParameterKey, ParameterLimits>> = {};
  for (const [parameter, inForce] of Object.entries(limitsInForce(tank.style, overridesOf(tank))))
    limits[parameter as ParameterKey] = inForce.limits;
  return limits;
}

async function seedLimits(tx: Tx, demo: DemoTank[]) {
  const rows = demo.flatMap((tank) =>
    Object.entries(limitsOf(tank)).map(([parameter, limits]) => ({
      tankId: tank.id,
      parameter: parameter as ParameterKey,
      ...limits,
      updatedBy: tank.technicianId,
    })),
  );
  if (rows.length > 0) await tx.insert(tankLimits).values(rows).onConflictDoNothing();
}

async function seedDevices(tx: Tx, demo: DemoTank[], now: Date): Promise<Map<DemoTankKey, string>> {
  const ids = new Map<DemoTankKey, string>();
  for (const tank of demo.filter((t) => withDevice.includes(t.key))) {
    const id = demoId(`device:${tank.key}`);
    // Nobody is told this token; staff create a fresh one to connect a real controller.
    const { tokenHash, tokenHint } = issueDeviceToken();
    await tx
      .insert(devices)
      .values({
        id,
        companyId: tank.companyId,
        tankId: tank.id,
        name: tank.key === 'quayside-reef' ? 'Sump controller' : 'Probe bar',
        tokenHash,
        tokenHint,
        lastSeenAt: now,
        createdBy: tank.technicianId,
        createdAt: new Date(now.getTime() - tank.historyDays * dayMs - hourMs),
      })
      .onConflictDoNothing();
    const [row] = await tx
      .select({ id: devices.id })
      .from(devices)
      .where(and(eq(devices.id, id), eq(devices.tankId, tank.id)));
    if (row) ids.set(tank.key, row.id);
  }
  return ids;
}

/**
 * Every 5 minutes for a year, per parameter, as one INSERT … SELECT over generate_series. `d` is
 * days before now, `h` the hour of the day (UTC); episodes are written as offsets from now.
 */
/** A number for SQL arithmetic; unannotated parameters leave PostgreSQL guessing their type. */
const f = (value: number) => sql`${value}::float8`;

async function seedDeviceHistory(tx: Tx, tank: DemoTank, deviceId: string, now: Date) {
  await tx.execute(sql`select setseed(${tank.key === 'quayside-reef' ? 0.31 : 0.62})`);
  const nowIso = now.toISOString();
  const lagoon = tank.key === 'saltfig-lagoon';
  const expressions: Record<(typeof deviceParameters)[number], ReturnType<typeof sql>> = {
    temperature: lagoon
      ? sql`25.3 + 0.3 * sin(2 * pi() * (h - 10) / 24) + 0.25 * sin(2 * pi() * d / 365) + (random() - 0.5) * 0.08`
      : // The heater stuck off 41 days ago at night: the water cooled towards the room's 21 °C
        // until the technician fitted a new heater 20 hours later, then took 6 hours to warm back.
        sql`25.6 + 0.3 * sin(2 * pi() * (h - 10) / 24) + (random() - 0.5) * 0.08
          - case
              when d > ${f(heater.fixedAt)} and d <= ${f(heater.failedAt)}
                then ${f(heater.fall)} * (1 - exp(-(${f(heater.failedAt)} - d) * 24 / ${f(heater.hours)}))
              when d > ${f(heater.warmedAt)} and d <= ${f(heater.fixedAt)}
                then ${f(heaterDropAtFix)} * (d - ${f(heater.warmedAt)}) / (${f(heater.fixedAt)} - ${f(heater.warmedAt)})
              else 0
            end`,
    salinity: lagoon
      ? // The top-off reservoir ran dry twice: 150 days ago (found at a visit after 9 days) and six
        // days ago, still going on; evaporation alone raises salinity about 0.2 a day here.
        sql`35.05 + (random() - 0.5) * 0.06
          + case when d > 141 and d <= 150 then (150 - d) * 0.19 else 0 end
          + case when d <= 6 then (6 - d) * 0.21 else 0 end`
      : sql`35.1 + 0.05 * sin(2 * pi() * d / 14) + (random() - 0.5) * 0.06`,
    ph: sql`8.14 + 0.11 * sin(2 * pi() * (h - 9) / 24) + (random() - 0.5) * 0.02`,
    orp: lagoon
      ? sql`350 + 18 * sin(2 * pi() * (h - 12) / 24) + (random() - 0.5) * 8`
      : sql`372 + 14 * sin(2 * pi() * (h - 12) / 24) - 8 * sin(2 * pi() * d / 30) + (random() - 0.5) * 8`,
  };
  for (const parameter of deviceParameters) {
    const { unit } = parameterCatalogue[parameter];
    // Probes report a little finer than people write down.
    const decimals = parameterCatalogue[parameter].decimals + 1;
    await tx.execute(sql`
      insert into readings
        (company_id, tank_id, parameter, value, entered_value, entered_unit, measured_at, source, device_id)
      select ${tank.companyId}, ${tank.id}, ${parameter}::parameter_key, v, v, ${unit}, t, 'device', ${deviceId}
      from (
        select t, round((${expressions[parameter]})::numeric, ${decimals})::float8 as v
        from (
          select t,
            extract(epoch from (${nowIso}::timestamptz - t)) / 86400 as d,
            extract(hour from t at time zone 'UTC') + extract(minute from t) / 60 as h
          from generate_series(${nowIso}::timestamptz - ${`${tank.historyDays} days`}::interval, ${nowIso}::timestamptz, interval '5 minutes') as t
        ) s
      ) x`);
  }
}

interface ManualReading {
  companyId: string;
  tankId: string;
  parameter: ParameterKey;
  value: number;
  enteredValue: number;
  enteredUnit: string;
  measuredAt: Date;
  source: ManualSource;
  recordedBy: string | null;
  method: string | null;
  note: string | null;
  sampleTempC: number | null;
  referenceTempC: number | null;
}

/** Stories told through the hand-tested values, as a change to the nominal value `daysAgo` before now. */
function episode(tank: DemoTank, parameter: ParameterKey, daysAgo: number): number {
  if (tank.key === 'ashdown-reef' && parameter === 'alkalinity') {
    // The doser ran dry 96 days ago; alkalinity fell for three weeks until the visit 75 days ago,
    // a double dose overshot, and it settled back over two weeks.
    if (daysAgo <= 96 && daysAgo > 75) return -((96 - daysAgo) / 21) * 2.2;
    if (daysAgo <= 75 && daysAgo > 73) return -2.2 + ((75 - daysAgo) / 2) * 5.4;
    if (daysAgo <= 73 && daysAgo > 59) return 3.2 * ((daysAgo - 59) / 14);
  }
  if (tank.key === 'quayside-reef' && parameter === 'temperature') return -heaterDrop(daysAgo);
  if (tank.key === 'saltfig-lagoon' && parameter === 'salinity') {
    if (daysAgo > 141 && daysAgo <= 150) return (150 - daysAgo) * 0.19;
    if (daysAgo <= 6) return (6 - daysAgo) * 0.21;
  }
  if (parameter === 'nitrate') {
    // Builds up between the fortnightly water changes.
    return ((daysAgo % 14) / 14) * -3 + 1.5;
  }
  return 0;
}

function manualHistory(tank: DemoTank, now: Date, hasDevice: boolean): ManualReading[] {
  const random = seededRandom([...tank.key].reduce((sum, ch) => sum * 31 + ch.charCodeAt(0), 7));
  const limits = limitsOf(tank);
  const rows: ManualReading[] = [];
  const watchedHere = parameterKeys.filter((p) => watched(limits[p]));
  const add = (
    parameter: ParameterKey,
    at: Date,
    source: ManualSource,
    extra: Partial<ManualReading> = {},
  ) => {
    const daysAgo = (now.getTime() - at.getTime()) / dayMs;
    const nominal = nominalFor(parameter, limits[parameter]!, tank.water);
    const noise = (random() - 0.5) * 2 * scatter[parameter];
    const stored = Math.max(0, nominal + episode(tank, parameter, daysAgo) + noise);
    const entry = (source === 'home-test' && ownerUnits[tank.key]?.[parameter]) || {
      unit: parameterCatalogue[parameter].unit,
    };
    const context: UnitContext = { sampleTempC: entry.sampleTempC, referenceTempC: entry.referenceTempC };
    const decimals = unitDecimals(parameter, entry.unit);
    const entered = Number(fromStored(parameter, stored, entry.unit, context).toFixed(decimals));
    rows.push({
      companyId: tank.companyId,
      tankId: tank.id,
      parameter,
      value: toStored(parameter, entered, entry.unit, context).value,
      enteredValue: entered,
      enteredUnit: entry.unit,
      measuredAt: at,
      source,
      recordedBy: source === 'visit' ? tank.technicianId : tank.ownerId,
      method: source === 'visit' ? methodAtVisit(parameter) : null,
      note: null,
      sampleTempC: entry.sampleTempC ?? null,
      referenceTempC: entry.referenceTempC ?? null,
      ...extra,
    });
  };

  // Visits every 14 days, the last one 3 days ago, mid-morning.
  for (let daysAgo = 3; daysAgo < tank.historyDays; daysAgo += 14) {
    const at = new Date(
      startOfUtcDay(now.getTime() - daysAgo * dayMs) + 10 * hourMs + Math.floor(random() * 90) * minuteMs,
    );
    if (at.getTime() > now.getTime()) continue;
    for (const parameter of watchedHere) if (parameter !== 'orp') add(parameter, at, 'visit');
  }
  // The urgent visit the morning the heater was found cold.
  if (tank.key === 'quayside-reef') {
    add('temperature', new Date(now.getTime() - heater.fixedAt * dayMs), 'visit', {
      note: 'Heater failed off overnight; replaced it, water warming back slowly.',
    });
  }
  // The visit that found the alkalinity low and dosed to correct it.
  if (tank.key === 'ashdown-reef') {
    add('alkalinity', new Date(now.getTime() - 75 * dayMs), 'visit', {
      note: 'Doser reservoir empty. Refilled and dosed to bring alkalinity back up.',
    });
  }

  // Home tests, in the evening, skipping what a device already measures.
  for (const parameter of watchedHere) {
    const every = homeTestEvery[parameter];
    if (!every || (hasDevice && (deviceParameters as readonly string[]).includes(parameter))) continue;
    // While alkalinity was swinging the owner tested every other day.
    for (let daysAgo = 0; daysAgo < tank.historyDays; daysAgo += 1) {
      const swinging =
        tank.key === 'ashdown-reef' && parameter === 'alkalinity' && daysAgo >= 59 && daysAgo <= 96;
      if (daysAgo % (swinging ? 2 : every) !== 0) continue;
      const evening =
        startOfUtcDay(now.getTime() - daysAgo * dayMs) + 19 * hourMs + Math.floor(random() * 60) * minuteMs;
      // Today's test is at most three hours old, so the tank reads as current when seeded.
      const at = daysAgo === 0 ? now.getTime() - 3 * hourMs : evening;
      if (at > now.getTime()) continue;
      add(parameter, new Date(at), 'home-test');
    }
  }
  return rows;
}

function startOfUtcDay(ms: number) {
  return Math.floor(ms / dayMs) * dayMs;
}

function methodAtVisit(parameter: ParameterKey): string {
  if (parameter === 'temperature') return 'calibrated thermometer';
  if (parameter === 'salinity') return 'conductivity meter';
  if (parameter === 'ph') return 'bench pH meter';
  return 'test kit';
}
