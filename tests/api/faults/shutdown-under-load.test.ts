import http from 'node:http';
import { eq } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { tanks } from '../../../api/db/schema/index';
import { parseEnv } from '../../../api/env';
import { createLogger } from '../../../api/lib/logger';
import { startServer } from '../../../api/server';
import { createTestDatabase, type TestDatabase } from '../../helpers/db';
import { createCompany, createPerson, createTank } from '../../helpers/factories';
import { freePort } from '../../helpers/free-port';
import { deviceFor } from '../readings-kit';

interface Answer {
  status: number;
  body: string;
}

/**
 * A device request whose headers the server has read (it answered `100 Continue`, RFC 9110
 * §10.1.1) but whose body is still to come: in flight by any measure. `finish` sends the body.
 */
async function requestInFlight(url: string, token: string, body: string) {
  const req = http.request(`${url}/api/ingest/readings`, {
    method: 'POST',
    agent: false,
    headers: {
      authorization: `Bearer ${token}`,
      'content-type': 'application/json',
      'content-length': Buffer.byteLength(body),
      expect: '100-continue',
    },
  });
  const answer = new Promise<Answer>((resolve, reject) => {
    req.on('response', (res) => {
      let text = '';
      res.setEncoding('utf8');
      res.on('data', (chunk: string) => (text += chunk));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, body: text }));
      res.on('error', reject);
    });
    req.on('error', reject);
  });
  req.flushHeaders();
  await new Promise<void>((resolve) => req.once('continue', () => resolve()));
  return { finish: () => req.end(body), answer };
}

describe('SIGTERM under load', () => {
  let database: TestDatabase;
  afterAll(() => database?.drop());

  it('lets every in-flight request finish with a complete answer, then refuses new connections', async () => {
    database = await createTestDatabase();
    const company = await createCompany(database.db);
    const technician = await createPerson(database.db, {
      companyId: company.id,
      role: 'technician',
      issuer: 'http://faults.invalid',
    });
    const tank = await createTank(database.db, { companyId: company.id });
    await database.db.update(tanks).set({ setUpOn: '2020-01-01' }).where(eq(tanks.id, tank.id));
    const { token } = await deviceFor(database.db, technician, tank.id);
    const server = await startServer({
      env: parseEnv({
        NODE_ENV: 'test',
        LOG_LEVEL: 'silent',
        DATABASE_URL: database.url,
        OIDC_CLIENT_SECRET: 'shutdown-test-client-secret',
        SESSION_SECRET: 'shutdown-test-session-secret-0123456789',
      }),
      databaseUrl: database.url,
      logger: createLogger('silent'),
      port: await freePort(),
      background: false,
      serveClient: false,
    });
    const start = Date.now() - 48 * 3_600_000;
    const bodies = Array.from({ length: 8 }, (_, batch) =>
      JSON.stringify({
        readings: Array.from({ length: 100 }, (_, i) => ({
          parameter: 'temperature',
          value: 25.5,
          unit: '°C',
          measuredAt: new Date(start + (batch * 100 + i) * 60_000).toISOString(),
        })),
      }),
    );
    const inFlight = await Promise.all(bodies.map((body) => requestInFlight(server.url, token, body)));

    // What the SIGTERM handler runs (api/server.ts onShutdown → close), while all eight are open.
    const closing = server.close();
    for (const request of inFlight) request.finish();
    const answers = await Promise.all(inFlight.map((request) => request.answer));
    await closing;
    const refused = await fetch(`${server.url}/api/health`).then(
      () => 'answered',
      (error: Error) => (error.cause as { code?: string } | undefined)?.code ?? error.message,
    );

    expect(answers.map((a) => a.status)).toEqual(Array(8).fill(200));
    expect(answers.map((a) => JSON.parse(a.body))).toEqual(
      Array(8).fill({ accepted: 100, duplicate: 0, rejected: [] }),
    );
    const stored = await database.pool.query<{ n: number }>('select count(*)::int as n from readings');
    expect(stored.rows[0]!.n).toBe(800);
    expect(refused).toBe('ECONNREFUSED');
  }, 120_000);
});
