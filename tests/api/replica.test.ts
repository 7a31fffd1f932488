import { chmodSync, mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { connectDatabase } from '../../api/db/client';
import { applyMigrations } from '../../api/db/migrations';
import { startPostgres, startReplica, type RunningPostgres } from '../../api/dev/postgres';
import type { TestDatabase } from '../helpers/db';
import { freePort } from '../helpers/free-port';
import { startTestStack, type TestStack } from '../helpers/stack';
import { readingsWorld } from './readings-kit';

/**
 * History, reading lists and exports may be read from a streaming replica (DATABASE_REPLICA_URL):
 * a real one, made here with pg_basebackup from a primary on loopback. Which server answered is
 * told by data only one of them has: replay is paused on the replica while a reading is written
 * to the primary. Nothing here measures time; the waits are bounds for a loaded machine.
 */
describe('reads from a streaming replica', () => {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'brinewatch-replica-'));
  // The clusters run as the postgres system user, which must reach their folders inside.
  chmodSync(dir, 0o755);
  const database = 'brinewatch_replica';
  let primary: RunningPostgres;
  let replica: RunningPostgres;
  let primaryPort: number;
  let replicaPort: number;
  let shared: TestDatabase;
  /** Reads the replica even far behind: what it answers is the replica's. */
  let patient: TestStack;
  /** Falls back to the primary once the replica is half a second behind. */
  let strict: TestStack;
  let patientWorld: Awaited<ReturnType<typeof readingsWorld>>;
  let strictWorld: Awaited<ReturnType<typeof readingsWorld>>;

  const startTheReplica = async () => {
    replica = await startReplica({
      primaryDir: path.join(dir, 'primary'),
      primaryPort,
      dir: path.join(dir, 'replica'),
      port: replicaPort,
      database,
      log: () => {},
    });
  };
  const onReplica = async (text: string) => {
    const client = new pg.Client({ connectionString: replica.url });
    await client.connect();
    try {
      return (await client.query(text)).rows;
    } finally {
      await client.end();
    }
  };
  async function until(what: string, check: () => Promise<boolean> | boolean) {
    for (let tries = 0; tries < 300; tries += 1) {
      if (await check()) return;
      await new Promise((resolve) => setTimeout(resolve, 100));
    }
    throw new Error(`gave up waiting: ${what}`);
  }
  const window = {
    parameter: 'temperature',
    from: '2026-11-01T00:00:00.000Z',
    to: '2026-11-30T00:00:00.000Z',
  };
  const historyOf = async (world: typeof patientWorld) => {
    const search = new URLSearchParams({ ...window, points: '500' });
    const res = await world.call('owner', 'GET', `/api/tanks/${world.tank.id}/readings?${search}`);
    expect(res.status).toBe(200);
    return res.body as { total: number; readings: { value: number }[] };
  };
  const writeOnPrimary = (tankId: string, companyId: string, value: number, at: string) =>
    shared.pool.query(
      `insert into readings (company_id, tank_id, parameter, value, entered_value, entered_unit, measured_at, source)
       values ($1, $2, 'temperature', $3, $3, '°C', $4, 'home-test')`,
      [companyId, tankId, value, at],
    );

  beforeAll(async () => {
    primaryPort = await freePort();
    replicaPort = await freePort();
    primary = await startPostgres({
      dir: path.join(dir, 'primary'),
      port: primaryPort,
      database,
      durable: false,
      log: () => {},
    });
    const connection = connectDatabase(primary.url);
    await applyMigrations(connection.db);
    shared = { ...connection, url: primary.url, name: database, drop: () => connection.pool.end() };
    await startTheReplica();
    const sharedDatabase = (): TestDatabase => ({ ...shared, drop: async () => {} });
    patient = await startTestStack({
      database: sharedDatabase(),
      env: { DATABASE_REPLICA_URL: replica.url, REPLICA_MAX_LAG_MS: String(10 * 60_000) },
    });
    strict = await startTestStack({
      database: sharedDatabase(),
      env: { DATABASE_REPLICA_URL: replica.url, REPLICA_MAX_LAG_MS: '500' },
    });
    patientWorld = await readingsWorld(patient, { signIn: ['owner'] });
    strictWorld = await readingsWorld(strict, { signIn: ['owner'] });
    await until(
      'the replica serves reads',
      () => patient.deps.reads.replicaInUse() && strict.deps.reads.replicaInUse(),
    );
  });
  afterAll(async () => {
    await patient?.close();
    await strict?.close();
    await shared?.pool.end();
    await replica?.stop();
    await primary?.stop();
    rmSync(dir, { recursive: true, force: true });
  });

  it('serves history from the replica, and a writer its own new readings from the primary', async () => {
    const { tank, company } = patientWorld;
    await onReplica('select pg_wal_replay_pause()');
    try {
      await writeOnPrimary(tank.id, company.id, 24.25, '2026-11-10T08:00:00Z');
      const fromReplica = await historyOf(patientWorld);
      expect(fromReplica.total).toBe(0);

      // The owner's own reading goes to the primary, and their next read follows it there.
      const posted = await patientWorld.call('owner', 'POST', `/api/tanks/${tank.id}/readings`, {
        readings: [
          { parameter: 'temperature', value: 25.5, unit: '°C', measuredAt: '2026-11-11T08:00:00.000Z' },
        ],
      });
      expect(posted.status).toBe(201);
      const ownView = await historyOf(patientWorld);
      expect(ownView.readings.map((reading) => reading.value).sort()).toEqual([24.25, 25.5]);
    } finally {
      await onReplica('select pg_wal_replay_resume()');
    }
    await until('the replica catches up', async () => (await historyOf(patientWorld)).total === 2);
  });

  it('falls back to the primary while the replica lags past the allowance, and returns to it', async () => {
    const { tank, company } = strictWorld;
    await onReplica('select pg_wal_replay_pause()');
    try {
      await writeOnPrimary(tank.id, company.id, 26.5, '2026-11-12T08:00:00Z');
      await until('the lagging replica is set aside', () => !strict.deps.reads.replicaInUse());
      expect((await historyOf(strictWorld)).total).toBe(1);
    } finally {
      await onReplica('select pg_wal_replay_resume()');
    }
    await until('the replica is used again', () => strict.deps.reads.replicaInUse());
    expect((await historyOf(strictWorld)).total).toBe(1);
  });

  it('answers from the primary while the replica is down, and uses it again once it is back', async () => {
    await replica.stop();
    // At once, before the health check notices: the failed read is retried on the primary.
    expect((await historyOf(strictWorld)).total).toBe(1);
    await until('the stopped replica is set aside', () => !strict.deps.reads.replicaInUse());
    expect((await historyOf(strictWorld)).total).toBe(1);
    const listed = await strictWorld.call(
      'owner',
      'GET',
      `/api/tanks/${strictWorld.tank.id}/readings/list?parameter=temperature`,
    );
    expect(listed.status).toBe(200);

    await startTheReplica();
    await until('the replica is back in use', () => strict.deps.reads.replicaInUse());
    expect((await historyOf(strictWorld)).total).toBe(1);
  });

  it('keeps writes on the primary: the replica refuses them', async () => {
    await expect(onReplica(`create table never_here (id int)`)).rejects.toThrow(/read-only transaction/);
  });
});
