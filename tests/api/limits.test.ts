import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { livestock, tanks } from '../../api/db/schema/index';
import { healthForTanks } from '../../api/services/tank-health';
import { findSpecies } from '@shared/livestock/catalogue';
import { comfortRange } from '@shared/livestock/comfort-range';
import { limitTemplates, limitTemplatesSource } from '@shared/parameters/limit-templates';
import { createTank } from '../helpers/factories';
import { startTestStack, type TestStack } from '../helpers/stack';
import { minutesAgo, readingsWorld } from './readings-kit';

describe('tank limits', () => {
  let stack: TestStack;
  let world: Awaited<ReturnType<typeof readingsWorld>>;
  const path = () => `/api/tanks/${world.tank.id}/limits`;
  type View = { parameter: string; [key: string]: unknown };
  const find = (body: { parameters: View[] }, parameter: string) =>
    body.parameters.find((p) => p.parameter === parameter);

  beforeAll(async () => {
    stack = await startTestStack();
    world = await readingsWorld(stack, { signIn: ['owner', 'technician', 'stranger'] });
  });
  afterAll(() => stack.close());

  describe('GET /api/tanks/:tankId/limits', () => {
    it("falls back to the style's template, marked as common practice, where the tank has no limits", async () => {
      const res = await world.call('owner', 'GET', path());

      expect(res.status).toBe(200);
      expect(res.body.style).toBe('mixed-reef');
      expect(res.body.templateSource).toBe(limitTemplatesSource);
      expect(res.body.templateSource).toMatch(/^Common practice/);
      expect(find(res.body, 'alkalinity')).toMatchObject({
        source: 'template',
        limits: limitTemplates['mixed-reef'].alkalinity,
        template: limitTemplates['mixed-reef'].alkalinity,
      });
      // A marine tank is not offered freshwater hardness.
      expect(find(res.body, 'gh')).toBeUndefined();
    });

    it('shows the comfort range of the livestock present now beside each limit', async () => {
      const tank = await createTank(stack.database.db, {
        companyId: world.company.id,
        owners: [world.people.owner],
      });
      const here = ['ocellaris-clownfish', 'yellow-tang'];
      await stack.database.db.insert(livestock).values([
        { companyId: world.company.id, tankId: tank.id, catalogueSpeciesId: here[0], status: 'thriving' },
        { companyId: world.company.id, tankId: tank.id, catalogueSpeciesId: here[1], status: 'sick' },
        // Gone animals no longer narrow the range.
        {
          companyId: world.company.id,
          tankId: tank.id,
          catalogueSpeciesId: 'flame-angelfish',
          status: 'died',
        },
      ]);
      const expected = comfortRange(here.map((id) => findSpecies(id)!)).ranges.temperature!;

      const res = await world.call('owner', 'GET', `/api/tanks/${tank.id}/limits`);

      expect(res.body.inhabitants).toBe(2);
      expect(find(res.body, 'temperature')!.comfort).toMatchObject({ min: expected.min, max: expected.max });
      // Named as people know them, not by catalogue id.
      const { limitedBy } = find(res.body, 'temperature')!.comfort as { limitedBy: { low: string[] } };
      expect([...limitedBy.low].sort()).toEqual(
        expected.limitedBy.low.map((id) => findSpecies(id)!.commonName).sort(),
      );
    });

    it("answers another company's tank with 404", async () => {
      expect((await world.call('stranger', 'GET', path())).status).toBe(404);
    });
  });

  describe('PUT /api/tanks/:tankId/limits', () => {
    it('stores the tank’s own limits, and null goes back to the template', async () => {
      const own = { warnLow: 24.5, warnHigh: 26.5, critLow: 23, critHigh: 28 };
      const set = await world.call('technician', 'PUT', path(), { limits: { temperature: own } });
      const back = await world.call('technician', 'PUT', path(), { limits: { temperature: null } });

      expect(set.status).toBe(200);
      expect(find(set.body, 'temperature')).toMatchObject({ source: 'tank', limits: own });
      expect(find(set.body, 'temperature')!.updatedAt).toEqual(expect.any(String));
      expect(find(back.body, 'temperature')).toMatchObject({
        source: 'template',
        limits: limitTemplates['mixed-reef'].temperature,
      });
    });

    it('refuses crossed bands and implausible bounds, naming the field', async () => {
      const res = await world.call('technician', 'PUT', path(), {
        limits: {
          ph: { warnLow: 7.9, warnHigh: 8.4, critLow: 8.0, critHigh: 8.6 },
          salinity: { warnLow: 34, warnHigh: 36, critLow: 32, critHigh: 70 },
        },
      });

      expect(res.status).toBe(400);
      expect(res.body.error.issues.map((i: { path: string }) => i.path).sort()).toEqual([
        'body.limits.ph.critLow',
        'body.limits.salinity.critHigh',
      ]);
    });

    it('lets staff stop watching a parameter by clearing every bound', async () => {
      const tank = await createTank(stack.database.db, { companyId: world.company.id });
      const none = { warnLow: null, warnHigh: null, critLow: null, critHigh: null };

      const res = await world.call('technician', 'PUT', `/api/tanks/${tank.id}/limits`, {
        limits: { orp: none },
      });
      const health = await healthForTanks(stack.database.db, [tank.id], new Date());

      expect(find(res.body, 'orp')).toMatchObject({ source: 'tank', limits: none });
      expect(health.get(tank.id)!.parameters.map((p) => p.parameter)).not.toContain('orp');
    });

    it('is for staff only', async () => {
      const res = await world.call('owner', 'PUT', path(), { limits: { temperature: null } });
      expect(res.status).toBe(403);
    });

    it('stores a rate rule of the tank’s own beside the template limits, and null goes back to the default', async () => {
      const tank = await createTank(stack.database.db, { companyId: world.company.id });
      const tankPath = `/api/tanks/${tank.id}/limits`;
      const rule = { maxChange: 0.5, perHours: 2 };

      const set = await world.call('technician', 'PUT', tankPath, { rates: { temperature: rule } });
      const read = await world.call('technician', 'GET', tankPath);
      const back = await world.call('technician', 'PUT', tankPath, { rates: { temperature: null } });

      expect(set.status).toBe(200);
      expect(find(read.body, 'temperature')).toMatchObject({
        rate: rule,
        defaultRate: { maxChange: 1, perHours: 1 },
        limits: limitTemplates['mixed-reef'].temperature,
      });
      expect(find(read.body, 'alkalinity')).toMatchObject({
        rate: null,
        defaultRate: { maxChange: 1, perHours: 24 },
      });
      // Day-night swings make a default rate rule for pH meaningless.
      expect(find(read.body, 'ph')).toMatchObject({ rate: null, defaultRate: null });
      expect(back.status).toBe(200);
      expect(find(back.body, 'temperature')).toMatchObject({
        rate: null,
        source: 'template',
        limits: limitTemplates['mixed-reef'].temperature,
      });
    });

    it('keeps a tank’s rate rule when its limits go back to the template, and keeps judging health by them', async () => {
      const tank = await createTank(stack.database.db, { companyId: world.company.id });
      const tankPath = `/api/tanks/${tank.id}/limits`;
      const rule = { maxChange: 0.4, perHours: 1 };
      await world.call('technician', 'PUT', tankPath, {
        limits: { temperature: { warnLow: 24.5, warnHigh: 26.5, critLow: 23, critHigh: 28 } },
        rates: { temperature: rule },
      });

      const res = await world.call('technician', 'PUT', tankPath, { limits: { temperature: null } });
      const health = await healthForTanks(stack.database.db, [tank.id], new Date());

      expect(find(res.body, 'temperature')).toMatchObject({
        rate: rule,
        limits: limitTemplates['mixed-reef'].temperature,
      });
      expect(health.get(tank.id)!.parameters.map((p) => p.parameter)).toContain('temperature');
    });

    it('refuses a zero change, a period outside 15 minutes to a week and a change no reading could make, naming the field', async () => {
      const res = await world.call('technician', 'PUT', path(), {
        rates: {
          temperature: { maxChange: 0, perHours: 0.1 },
          salinity: { maxChange: 1, perHours: 200 },
          alkalinity: { maxChange: 500, perHours: 24 },
        },
      });

      expect(res.status).toBe(400);
      expect(res.body.error.issues.map((i: { path: string }) => i.path).sort()).toEqual([
        'body.rates.alkalinity.maxChange',
        'body.rates.salinity.perHours',
        'body.rates.temperature.maxChange',
        'body.rates.temperature.perHours',
      ]);
      expect(find((await world.call('technician', 'GET', path())).body, 'alkalinity')!.rate).toBeNull();
    });

    it('refuses an owner who tries to change a rate rule', async () => {
      const res = await world.call('owner', 'PUT', path(), {
        rates: { temperature: { maxChange: 0.5, perHours: 1 } },
      });

      expect(res.status).toBe(403);
      expect(find((await world.call('owner', 'GET', path())).body, 'temperature')!.rate).toBeNull();
    });

    it("answers another company's tank with 404", async () => {
      const res = await world.call('stranger', 'PUT', path(), {
        rates: { temperature: { maxChange: 0.5, perHours: 1 } },
      });

      expect(res.status).toBe(404);
    });

    it('applies to the health of the tank at once', async () => {
      const tank = await createTank(stack.database.db, {
        companyId: world.company.id,
        owners: [world.people.owner],
      });
      await stack.database.db.update(tanks).set({ setUpOn: '2024-01-01' }).where(eq(tanks.id, tank.id));
      await world.call('technician', 'POST', `/api/tanks/${tank.id}/readings`, {
        readings: [
          { parameter: 'nitrate', value: 30, unit: 'mg/L NO3', measuredAt: minutesAgo(new Date(), 5) },
        ],
      });
      const before = await world.call('owner', 'GET', `/api/tanks/${tank.id}/readings/latest`);
      const openBefore = await world.call('owner', 'GET', `/api/alerts?tankId=${tank.id}`);
      await world.call('technician', 'PUT', `/api/tanks/${tank.id}/limits`, {
        limits: { nitrate: { warnLow: null, warnHigh: 35, critLow: null, critHigh: 60 } },
      });
      const after = await world.call('owner', 'GET', `/api/tanks/${tank.id}/readings/latest`);
      const openAfter = await world.call('owner', 'GET', `/api/alerts?tankId=${tank.id}`);

      expect(find(before.body, 'nitrate')!.health).toBe('warning');
      expect(find(after.body, 'nitrate')!.health).toBe('in-range');
      // The alert the old limits opened closes with the change, not at the next reading.
      expect(openBefore.body.map((alert: { parameter: string }) => alert.parameter)).toEqual(['nitrate']);
      expect(openAfter.body).toEqual([]);
    });
  });
});
