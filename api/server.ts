import { once } from 'node:events';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { createApp } from './app';
import { createDeps } from './deps';
import { connectDatabase } from './db/client';
import { applyMigrations } from './db/migrations';
import { loadEnvOrExit, type Env } from './env';
import { isMain } from './lib/is-main';
import { createLogger, type Logger } from './lib/logger';

export const webDist = fileURLToPath(new URL('../dist/web', import.meta.url));

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
}): Promise<RunningServer> {
  const { env, logger } = options;
  const database = connectDatabase(options.databaseUrl);
  await applyMigrations(database.db);
  const app = createApp(
    createDeps({ env, database, logger, webDist: options.serveClient === false ? undefined : webDist }),
  );
  const server = app.listen(options.port ?? env.PORT, '127.0.0.1');
  await once(server, 'listening');
  const { port } = server.address() as AddressInfo;

  let closing: Promise<void> | undefined;
  return {
    url: `http://localhost:${port}`,
    close() {
      closing ??= (async () => {
        const closed = new Promise<void>((resolve) => server.close(() => resolve()));
        server.closeIdleConnections();
        await closed;
        await database.pool.end();
      })();
      return closing;
    },
  };
}

/** Stops cleanly on SIGINT/SIGTERM, running the given steps in order. */
export function onShutdown(logger: Logger, steps: Array<() => Promise<void>>) {
  let shuttingDown = false;
  const shutdown = async (signal: string) => {
    if (shuttingDown) return;
    shuttingDown = true;
    logger.info({ signal }, 'shutting down');
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
