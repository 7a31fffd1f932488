import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { connectDatabase, type Database } from '../../../api/db/client';
import { tanks } from '../../../api/db/schema/index';
import { startPostgres, type RunningPostgres } from '../../../api/dev/postgres';
import { parseEnv } from '../../../api/env';
import { createLogger } from '../../../api/lib/logger';
import { startServer, type RunningServer } from '../../../api/server';
import { createCompany, createPerson, createTank } from '../../helpers/factories';
import { freePort } from '../../helpers/free-port';
import { deviceFor } from '../readings-kit';

/*
 * PostgreSQL stops while devices are posting readings. This file runs its own cluster (durable,
 * as in production), since stopping the test run's shared cluster would stop every other file.
 */
describe('device ingest while PostgreSQL is down', () => {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'brinewatch-fault-pg-'));
  let port: number;
  let postgres: RunningPostgres;
  let server: RunningServer;
  let database: Database;
  let tokens: string[];

  const startCluster = () =>
    startPostgres({ dir, port, database: 'brinewatch', durable: true, log: () => {} });

  beforeAll(async () => {
    port = await freePort();
    postgres = await startCluster();
    const env = parseEnv({
      NODE_ENV: 'test',
      LOG_LEVEL: 'silent',
      DATABASE_URL: postgres.url,
      OIDC_CLIENT_SECRET: 'fault-test-client-secret',
      SESSION_SECRET: 'fault-test-session-secret-0123456789',
    });
    server = await startServer({
      env,
      databaseUrl: postgres.url,
      logger: createLogger('silent'),
      port: await freePort(),
      background: false,
      serveClient: false,
    });
    database = connectDatabase(postgres.url, { max: 2 });
    const company = await createCompany(database.db);
    const technician = await createPerson(database.db, {
      companyId: company.id,
      role: 'technician',
      issuer: 'http://faults.invalid',
    });
    const tank = await createTank(database.db, { companyId: company.id });
    await database.db.update(tanks).set({ setUpOn: '2020-01-01' }).where(eq(tanks.id, tank.id));
    // Requests are spread over devices so that none reaches its 20-a-minute ingest limit.
    tokens = [];
    for (let i = 0; i < 20; i += 1) {
      tokens.push((await deviceFor(database.db, technician, tank.id, `Probe ${i}`)).token);
    }
  }, 120_000);

  afterAll(async () => {
    await database?.pool.end();
    await server?.close();
    await postgres?.stop();
    rmSync(dir, { recursive: true, force: true });
  });

  it('answers 503 with Retry-After while it is down, recovers by itself, and keeps every acknowledged reading once', async () => {
    const started = Date.now() - 24 * 3_600_000;
    let sent = 0;
    let requests = 0;
    const acknowledged: string[] = [];
    const unacknowledged: { token: string; body: string; moments: string[] }[] = [];
    const outages: { status: number; retryAfter: string | null; code: unknown }[] = [];
    const others: number[] = [];

    async function post(token: string, body: string) {
      const res = await fetch(`${server.url}/api/ingest/readings`, {
        method: 'POST',
        headers: { authorization: `Bearer ${token}`, 'content-type': 'application/json' },
        body,
      });
      const json = (await res.json()) as {
        accepted?: number;
        duplicate?: number;
        error?: { code?: string };
      };
      return { res, json };
    }

    /** One batch of two temperatures, at moments no other batch uses. */
    async function sendBatch() {
      const moments = [0, 1].map((k) => new Date(started + (sent * 2 + k) * 60_000).toISOString());
      sent += 1;
      const token = tokens[requests % tokens.length]!;
      requests += 1;
      const body = JSON.stringify({
        readings: moments.map((measuredAt) => ({
          parameter: 'temperature',
          value: 25.4,
          unit: '°C',
          measuredAt,
        })),
      });
      const { res, json } = await post(token, body);
      if (res.status === 200) {
        expect(json.accepted).toBe(2);
        acknowledged.push(...moments);
      } else {
        unacknowledged.push({ token, body, moments });
        if (res.status === 503) {
          outages.push({
            status: res.status,
            retryAfter: res.headers.get('retry-after'),
            code: json.error?.code,
          });
        } else others.push(res.status);
      }
      return res.status;
    }

    const pause = () => new Promise((resolve) => setTimeout(resolve, 150));
    for (let i = 0; i < 5; i += 1) await sendBatch();
    expect(acknowledged).toHaveLength(10);

    await postgres.stop();
    while (outages.length < 5) {
      await sendBatch();
      await pause();
    }

    postgres = await startCluster();
    // No restart of the app: its pool must find the database again by itself.
    let recovered = 0;
    while (recovered < 5) {
      if ((await sendBatch()) === 200) recovered += 1;
      await pause();
    }
    // Each device sends again what was not acknowledged; a resend adds nothing twice.
    const resent: number[] = [];
    for (const batch of unacknowledged) {
      const { res, json } = await post(batch.token, batch.body);
      resent.push(res.status);
      // Accepted now, or already stored by a request whose answer was lost.
      if (res.status === 200 && (json.accepted ?? 0) + (json.duplicate ?? 0) === 2) {
        acknowledged.push(...batch.moments);
      }
      await pause();
    }

    const stored = await database.pool.query<{ ms: string; n: number }>(
      `select extract(epoch from measured_at) * 1000 as ms, count(*)::int as n from readings group by measured_at`,
    );
    const copies = new Map(stored.rows.map((row) => [new Date(Number(row.ms)).toISOString(), row.n]));
    expect(outages.every((o) => o.retryAfter !== null && Number(o.retryAfter) > 0)).toBe(true);
    expect(outages.map((o) => o.code)).not.toContain('internal_error');
    expect(others).toEqual([]);
    expect(resent.every((status) => status === 200)).toBe(true);
    expect(acknowledged).toHaveLength(sent * 2);
    expect(acknowledged.filter((at) => copies.get(at) !== 1)).toEqual([]);
    expect(stored.rows.reduce((sum, row) => sum + row.n, 0)).toBe(sent * 2);
  }, 180_000);
});
