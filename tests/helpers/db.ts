import { randomBytes } from 'node:crypto';
import pg from 'pg';
import { inject } from 'vitest';
import { connectDatabase, type Database } from '../../api/db/client';

const templateDatabase = 'brinewatch_template';

export interface TestDatabase extends Database {
  url: string;
  name: string;
  drop(): Promise<void>;
}

/** A fresh, migrated database copied from the run's template: nothing leaks between test files. */
export function createTestDatabase(): Promise<TestDatabase> {
  return createDatabaseFrom(inject('postgresBaseUrl'));
}

/** A new database from the run's migrated template, or another (`template0`: an empty one). */
export async function createDatabaseFrom(
  base: string,
  options: { template?: string } = {},
): Promise<TestDatabase> {
  const name = `test_${randomBytes(6).toString('hex')}`;
  const admin = new pg.Client({ connectionString: `${base}/postgres` });
  await admin.connect();
  try {
    await admin.query(`create database ${name} template ${options.template ?? templateDatabase}`);
  } finally {
    await admin.end();
  }
  const url = `${base}/${name}`;
  const database = connectDatabase(url, { max: 5 });
  return {
    ...database,
    url,
    name,
    async drop() {
      await database.pool.end();
      const client = new pg.Client({ connectionString: `${base}/postgres` });
      await client.connect();
      try {
        await client.query(`drop database if exists ${name} with (force)`);
      } finally {
        await client.end();
      }
    },
  };
}
