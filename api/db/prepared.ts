import type pg from 'pg';
import type { Db } from './client';

/**
 * A statement on a hot path (device ingest, the token lookup in front of it): sent by name, so each
 * connection parses and plans it once, and built without the query builder, whose work per call
 * costs more than the statement itself on these paths. Everything else uses Drizzle.
 */
export function preparedStatement<Row extends pg.QueryResultRow, Values extends unknown[]>(
  name: string,
  text: string,
) {
  return async (db: Db, ...values: Values): Promise<Row[]> =>
    (await db.$client.query<Row>({ name, text, values })).rows;
}
