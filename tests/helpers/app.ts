import { createApp } from '../../api/app';
import { createDeps } from '../../api/deps';
import { parseEnv, type Env } from '../../api/env';
import { createLogger } from '../../api/lib/logger';
import { createTestDatabase, type TestDatabase } from './db';

export interface TestApp {
  app: ReturnType<typeof createApp>;
  database: TestDatabase;
  env: Env;
  close(): Promise<void>;
}

/** The real app on its own fresh database, without listening; supertest drives it. */
export async function createTestApp(overrides: Record<string, string> = {}): Promise<TestApp> {
  const database = await createTestDatabase();
  const env = parseEnv({ NODE_ENV: 'test', LOG_LEVEL: 'silent', DATABASE_URL: database.url, ...overrides });
  const app = createApp(createDeps({ env, database, logger: createLogger(env.LOG_LEVEL) }));
  return { app, database, env, close: () => database.drop() };
}
