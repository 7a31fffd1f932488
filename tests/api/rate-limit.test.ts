import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../api/app';
import { connectDatabase, type Database } from '../../api/db/client';
import { createDeps } from '../../api/deps';
import { createLogger } from '../../api/lib/logger';
import { ingestRateLimit } from '../../api/routes/ingest';
import { createTestApp, type TestApp } from '../helpers/app';
import { createCompany, createPerson, createTank } from '../helpers/factories';
import { deviceFor } from './readings-kit';

describe('rate limits across API processes', () => {
  let first: TestApp;
  let secondDatabase: Database;
  let second: ReturnType<typeof createApp>;

  beforeAll(async () => {
    first = await createTestApp();
    // Another process: its own pool and app over the same database.
    secondDatabase = connectDatabase(first.database.url, { max: 2 });
    second = createApp(
      createDeps({ env: first.env, database: secondDatabase, logger: createLogger('silent') }),
    );
  });
  afterAll(async () => {
    await secondDatabase.pool.end();
    await first.close();
  });

  async function freshDevice() {
    const { db } = first.database;
    const company = await createCompany(db);
    const technician = await createPerson(db, {
      companyId: company.id,
      role: 'technician',
      issuer: 'https://identity.example.test',
    });
    const tank = await createTank(db, { companyId: company.id });
    return deviceFor(db, technician, tank.id);
  }

  const ingest = (app: ReturnType<typeof createApp>, token: string) =>
    request(app)
      .post('/api/ingest/readings')
      .set('authorization', `Bearer ${token}`)
      .send({
        readings: [{ parameter: 'temperature', value: 25, unit: '°C', measuredAt: new Date().toISOString() }],
      });

  it('counts one device’s requests to two app instances against one budget', async () => {
    const device = await freshDevice();
    const statuses: number[] = [];
    for (let i = 0; i < ingestRateLimit.points; i += 1) {
      statuses.push((await ingest(i % 2 === 0 ? first.app : second, device.token)).status);
    }

    const overFirst = await ingest(first.app, device.token);
    const overSecond = await ingest(second, device.token);

    expect(statuses.every((status) => status === 200)).toBe(true);
    for (const refused of [overFirst, overSecond]) {
      expect(refused.status).toBe(429);
      expect(refused.body.error.code).toBe('rate_limited');
      expect(typeof refused.body.error.message).toBe('string');
      const retryAfter = Number(refused.headers['retry-after']);
      expect(retryAfter).toBeGreaterThan(0);
      expect(retryAfter).toBeLessThanOrEqual(ingestRateLimit.durationS);
    }
  });
});
