import { DrizzleQueryError } from 'drizzle-orm/errors';
import type pg from 'pg';
import type { Db } from './client';

/**
 * A statement on a hot path (device ingest, the token lookup in front of it): sent by name, so each
 * connection parses and plans it once, and built without the query builder, whose work per call
 * costs more than the statement itself on these paths. Everything else uses Drizzle. A failure is
 * raised as Drizzle's own error, so it is logged and mapped like every other query's (the SQL and
 * the driver's code, never the parameters: lib/logger.ts, lib/database-errors.ts).
 */
export function preparedStatement<Row extends pg.QueryResultRow, Values extends unknown[]>(
  name: string,
  text: string,
) {
  return async (db: Db, ...values: Values): Promise<Row[]> => {
    try {
      return (await db.$client.query<Row>({ name, text, values })).rows;
    } catch (error) {
      throw new DrizzleQueryError(text, values, error instanceof Error ? error : undefined);
    }
  };
}
