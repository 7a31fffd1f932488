import { eq } from 'drizzle-orm';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { readings, tanks } from '../../api/db/schema/index';
import { readingsFromCsv } from '@shared/readings/csv';
import { createTank, insertReadings } from '../helpers/factories';
import { minutes } from '../helpers/clock';
import { startTestStack, type TestStack } from '../helpers/stack';
import { minutesAgo, readingCount, readingsWorld } from './readings-kit';

describe('readings entered by people', () => {
  let stack: TestStack;
  let world: Awaited<ReturnType<typeof readingsWorld>>;
  const path = () => `/api/tanks/${world.tank.id}/readings`;

  beforeAll(async () => {
    stack = await startTestStack();
    world = await readingsWorld(stack);
  });
  afterAll(() => stack.close());
  afterEach(() => stack.clock.reset());

  describe('POST /api/tanks/:tankId/readings', () => {
    it('stores SG 1.026 at 25 °C on a 25 °C-referenced instrument as salinity ≈ 34.5 (EOS-80, UNESCO Tech. Pap. 44)', async () => {
      const res = await world.call('technician', 'POST', path(), {
        readings: [
          {
            parameter: 'salinity',
            value: 1.026,
            unit: 'specific gravity',
            sampleTempC: 25,
            referenceTempC: 25,
            measuredAt: minutesAgo(stack.clock.now(), 10),
            method: 'hydrometer',
          },
        ],
      });

      expect(res.status).toBe(201);
      const [saved] = res.body.readings;
      expect(saved.value).toBeCloseTo(34.5, 1);
      expect(saved).toMatchObject({
        enteredValue: 1.026,
        enteredUnit: 'specific gravity',
        sampleTempC: 25,
        referenceTempC: 25,
        source: 'visit',
        method: 'hydrometer',
        recordedBy: world.people.technician.name,
      });
    });

    it('stores the same SG 1.026 at 25 °C on a 4 °C-referenced instrument as salinity ≈ 38.5 (EOS-80, UNESCO Tech. Pap. 44)', async () => {
      const res = await world.call('technician', 'POST', path(), {
        readings: [
          {
            parameter: 'salinity',
            value: 1.026,
            unit: 'specific gravity',
            sampleTempC: 25,
            referenceTempC: 4,
            measuredAt: minutesAgo(stack.clock.now(), 9),
          },
        ],
      });

      expect(res.status).toBe(201);
      expect(res.body.readings[0].value).toBeCloseTo(38.5, 1);
      const [row] = await stack.database.db
        .select()
        .from(readings)
        .where(eq(readings.id, res.body.readings[0].id));
      expect(row).toMatchObject({ referenceTempC: 4, sampleTempC: 25, enteredUnit: 'specific gravity' });
    });

    it('lets an owner record a set of home tests on their own tank, converting each unit', async () => {
      const at = minutesAgo(stack.clock.now(), 5);
      const res = await world.call('owner', 'POST', path(), {
        readings: [
          { parameter: 'temperature', value: 78.8, unit: '°F', measuredAt: at },
          { parameter: 'alkalinity', value: 3, unit: 'meq/L', measuredAt: at, method: 'titration kit' },
          { parameter: 'nitrate', value: 5, unit: 'mg/L NO3', measuredAt: at, note: 'after feeding' },
        ],
      });

      expect(res.status).toBe(201);
      expect(res.body.readings.map((r: { source: string }) => r.source)).toEqual([
        'home-test',
        'home-test',
        'home-test',
      ]);
      expect(res.body.readings[0].value).toBeCloseTo(26, 6);
      // 1 dKH = 0.35665 meq/L (10 mg/L CaO; Standard Methods 2320 B with 50.04 mg CaCO3 per meq).
      expect(res.body.readings[1].value).toBeCloseTo(3 / 0.35665, 2);
      expect(res.body.readings[2]).toMatchObject({ value: 5, note: 'after feeding' });
    });

    it('refuses visit readings from an owner', async () => {
      const res = await world.call('owner', 'POST', path(), {
        source: 'visit',
        readings: [{ parameter: 'ph', value: 8.1, unit: '', measuredAt: minutesAgo(stack.clock.now(), 1) }],
      });

      expect(res.status).toBe(403);
    });

    it('lets staff record a home test taken by the owner', async () => {
      const res = await world.call('admin', 'POST', path(), {
        source: 'home-test',
        readings: [{ parameter: 'ph', value: 8.1, unit: '', measuredAt: minutesAgo(stack.clock.now(), 1) }],
      });

      expect(res.status).toBe(201);
      expect(res.body.readings[0].source).toBe('home-test');
    });

    it('saves nothing when one row of the batch is wrong, and names the row and field', async () => {
      const before = await readingCount(stack.database.db, world.tank.id);
      const at = minutesAgo(stack.clock.now(), 2);
      const res = await world.call('technician', 'POST', path(), {
        readings: [
          { parameter: 'temperature', value: 25.8, unit: '°C', measuredAt: at },
          { parameter: 'calcium', value: 420, unit: 'dKH', measuredAt: at },
          { parameter: 'ph', value: 81, unit: '', measuredAt: at },
        ],
      });

      expect(res.status).toBe(400);
      expect(res.body.error.issues.map((i: { path: string }) => i.path)).toEqual([
        'body.readings.1.unit',
        'body.readings.2.value',
      ]);
      expect(await readingCount(stack.database.db, world.tank.id)).toBe(before);
    });

    it('rejects a reading dated more than 5 minutes in the future, and accepts one 4 minutes ahead', async () => {
      const now = stack.clock.now();
      const ahead = (n: number) => new Date(now.getTime() + minutes(n)).toISOString();
      const late = await world.call('technician', 'POST', path(), {
        readings: [
          { parameter: 'ph', value: 8.1, unit: '', measuredAt: ahead(4) },
          { parameter: 'ph', value: 8.2, unit: '', measuredAt: ahead(6) },
        ],
      });
      const fine = await world.call('technician', 'POST', path(), {
        readings: [{ parameter: 'ph', value: 8.1, unit: '', measuredAt: ahead(4) }],
      });

      expect(late.status).toBe(400);
      expect(late.body.error.issues).toEqual([
        { path: 'body.readings.1.measuredAt', message: expect.stringContaining('future') },
      ]);
      expect(fine.status).toBe(201);
    });

    it('follows the server clock for "the future"', async () => {
      const at = new Date(stack.clock.now().getTime() + minutes(30)).toISOString();
      const early = await world.call('technician', 'POST', path(), {
        readings: [{ parameter: 'ph', value: 8.1, unit: '', measuredAt: at }],
      });
      stack.clock.advance(minutes(30));
      const onTime = await world.call('technician', 'POST', path(), {
        readings: [{ parameter: 'ph', value: 8.1, unit: '', measuredAt: at }],
      });

      expect([early.status, onTime.status]).toEqual([400, 201]);
    });

    it('rejects a reading from before the tank existed', async () => {
      const res = await world.call('technician', 'POST', path(), {
        readings: [{ parameter: 'ph', value: 8.1, unit: '', measuredAt: '2019-06-01T10:00:00Z' }],
      });

      expect(res.status).toBe(400);
      expect(res.body.error.issues[0]).toMatchObject({
        path: 'body.readings.0.measuredAt',
        message: expect.stringContaining('before the tank existed'),
      });
    });

    it('dates a tank without a set-up day from when it was added', async () => {
      const fresh = await createTank(stack.database.db, {
        companyId: world.company.id,
        owners: [world.people.owner],
      });
      const res = await world.call('owner', 'POST', `/api/tanks/${fresh.id}/readings`, {
        readings: [{ parameter: 'ph', value: 8.1, unit: '', measuredAt: minutesAgo(fresh.createdAt, 60) }],
      });

      expect(res.status).toBe(400);
    });

    it("answers another owner's tank and another company's tank with the same 404 as a missing one", async () => {
      const body = {
        readings: [{ parameter: 'ph', value: 8.1, unit: '', measuredAt: minutesAgo(stack.clock.now(), 1) }],
      };
      const otherOwner = await world.call('otherOwner', 'POST', path(), body);
      const stranger = await world.call('stranger', 'POST', path(), body);
      const missing = await world.call(
        'stranger',
        'POST',
        '/api/tanks/00000000-0000-4000-8000-000000000000/readings',
        body,
      );

      expect([otherOwner.status, stranger.status, missing.status]).toEqual([404, 404, 404]);
      expect(stranger.body).toEqual(missing.body);
    });
  });

  describe('GET /api/tanks/:tankId/readings/list', () => {
    it('pages newest first with a cursor, filtered by parameter and source', async () => {
      const { tank } = await readingsWorldTank();
      const now = stack.clock.now();
      await world.call('technician', 'POST', `/api/tanks/${tank}/readings`, {
        readings: Array.from({ length: 5 }, (_, i) => ({
          parameter: 'temperature',
          value: 25 + i / 10,
          unit: '°C',
          measuredAt: minutesAgo(now, 60 - i),
        })),
      });
      await world.call('owner', 'POST', `/api/tanks/${tank}/readings`, {
        readings: [{ parameter: 'nitrate', value: 4, unit: 'mg/L NO3', measuredAt: minutesAgo(now, 30) }],
      });

      const first = await world.call('owner', 'GET', `/api/tanks/${tank}/readings/list?limit=4`);
      const second = await world.call(
        'owner',
        'GET',
        `/api/tanks/${tank}/readings/list?limit=4&before=${encodeURIComponent(first.body.next)}`,
      );
      const visits = await world.call(
        'owner',
        'GET',
        `/api/tanks/${tank}/readings/list?parameter=temperature&source=visit`,
      );
      const home = await world.call('owner', 'GET', `/api/tanks/${tank}/readings/list?source=home-test`);

      expect(first.body.readings.map((r: { parameter: string }) => r.parameter)).toEqual([
        'nitrate',
        'temperature',
        'temperature',
        'temperature',
      ]);
      expect(second.body.readings).toHaveLength(2);
      expect(second.body.next).toBeNull();
      expect(visits.body.readings).toHaveLength(5);
      expect(home.body.readings.map((r: { value: number }) => r.value)).toEqual([4]);
    });
  });

  describe('CSV export and import', () => {
    it('exports readings as CSV that imports again into another tank', async () => {
      const { tank } = await readingsWorldTank();
      const now = stack.clock.now();
      await world.call('technician', 'POST', `/api/tanks/${tank}/readings`, {
        readings: [
          {
            parameter: 'salinity',
            value: 1.0255,
            unit: 'specific gravity',
            sampleTempC: 24,
            referenceTempC: 25,
            measuredAt: minutesAgo(now, 20),
            note: '=looks, fine',
          },
          { parameter: 'orp', value: -20, unit: 'mV', measuredAt: minutesAgo(now, 10) },
        ],
      });

      const exported = await world.call('owner', 'GET', `/api/tanks/${tank}/readings/export`);
      const parsed = readingsFromCsv(exported.body as string, 'home-test');
      const { tank: target } = await readingsWorldTank();
      const imported = await world.call('technician', 'POST', `/api/tanks/${target}/readings/import`, {
        readings: parsed.rows.map((row) => row.reading),
      });
      const copy = await world.call('owner', 'GET', `/api/tanks/${target}/readings/list`);
      const original = await world.call('owner', 'GET', `/api/tanks/${tank}/readings/list`);
      const essentials = (list: { readings: Record<string, unknown>[] }) =>
        list.readings.map(({ parameter, value, enteredValue, enteredUnit, measuredAt, source, note }) => ({
          parameter,
          value,
          enteredValue,
          enteredUnit,
          measuredAt,
          source,
          note,
        }));

      expect(exported.status).toBe(200);
      expect(exported.headers.get('content-type')).toMatch(/^text\/csv/);
      expect(exported.headers.get('content-disposition')).toMatch(/^attachment; filename=".+\.csv"$/);
      expect((exported.body as string).split('\r\n')[0]).toBe(
        'measured_at,parameter,value,unit,source,method,note,sample_temp_c,reference_temp_c,stored_value,recorded_by',
      );
      // A note a spreadsheet would run as a formula is written as text (OWASP, CSV Injection).
      expect(exported.body).toContain(`"'=looks, fine"`);
      expect(parsed.ignoredColumns).toEqual(['stored_value', 'recorded_by']);
      expect(parsed.rows.every((row) => row.issues.length === 0)).toBe(true);
      expect(imported.status).toBe(201);
      expect(imported.body).toEqual({ imported: 2 });
      expect(essentials(copy.body)).toEqual(essentials(original.body));
    });

    it('refuses the whole import when a row is wrong, naming each row', async () => {
      const { tank } = await readingsWorldTank();
      const at = minutesAgo(stack.clock.now(), 5);
      const res = await world.call('owner', 'POST', `/api/tanks/${tank}/readings/import`, {
        readings: [
          { parameter: 'ph', value: 8.1, unit: '', measuredAt: at, source: 'home-test' },
          { parameter: 'ph', value: 8.1, unit: '', measuredAt: at, source: 'visit' },
          { parameter: 'ph', value: 8.1, unit: '', measuredAt: '2031-01-01T00:00:00Z', source: 'home-test' },
        ],
      });

      expect(res.status).toBe(400);
      expect(res.body.error.issues.map((i: { path: string }) => i.path)).toEqual([
        'body.readings.1.source',
        'body.readings.2.measuredAt',
      ]);
      expect(await readingCount(stack.database.db, tank)).toBe(0);
    });

    it('exports every reading exactly once, oldest first, across page boundaries', async () => {
      const { tank } = await readingsWorldTank();
      const target = { id: tank, companyId: world.company.id };
      const end = stack.clock.now().getTime() - 60 * 60_000;
      // 4,500 temperatures and 2,300 pH readings: both cross the 2,000-row pages, and every third
      // pH shares its moment with a temperature, so ties between parameters must be broken by id.
      await insertReadings(
        stack.database.db,
        target,
        Array.from({ length: 4500 }, (_, i) => ({
          parameter: 'temperature' as const,
          value: 25 + (i % 10) / 10,
          measuredAt: new Date(end - (4500 - i) * 60_000),
        })),
      );
      await insertReadings(
        stack.database.db,
        target,
        Array.from({ length: 2300 }, (_, i) => ({
          parameter: 'ph' as const,
          value: 8 + (i % 5) / 100,
          measuredAt: new Date(end - (4500 - i * 3) * 60_000 + (i % 3 === 0 ? 0 : 30_000)),
        })),
      );
      const expected = (
        await stack.database.pool.query<{ id: string; at: Date; parameter: string }>(
          'select id, measured_at as at, parameter from readings where tank_id = $1 order by measured_at, id',
          [tank],
        )
      ).rows.map((row) => `${row.at.toISOString()} ${row.parameter}`);

      const res = await world.call('owner', 'GET', `/api/tanks/${tank}/readings/export`);
      const lines = (res.body as string).split('\r\n').filter(Boolean).slice(1);
      const exported = lines.map((line) => line.split(',').slice(0, 2).join(' '));
      const times = lines.map((line) => Date.parse(line.split(',')[0]!));

      expect(res.status).toBe(200);
      expect(expected).toHaveLength(6800);
      expect(exported).toEqual(expected);
      expect(times.every((t, i) => i === 0 || t >= times[i - 1]!)).toBe(true);
    });

    it('refuses an export longer than 400 days, naming the limit', async () => {
      const { tank } = await readingsWorldTank();
      const to = stack.clock.now();
      const from = new Date(to.getTime() - 401 * 24 * 3_600_000);

      const res = await world.call(
        'owner',
        'GET',
        `/api/tanks/${tank}/readings/export?from=${from.toISOString()}&to=${to.toISOString()}`,
      );

      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('range_too_long');
      expect(res.body.error.message).toMatch(/at most 400 days/);
      expect(res.body.error.issues).toEqual([{ path: 'query.from', message: expect.any(String) }]);
    });
  });

  describe('GET /api/tanks/:tankId/readings/latest', () => {
    it('gives the latest reading of each parameter with its health and limits', async () => {
      const { tank } = await readingsWorldTank();
      const now = stack.clock.now();
      await world.call('technician', 'POST', `/api/tanks/${tank}/readings`, {
        readings: [
          { parameter: 'temperature', value: 25.2, unit: '°C', measuredAt: minutesAgo(now, 120) },
          { parameter: 'temperature', value: 29.4, unit: '°C', measuredAt: minutesAgo(now, 60) },
        ],
      });

      const res = await world.call('owner', 'GET', `/api/tanks/${tank}/readings/latest`);

      expect(res.status).toBe(200);
      expect(res.body.status).toBe('alert');
      expect(
        res.body.parameters.find((p: { parameter: string }) => p.parameter === 'temperature'),
      ).toMatchObject({
        health: 'critical',
        watched: true,
        latest: { value: 29.4, source: 'visit' },
        limitsSource: 'template',
        limits: { warnLow: 24, warnHigh: 27.5, critLow: 22.5, critHigh: 29 },
      });
    });
  });

  /** A fresh tank of the owner's, so each test starts from no readings. */
  async function readingsWorldTank() {
    const created = await createTank(stack.database.db, {
      companyId: world.company.id,
      owners: [world.people.owner],
    });
    await stack.database.db.update(tanks).set({ setUpOn: '2024-03-01' }).where(eq(tanks.id, created.id));
    return { tank: created.id };
  }
});
