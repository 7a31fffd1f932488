import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { TankHealthSummary } from '@shared/schemas/readings';
import type { TankDetail, TankSummary } from '@shared/schemas/tanks';
import { demoCompanies, demoId, demoTanks, seedDemo } from '../../api/dev/seed/index';
import { createPerson } from '../helpers/factories';
import { HttpBrowser } from '../helpers/http-browser';
import { signIn, startTestStack, type TestStack } from '../helpers/stack';

/**
 * "A status you can trust": on the demo tanks, with the alerts their stories raise, the tank list,
 * the tank page, the latest-readings tiles and the readings header give one status and one reason.
 */
describe('tank status across the API (demo tanks)', () => {
  let stack: TestStack;
  let browser: HttpBrowser;

  beforeAll(async () => {
    stack = await startTestStack();
    const { db, pool } = stack.database;
    await seedDemo(db, { issuer: stack.idp.issuer, now: stack.clock.now() });
    const { rows } = await pool.query<{ id: string }>('select id from companies where slug = $1', [
      demoCompanies[0].slug,
    ]);
    const admin = await createPerson(db, { companyId: rows[0]!.id, role: 'admin', issuer: stack.idp.issuer });
    browser = new HttpBrowser();
    await signIn(stack, browser, admin);
  }, 300_000);
  afterAll(() => stack.close());

  const get = async <T>(path: string): Promise<T> => {
    const res = await browser.visit(`${stack.origin}${path}`);
    expect([path, res.status]).toEqual([path, 200]);
    return (await res.json()) as T;
  };

  it('gives the same status and reason in the list, the tank page and the readings', async () => {
    const list = await get<TankSummary[]>('/api/tanks');
    const driftglassTanks = demoTanks.filter((tank) => list.some((row) => row.id === demoId(tank.key)));
    expect(driftglassTanks.length).toBeGreaterThan(0);

    for (const { key } of driftglassTanks) {
      const id = demoId(key);
      const inList = list.find((row) => row.id === id)!;
      const detail = await get<TankDetail>(`/api/tanks/${id}`);
      const latest = await get<TankHealthSummary>(`/api/tanks/${id}/readings/latest`);
      const open = (
        await stack.database.pool.query<{ severity: string; n: number }>(
          `select severity, count(*)::int as n from alerts where tank_id = $1 and status <> 'resolved' group by 1`,
          [id],
        )
      ).rows;

      expect({ key, list: [inList.status, inList.statusReason] }).toEqual({
        key,
        list: [detail.status, detail.statusReason],
      });
      expect({ key, readings: [latest.status, latest.statusReason] }).toEqual({
        key,
        readings: [detail.status, detail.statusReason],
      });
      expect(detail.statusReason.length).toBeGreaterThan(0);

      // Open alerts and the status never tell two stories.
      const severities = new Set(open.map((row) => row.severity));
      if (severities.has('critical')) expect([key, detail.status]).toEqual([key, 'alert']);
      else if (severities.has('warning')) expect([key, detail.status]).not.toEqual([key, 'healthy']);

      // Each tile agrees with the tank: a tank is only as good as its worst watched tile.
      const tiles = latest.parameters.filter((p) => p.watched);
      for (const tile of latest.parameters) expect(tile.reason.length).toBeGreaterThan(0);
      if (tiles.some((t) => t.health === 'critical')) expect([key, latest.status]).toEqual([key, 'alert']);
      if (tiles.some((t) => t.health === 'warning'))
        expect([key, ['watch', 'alert'].includes(latest.status)]).toEqual([key, true]);
      if (latest.status === 'healthy') {
        expect({ key, tiles: tiles.map((t) => [t.parameter, t.health]) }).toEqual({
          key,
          tiles: tiles.map((t) => [t.parameter, 'in-range']),
        });
      }
      // A tile off the comfort range or under an alert is never "in range".
      for (const tile of tiles.filter((t) => t.health === 'in-range'))
        expect([key, tile.parameter, tile.reason]).toEqual([
          key,
          tile.parameter,
          expect.stringMatching(/in range$/),
        ]);
    }
  });

  it('times device data by each device’s own interval', async () => {
    const fromDevice: TankHealthSummary['parameters'] = [];
    for (const row of await get<TankSummary[]>('/api/tanks')) {
      const latest = await get<TankHealthSummary>(`/api/tanks/${row.id}/readings/latest`);
      fromDevice.push(...latest.parameters.filter((p) => p.latest?.source === 'device'));
    }
    expect(fromDevice.length).toBeGreaterThan(0);
    // The demo devices report every 5 minutes: three intervals is under the 30-minute floor.
    for (const tile of fromDevice) {
      expect([tile.parameter, tile.expectedIntervalMs]).toEqual([tile.parameter, 30 * 60_000]);
    }
  });
});
