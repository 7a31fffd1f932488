import { spawn, type ChildProcess } from 'node:child_process';
import net from 'node:net';
import { eq, sql } from 'drizzle-orm';
import type { PgBoss } from 'pg-boss';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { deliveries } from '../../../api/db/schema/index';
import { queues, startJobQueue } from '../../../api/lib/job-queue';
import { createLogger } from '../../../api/lib/logger';
import { buildServer, serverNodeFlags } from '../../../api/build';
import { evaluateNewReadings } from '../../../api/services/alert-engine';
import { afterAlertEvents } from '../../../api/services/alerts';
import { startWorkers } from '../../../api/services/workers';
import { testSecrets } from '../../helpers/app';
import {
  createCompany,
  createPerson,
  createTank,
  insertReadings,
  type TestPerson,
} from '../../helpers/factories';
import { freePort } from '../../helpers/free-port';
import { startTestStack, testClient, type TestStack } from '../../helpers/stack';

/*
 * An API process dies (SIGKILL) while it is sending an alert e-mail. Its job stays active in
 * pg-boss with nobody sending its heartbeat; a second instance on the same database must retry it
 * and deliver the e-mail exactly once. The first instance runs as a real separate process
 * (the production bundle, dist/api/server.mjs, built here), so the kill leaves exactly what a crash leaves: no graceful stop, no failed job.
 */

/**
 * An SMTP relay that greets and then never answers, so the first instance's send is in flight
 * (its job active) for as long as the test wants. A relay outside the project, hence not the stand-in.
 */
async function startSilentRelay() {
  const sockets = new Set<net.Socket>();
  const server = net.createServer((socket) => {
    sockets.add(socket);
    socket.on('close', () => sockets.delete(socket));
    socket.on('error', () => sockets.delete(socket));
    socket.write('220 relay.test ESMTP\r\n');
  });
  server.listen(0, '127.0.0.1');
  await new Promise((resolve) => server.once('listening', resolve));
  let connections = 0;
  server.on('connection', () => (connections += 1));
  return {
    port: (server.address() as net.AddressInfo).port,
    connections: () => connections,
    close: () =>
      new Promise<void>((resolve) => {
        for (const socket of sockets) socket.destroy();
        server.close(() => resolve());
      }),
  };
}

const until = async (check: () => Promise<boolean>, what: string, stopped?: () => string | null) => {
  while (!(await check())) {
    const reason = stopped?.();
    if (reason) throw new Error(`${what}: ${reason}`);
    await new Promise((resolve) => setTimeout(resolve, 250));
  }
};

describe('a worker killed while it delivers an e-mail', () => {
  let stack: TestStack;
  let relay: Awaited<ReturnType<typeof startSilentRelay>>;
  let first: ChildProcess | null = null;
  let firstExit: Promise<void> = Promise.resolve();
  let firstStderr = '';
  let firstExited = false;
  let second: PgBoss | null = null;
  let owner: TestPerson;
  let tank: { id: string; companyId: string };

  beforeAll(async () => {
    // The stack gives the database, the identity provider and the mail stand-in; its own app runs
    // no workers, so every job runs in one of the two instances below.
    stack = await startTestStack();
    relay = await startSilentRelay();
    const { db } = stack.database;
    const company = await createCompany(db);
    owner = await createPerson(db, { companyId: company.id, role: 'owner', issuer: stack.idp.issuer });
    tank = await createTank(db, { companyId: company.id, name: 'Lobby reef', owners: [owner] });

    const port = await freePort();
    first = spawn(process.execPath, [...serverNodeFlags, await buildServer()], {
      env: {
        ...process.env,
        NODE_ENV: 'test',
        LOG_LEVEL: 'warn',
        PORT: String(port),
        APP_ORIGIN: `http://localhost:${port}`,
        DATABASE_URL: stack.database.url,
        OIDC_ISSUER: stack.idp.issuer,
        OIDC_CLIENT_ID: testClient.clientId,
        OIDC_CLIENT_SECRET: testSecrets.OIDC_CLIENT_SECRET,
        SESSION_SECRET: testSecrets.SESSION_SECRET,
        SMTP_PORT: String(relay.port),
        S3_ENDPOINT: stack.deps.env.S3_ENDPOINT,
        S3_BUCKET: stack.deps.env.S3_BUCKET,
      },
      stdio: ['ignore', 'ignore', 'pipe'],
    });
    first.stderr?.on('data', (chunk: Buffer) => (firstStderr += chunk.toString()));
    firstExit = new Promise((resolve) =>
      first!.once('exit', () => {
        firstExited = true;
        resolve();
      }),
    );
    const ended = () => (firstExited ? `the first instance ended:\n${firstStderr}` : null);
    await until(
      async () => {
        try {
          return (await fetch(`http://127.0.0.1:${port}/api/health`)).status === 200;
        } catch {
          return false;
        }
      },
      'waiting for the first instance',
      ended,
    );
    // The second instance's queue is up from the start (it sends the fan-out job); its workers
    // start only once the first instance is dead.
    second = await startJobQueue(stack.database.url, createLogger('silent'));
  }, 180_000);

  afterAll(async () => {
    if (first && !firstExited) first.kill('SIGKILL');
    await firstExit;
    await second?.stop({ graceful: false, timeout: 2000 });
    await relay?.close();
    await stack?.close();
  });

  const emailJobs = async () =>
    (
      await stack.database.db.execute<{
        state: string;
        retry_count: number;
        heartbeat_seconds: number | null;
      }>(sql`
        select state, retry_count, heartbeat_seconds from pgboss.job where name = ${queues.email}`)
    ).rows;

  it('is retried by another instance, which sends the e-mail once', async () => {
    const { db } = stack.database;
    const deps = { ...stack.deps, jobs: second };
    const ended = () => (firstExited ? `the first instance ended:\n${firstStderr}` : null);

    // A critical temperature (the mixed-reef template's critical limit is 29 °C) wants one e-mail.
    const stored = await insertReadings(db, tank, [
      {
        parameter: 'temperature',
        value: 30.5,
        measuredAt: new Date(Date.now() - 10 * 60_000),
        source: 'home-test',
      },
    ]);
    await afterAlertEvents(deps, await evaluateNewReadings(db, tank.id, stored));

    // The first instance fans out, takes the delivery job and is stuck talking to the relay.
    await until(
      async () => relay.connections() > 0 && (await emailJobs()).some((j) => j.state === 'active'),
      'waiting for the first instance to start sending',
      ended,
    );
    first!.kill('SIGKILL');
    await firstExit;

    // What a crash leaves: the job still active, the delivery pending, nothing sent.
    const [held] = await emailJobs();
    expect(held?.state).toBe('active');
    expect(held?.heartbeat_seconds).toBeGreaterThanOrEqual(10);
    const [planned, ...others] = await db.select().from(deliveries).where(eq(deliveries.channel, 'email'));
    expect(others).toHaveLength(0);
    expect(planned?.status).toBe('pending');
    expect(stack.mail.messages()).toHaveLength(0);

    await startWorkers(deps);
    // Bounded by the test's timeout: a missed heartbeat (30 s) plus a monitor pass (60 s) and a retry.
    await until(async () => {
      const [delivery] = await db.select().from(deliveries).where(eq(deliveries.id, planned!.id));
      const jobs = await emailJobs();
      return delivery?.status === 'sent' && jobs.every((j) => j.state === 'completed');
    }, 'waiting for the second instance to deliver');

    const mails = stack.mail.messages().filter((m) => m.to.includes(owner.email));
    expect(mails).toHaveLength(1);
    expect(stack.mail.messages()).toHaveLength(1);
    const [job, ...moreJobs] = await emailJobs();
    expect(moreJobs).toHaveLength(0);
    // Completed on a later attempt than the one the killed instance held.
    expect(job?.retry_count).toBeGreaterThanOrEqual(1);
  }, 300_000);
});
