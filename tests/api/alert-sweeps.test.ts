import { eq } from 'drizzle-orm';
import { reportingRhythmLookBackMs } from '@shared/alerts/stale-device';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { alerts, devices, readings } from '../../api/db/schema/index';
import { hashToken, newSecretToken } from '../../api/lib/tokens';
import { sweepOverdueTests, sweepStaleDevices } from '../../api/services/sweeps';
import { days, minutes } from '../helpers/clock';
import { createCompany, createTank, insertReadings } from '../helpers/factories';
import { startTestStack, type TestStack } from '../helpers/stack';

describe('scheduled alert sweeps', () => {
  let stack: TestStack;
  let tank: { id: string; companyId: string };

  beforeAll(async () => {
    stack = await startTestStack();
    const company = await createCompany(stack.database.db);
    tank = await createTank(stack.database.db, { companyId: company.id, name: 'Office reef' });
  });
  afterAll(() => stack.close());
  afterEach(async () => {
    stack.clock.reset();
    await stack.database.pool.query('delete from alerts; delete from readings; delete from devices');
  });

  async function addDevice(lastSeenAt: Date | null, createdAt?: Date) {
    const [device] = await stack.database.db
      .insert(devices)
      .values({
        companyId: tank.companyId,
        tankId: tank.id,
        name: 'Sump probe',
        tokenHash: hashToken(newSecretToken()),
        tokenHint: 'bw_xxxx',
        lastSeenAt,
        ...(createdAt ? { createdAt } : {}),
      })
      .returning();
    return device!;
  }

  /** A device's temperature reports at the given epoch-ms times, stored straight into readings. */
  async function deviceReports(device: { id: string }, times: readonly number[]) {
    await stack.database.db.insert(readings).values(
      times.map((at) => ({
        companyId: tank.companyId,
        tankId: tank.id,
        deviceId: device.id,
        parameter: 'temperature' as const,
        value: 25,
        enteredValue: 25,
        enteredUnit: 'stored',
        measuredAt: new Date(at),
        source: 'device' as const,
      })),
    );
  }

  it('opens one alert for a device silent for more than 30 minutes, and closes it when it reports again', async () => {
    const device = await addDevice(new Date(stack.clock.now().getTime() - minutes(31)));

    expect(await sweepStaleDevices(stack.deps)).toHaveLength(1);
    expect(await sweepStaleDevices(stack.deps)).toHaveLength(0);
    const [open] = await stack.database.db.select().from(alerts);
    expect(open).toMatchObject({
      kind: 'device-stale',
      status: 'open',
      ruleKey: `device-stale:${device.id}`,
    });
    expect(open!.body).toMatch(/Sump probe/);

    await stack.database.db
      .update(devices)
      .set({ lastSeenAt: stack.clock.now() })
      .where(eq(devices.id, device.id));
    await sweepStaleDevices(stack.deps);

    expect((await stack.database.db.select().from(alerts))[0]!.status).toBe('resolved');
  });

  it('leaves a device that reported 29 minutes ago alone', async () => {
    await addDevice(new Date(stack.clock.now().getTime() - minutes(29)));
    expect(await sweepStaleDevices(stack.deps)).toEqual([]);
  });

  it('gives a device that has never reported 30 minutes from when it was added, then opens an alert', async () => {
    const added = stack.clock.now();
    await addDevice(null, added);

    stack.clock.advance(minutes(29));
    expect(await sweepStaleDevices(stack.deps)).toEqual([]);

    stack.clock.advance(minutes(16));
    expect(await sweepStaleDevices(stack.deps)).toHaveLength(1);
    const [open] = await stack.database.db.select().from(alerts);
    expect(open).toMatchObject({ kind: 'device-stale', status: 'open' });
    expect(open!.body).toMatch(/^Sump probe has sent no reading since it was added 45 minutes ago\./);
  });

  it('judges each device by its own reporting rhythm, all in one sweep', async () => {
    const now = stack.clock.now().getTime();
    // Eleven reports each: one device every 5 minutes (stale after 30), one every hour (after 3 h).
    const reports = (device: { id: string }, everyMin: number, lastMinAgo: number) =>
      deviceReports(
        device,
        Array.from({ length: 11 }, (_, i) => now - minutes(lastMinAgo + i * everyMin)),
      );
    const frequent = await addDevice(new Date(now - minutes(40)));
    const hourly = await addDevice(new Date(now - minutes(120)));
    await reports(frequent, 5, 40);
    await reports(hourly, 60, 120);

    expect(await sweepStaleDevices(stack.deps)).toHaveLength(1);
    const open = await stack.database.db.select().from(alerts);
    expect(open.map((alert) => alert.ruleKey)).toEqual([`device-stale:${frequent.id}`]);

    // Three missed hours later the hourly one is silent too; the first stays open, not doubled.
    stack.clock.advance(minutes(61));
    expect(await sweepStaleDevices(stack.deps)).toHaveLength(1);
    const ruleKeys = (await stack.database.db.select().from(alerts)).map((alert) => alert.ruleKey);
    expect(ruleKeys.sort()).toEqual([`device-stale:${frequent.id}`, `device-stale:${hourly.id}`].sort());
  });

  it('finds a rhythm only in the reports of the 90 days before the device was last seen', async () => {
    const now = stack.clock.now().getTime();
    const lastSeen = now - minutes(40);
    const device = await addDevice(new Date(lastSeen));
    // Hourly long ago, then one report 40 minutes ago: the old hours would set "stale after 3 h".
    await deviceReports(device, [
      lastSeen,
      ...Array.from({ length: 10 }, (_, i) => lastSeen - reportingRhythmLookBackMs - minutes(60 * (i + 1))),
    ]);

    // One report in the window shows no rhythm, so the 30-minute default holds: silent at 40.
    expect(await sweepStaleDevices(stack.deps)).toHaveLength(1);
    const [open] = await stack.database.db.select().from(alerts);
    expect(open).toMatchObject({ ruleKey: `device-stale:${device.id}`, status: 'open' });
  });

  it('raises a low-urgency notice when a home test is overdue, and clears it after a new test', async () => {
    const lastTest = new Date(stack.clock.now().getTime() - days(8));
    await insertReadings(stack.database.db, tank, [
      { parameter: 'alkalinity', value: 8.2, measuredAt: lastTest, source: 'home-test' },
    ]);

    await sweepOverdueTests(stack.deps);
    const [notice] = await stack.database.db.select().from(alerts);
    expect(notice).toMatchObject({
      kind: 'test-overdue',
      severity: 'notice',
      parameter: 'alkalinity',
      status: 'open',
    });

    await insertReadings(stack.database.db, tank, [
      { parameter: 'alkalinity', value: 8.3, measuredAt: stack.clock.now(), source: 'home-test' },
    ]);
    await sweepOverdueTests(stack.deps);

    expect((await stack.database.db.select().from(alerts))[0]!.status).toBe('resolved');
  });
});
