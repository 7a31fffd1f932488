import { once } from 'node:events';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import { createApp } from './app';
import { createDeps, type AppDeps } from './deps';
import { listenForEvents } from './lib/event-bus';
import { startJobQueue } from './lib/job-queue';
import type { Clock } from './lib/clock';
import { startWorkers } from './services/workers';
import { connectDatabase } from './db/client';
import { applyMigrations } from './db/migrations';
import { loadEnvOrExit, type Env } from './env';
import { isMain } from './lib/is-main';
import { projectPath } from './lib/project-root';
import { createLogger, type Logger } from './lib/logger';

export const webDist = projectPath('dist', 'web');

export interface RunningServer {
  url: string;
  close(): Promise<void>;
}

/** Connects, migrates and listens; `close` stops accepting, lets in-flight requests finish, then closes the pool. */
export async function startServer(options: {
  env: Env;
  databaseUrl: string;
  logger: Logger;
  port?: number;
  serveClient?: boolean;
  clock?: Clock;
  /** Background work (notification delivery, sweeps); on unless a test wants a bare API. */
  background?: boolean;
  /**
   * The sweeps that run at a wall-clock hour; off where a test checks an exact state, which would
   * otherwise depend on the hour the run crosses.
   */
  dailySweeps?: boolean;
}): Promise<RunningServer & { deps: AppDeps }> {
  const { env, logger } = options;
  const database = connectDatabase(options.databaseUrl);
  await applyMigrations(database.db);
  const background = options.background !== false;
  const jobs = background ? await startJobQueue(options.databaseUrl, logger) : null;
  const events = listenForEvents(options.databaseUrl, logger);
  await events.ready;
  const deps = createDeps({
    env,
    database,
    logger,
    clock: options.clock,
    jobs,
    events,
    webDist: options.serveClient === false ? undefined : webDist,
  });
  if (jobs) await startWorkers(deps, { dailySweeps: options.dailySweeps });
  const app = createApp(deps);
  const server = app.listen(options.port ?? env.PORT, '127.0.0.1');
  await once(server, 'listening');
  const { port } = server.address() as AddressInfo;

  let closing: Promise<void> | undefined;
  return {
    url: `http://localhost:${port}`,
    deps,
    close() {
      closing ??= (async () => {
        const closed = new Promise<void>((resolve) => server.close(() => resolve()));
        server.closeIdleConnections();
        // Live event streams never finish by themselves: give requests a moment, then end them.
        const grace = setTimeout(() => server.closeAllConnections(), shutdownGraceMs);
        await closed;
        clearTimeout(grace);
        // Jobs are idempotent and retried, so one cut short by the timeout simply runs again later.
        await jobs?.stop({ graceful: true, timeout: jobStopTimeoutMs });
        await events.close();
        await deps.reads.close();
        await database.pool.end();
      })();
      return closing;
    },
  };
}

// Together these keep a stop within about five seconds, even with jobs and event streams open.
const shutdownGraceMs = 1_500;
const jobStopTimeoutMs = 2_500;

/**
 * Stops cleanly on SIGINT/SIGTERM, running `steps` in order. A second signal (or a stop that takes
 * longer than `deadlineMs`) skips what is left but `urgent` — stopping PostgreSQL — and exits.
 */
export function onShutdown(
  logger: Logger,
  steps: Array<() => Promise<void>>,
  options: { urgent?: () => Promise<void>; deadlineMs?: number } = {},
) {
  let shuttingDown = false;
  let forcing = false;
  const force = async (reason: string) => {
    if (forcing) return;
    forcing = true;
    logger.warn({ reason }, 'stopping at once');
    try {
      await options.urgent?.();
    } catch (error) {
      logger.error({ err: error }, 'urgent shutdown step failed');
    }
    process.exit(130);
  };
  const shutdown = async (signal: string) => {
    if (shuttingDown) return void force(`second ${signal}`);
    shuttingDown = true;
    logger.info({ signal }, 'shutting down');
    setTimeout(() => void force('shutdown took too long'), options.deadlineMs ?? 8_000).unref();
    for (const step of steps) {
      try {
        await step();
      } catch (error) {
        logger.error({ err: error }, 'shutdown step failed');
      }
    }
    process.exit(0);
  };
  process.on('SIGINT', () => void shutdown('SIGINT'));
  process.on('SIGTERM', () => void shutdown('SIGTERM'));
}

async function main() {
  const env = loadEnvOrExit();
  if (!env.DATABASE_URL) {
    console.error(
      'Brinewatch cannot start: DATABASE_URL is required (use `npm start` for the self-contained demo).',
    );
    process.exit(1);
  }
  const logger = createLogger(env.LOG_LEVEL);
  const server = await startServer({ env, databaseUrl: env.DATABASE_URL, logger });
  logger.info({ url: server.url, dir: path.relative(process.cwd(), webDist) }, 'Brinewatch listening');
  onShutdown(logger, [() => server.close()]);
}

if (isMain(import.meta.url)) await main();
