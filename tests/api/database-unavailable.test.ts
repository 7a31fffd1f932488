import { createHmac, randomUUID } from 'node:crypto';
import { once } from 'node:events';
import net from 'node:net';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../api/app';
import { connectDatabase, type Database } from '../../api/db/client';
import { createDeps } from '../../api/deps';
import { parseEnv } from '../../api/env';
import { createLogger } from '../../api/lib/logger';
import { testSecrets } from '../helpers/app';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import { createCompany, createPerson, createTank } from '../helpers/factories';
import { freePort } from '../helpers/free-port';
import { deviceFor } from './readings-kit';

/**
 * A TCP relay in front of the test cluster that can be pulled like a cable: closed, PostgreSQL is
 * out of reach for the app (connections refused, open ones cut); opened again, it is back.
 */
async function startRelay(target: URL) {
  const port = await freePort();
  const sockets = new Set<net.Socket>();
  let server: net.Server | null = null;
  const open = async () => {
    server = net.createServer((client) => {
      const upstream = net.connect(Number(target.port), target.hostname);
      for (const socket of [client, upstream]) {
        sockets.add(socket);
        socket.on('close', () => sockets.delete(socket));
        socket.on('error', () => {});
      }
      client.pipe(upstream).pipe(client);
    });
    server.listen(port, '127.0.0.1');
    await once(server, 'listening');
  };
  const close = async () => {
    const closing = server;
    server = null;
    if (!closing) return;
    const closed = new Promise((resolve) => closing.close(resolve));
    for (const socket of sockets) socket.destroy();
    await closed;
  };
  await open();
  return { port, open, close };
}

/** express-session's signed cookie value (cookie-signature: HMAC-SHA256, base64 without padding). */
const signedSid = (sid: string, secret: string) =>
  `s:${sid}.${createHmac('sha256', secret).update(sid).digest('base64').replace(/=+$/, '')}`;

describe('PostgreSQL out of reach', () => {
  let database: TestDatabase;
  let relay: Awaited<ReturnType<typeof startRelay>>;
  let relayed: Database;
  let app: ReturnType<typeof createApp>;
  let deviceToken: string;
  let sessionCookie: string;

  beforeAll(async () => {
    database = await createTestDatabase();
    const direct = new URL(database.url);
    relay = await startRelay(direct);
    const viaRelay = new URL(database.url);
    viaRelay.host = `127.0.0.1:${relay.port}`;
    relayed = connectDatabase(viaRelay.toString(), { max: 3 });
    const env = parseEnv({
      NODE_ENV: 'test',
      LOG_LEVEL: 'silent',
      DATABASE_URL: viaRelay.toString(),
      ...testSecrets,
    });
    app = createApp(createDeps({ env, database: relayed, logger: createLogger('silent') }));

    const { db, pool } = database;
    const company = await createCompany(db);
    const issuer = 'http://127.0.0.1:1';
    const owner = await createPerson(db, { companyId: company.id, role: 'owner', issuer });
    const technician = await createPerson(db, { companyId: company.id, role: 'technician', issuer });
    const tank = await createTank(db, { companyId: company.id, owners: [owner], setUpOn: '2020-01-01' });
    deviceToken = (await deviceFor(db, technician, tank.id)).token;
    // A signed-in owner's session, as the sign-in would have stored it.
    const sid = randomUUID();
    const now = Date.now();
    const expires = new Date(now + 86_400_000);
    await pool.query('insert into session (sid, sess, expire) values ($1, $2, $3)', [
      sid,
      {
        cookie: {
          originalMaxAge: 86_400_000,
          expires,
          httpOnly: true,
          path: '/',
          sameSite: 'lax',
          secure: false,
        },
        userId: owner.id,
        signedInAt: now,
        lastSeenAt: now,
      },
      expires,
    ]);
    sessionCookie = `bw_session=${encodeURIComponent(signedSid(sid, env.SESSION_SECRET.split(',')[0]!))}`;
  });
  afterAll(async () => {
    await relay.open().catch(() => {});
    await relayed.pool.end();
    await relay.close();
    await database.drop();
  });

  const ingest = () =>
    request(app)
      .post('/api/ingest/readings')
      .set('Authorization', `Bearer ${deviceToken}`)
      .send({
        readings: [
          { parameter: 'temperature', value: 25.1, unit: '°C', measuredAt: new Date().toISOString() },
        ],
      });
  const tanksPage = () => request(app).get('/api/tanks').set('Cookie', sessionCookie);

  async function eventually(call: () => Promise<{ status: number }>, status: number) {
    const deadline = Date.now() + 10_000;
    let last = await call();
    while (last.status !== status && Date.now() < deadline) {
      await new Promise((resolve) => setTimeout(resolve, 100));
      last = await call();
    }
    return last;
  }

  it('answers 200 while the database is there', async () => {
    expect((await tanksPage()).status).toBe(200);
    expect((await ingest()).status).toBe(200);
  });

  it('answers 503 with Retry-After on ingest and on a page while it is gone', async () => {
    await relay.close();

    const ingested = await ingest();
    const page = await tanksPage();

    for (const res of [ingested, page]) {
      expect(res.status).toBe(503);
      expect(res.body.error.code).toBe('service_unavailable');
      expect(Number(res.headers['retry-after'])).toBeGreaterThan(0);
    }
  });

  it('answers 200 again by itself once it is back', async () => {
    await relay.open();

    expect((await eventually(tanksPage, 200)).status).toBe(200);
    expect((await eventually(ingest, 200)).status).toBe(200);
  });
});
