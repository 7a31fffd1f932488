import fc from 'fast-check';
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readings } from '../../api/db/schema/index';
import { loadRateSeries, type NewReading } from '../../api/services/alert-engine';
import { evaluateRate } from '@shared/alerts/rate';
import { dayMs, hourMs, parameterCatalogue } from '@shared/parameters/catalogue';
import type { ParameterKey } from '@shared/parameters/keys';
import type { RateRule } from '@shared/parameters/limits';
import { startTestStack, type TestStack } from '../helpers/stack';
import { readingsWorld } from './readings-kit';

/*
 * The alert engine asks the database only for the earlier readings that can be the worst change (at
 * the most positive and the most negative change, ties included) instead of the whole window.
 * Whatever the readings, the rate judged from those must be the one judged from every reading in
 * the window. Random but repeatable: every property runs from a fixed seed.
 */

const seed = 20261203;
/** The catalogue's rule for temperature (per hour) and a tank's own rule for pH (per day). */
const temperatureRule = parameterCatalogue.temperature.rateOfChange!;
const phRule: RateRule = { maxChange: 0.2, perMs: dayMs };
const rules = { temperature: temperatureRule, ph: phRule } satisfies Partial<Record<ParameterKey, RateRule>>;
type Judged = keyof typeof rules;

/**
 * The latest reading is at `to` (on the hour, or anywhere in the hour after it, so the window's
 * ends fall on and between the hourly rollups); earlier ones from a little before the window up to
 * just before it.
 */
const onTheHour = Date.parse('2026-06-10T12:00:00Z');

const earlier = (rule: RateRule) =>
  fc.record({
    // Anywhere (a few outside the window); on a coarse grid, so equal changes (ties) happen; or
    // bunched in a few hours, so the hourly bounds are loose and skipping an hour is tested.
    beforeMs: fc.oneof(
      fc.integer({ min: 1, max: 2 * rule.perMs + hourMs }),
      fc.integer({ min: 1, max: 8 }).map((step) => (step * rule.perMs) / 4),
      fc
        .tuple(fc.constantFrom(0, 0.25, 0.5, 1, 1.25, 1.5, 1.75), fc.integer({ min: 1, max: hourMs - 1 }))
        .map(([share, within]) => Math.floor((share * 2 * rule.perMs) / hourMs) * hourMs + within),
    ),
    value: fc.oneof(
      fc.integer({ min: 2400, max: 2800 }).map((hundredths) => hundredths / 100),
      fc.constantFrom(24.5, 25, 25.5, 26),
    ),
  });

const scenario = fc.record({
  to: fc.oneof(
    fc.constant(onTheHour),
    fc.integer({ min: 1, max: hourMs - 1 }).map((ms) => onTheHour + ms),
  ),
  temperature: fc.record({
    latest: fc.constantFrom(24, 25.25, 26.5),
    earlier: fc.array(earlier(temperatureRule), { maxLength: 60 }),
  }),
  ph: fc.record({
    latest: fc.constantFrom(7.9, 8.1, 8.35),
    earlier: fc.array(
      earlier(phRule).map((r) => ({ ...r, value: Math.round((r.value / 3.1) * 100) / 100 })),
      { maxLength: 60 },
    ),
  }),
});

describe('the rate series the alert engine reads', () => {
  let stack: TestStack;
  let world: Awaited<ReturnType<typeof readingsWorld>>;

  beforeAll(async () => {
    stack = await startTestStack();
    world = await readingsWorld(stack, { signIn: [] });
  });
  afterAll(() => stack.close());

  async function everyReadingInWindow(parameter: Judged, rule: RateRule, to: number) {
    const { rows } = await stack.database.db.execute<{ value: number; measured_at: string }>(sql`
      select value, measured_at from readings
      where tank_id = ${world.tank.id} and parameter = ${parameter}
        and measured_at >= ${new Date(to - 2 * rule.perMs).toISOString()}::timestamptz
        and measured_at <= ${new Date(to).toISOString()}::timestamptz
      order by measured_at`);
    return rows.map((row) => ({ value: row.value, measuredAt: new Date(row.measured_at) }));
  }

  it('judges every window the same from the two candidates as from all of its readings', async () => {
    const { db } = stack.database;
    let breaches = 0;
    let calm = 0;
    await fc.assert(
      fc.asyncProperty(scenario, async (drafts) => {
        const { to } = drafts;
        await db.execute(sql`delete from readings where tank_id = ${world.tank.id}`);
        const latest = new Map<ParameterKey, NewReading>();
        const rows = [];
        for (const parameter of Object.keys(rules) as Judged[]) {
          const { latest: value, earlier: list } = drafts[parameter];
          latest.set(parameter, { parameter, value, measuredAt: new Date(to), source: 'home-test' });
          // One reading per moment, as a tank's home tests are; the latest moment is the latest's.
          const moments = new Map(list.map((r) => [r.beforeMs, r.value]));
          moments.set(0, value);
          for (const [beforeMs, v] of moments) {
            rows.push({
              companyId: world.company.id,
              tankId: world.tank.id,
              parameter,
              value: v,
              enteredValue: v,
              enteredUnit: 'stored',
              measuredAt: new Date(to - beforeMs),
              source: 'home-test' as const,
            });
          }
        }
        await db.insert(readings).values(rows);

        const series = await loadRateSeries(db, { id: world.tank.id, rates: { ph: phRule } }, latest);
        for (const parameter of Object.keys(rules) as Judged[]) {
          const rule = rules[parameter];
          const candidates = series.get(parameter)!;
          const full = await everyReadingInWindow(parameter, rule, to);
          // The latest, and from the earlier ones only those at the two extreme changes (ties too).
          const changes = new Set(
            candidates
              .slice(0, -1)
              .map(
                (r) =>
                  ((drafts[parameter].latest - r.value) * rule.perMs) /
                  Math.max(to - r.measuredAt.getTime(), rule.perMs),
              ),
          );
          expect(changes.size).toBeLessThanOrEqual(2);
          expect(candidates.length).toBeLessThanOrEqual(full.length);
          const expected = evaluateRate(full, rule);
          expect(evaluateRate(candidates, rule), parameter).toEqual(expected);
          if (expected.breach) breaches += 1;
          else calm += 1;
        }
      }),
      {
        seed,
        numRuns: 100,
        examples: [
          // Two readings an equal change away, the worst: the earlier of them is the one named; the
          // smallest change in between.
          [
            {
              to: onTheHour,
              temperature: {
                latest: 26.5,
                earlier: [
                  { beforeMs: hourMs / 4, value: 25 },
                  { beforeMs: hourMs / 2, value: 25 },
                  { beforeMs: hourMs / 8, value: 26.4 },
                ],
              },
              ph: { latest: 7.9, earlier: [{ beforeMs: dayMs / 2, value: 8.2 }] },
            },
          ],
          // The worst change is early in an hour more than a day back (1.35 × 24/30.02 = 1.079);
          // judged at the hour's far end it would look smaller (1.045) than what an hour of the
          // last day surely reaches (1.06), and be skipped (a falling reading takes the other side).
          [
            {
              to: onTheHour,
              temperature: { latest: 25.25, earlier: [] },
              ph: {
                latest: 8.35,
                earlier: [
                  { beforeMs: 30 * hourMs + 60_000, value: 7 },
                  { beforeMs: 5.5 * hourMs, value: 7.29 },
                  { beforeMs: 2.5 * hourMs, value: 8.4 },
                ],
              },
            },
          ],
        ],
      },
    );
    // The property means something only if windows both breach and do not.
    expect(breaches).toBeGreaterThan(5);
    expect(calm).toBeGreaterThan(5);
  });

  it('reads no rate series for a parameter without a rate rule', async () => {
    const latest = new Map<ParameterKey, NewReading>([
      ['nitrate', { parameter: 'nitrate', value: 10, measuredAt: new Date(onTheHour), source: 'home-test' }],
    ]);
    expect(parameterCatalogue.nitrate.rateOfChange).toBeNull();
    const series = await loadRateSeries(stack.database.db, { id: world.tank.id, rates: {} }, latest);
    expect(series.size).toBe(0);
  });
});
