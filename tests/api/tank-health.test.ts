import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Db } from '../../api/db/client';
import { alerts, devices, readings, tankLimits, tanks } from '../../api/db/schema/index';
import { healthForTanks } from '../../api/services/tank-health';
import {
  expectedIntervalMs,
  parameterHealth,
  tankStatus,
  type LatestReading,
  type ParameterHealth,
} from '@shared/parameters/health';
import { parameterKeys, type ParameterKey } from '@shared/parameters/keys';
import { limitTemplates, tankStyles, type TankStyle } from '@shared/parameters/limit-templates';
import { limitsInForce, type OwnLimits } from '@shared/parameters/limits-in-force';
import type { ParameterLimits } from '@shared/parameters/limits';
import { readingSources, type ReadingSource } from '@shared/readings/sources';
import { days, hours, minutes } from '../helpers/clock';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import { addLivestockTo, createCompany, createTank } from '../helpers/factories';

const now = new Date('2026-12-01T12:00:00.000Z');
const ago = (ms: number) => new Date(now.getTime() - ms);

describe('healthForTanks', () => {
  let database: TestDatabase;
  let db: Db;
  let companyId: string;

  beforeAll(async () => {
    database = await createTestDatabase();
    db = database.db;
    companyId = (await createCompany(db)).id;
  });
  afterAll(() => database.drop());

  async function tankWith(
    rows: { parameter: ParameterKey; value: number; at: Date; source?: ReadingSource }[],
    style: TankStyle = 'mixed-reef',
  ) {
    const tank = await createTank(db, { companyId });
    await db.update(tanks).set({ style }).where(eq(tanks.id, tank.id));
    if (rows.length > 0) {
      await db.insert(readings).values(
        rows.map((r) => ({
          companyId,
          tankId: tank.id,
          parameter: r.parameter,
          value: r.value,
          enteredValue: r.value,
          enteredUnit: 'stored',
          measuredAt: r.at,
          source: r.source ?? 'device',
        })),
      );
    }
    return tank.id;
  }

  /** A tank watched for temperature only, so one reading decides its status. */
  async function temperatureTank(value: number, at: Date, source: ReadingSource = 'device') {
    const id = await tankWith([{ parameter: 'temperature', value, at, source }]);
    await watchOnly(id, 'temperature', { warnLow: 24, warnHigh: 27, critLow: 22, critHigh: 28.5 });
    return id;
  }

  async function watchOnly(tankId: string, parameter: ParameterKey, limits: ParameterLimits) {
    const none = { warnLow: null, warnHigh: null, critLow: null, critHigh: null };
    await db
      .insert(tankLimits)
      .values(
        parameterKeys.map((key) => ({ tankId, parameter: key, ...(key === parameter ? limits : none) })),
      );
  }

  const statusOf = async (id: string) => (await healthForTanks(db, [id], now)).get(id)!;

  it('is healthy with a fresh reading inside the limits', async () => {
    const id = await temperatureTank(25.5, ago(minutes(5)));
    const health = await statusOf(id);

    expect(health.status).toBe('healthy');
    expect(health.statusReason).toBe('Temperature 25.5 °C is in range');
    expect(health.parameters).toEqual([
      {
        parameter: 'temperature',
        health: 'in-range',
        reason: 'Temperature 25.5 °C is in range',
        watched: true,
        latest: { value: 25.5, measuredAt: ago(minutes(5)).toISOString(), source: 'device' },
        limits: { warnLow: 24, warnHigh: 27, critLow: 22, critHigh: 28.5 },
        limitsSource: 'tank',
        expectedIntervalMs: minutes(30),
      },
    ]);
  });

  it('is watch beyond a warning bound and alert beyond a critical one, and in range exactly on a bound', async () => {
    const cases = [
      [27.1, 'watch'],
      [23.9, 'watch'],
      [28.6, 'alert'],
      [21.9, 'alert'],
      [27, 'healthy'],
      [28.5, 'watch'],
    ] as const;
    for (const [value, status] of cases) {
      expect([value, (await statusOf(await temperatureTank(value, ago(minutes(1))))).status]).toEqual([
        value,
        status,
      ]);
    }
  });

  it('keeps an old critical reading critical: bad news does not go stale', async () => {
    const health = await statusOf(await temperatureTank(29.5, ago(days(4))));
    expect([health.status, health.parameters[0]!.health]).toEqual(['alert', 'critical']);
  });

  it('goes stale after the interval for the reading’s source, not at it', async () => {
    const onTime = await statusOf(await temperatureTank(25, ago(minutes(30))));
    const late = await statusOf(await temperatureTank(25, new Date(ago(minutes(30)).getTime() - 1)));
    const homeTest = await statusOf(await temperatureTank(25, ago(hours(20)), 'home-test'));

    expect(onTime.status).toBe('healthy');
    expect(late.status).toBe('no-data');
    expect(late.parameters[0]!.health).toBe('stale');
    expect(homeTest.status).toBe('healthy');
  });

  it('is watch when some watched parameters are stale and the rest in range', async () => {
    const id = await tankWith([
      { parameter: 'temperature', value: 25.5, at: ago(minutes(5)) },
      { parameter: 'ph', value: 8.1, at: ago(hours(2)) },
    ]);
    const health = await statusOf(id);

    // The mixed-reef template also watches parameters never read here; those count as stale.
    expect(health.status).toBe('watch');
    expect(health.parameters.find((p) => p.parameter === 'ph')!.health).toBe('stale');
    expect(health.parameters.find((p) => p.parameter === 'calcium')).toMatchObject({
      health: 'stale',
      watched: true,
      latest: null,
      limitsSource: 'template',
    });
  });

  it('has no data for a tank without readings, and for one watched for nothing', async () => {
    const empty = await tankWith([]);
    const unwatched = await tankWith([{ parameter: 'temperature', value: 25, at: ago(minutes(1)) }]);
    const none = { warnLow: null, warnHigh: null, critLow: null, critHigh: null };
    await db
      .insert(tankLimits)
      .values(parameterKeys.map((parameter) => ({ tankId: unwatched, parameter, ...none })));
    const both = await healthForTanks(db, [empty, unwatched], now);

    expect(both.get(empty)!.status).toBe('no-data');
    expect(both.get(unwatched)!.status).toBe('no-data');
    // A reading of a parameter nobody watches is still shown, just not judged against limits.
    expect(both.get(unwatched)!.parameters).toMatchObject([{ parameter: 'temperature', watched: false }]);
  });

  it('is watch, with the alerts named, while warning alerts are open, though every reading is in range', async () => {
    const id = await temperatureTank(25.5, ago(minutes(5)));
    const { companyId: company } = (await db.select().from(tanks).where(eq(tanks.id, id)))[0]!;
    const alert = (ruleKey: string, title: string, severity: 'warning' | 'critical' | 'notice') => ({
      companyId: company,
      tankId: id,
      kind: 'rate' as const,
      ruleKey,
      parameter: 'salinity' as const,
      severity,
      title,
      body: title,
      openedAt: ago(hours(1)),
      lastSeenAt: ago(hours(1)),
    });
    await db.insert(alerts).values([
      alert('rate:salinity', 'Salinity rising fast in Test tank', 'warning'),
      {
        ...alert('test-overdue:alkalinity', 'Alkalinity test due in Test tank', 'notice'),
        kind: 'test-overdue',
      },
    ]);
    await db.insert(alerts).values({
      ...alert('rate:ph', 'pH falling fast in Test tank', 'warning'),
      parameter: 'ph',
      status: 'resolved',
    });

    const health = await statusOf(id);

    expect([health.status, health.statusReason]).toEqual([
      'watch',
      'Open alert: Salinity rising fast in Test tank',
    ]);
    // The alert's parameter becomes a tile of its own, agreeing with the tank.
    expect(health.parameters.find((p) => p.parameter === 'salinity')).toMatchObject({
      health: 'warning',
      watched: true,
      reason: 'Open alert: Salinity rising fast in Test tank',
    });
  });

  it('is watch for a reading inside the limits but outside what the present livestock tolerate', async () => {
    const id = await temperatureTank(26.8, ago(minutes(5)));
    const tank = { id, companyId };
    await addLivestockTo(db, tank, { catalogueSpeciesId: 'bubble-tip-anemone', status: 'stable' });
    // A removed animal no longer shapes the comfort range.
    await addLivestockTo(db, tank, { catalogueSpeciesId: 'zebra-danio', status: 'removed' });
    const before = await statusOf(id);
    await addLivestockTo(db, tank, { catalogueSpeciesId: 'neon-tetra', status: 'stable' });

    const after = await statusOf(id);

    expect([before.status, before.statusReason]).toEqual(['healthy', 'Temperature 26.8 °C is in range']);
    expect([after.status, after.parameters[0]!.health]).toEqual(['watch', 'warning']);
    expect(after.statusReason).toBe(
      'Temperature 26.8 °C is above what the neon tetra (Paracheirodon innesi) tolerates (max 26 °C)',
    );
  });

  it('judges device data by that device’s own reporting interval', async () => {
    const hourlyTank = await createTank(db, { companyId });
    const [device] = await db
      .insert(devices)
      .values({
        companyId,
        tankId: hourlyTank.id,
        name: 'Sump probe',
        tokenHash: `hash-${hourlyTank.id}`,
        tokenHint: 'bw_test',
      })
      .returning();
    const last = ago(minutes(38));
    await db.insert(readings).values(
      Array.from({ length: 12 }, (_, i) => ({
        companyId,
        tankId: hourlyTank.id,
        parameter: 'temperature' as const,
        value: 25,
        enteredValue: 25,
        enteredUnit: '°C',
        measuredAt: new Date(last.getTime() - i * hours(1)),
        source: 'device' as const,
        deviceId: device!.id,
      })),
    );
    await watchOnly(hourlyTank.id, 'temperature', { warnLow: 24, warnHigh: 27, critLow: 22, critHigh: 28.5 });

    const current = await statusOf(hourlyTank.id);
    const late = (await healthForTanks(db, [hourlyTank.id], new Date(last.getTime() + hours(3) + 1))).get(
      hourlyTank.id,
    )!;

    expect([current.status, current.parameters[0]!.expectedIntervalMs]).toEqual(['healthy', hours(3)]);
    expect([late.status, late.statusReason]).toEqual(['no-data', 'No reading for 3 hours']);
  });

  it('never reads a tank it was not asked about', async () => {
    const id = await temperatureTank(25, ago(minutes(1)));
    expect([...(await healthForTanks(db, [id], now)).keys()]).toEqual([id]);
    expect((await healthForTanks(db, [], now)).size).toBe(0);
  });

  it('answers a 50-tank list with one query', async () => {
    const ids = await Promise.all(
      Array.from({ length: 50 }, (_, i) => temperatureTank(24 + i / 10, ago(minutes(i)))),
    );
    const pool = database.pool;
    const query = pool.query.bind(pool);
    let count = 0;
    pool.query = ((...args: Parameters<typeof pool.query>) => {
      count += 1;
      return query(...args);
    }) as typeof pool.query;
    try {
      const health = await healthForTanks(db, ids, now);
      expect(health.size).toBe(50);
    } finally {
      pool.query = query;
    }
    expect(count).toBe(1);
  });

  it('judges by the limits in force (shared/parameters/limits-in-force.ts) for tanks with different overrides', async () => {
    const unwatched = { warnLow: null, warnHigh: null, critLow: null, critHigh: null };
    const cases: { style: TankStyle; own: OwnLimits[] }[] = [
      { style: 'sps-reef', own: [] },
      {
        style: 'mixed-reef',
        own: [
          { parameter: 'temperature', warnLow: 23, warnHigh: 26, critLow: null, critHigh: 28 },
          { parameter: 'orp', ...unwatched },
        ],
      },
      // Rows for parameters the style leaves out: one watched, one not.
      {
        style: 'planted-freshwater',
        own: [
          { parameter: 'salinity', warnLow: null, warnHigh: 1, critLow: null, critHigh: 2 },
          { parameter: 'orp', ...unwatched },
          { parameter: 'nitrate', warnLow: null, warnHigh: 20, critLow: null, critHigh: 40 },
        ],
      },
      { style: 'brackish', own: parameterKeys.map((parameter) => ({ parameter, ...unwatched })) },
    ];
    const ids: string[] = [];
    for (const { style, own } of cases) {
      // One reading of every parameter, so each is listed whether it is watched or not.
      const id = await tankWith(
        parameterKeys.map((parameter) => ({ parameter, value: 1, at: ago(minutes(5)) })),
        style,
      );
      if (own.length > 0) await db.insert(tankLimits).values(own.map((row) => ({ tankId: id, ...row })));
      ids.push(id);
    }

    const health = await healthForTanks(db, ids, now);

    cases.forEach(({ style, own }, index) => {
      const inForce = limitsInForce(style, own);
      const listed = health.get(ids[index]!)!.parameters;
      expect(listed.map((p) => p.parameter)).toEqual([...parameterKeys]);
      for (const p of listed) {
        const expected = inForce[p.parameter];
        expect({ parameter: p.parameter, limits: p.limits, source: p.limitsSource }).toEqual({
          parameter: p.parameter,
          limits: expected?.limits ?? null,
          source: expected?.source ?? null,
        });
        expect(p.watched).toBe(
          expected !== undefined && Object.values(expected.limits).some((bound) => bound !== null),
        );
      }
    });
  });

  it('agrees with parameterHealth and tankStatus (shared/parameters/health.ts) on generated data', async () => {
    const random = seeded(20261201);
    const pick = <T>(items: readonly T[]) => items[Math.floor(random() * items.length)]!;
    const world: { id: string; style: TankStyle; rows: Row[]; own: Map<ParameterKey, ParameterLimits> }[] =
      [];
    for (let t = 0; t < 40; t += 1) {
      const style = pick(tankStyles);
      const rows: Row[] = [];
      for (const parameter of parameterKeys) {
        if (random() < 0.35) continue;
        const limits = limitTemplates[style][parameter] ?? {
          warnLow: 5,
          warnHigh: 10,
          critLow: 2,
          critHigh: 12,
        };
        const low = limits.critLow ?? limits.warnLow ?? 0;
        const high = limits.critHigh ?? limits.warnHigh ?? low + 10;
        for (let n = Math.ceil(random() * 3); n > 0; n -= 1) {
          const span = high - low || 1;
          // Values from well below to well above the bands, sometimes exactly on a bound.
          const onBound =
            random() < 0.15 ? pick([limits.warnLow, limits.warnHigh, limits.critLow, limits.critHigh]) : null;
          rows.push({
            parameter,
            value: onBound ?? low - span * 0.3 + random() * span * 1.6,
            at: ago(Math.floor(random() * random() * days(40))),
            source: pick(readingSources),
          });
        }
      }
      const id = await tankWith(rows, style);
      const own = new Map<ParameterKey, ParameterLimits>();
      for (const parameter of parameterKeys) {
        if (random() < 0.15) {
          const base = limitTemplates[style][parameter] ?? null;
          const limits =
            base && random() < 0.7
              ? { ...base, warnHigh: base.warnHigh === null ? null : base.warnHigh * 0.98 }
              : { warnLow: null, warnHigh: null, critLow: null, critHigh: null };
          own.set(parameter, limits);
          await db.insert(tankLimits).values({ tankId: id, parameter, ...limits });
        }
      }
      world.push({ id, style, rows, own });
    }

    const health = await healthForTanks(
      db,
      world.map((w) => w.id),
      now,
    );

    for (const tank of world) {
      const expected = expectedHealth(tank, now);
      const actual = health.get(tank.id)!;
      expect({
        status: actual.status,
        parameters: actual.parameters.map((p) => [p.parameter, p.health, p.watched]),
      }).toEqual(expected);
    }
  });
});

type Row = { parameter: ParameterKey; value: number; at: Date; source: ReadingSource };

/** The same judgement made with the pure functions, for comparison with the SQL. */
function expectedHealth(
  tank: { style: TankStyle; rows: Row[]; own: Map<ParameterKey, ParameterLimits> },
  now: Date,
) {
  const judged: [ParameterKey, ParameterHealth, boolean][] = [];
  for (const parameter of parameterKeys) {
    const own = [...tank.own].map(([key, bounds]) => ({ parameter: key, ...bounds }));
    const limits = limitsInForce(tank.style, own)[parameter]?.limits ?? null;
    const watched = limits !== null && Object.values(limits).some((bound) => bound !== null);
    const mine = tank.rows
      .filter((r) => r.parameter === parameter)
      .sort((a, b) => b.at.getTime() - a.at.getTime());
    const newest = mine[0];
    if (!watched && !newest) continue;
    const latest: LatestReading | null = newest
      ? { value: newest.value, measuredAt: newest.at, source: newest.source }
      : null;
    const interval = newest ? expectedIntervalMs(parameter, newest.source) : null;
    judged.push([parameter, parameterHealth(latest, limits, interval, now), watched]);
  }
  return {
    status: tankStatus(judged.filter(([, , watched]) => watched).map(([, health]) => health)),
    parameters: judged,
  };
}

/** mulberry32: a small seeded generator, so a failure can be replayed. */
function seeded(seed: number) {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
