import { and, eq, ne } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { alerts, devices, readings } from '../../api/db/schema/index';
import { ingestRateLimit } from '../../api/routes/ingest';
import { findDeviceByToken } from '../../api/services/devices';
import { writeDeviceGroup, type DeviceRow } from '../../api/services/ingest';
import { createTank } from '../helpers/factories';
import { startTestStack, type TestStack } from '../helpers/stack';
import { deviceFor, minutesAgo, readingCount, readingsWorld } from './readings-kit';

describe('device ingest', () => {
  let stack: TestStack;
  let world: Awaited<ReturnType<typeof readingsWorld>>;

  beforeAll(async () => {
    stack = await startTestStack();
    world = await readingsWorld(stack, { signIn: ['owner', 'technician', 'stranger'] });
  });
  afterAll(() => stack.close());

  const ingest = async (token: string | null, body: unknown, headers: Record<string, string> = {}) => {
    const res = await fetch(`${stack.origin}/api/ingest/readings`, {
      method: 'POST',
      headers: {
        'content-type': 'application/json',
        ...(token ? { authorization: `Bearer ${token}` } : {}),
        ...headers,
      },
      body: typeof body === 'string' ? body : JSON.stringify(body),
    });
    const text = await res.text();
    // eslint-disable-next-line @typescript-eslint/no-explicit-any -- tests read whatever the API answered
    return { status: res.status, headers: res.headers, body: (text ? JSON.parse(text) : null) as any };
  };

  const series = (count: number, start = 60) =>
    Array.from({ length: count }, (_, i) => ({
      parameter: 'temperature',
      value: 25 + (i % 10) / 10,
      unit: '°C',
      measuredAt: minutesAgo(new Date(), start - i),
    }));

  async function freshDevice() {
    return deviceFor(stack.database.db, world.people.technician, world.tank.id);
  }

  describe('POST /api/ingest/readings', () => {
    it('stores a batch for the token’s tank without a session or a same-origin header', async () => {
      const device = await freshDevice();
      const before = await readingCount(stack.database.db, world.tank.id);

      const res = await ingest(device.token, { readings: series(3) });

      expect(res.status).toBe(200);
      expect(res.body).toEqual({ accepted: 3, duplicate: 0, rejected: [] });
      expect(res.headers.get('set-cookie')).toBeNull();
      expect(await readingCount(stack.database.db, world.tank.id)).toBe(before + 3);
      const [seen] = await stack.database.db.select().from(devices).where(eq(devices.id, device.id));
      expect(seen!.lastSeenAt).not.toBeNull();
    });

    it('adds nothing when the same batch comes twice', async () => {
      const device = await freshDevice();
      const batch = { readings: series(5, 120) };
      const first = await ingest(device.token, batch);
      const count = await readingCount(stack.database.db, world.tank.id);

      const again = await ingest(device.token, batch);

      expect(first.body).toMatchObject({ accepted: 5, duplicate: 0 });
      expect(again.body).toEqual({ accepted: 0, duplicate: 5, rejected: [] });
      expect(await readingCount(stack.database.db, world.tank.id)).toBe(count);
    });

    it('drops duplicates inside one batch before storing', async () => {
      const device = await freshDevice();
      const [one, two] = series(2, 200);

      const res = await ingest(device.token, { readings: [one, two, one, { ...one, value: 30 }] });

      expect(res.body).toEqual({ accepted: 2, duplicate: 2, rejected: [] });
    });

    it('adds one row when the same readings arrive concurrently', async () => {
      const device = await freshDevice();
      const batch = { readings: series(20, 300) };

      const answers = await Promise.all(Array.from({ length: 4 }, () => ingest(device.token, batch)));

      expect(answers.map((a) => a.status)).toEqual([200, 200, 200, 200]);
      expect(answers.reduce((sum, a) => sum + a.body.accepted, 0)).toBe(20);
      expect(answers.reduce((sum, a) => sum + a.body.duplicate, 0)).toBe(60);
      const stored = await stack.database.db.select().from(readings).where(eq(readings.deviceId, device.id));
      expect(stored).toHaveLength(20);
    });

    it('sets aside bad readings by index and reason, and keeps the good ones', async () => {
      const device = await freshDevice();
      const now = new Date();
      const at = (n: number) => minutesAgo(now, n);
      const res = await ingest(device.token, {
        readings: [
          { parameter: 'temperature', value: 25.5, unit: '°C', measuredAt: at(30) },
          { parameter: 'temperature', value: 25.6, unit: '°C', measuredAt: minutesAgo(now, -10) },
          { parameter: 'turbidity', value: 3, unit: 'NTU', measuredAt: at(29) },
          { parameter: 'ph', value: 8.1, unit: 'pH units', measuredAt: at(28) },
          { parameter: 'salinity', value: 350, unit: 'salinity', measuredAt: at(27) },
          { parameter: 'salinity', value: 1.026, unit: 'specific gravity', measuredAt: at(26) },
          { parameter: 'orp', value: 380, unit: 'mV', measuredAt: '2019-01-01T00:00:00Z' },
          { parameter: 'orp', value: 'high', unit: 'mV', measuredAt: at(25) },
          { parameter: 'salinity', value: 53.1, unit: 'conductivity mS/cm', measuredAt: at(24) },
          { parameter: 'orp', value: 380, unit: 'mV', measuredAt: at(23) },
        ],
      });

      expect(res.status).toBe(200);
      expect(res.body.accepted).toBe(3);
      expect(res.body.duplicate).toBe(0);
      expect(res.body.rejected.map((r: { index: number; reason: string }) => [r.index, r.reason])).toEqual([
        [1, 'future'],
        [2, 'unknown-parameter'],
        [3, 'unknown-unit'],
        [4, 'implausible'],
        [5, 'unknown-unit'],
        [6, 'before-tank'],
        [7, 'invalid'],
      ]);
      expect(res.body.rejected.every((r: { message: string }) => r.message.length > 0)).toBe(true);
    });

    it('takes the tank from the token alone, whatever the body says', async () => {
      const device = await freshDevice();
      const [reading] = series(1, 400);

      const res = await ingest(device.token, {
        tankId: world.otherTank.id,
        readings: [
          { ...reading, tankId: world.otherTank.id, deviceId: '00000000-0000-4000-8000-000000000000' },
        ],
      });

      expect(res.body.accepted).toBe(1);
      const [row] = await stack.database.db.select().from(readings).where(eq(readings.deviceId, device.id));
      expect(row).toMatchObject({ tankId: world.tank.id, companyId: world.company.id, source: 'device' });
      expect(await readingCount(stack.database.db, world.otherTank.id)).toBe(0);
    });

    it('answers 401 with no token, a wrong token and a revoked token', async () => {
      const device = await freshDevice();
      const revoked = await freshDevice();
      await world.call('technician', 'DELETE', `/api/tanks/${world.tank.id}/devices/${revoked.id}`);
      const body = { readings: series(1, 500) };

      const answers = [
        await ingest(null, body),
        await ingest(`${device.token.slice(0, -4)}AAAA`, body),
        await ingest(revoked.token, body),
        await ingest(null, body, { authorization: `Basic ${device.token}` }),
      ];

      expect(answers.map((a) => a.status)).toEqual([401, 401, 401, 401]);
      expect(answers[0]!.headers.get('www-authenticate')).toMatch(/^Bearer/);
      expect(answers[2]!.body.error.code).toBe('invalid_device_token');
    });

    it('answers 413 to a body over the size limit and to more than 1000 readings', async () => {
      const device = await freshDevice();
      const huge = JSON.stringify({ readings: series(1), padding: 'x'.repeat(1_100_000) });

      const tooBig = await ingest(device.token, huge);
      const tooMany = await ingest(device.token, { readings: series(1001, 2000) });
      const justRight = await ingest(device.token, { readings: series(1000, 4000) });

      expect(tooBig.status).toBe(413);
      expect(tooMany.status).toBe(413);
      expect(justRight.body).toMatchObject({ accepted: 1000 });
    });

    it('answers 429 with Retry-After once a device sends too often, without slowing another device', async () => {
      const busy = await freshDevice();
      const calm = await freshDevice();
      const statuses: number[] = [];
      let last: Awaited<ReturnType<typeof ingest>> | undefined;
      for (let i = 0; i <= ingestRateLimit.points; i += 1) {
        last = await ingest(busy.token, { readings: series(1, 600 + i) });
        statuses.push(last.status);
      }

      const other = await ingest(calm.token, { readings: series(1, 700) });

      expect(statuses.slice(0, ingestRateLimit.points).every((s) => s === 200)).toBe(true);
      expect(statuses.at(-1)).toBe(429);
      expect(last!.body.error.code).toBe('rate_limited');
      const retryAfter = Number(last!.headers.get('retry-after'));
      expect(retryAfter).toBeGreaterThan(0);
      expect(retryAfter).toBeLessThanOrEqual(ingestRateLimit.durationS);
      expect(other.status).toBe(200);
    });
  });

  describe('batches stored as a group', () => {
    const rowsOf = (list: Array<{ value: number; minutesAgo: number }>): DeviceRow[] =>
      list.map(({ value, minutesAgo: ago }) => ({
        parameter: 'temperature',
        value,
        entered: value,
        unit: '°C',
        measuredAt: new Date(Math.floor(Date.now() / 60_000) * 60_000 - ago * 60_000),
      }));
    const identity = async (tankId: string) => {
      const device = await deviceFor(stack.database.db, world.people.technician, tankId);
      return (await findDeviceByToken(stack.database.db, device.token))!;
    };
    const tankIn = (name: string) =>
      createTank(stack.database.db, { companyId: world.company.id, name, setUpOn: '2020-01-01' });
    const openAlerts = (tankId: string) =>
      stack.database.db
        .select()
        .from(alerts)
        .where(and(eq(alerts.tankId, tankId), ne(alerts.status, 'resolved')));

    it('stores several devices’ batches in one write, answers each, and judges every tank', async () => {
      const calm = await tankIn('Lobby reef');
      const hot = await tankIn('Clinic reef');
      const first = await identity(calm.id);
      const second = await identity(calm.id);
      const heater = await identity(hot.id);
      const shared = { value: 25.4, minutesAgo: 30 };

      const results = await writeDeviceGroup(stack.deps, [
        { device: first, rows: rowsOf([{ value: 25.2, minutesAgo: 40 }, shared]) },
        // The same reading again, from a re-send still on its way: stored once, for the first.
        { device: first, rows: rowsOf([shared, { value: 25.5, minutesAgo: 20 }]) },
        { device: second, rows: rowsOf([{ value: 25.3, minutesAgo: 35 }]) },
        {
          device: heater,
          rows: rowsOf([31, 31.2, 31.4, 31.5].map((value, i) => ({ value, minutesAgo: 20 - 5 * i }))),
        },
      ]);

      expect(results).toEqual([2, 1, 1, 4].map((value) => ({ status: 'fulfilled', value })));
      expect(await readingCount(stack.database.db, calm.id)).toBe(4);
      expect(await readingCount(stack.database.db, hot.id)).toBe(4);
      const raised = await openAlerts(hot.id);
      expect(raised.map((alert) => [alert.ruleKey, alert.severity])).toEqual([
        ['limit:temperature', 'critical'],
      ]);
      expect(await openAlerts(calm.id)).toEqual([]);
      const states = await stack.database.pool.query<{ tank_id: string }>(
        `select tank_id from alert_rule_states where rule_key = 'limit:temperature' and tank_id = any($1::uuid[])`,
        [[calm.id, hot.id]],
      );
      expect(states.rows.map((row) => row.tank_id).sort()).toEqual([calm.id, hot.id].sort());
    });

    it('fails only the batch whose tank went away; the others are stored and judged', async () => {
      const kept = await tankIn('Office reef');
      const hot = await tankIn('Restaurant reef');
      const doomed = await tankIn('Closing reef');
      const keeper = await identity(kept.id);
      const heater = await identity(hot.id);
      const orphan = await identity(doomed.id);
      await stack.database.pool.query('delete from tanks where id = $1', [doomed.id]);

      const results = await writeDeviceGroup(stack.deps, [
        { device: keeper, rows: rowsOf([{ value: 25.1, minutesAgo: 10 }]) },
        { device: orphan, rows: rowsOf([{ value: 25.1, minutesAgo: 10 }]) },
        {
          device: heater,
          rows: rowsOf([31, 31.2, 31.4, 31.5].map((value, i) => ({ value, minutesAgo: 20 - 5 * i }))),
        },
      ]);

      expect(results.map((result) => result.status)).toEqual(['fulfilled', 'rejected', 'fulfilled']);
      expect(results[0]).toEqual({ status: 'fulfilled', value: 1 });
      expect(results[2]).toEqual({ status: 'fulfilled', value: 4 });
      expect(await readingCount(stack.database.db, kept.id)).toBe(1);
      expect(await readingCount(stack.database.db, doomed.id)).toBe(0);
      expect((await openAlerts(hot.id)).map((alert) => alert.ruleKey)).toEqual(['limit:temperature']);
    });

    it('answers every one of many devices sending at once with its own counts', async () => {
      const tank = await tankIn('Gallery reef');
      const senders = await Promise.all(
        Array.from({ length: 8 }, () => deviceFor(stack.database.db, world.people.technician, tank.id)),
      );

      const answers = await Promise.all(
        senders.map((device, n) => ingest(device.token, { readings: series(n + 1, 90) })),
      );

      expect(answers.map((answer) => answer.status)).toEqual(senders.map(() => 200));
      expect(answers.map((answer) => answer.body.accepted)).toEqual(senders.map((_, n) => n + 1));
      expect(await readingCount(stack.database.db, tank.id)).toBe((8 * 9) / 2);
    });
  });

  describe('/api/tanks/:tankId/devices', () => {
    it('shows a new token once, keeps only its hash, and lists the device with its hint', async () => {
      const created = await world.call('technician', 'POST', `/api/tanks/${world.tank.id}/devices`, {
        name: 'Sump probe',
      });
      const list = await world.call('technician', 'GET', `/api/tanks/${world.tank.id}/devices`);

      expect(created.status).toBe(201);
      const { token, device } = created.body;
      // At least 128 random bits: the token carries 32 random bytes (256 bits) in base64url.
      expect(token).toMatch(/^bwd_[A-Za-z0-9_-]{43}$/);
      expect(device).toMatchObject({ name: 'Sump probe', tokenHint: token.slice(0, 10), revokedAt: null });
      const [row] = await stack.database.db.select().from(devices).where(eq(devices.id, device.id));
      expect(row!.tokenHash).not.toContain(token);
      expect(JSON.stringify(row)).not.toContain(token.slice(4));
      expect(JSON.stringify(list.body)).not.toContain(token);
      expect(list.body.some((d: { id: string }) => d.id === device.id)).toBe(true);
    });

    it('revokes a device: its token stops working, and the row stays', async () => {
      const created = await world.call('technician', 'POST', `/api/tanks/${world.tank.id}/devices`, {
        name: 'Return pump sensor',
      });
      const { token, device } = created.body;
      expect((await ingest(token, { readings: series(1, 800) })).status).toBe(200);

      const revoked = await world.call(
        'technician',
        'DELETE',
        `/api/tanks/${world.tank.id}/devices/${device.id}`,
      );
      const twice = await world.call(
        'technician',
        'DELETE',
        `/api/tanks/${world.tank.id}/devices/${device.id}`,
      );

      expect(revoked.status).toBe(200);
      expect(revoked.body.revokedAt).not.toBeNull();
      expect(twice.status).toBe(404);
      expect((await ingest(token, { readings: series(1, 801) })).status).toBe(401);
    });

    it('keeps devices to staff of the tank’s company', async () => {
      const path = `/api/tanks/${world.tank.id}/devices`;
      const owner = await world.call('owner', 'GET', path);
      const stranger = await world.call('stranger', 'POST', path, { name: 'Sneaky' });

      expect([owner.status, stranger.status]).toEqual([403, 404]);
    });
  });
});
