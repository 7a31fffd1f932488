import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { TestProject } from 'vitest/node';
import { connectDatabase } from '../../api/db/client';
import { applyMigrations } from '../../api/db/migrations';
import { startPostgres } from '../../api/dev/postgres';
import { freePort } from './free-port';

export const templateDatabase = 'brinewatch_template';

declare module 'vitest' {
  export interface ProvidedContext {
    /** Server URL without a database name; each test file clones the migrated template. */
    postgresBaseUrl: string;
  }
}

/**
 * One throwaway PostgreSQL cluster per test run (fsync off), migrated once into a template
 * database that every test file copies for isolation.
 */
export async function startTestCluster(): Promise<{ baseUrl: string; stop(): Promise<void> }> {
  if (process.env.DATABASE_URL) {
    throw new Error('Tests start their own PostgreSQL; unset DATABASE_URL to run them.');
  }
  const dir = mkdtempSync(path.join(os.tmpdir(), 'brinewatch-test-pg-'));
  const postgres = await startPostgres({
    dir,
    port: await freePort(),
    database: templateDatabase,
    durable: false,
    log: () => {},
  });
  const { db, pool } = connectDatabase(postgres.url, { max: 1 });
  await applyMigrations(db);
  await pool.end();
  return {
    baseUrl: postgres.url.slice(0, postgres.url.lastIndexOf('/')),
    async stop() {
      await postgres.stop();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}

export default async function setup(project: TestProject) {
  const cluster = await startTestCluster();
  project.provide('postgresBaseUrl', cluster.baseUrl);
  return () => cluster.stop();
}
