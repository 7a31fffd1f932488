import { createApp } from '../../api/app';
import { createDeps } from '../../api/deps';
import { parseEnv, type Env } from '../../api/env';
import { createLogger } from '../../api/lib/logger';
import { createTestDatabase, type TestDatabase } from './db';

/** Secrets have no defaults in the code; tests pass their own. */
export const testSecrets = {
  SESSION_SECRET: 'test-session-secret-5d1e8b2a9c4f7e30a6b1',
  OIDC_CLIENT_SECRET: 'test-client-secret-3f9a1c7e',
};

export interface TestApp {
  app: ReturnType<typeof createApp>;
  database: TestDatabase;
  env: Env;
  close(): Promise<void>;
}

/** The real app on its own fresh database, without listening; supertest drives it. */
export async function createTestApp(overrides: Record<string, string> = {}): Promise<TestApp> {
  const database = await createTestDatabase();
  const env = parseEnv({
    NODE_ENV: 'test',
    LOG_LEVEL: 'silent',
    DATABASE_URL: database.url,
    ...testSecrets,
    ...overrides,
  });
  const app = createApp(createDeps({ env, database, logger: createLogger(env.LOG_LEVEL) }));
  return { app, database, env, close: () => database.drop() };
}
