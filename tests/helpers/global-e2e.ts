import { execFileSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import path from 'node:path';
import type { TestProject } from 'vitest/node';
import { parseEnv } from '../../api/env';
import { createLogger } from '../../api/lib/logger';
import { startServer, webDist } from '../../api/server';
import { ensureChromium } from './chromium';
import { createDatabaseFrom } from './db';
import { freePort } from './free-port';
import { startTestCluster } from './global-db';

declare module 'vitest' {
  export interface ProvidedContext {
    appUrl: string;
  }
}

/** The whole product for the browser tests: a fresh database, the app and its built client. */
export default async function setup(project: TestProject) {
  ensureChromium();
  if (!existsSync(path.join(webDist, 'index.html'))) {
    execFileSync('npx', ['vite', 'build', '--logLevel', 'warn'], { stdio: 'inherit' });
  }
  const cluster = await startTestCluster();
  const database = await createDatabaseFrom(cluster.baseUrl);
  const port = await freePort();
  const env = parseEnv({
    NODE_ENV: 'test',
    LOG_LEVEL: 'silent',
    PORT: String(port),
    DATABASE_URL: database.url,
  });
  const server = await startServer({ env, databaseUrl: database.url, logger: createLogger('silent') });
  project.provide('appUrl', server.url);
  project.provide('postgresBaseUrl', cluster.baseUrl);
  return async () => {
    await server.close();
    await database.drop();
    await cluster.stop();
  };
}
