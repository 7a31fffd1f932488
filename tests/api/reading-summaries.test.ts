import fc from 'fast-check';
import { sql, type SQL } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readings } from '../../api/db/schema/index';
import { dayMs, hourMs, minuteMs } from '@shared/parameters/catalogue';
import type { ParameterKey } from '@shared/parameters/keys';
import { bucketOrigin, bucketWidthMs } from '@shared/readings/buckets';
import type { ReadingBucket, ReadingHistory } from '@shared/schemas/readings';
import { createTank } from '../helpers/factories';
import { startTestStack, type TestStack } from '../helpers/stack';
import { deviceFor, readingsWorld } from './readings-kit';

/*
 * latest_readings and the hourly and daily rollups are kept by statement triggers on `readings`
 * (drizzle/0016). Whatever is written, they must say what a query over the readings says, and the
 * history read from them must equal the one read from the readings alone. Random but repeatable:
 * every property runs from a fixed seed.
 */

const seed = 20261202;
const origin = sql`${bucketOrigin}::timestamptz`;
const parameters = ['temperature', 'ph'] as const satisfies readonly ParameterKey[];
type ManualSource = 'home-test' | 'visit';

/** A reading to write: on tank 0 or 1, from one of that tank's two devices or from a person. */
interface Draft {
  tank: 0 | 1;
  parameter: (typeof parameters)[number];
  from: 0 | 1 | ManualSource;
  /** Milliseconds after `base`. */
  at: number;
  value: number;
}

/** Sunday 1 March 2026 00:00 UTC: three days from here cross hour, day and week boundaries. */
const base = Date.parse('2026-03-01T00:00:00Z');

const moment = fc.oneof(
  { arbitrary: fc.integer({ min: 0, max: 3 * dayMs - 1 }), weight: 3 },
  // On or a millisecond either side of an hour (every 24th a day): the edges of the buckets. Device
  // readings here also collide with earlier ones, which the device key turns away.
  {
    arbitrary: fc
      .tuple(fc.integer({ min: 0, max: 72 }), fc.constantFrom(-1, 0, 1))
      .map(([hours, nudge]) => hours * hourMs + nudge),
    weight: 2,
  },
);
// Hundredths plus a little: sums that do not add up exactly in binary, and never -0.
const value = fc
  .tuple(fc.integer({ min: -500, max: 4000 }), fc.integer({ min: 0, max: 999 }))
  .map(([hundredths, millionths]) => hundredths / 100 + millionths / 1e6);
const draft: fc.Arbitrary<Draft> = fc.record({
  tank: fc.constantFrom(0 as const, 1 as const),
  parameter: fc.constantFrom(...parameters),
  from: fc.constantFrom(0 as const, 1 as const, 'home-test' as const, 'visit' as const),
  at: moment,
  value,
});
const statement = (max: number) => fc.array(draft, { minLength: 1, maxLength: max });

/** Which of the current readings (by position, modulo their number) an operation picks. */
const pick = fc.nat({ max: 10_000 });

type Step =
  | { kind: 'insert'; drafts: Draft[] }
  /** Earlier device readings sent again (other values), with some new ones in the same statement. */
  | { kind: 'resend'; picks: number[]; drafts: Draft[] }
  /** Readings people took at the very moment of earlier ones (and of the latest): ties on time. */
  | { kind: 'same-moment'; picks: number[]; latest: boolean; value: number }
  | { kind: 'delete'; picks: number[] }
  | { kind: 'delete-latest'; tank: 0 | 1 }
  | { kind: 'delete-span'; tank: 0 | 1; parameter: Draft['parameter']; at: number; length: number }
  | { kind: 'correct-value'; pick: number; value: number }
  | { kind: 'move'; pick: number | 'latest'; at: number }
  | { kind: 'shift-people'; tank: 0 | 1; shift: number; delta: number };

const inserts: fc.Arbitrary<Step>[] = [
  // One reading, a handful, a batch: the trigger sees transition tables of every size.
  statement(3).map((drafts) => ({ kind: 'insert', drafts })),
  statement(60).map((drafts) => ({ kind: 'insert', drafts })),
  fc
    .record({
      picks: fc.array(pick, { minLength: 1, maxLength: 6 }),
      drafts: fc.array(draft, { maxLength: 4 }),
    })
    .map((s) => ({ kind: 'resend', ...s })),
  fc
    .record({ picks: fc.array(pick, { maxLength: 5 }), latest: fc.boolean(), value })
    .map((s) => ({ kind: 'same-moment', ...s })),
];
const corrections: fc.Arbitrary<Step>[] = [
  fc.array(pick, { minLength: 1, maxLength: 8 }).map((picks) => ({ kind: 'delete', picks })),
  fc.constantFrom(0 as const, 1 as const).map((tank) => ({ kind: 'delete-latest', tank })),
  fc
    .record({
      tank: fc.constantFrom(0 as const, 1 as const),
      parameter: fc.constantFrom(...parameters),
      at: moment,
      length: fc.integer({ min: 1, max: 30 * hourMs }),
    })
    .map((s) => ({ kind: 'delete-span', ...s })),
  fc.record({ pick, value }).map((s) => ({ kind: 'correct-value', ...s })),
  fc
    .record({ pick: fc.oneof(pick, fc.constant('latest' as const)), at: moment })
    .map((s) => ({ kind: 'move', ...s })),
  fc
    .record({
      tank: fc.constantFrom(0 as const, 1 as const),
      shift: fc.integer({ min: -2 * dayMs, max: 2 * dayMs }),
      delta: value,
    })
    .map((s) => ({ kind: 'shift-people', ...s })),
];
const insertScript = fc.tuple(statement(60), fc.array(fc.oneof(...inserts), { minLength: 2, maxLength: 7 }));
const correctionScript = fc.tuple(
  statement(60),
  fc.array(fc.oneof(...inserts, ...corrections, ...corrections), { minLength: 3, maxLength: 9 }),
);

/** Moments as epoch milliseconds in their stored order (a timestamptz[] comes back as text); null stays null. */
const momentsMs = (moments: SQL) => sql`
  case when (${moments}) is not null then array(
    select (extract(epoch from m) * 1000)::float8 from unnest(${moments}) with ordinality as u(m, i) order by i
  ) end`;

const withoutSum = <T extends { sum: number }>({ sum: _sum, ...rest }: T) => rest;

describe('reading summaries (latest_readings, reading_rollups_hourly, reading_rollups_daily)', () => {
  let stack: TestStack;
  let world: Awaited<ReturnType<typeof readingsWorld>>;

  beforeAll(async () => {
    stack = await startTestStack();
    world = await readingsWorld(stack, { signIn: ['owner'] });
  });
  afterAll(() => stack.close());

  /** Two fresh tanks of the world's company, each with two devices. */
  async function twoTanks() {
    const { db } = stack.database;
    const made = [];
    for (const name of ['Display', 'Frag system']) {
      const tank = await createTank(db, { companyId: world.company.id, name, owners: [world.people.owner] });
      const devices = [
        (await deviceFor(db, world.people.technician, tank.id, 'Probe one')).id,
        (await deviceFor(db, world.people.technician, tank.id, 'Probe two')).id,
      ];
      made.push({ id: tank.id, devices });
    }
    return made;
  }
  type Tanks = Awaited<ReturnType<typeof twoTanks>>;

  function rowsOf(tanks: Tanks, drafts: Draft[]) {
    return drafts.map((d) => {
      const tank = tanks[d.tank]!;
      const device = typeof d.from === 'number' ? tank.devices[d.from]! : null;
      return {
        companyId: world.company.id,
        tankId: tank.id,
        parameter: d.parameter,
        value: d.value,
        enteredValue: d.value,
        enteredUnit: 'stored',
        measuredAt: new Date(base + d.at),
        source: device ? ('device' as const) : (d.from as ManualSource),
        deviceId: device,
      };
    });
  }

  async function insert(tanks: Tanks, drafts: Draft[]) {
    if (drafts.length === 0) return 0;
    // As ingest does: a device reading already stored is skipped, not an error.
    const result = await stack.database.db
      .insert(readings)
      .values(rowsOf(tanks, drafts))
      .onConflictDoNothing();
    return result.rowCount ?? 0;
  }

  const inTanks = (tanks: Tanks, column: SQL) =>
    sql`${column} = any(${sql.param(tanks.map((t) => t.id))}::uuid[])`;

  async function currentIds(tanks: Tanks) {
    const { rows } = await stack.database.db.execute<{ id: string }>(
      sql`select id from readings r where ${inTanks(tanks, sql`r.tank_id`)} order by id`,
    );
    return rows.map((r) => r.id);
  }

  async function run(tanks: Tanks, step: Step) {
    const { db } = stack.database;
    const tankId = (tank: 0 | 1) => tanks[tank]!.id;
    switch (step.kind) {
      case 'insert':
        await insert(tanks, step.drafts);
        return;
      case 'resend': {
        const { rows: sent } = await db.execute<{ id: string }>(sql`
          select id from readings r where ${inTanks(tanks, sql`r.tank_id`)} and r.device_id is not null
          order by id`);
        if (sent.length === 0) return;
        const ids = step.picks.map((p) => sent[p % sent.length]!.id);
        const before = await currentIds(tanks);
        const again = await db.execute(sql`
          insert into readings
            (company_id, tank_id, parameter, value, entered_value, entered_unit, measured_at, source, device_id)
          select company_id, tank_id, parameter, value + 1, entered_value + 1, entered_unit, measured_at, source,
            device_id
          from readings where id = any(${sql.param(ids)}::bigint[])
          on conflict do nothing`);
        expect(again.rowCount).toBe(0);
        expect(await currentIds(tanks)).toEqual(before);
        await insert(tanks, step.drafts);
        return;
      }
      case 'same-moment': {
        const ids = await currentIds(tanks);
        if (ids.length === 0) return;
        const at = step.picks.map((p) => ids[p % ids.length]!);
        const latest = step.latest
          ? sql`select reading_id from latest_readings where ${inTanks(tanks, sql`tank_id`)}`
          : sql`select null::bigint`;
        await db.execute(sql`
          insert into readings
            (company_id, tank_id, parameter, value, entered_value, entered_unit, measured_at, source)
          select company_id, tank_id, parameter, ${step.value}, ${step.value}, 'stored', measured_at, 'visit'
          from readings where id = any(${sql.param(at)}::bigint[]) or id in (${latest})`);
        return;
      }
      case 'delete': {
        const ids = await currentIds(tanks);
        if (ids.length === 0) return;
        const gone = step.picks.map((p) => ids[p % ids.length]!);
        await db.execute(sql`delete from readings where id = any(${sql.param(gone)}::bigint[])`);
        return;
      }
      case 'delete-latest':
        await db.execute(sql`
          delete from readings where id in (select reading_id from latest_readings where tank_id = ${tankId(step.tank)})`);
        return;
      case 'delete-span': {
        const from = new Date(base + step.at).toISOString();
        const to = new Date(base + step.at + step.length).toISOString();
        await db.execute(sql`
          delete from readings where tank_id = ${tankId(step.tank)} and parameter = ${step.parameter}
            and measured_at >= ${from}::timestamptz and measured_at < ${to}::timestamptz`);
        return;
      }
      case 'correct-value': {
        const ids = await currentIds(tanks);
        if (ids.length === 0) return;
        await db.execute(sql`
          update readings set value = ${step.value}, entered_value = ${step.value}
          where id = ${ids[step.pick % ids.length]!}`);
        return;
      }
      case 'move': {
        const ids = await currentIds(tanks);
        if (ids.length === 0) return;
        const target =
          step.pick === 'latest'
            ? sql`(select reading_id from latest_readings where ${inTanks(tanks, sql`tank_id`)} order by 1 limit 1)`
            : sql`${ids[step.pick % ids.length]!}`;
        const at = new Date(base + step.at).toISOString();
        // Into another hour or day, possibly past the latest or behind it; never onto the moment of
        // another report of the same device (the device key).
        await db.execute(sql`
          update readings r set measured_at = ${at}::timestamptz
          where r.id = ${target} and not exists (
            select 1 from readings d
            where d.device_id = r.device_id and d.parameter = r.parameter and d.measured_at = ${at}::timestamptz)`);
        return;
      }
      case 'shift-people':
        // Many rows in one statement, across buckets and both parameters.
        await db.execute(sql`
          update readings
          set measured_at = measured_at + ${`${step.shift} milliseconds`}::interval, value = value + ${step.delta}
          where tank_id = ${tankId(step.tank)} and source <> 'device'`);
        return;
    }
  }

  async function summariesOf(tanks: Tanks) {
    const { db } = stack.database;
    const tankIds = inTanks(tanks, sql`tank_id`);
    const rollup = async (table: SQL) =>
      (
        await db.execute<RollupRow>(sql`
          select tank_id, parameter, bucket_start, min, max, sum, count, device_count, home_count, visit_count,
            last_value, last_at
          from ${table} where ${tankIds} order by tank_id, parameter, bucket_start`)
      ).rows;
    const latest = await db.execute<LatestRow>(sql`
      select tank_id, parameter, reading_id, value, measured_at, source, device_id,
        ${momentsMs(sql`device_moments`)} as device_moments
      from latest_readings where ${tankIds} order by tank_id, parameter`);
    return {
      latest: latest.rows,
      hourly: await rollup(sql`reading_rollups_hourly`),
      daily: await rollup(sql`reading_rollups_daily`),
    };
  }

  /** What the summaries must say, worked out from the readings alone. */
  async function expectedFor(tanks: Tanks) {
    const { db } = stack.database;
    const tankIds = inTanks(tanks, sql`r.tank_id`);
    const rollup = async (unit: string) =>
      (
        await db.execute<RollupRow>(sql`
          select r.tank_id, r.parameter, date_bin(${unit}::interval, r.measured_at, ${origin}) as bucket_start,
            min(r.value) as min, max(r.value) as max, sum(r.value) as sum, count(*)::int as count,
            (count(*) filter (where r.source = 'device'))::int as device_count,
            (count(*) filter (where r.source = 'home-test'))::int as home_count,
            (count(*) filter (where r.source = 'visit'))::int as visit_count,
            (array_agg(r.value order by r.measured_at desc, r.id desc))[1] as last_value,
            max(r.measured_at) as last_at
          from readings r where ${tankIds}
          group by 1, 2, 3 order by 1, 2, 3`)
      ).rows;
    const latest = await db.execute<LatestRow>(sql`
      select distinct on (r.tank_id, r.parameter)
        r.tank_id, r.parameter, r.id as reading_id, r.value, r.measured_at, r.source, r.device_id,
        ${momentsMs(sql`case when r.source = 'device' then array(
          select d.measured_at from readings d
          where d.device_id = r.device_id and d.parameter = r.parameter and d.measured_at <= r.measured_at
          order by d.measured_at desc limit 11
        ) end`)} as device_moments
      from readings r where ${tankIds}
      order by r.tank_id, r.parameter, r.measured_at desc, r.id desc`);
    return { latest: latest.rows, hourly: await rollup('1 hour'), daily: await rollup('1 day') };
  }

  type Summaries = Awaited<ReturnType<typeof summariesOf>>;

  function expectSame(actual: Summaries, expected: Summaries, context: string) {
    expect(actual.latest, `${context}: latest_readings`).toEqual(expected.latest);
    for (const unit of ['hourly', 'daily'] as const) {
      expect(actual[unit].map(withoutSum), `${context}: ${unit} rollups`).toEqual(
        expected[unit].map(withoutSum),
      );
      actual[unit].forEach((row, i) =>
        expect(row.sum, `${context}: ${unit} sum`).toBeCloseTo(expected[unit][i]!.sum, 9),
      );
    }
  }

  async function expectSummariesOfReadings(tanks: Tanks, context: string) {
    expectSame(await summariesOf(tanks), await expectedFor(tanks), context);
  }

  /** Deleting the tank (its readings and devices go by cascade) leaves none of its summaries behind. */
  async function dropTank(tanks: Tanks, which: 0 | 1) {
    await stack.database.db.execute(sql`delete from tanks where id = ${tanks[which]!.id}`);
    const left = await summariesOf([tanks[which]!]);
    expect(left).toEqual({ latest: [], hourly: [], daily: [] });
  }

  it('keeps the latest reading, its device moments and both rollups equal to the readings after every insert statement, and a rebuild from scratch changes nothing', async () => {
    await fc.assert(
      fc.asyncProperty(insertScript, async ([first, steps]) => {
        const tanks = await twoTanks();
        await insert(tanks, first);
        await expectSummariesOfReadings(tanks, 'first insert');
        for (const [i, step] of steps.entries()) {
          await run(tanks, step);
          await expectSummariesOfReadings(tanks, `step ${i} (${step.kind})`);
        }

        const incremental = await summariesOf(tanks);
        await stack.database.db.execute(sql`select rebuild_all_reading_summaries()`);
        expectSame(await summariesOf(tanks), incremental, 'rebuilt from scratch');

        await dropTank(tanks, 0);
        await dropTank(tanks, 1);
      }),
      { seed, numRuns: 15 },
    );
  });

  it('keeps them equal through corrections, deletions (of the latest too) and readings moved in time', async () => {
    await fc.assert(
      fc.asyncProperty(correctionScript, async ([first, steps]) => {
        const tanks = await twoTanks();
        await insert(tanks, first);
        for (const [i, step] of steps.entries()) {
          await run(tanks, step);
          await expectSummariesOfReadings(tanks, `step ${i} (${step.kind})`);
        }
        await dropTank(tanks, 0);
        await dropTank(tanks, 1);
      }),
      { seed: seed + 1, numRuns: 15 },
    );
  });

  it('counts a device reading sent twice once', async () => {
    const tanks = await twoTanks();
    const reading: Draft = { tank: 0, parameter: 'temperature', from: 0, at: 5 * hourMs, value: 25.4 };

    expect(await insert(tanks, [reading])).toBe(1);
    expect(await insert(tanks, [{ ...reading, value: 26.1 }, reading])).toBe(0);

    const summaries = await summariesOf(tanks);
    expect(summaries.hourly.map((r) => [r.count, r.device_count, r.sum, r.last_value])).toEqual([
      [1, 1, 25.4, 25.4],
    ]);
    expect(summaries.daily.map((r) => [r.count, r.sum])).toEqual([[1, 25.4]]);
    expect(summaries.latest.map((r) => [r.value, r.device_moments])).toEqual([[25.4, [base + 5 * hourMs]]]);
    await expectSummariesOfReadings(tanks, 'sent twice');
  });

  it("removes a deleted tank's summaries and leaves the other tank's as they were", async () => {
    const [[first, steps]] = fc.sample(insertScript, { seed: seed + 2, numRuns: 1 }) as [[Draft[], Step[]]];
    const tanks = await twoTanks();
    await insert(tanks, [...first, { tank: 1, parameter: 'ph', from: 1, at: 0, value: 8.1 }]);
    for (const step of steps) await run(tanks, step);
    const kept = await summariesOf([tanks[0]!]);

    await dropTank(tanks, 1);

    expect(await summariesOf([tanks[0]!])).toEqual(kept);
    await expectSummariesOfReadings([tanks[0]!], 'after the other tank went');
  });

  describe('GET /api/tanks/:tankId/readings reads the rollups and answers as the readings alone do', () => {
    /** Monday 4 May 2026, and 120 days of readings from there. */
    const dataStart = Date.parse('2026-05-04T00:00:00Z');
    const dataEnd = dataStart + 120 * dayMs;
    const seen = { daily: 0, hourly: 0, readings: 0, raw: 0 };

    beforeAll(async () => {
      const { db } = stack.database;
      const tank = world.tank;
      const other = await createTank(db, {
        companyId: world.company.id,
        name: 'Quarantine',
        owners: [world.people.owner],
      });
      const probes = [
        await deviceFor(db, world.people.technician, tank.id, 'Probe one'),
        await deviceFor(db, world.people.technician, tank.id, 'Probe two'),
      ];
      const device = (
        id: string,
        firstMs: number,
        stepMs: number,
        from: number,
        to: number,
        parameter: ParameterKey = 'temperature',
      ) => sql`
        insert into readings
          (company_id, tank_id, parameter, value, entered_value, entered_unit, measured_at, source, device_id)
        select ${world.company.id}, ${tank.id}, ${parameter}, v, v, 'stored', t, 'device', ${id}
        from (
          select t, 25 + 0.6 * sin(extract(epoch from t) / 86400 * 2 * pi())
            + (floor(extract(epoch from t) / 60)::bigint % 7) / 100.0 as v
          from generate_series(${new Date(firstMs).toISOString()}::timestamptz,
            ${new Date(dataEnd).toISOString()}::timestamptz, ${`${stepMs} milliseconds`}::interval) t
          where t >= ${new Date(from).toISOString()}::timestamptz and t < ${new Date(to).toISOString()}::timestamptz
        ) s`;
      // Probe one every 10 minutes on the hour, probe two every 17 minutes 13.5 s off it; written a
      // month at a time out of order, so later statements hold late readings.
      for (const month of [2, 0, 3, 1]) {
        const from = dataStart + month * 30 * dayMs;
        await db.execute(device(probes[0]!.id, dataStart, 10 * minuteMs, from, from + 30 * dayMs));
        await db.execute(device(probes[1]!.id, dataStart + 13_500, 17 * minuteMs, from, from + 30 * dayMs));
      }
      // Another parameter of this tank and the same parameter of another tank stay out of its charts.
      await db.execute(device(probes[0]!.id, dataStart, hourMs, dataStart, dataEnd, 'ph'));
      await db.execute(sql`
        insert into readings
          (company_id, tank_id, parameter, value, entered_value, entered_unit, measured_at, source)
        select ${world.company.id}, ${other.id}, 'temperature', 40, 40, 'stored', t, 'home-test'
        from generate_series(${new Date(dataStart).toISOString()}::timestamptz,
          ${new Date(dataEnd).toISOString()}::timestamptz, interval '1 hour') t`);

      // People's readings, some on bucket edges, in statements of 1 to 40.
      const people = fc.sample(
        fc.array(
          fc.record({
            at: fc.oneof(
              fc.integer({ min: dataStart - 2 * dayMs, max: dataEnd + 2 * dayMs }),
              fc.integer({ min: -48, max: 120 * 24 + 48 }).map((h) => dataStart + h * hourMs),
            ),
            source: fc.constantFrom('home-test' as const, 'visit' as const),
            value,
          }),
          { minLength: 1, maxLength: 40 },
        ),
        { seed: seed + 3, numRuns: 8 },
      );
      for (const batch of people) {
        await db.insert(readings).values(
          batch.map((r) => ({
            companyId: world.company.id,
            tankId: tank.id,
            parameter: 'temperature' as const,
            value: r.value,
            enteredValue: r.value,
            enteredUnit: 'stored',
            measuredAt: new Date(r.at),
            source: r.source,
            recordedBy: world.people.owner.id,
          })),
        );
      }
      // Corrections and a removed day, so some buckets were rebuilt rather than added up.
      await db.execute(sql`
        update readings set value = value - 1.5
        where tank_id = ${tank.id} and parameter = 'temperature' and id % 97 = 0`);
      await db.execute(sql`
        delete from readings where device_id = ${probes[1]!.id}
          and measured_at >= ${new Date(dataStart + 40 * dayMs + 5 * hourMs).toISOString()}::timestamptz
          and measured_at < ${new Date(dataStart + 41 * dayMs + 7 * hourMs).toISOString()}::timestamptz`);
    });

    /** The query history ran before the rollups: every bucket straight from the readings. */
    async function fromReadings(from: string, to: string, widthMs: number) {
      const { rows } = await stack.database.db.execute<{
        start_ms: string;
        min: number;
        mean: number;
        max: number;
        count: number;
        device: number;
        home: number;
        visit: number;
      }>(sql`
        select
          extract(epoch from date_bin(${`${widthMs} milliseconds`}::interval, r.measured_at, ${bucketOrigin}::timestamptz)) * 1000
            as start_ms,
          min(r.value) as min, avg(r.value) as mean, max(r.value) as max, count(*)::int as count,
          (count(*) filter (where r.source = 'device'))::int as device,
          (count(*) filter (where r.source = 'home-test'))::int as home,
          (count(*) filter (where r.source = 'visit'))::int as visit
        from readings r
        where r.tank_id = ${world.tank.id} and r.parameter = 'temperature'
          and r.measured_at >= ${from}::timestamptz and r.measured_at <= ${to}::timestamptz
        group by 1
        order by 1`);
      return rows.map((row) => ({
        start: new Date(Math.round(Number(row.start_ms))).toISOString(),
        min: row.min,
        mean: row.mean,
        max: row.max,
        count: row.count,
        bySource: { device: row.device, 'home-test': row.home, visit: row.visit },
      }));
    }

    const alignTo = { ms: 1, minute: minuteMs, hour: hourMs, day: dayMs } as const;
    const windowOf = fc
      .record({
        start: fc.integer({ min: dataStart - 30 * dayMs, max: dataEnd - dayMs }),
        span: fc.oneof(
          fc.integer({ min: 5 * minuteMs, max: dayMs - 1 }),
          fc.integer({ min: dayMs, max: 10 * dayMs }),
          fc.integer({ min: 28 * dayMs, max: 400 * dayMs }),
        ),
        align: fc.constantFrom(...(Object.keys(alignTo) as (keyof typeof alignTo)[])),
        points: fc.oneof(fc.constantFrom(10, 20, 100, 500, 2000), fc.integer({ min: 10, max: 2000 })),
      })
      .map(({ start, span, align, points }) => {
        const unit = alignTo[align];
        const from = Math.floor(start / unit) * unit;
        const to = Math.max(from + unit, Math.floor((from + span) / unit) * unit);
        return { from: new Date(from).toISOString(), to: new Date(to).toISOString(), points };
      });
    type Window = { from: string; to: string; points: number };
    const at = (ms: number) => new Date(ms).toISOString();
    // Always among the cases: a year as 500 days, unaligned days as hours, a short window in minutes.
    const examples: [Window][] = [
      [{ from: at(dataStart - 100 * dayMs + 1234), to: at(dataEnd + 145 * dayMs - 4321), points: 500 }],
      [
        {
          from: at(dataStart + 10 * dayMs + 7 * minuteMs),
          to: at(dataStart + 13 * dayMs + 50 * minuteMs),
          points: 100,
        },
      ],
      [
        {
          from: at(dataStart + 20 * dayMs + 3 * hourMs),
          to: at(dataStart + 20 * dayMs + 9 * hourMs + 1),
          points: 20,
        },
      ],
      [{ from: at(dataStart + 20 * dayMs), to: at(dataStart + 20 * dayMs + 20 * minuteMs), points: 10 }],
    ];

    it('gives the same buckets, counts by source, total and mode for windows aligned or not, of minutes to a year', async () => {
      await fc.assert(
        fc.asyncProperty(windowOf, async ({ from, to, points }) => {
          const widthMs = bucketWidthMs(Date.parse(to) - Date.parse(from), points);
          const expected = await fromReadings(from, to, widthMs);
          const total = expected.reduce((sum, b) => sum + b.count, 0);
          const search = new URLSearchParams({ parameter: 'temperature', from, to, points: String(points) });

          const res = await world.call('owner', 'GET', `/api/tanks/${world.tank.id}/readings?${search}`);
          const body = res.body as ReadingHistory;

          expect(res.status).toBe(200);
          expect(body.total).toBe(total);
          expect(body.mode).toBe(total <= points ? 'raw' : 'buckets');
          if (body.mode === 'raw') {
            seen.raw += 1;
            expect(body.buckets).toEqual([]);
            expect(body.readings).toHaveLength(total);
            return;
          }
          seen[widthMs % dayMs === 0 ? 'daily' : widthMs % hourMs === 0 ? 'hourly' : 'readings'] += 1;
          expect(body.bucketMs).toBe(widthMs);
          const exact = ({ mean: _mean, ...rest }: ReadingBucket) => rest;
          expect(body.buckets.map(exact)).toEqual(expected.map(exact));
          body.buckets.forEach((bucket, i) => expect(bucket.mean).toBeCloseTo(expected[i]!.mean, 9));
        }),
        { seed: seed + 4, numRuns: 40, examples },
      );

      // The cases above went through each way of answering: the daily and the hourly rollups, the
      // readings alone, and raw readings.
      expect(
        Object.values(seen).every((n) => n > 0),
        JSON.stringify(seen),
      ).toBe(true);
    });
  });
});

interface RollupRow extends Record<string, unknown> {
  tank_id: string;
  parameter: string;
  bucket_start: Date;
  min: number;
  max: number;
  sum: number;
  count: number;
  device_count: number;
  home_count: number;
  visit_count: number;
  last_value: number;
  last_at: Date;
}

interface LatestRow extends Record<string, unknown> {
  tank_id: string;
  parameter: string;
  reading_id: string;
  value: number;
  measured_at: Date;
  source: string;
  device_id: string | null;
  /** Epoch milliseconds, newest first. */
  device_moments: number[] | null;
}
