import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { databaseProblem } from '../../api/lib/database-errors';
import { createTestDatabase, type TestDatabase } from '../helpers/db';
import { freePort } from '../helpers/free-port';

/** Real errors from PostgreSQL and node-postgres, and the answer each one gets. */
describe('databaseProblem', () => {
  let database: TestDatabase;
  beforeAll(async () => {
    database = await createTestDatabase();
  });
  afterAll(() => database.drop());

  async function errorOf(query: string, values: unknown[] = []): Promise<unknown> {
    try {
      await database.pool.query(query, values);
    } catch (error) {
      return error;
    }
    throw new Error(`${query} did not fail`);
  }

  it.each([
    ['a NUL byte in text (22021)', 'select $1::text', ['a\u0000b']],
    ['a bigint out of range (22003)', 'select $1::bigint', ['99999999999999999999']],
    ['text that is not a uuid (22P02)', 'select $1::uuid', ['not-a-uuid']],
    ['a date that does not exist (22008)', "select '2026-02-30'::date", []],
    ['a lone surrogate in json (22P02)', 'select $1::jsonb', ['"\\ud800"']],
  ])('answers %s with 400 invalid_request', async (_what, query, values) => {
    const problem = databaseProblem(await errorOf(query, values));
    expect(problem?.error.status).toBe(400);
    expect(problem?.error.code).toBe('invalid_request');
  });

  it('answers a unique violation with 409 conflict', async () => {
    await database.pool.query('create temporary table once_only (id int primary key)');
    await database.pool.query('insert into once_only values (1)');
    const problem = databaseProblem(await errorOf('insert into once_only values (1)'));
    expect(problem).toMatchObject({ code: '23505', error: { status: 409, code: 'conflict' } });
  });

  it('answers a refused connection with 503 service_unavailable', async () => {
    const port = await freePort();
    const pool = new pg.Pool({ connectionString: `postgres://nobody@127.0.0.1:${port}/none` });
    let error: unknown;
    try {
      await pool.query('select 1');
    } catch (caught) {
      error = caught;
    } finally {
      await pool.end();
    }
    expect(databaseProblem(error)).toMatchObject({ error: { status: 503, code: 'service_unavailable' } });
  });

  it('answers a terminated backend (57P01) with 503', async () => {
    const client = new pg.Client({ connectionString: database.url });
    await client.connect();
    client.on('error', () => {});
    const { rows } = await client.query<{ pid: number }>('select pg_backend_pid() as pid');
    const waiting = client.query('select pg_sleep(10)').catch((error: unknown) => error);
    await new Promise((resolve) => setTimeout(resolve, 100));
    await database.pool.query('select pg_terminate_backend($1)', [rows[0]!.pid]);
    const problem = databaseProblem(await waiting);
    await client.end().catch(() => {});
    expect(problem?.error.status).toBe(503);
  });

  it("leaves an error that is not the request's fault for the 500 path", async () => {
    expect(databaseProblem(new Error('something else'))).toBeNull();
    expect(databaseProblem(await errorOf('select from nowhere_at_all'))).toBeNull();
  });
});
