import { openSync, readSync, statSync, closeSync } from 'node:fs';
import path from 'node:path';
import { setTimeout as sleep } from 'node:timers/promises';
import type pg from 'pg';
import { benchDataDir } from './cluster';

export interface CapturedStatement {
  pid: number;
  text: string;
  values: Array<string | null>;
}

const prefix = '@@bench ';

/** Reads `$1 = 'a', $2 = NULL, $3 = 'it''s'` as PostgreSQL logs bind parameters. */
export function parseParameters(detail: string): Array<string | null> {
  const values: Array<string | null> = [];
  for (const match of detail.matchAll(/\$(\d+) = (NULL|'((?:[^']|'')*)')/g)) {
    values[Number(match[1]) - 1] = match[2] === 'NULL' ? null : match[3]!.replaceAll("''", "'");
  }
  return values;
}

/**
 * Statements as `log_statement = all` writes them with the prefix below: `execute <name>: sql`
 * (extended protocol) or `statement: sql`, each maybe followed by its parameters. Lines that do
 * not start with the prefix continue the entry before, with a tab in front.
 */
export function parseStatementLog(log: string): CapturedStatement[] {
  const entries: Array<{ pid: number; body: string }> = [];
  for (const line of log.split('\n')) {
    if (line.startsWith(prefix)) {
      const match = /^@@bench (\d+)@@ (.*)$/.exec(line);
      if (match) entries.push({ pid: Number(match[1]), body: match[2]! });
    } else if (entries.length > 0) {
      entries.at(-1)!.body += `\n${line.replace(/^\t/, '')}`;
    }
  }
  const statements: CapturedStatement[] = [];
  for (const entry of entries) {
    const statement = /^LOG:\s+(?:execute [^:]+|statement): ([\s\S]*)$/.exec(entry.body);
    if (statement) {
      statements.push({ pid: entry.pid, text: statement[1]!.trim(), values: [] });
      continue;
    }
    const detail = /^DETAIL:\s+parameters: ([\s\S]*)$/.exec(entry.body);
    const last = statements.at(-1);
    if (detail && last && last.pid === entry.pid) last.values = parseParameters(detail[1]!);
  }
  return statements;
}

/** The job queue, live-event listener and this harness run statements too; they are not the request's. */
const notTheRequest =
  /pgboss|^(alter system|select pg_reload_conf|listen |unlisten |notify |select pg_notify)/i;

/**
 * The statements of the first capture that every capture holds: background work (a sweep, a
 * fan-out job) that happened to run during one of them drops out.
 */
export function commonToAll(captures: CapturedStatement[][]): CapturedStatement[] {
  const normal = (text: string) => text.replace(/\s+/g, ' ');
  const [first = [], ...rest] = captures;
  return first.filter((statement) =>
    rest.every((other) => other.some((candidate) => normal(candidate.text) === normal(statement.text))),
  );
}

/**
 * Every statement the API sends while `act` runs, read from the cluster's log with
 * log_statement switched on for that moment only. `act` runs `times` times, each captured on its
 * own, and only the statements all of them sent are kept.
 */
export async function captureStatements(
  pool: pg.Pool,
  act: () => Promise<void>,
  times = 3,
): Promise<CapturedStatement[]> {
  const captures: CapturedStatement[][] = [];
  for (let i = 0; i < times; i++) captures.push(await captureOnce(pool, act));
  return commonToAll(captures);
}

async function captureOnce(pool: pg.Pool, act: () => Promise<void>): Promise<CapturedStatement[]> {
  const logFile = path.join(benchDataDir, 'postgres.log');
  await pool.query(`alter system set log_line_prefix = '${prefix}%p@@ '`);
  await pool.query(`alter system set log_statement = 'all'`);
  await pool.query('select pg_reload_conf()');
  await sleep(500);
  const from = statSync(logFile).size;
  try {
    await act();
    await sleep(500);
  } finally {
    await pool.query('alter system reset log_statement');
    await pool.query('alter system reset log_line_prefix');
    await pool.query('select pg_reload_conf()');
  }
  const to = statSync(logFile).size;
  const buffer = Buffer.alloc(to - from);
  const fd = openSync(logFile, 'r');
  try {
    readSync(fd, buffer, 0, buffer.length, from);
  } finally {
    closeSync(fd);
  }
  return parseStatementLog(buffer.toString('utf8')).filter(
    (statement) => !notTheRequest.test(statement.text),
  );
}
