import { sql, type SQL } from 'drizzle-orm';
import { parameterKeys, type ParameterKey } from '@shared/parameters/keys';
import { toStored } from '@shared/parameters/units';
import { dayMs } from '@shared/parameters/catalogue';
import { csvHeaderLine, readingCsvLine } from '@shared/readings/csv';
import {
  futureToleranceMs,
  type CreateReadingsInput,
  type ImportReadingsInput,
  type ManualReadingInput,
  type ReadingExportQuery,
  type ReadingListQuery,
  type ReadingPage,
  type TankHealthSummary,
} from '@shared/schemas/readings';
import type { Reading } from '@shared/readings/reading';
import type { ManualSource, ReadingSource } from '@shared/readings/sources';
import type { AppDeps } from '../deps';
import type { Db } from '../db/client';
import type { ReadRouting } from '../db/replica';
import { readings, type tanks } from '../db/schema/index';
import { badRequest, forbidden, type ErrorIssue } from '../lib/http-error';
import { roleCan } from '@shared/people/permissions';
import { findTankFor } from '../policy/index';
import type { Actor } from './actors';
import type { NewReading } from './alert-engine';
import { raiseAlertsForTanks } from './alerts';
import { healthForTanks } from './tank-health';
import { formatDate } from '@shared/text/dates';

type TankRow = typeof tanks.$inferSelect;

/**
 * The earliest a reading of this tank may be dated: the day it was set up when that is known (a
 * date without a zone begins at the earliest at UTC+14), else when it was added to Brinewatch.
 */
export function tankExistsFrom(tank: Pick<TankRow, 'createdAt' | 'setUpOn'>): Date {
  if (!tank.setUpOn) return tank.createdAt;
  return new Date(Date.parse(`${tank.setUpOn}T00:00:00Z`) - 14 * 3_600_000);
}

export type TimeProblem = 'future' | 'before-tank';

export function timeProblem(measuredAt: Date, existsFrom: Date, now: Date): TimeProblem | null {
  if (measuredAt.getTime() > now.getTime() + futureToleranceMs) return 'future';
  if (measuredAt.getTime() < existsFrom.getTime()) return 'before-tank';
  return null;
}

export function timeProblemMessage(problem: TimeProblem, existsFrom: Date): string {
  return problem === 'future'
    ? 'this time is in the future; check the date and time'
    : `this is before the tank existed (from ${formatDate(existsFrom, 'UTC')})`;
}

/** A stored reading as the alert engine judges it. */
export type StoredReading = NewReading;

export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

/**
 * The one way readings are stored, whoever sends them (a person, a CSV import, a device): `write`
 * stores them in one transaction and says which are new, and only after that commit are they
 * handed to the alert engine, so an alert never points at a reading that was rolled back.
 */
export async function commitReadings<T>(
  deps: AppDeps,
  tankId: string,
  write: (tx: Tx) => Promise<{ stored: readonly StoredReading[]; result: T }>,
): Promise<T> {
  const { stored, result } = await deps.db.transaction(write);
  return afterCommit(deps, new Map([[tankId, stored]]), result);
}

/**
 * The same for a write that is a single statement, atomic on its own (device ingest, several
 * devices' batches at once): it runs on the pool without BEGIN and COMMIT around it, and says
 * which readings are new for each tank; the tanks are judged together after it.
 */
export async function commitReadingsStatement<T>(
  deps: AppDeps,
  write: (
    db: Pick<Db, 'execute'>,
  ) => Promise<{ stored: ReadonlyMap<string, readonly StoredReading[]>; result: T }>,
): Promise<T> {
  const { stored, result } = await write(deps.db);
  return afterCommit(deps, stored, result);
}

async function afterCommit<T>(
  deps: AppDeps,
  stored: ReadonlyMap<string, readonly StoredReading[]>,
  result: T,
): Promise<T> {
  for (const tankId of stored.keys()) deps.reads.wrote(tankId);
  await raiseAlertsForTanks(deps, stored);
  return result;
}

export interface ManualRow extends ManualReadingInput {
  source: ManualSource;
}

function manualValues(tank: TankRow, actor: Actor, rows: readonly ManualRow[]) {
  return rows.map((reading) => ({
    companyId: tank.companyId,
    tankId: tank.id,
    parameter: reading.parameter,
    // The schema has already checked the conversion; this cannot throw for a parsed reading.
    value: toStored(reading.parameter, reading.value, reading.unit, reading).value,
    enteredValue: reading.value,
    enteredUnit: reading.unit,
    measuredAt: new Date(reading.measuredAt),
    source: reading.source,
    recordedBy: actor.id,
    method: reading.method ?? null,
    note: reading.note || null,
    sampleTempC: reading.sampleTempC ?? null,
    referenceTempC: reading.referenceTempC ?? null,
  }));
}

/** Issues with when readings were taken: not in the future, not before the tank existed. */
export function manualTimeIssues(
  tank: TankRow,
  rows: readonly Pick<ManualRow, 'measuredAt'>[],
  now: Date,
  pathPrefix: string,
): ErrorIssue[] {
  const existsFrom = tankExistsFrom(tank);
  return rows.flatMap((row, index) => {
    const problem = timeProblem(new Date(row.measuredAt), existsFrom, now);
    return problem
      ? [{ path: `${pathPrefix}.${index}.measuredAt`, message: timeProblemMessage(problem, existsFrom) }]
      : [];
  });
}

/** Inserts checked readings inside the caller's transaction; the caller hands them to commitReadings. */
export async function insertManualRows(
  tx: Tx,
  tank: TankRow,
  actor: Actor,
  rows: readonly ManualRow[],
): Promise<(typeof readings.$inferSelect)[]> {
  const inserted: (typeof readings.$inferSelect)[] = [];
  // 1000 rows × 14 columns stays far below PostgreSQL's 65,535 parameters per statement.
  for (let start = 0; start < rows.length; start += 1000) {
    const values = manualValues(tank, actor, rows.slice(start, start + 1000));
    inserted.push(...(await tx.insert(readings).values(values).returning()));
  }
  return inserted;
}

/** All or nothing: every row is checked, and any issue refuses the whole batch with every issue. */
async function insertManual(
  deps: AppDeps,
  actor: Actor,
  tank: TankRow,
  rows: readonly ManualRow[],
  extraIssues: ErrorIssue[] = [],
): Promise<Reading[]> {
  const issues = [...extraIssues, ...manualTimeIssues(tank, rows, deps.clock(), 'body.readings')];
  if (issues.length > 0) {
    issues.sort((a, b) => a.path.localeCompare(b.path, 'en', { numeric: true }));
    throw badRequest('invalid_request', 'Some readings need attention; none were saved.', issues);
  }
  const saved = await commitReadings(deps, tank.id, async (tx) => {
    const inserted = await insertManualRows(tx, tank, actor, rows);
    return { stored: inserted, result: inserted };
  });
  return saved.map((row) => ({
    id: row.id,
    parameter: row.parameter,
    value: row.value,
    enteredValue: row.enteredValue,
    enteredUnit: row.enteredUnit,
    measuredAt: row.measuredAt.toISOString(),
    source: row.source,
    recordedBy: actor.name,
    method: row.method,
    note: row.note,
    sampleTempC: row.sampleTempC,
    referenceTempC: row.referenceTempC,
  }));
}

/** Readings typed in by a person; their alerts are raised before this returns. */
export async function recordReadings(
  deps: AppDeps,
  actor: Actor,
  tankId: string,
  input: CreateReadingsInput,
): Promise<Reading[]> {
  const tank = await findTankFor(deps.db, actor, tankId, 'read');
  const source: ManualSource =
    input.source ?? (roleCan(actor.role, 'readings:record-visit') ? 'visit' : 'home-test');
  if (!roleCan(actor.role, 'readings:record-visit') && source !== 'home-test') {
    throw forbidden('Owners record home tests; visit readings come from the company.');
  }
  return insertManual(
    deps,
    actor,
    tank,
    input.readings.map((reading) => ({ ...reading, source })),
  );
}

/** A CSV file's readings, checked in the browser and again here; their alerts are raised before this returns. */
export async function importReadings(
  deps: AppDeps,
  actor: Actor,
  tankId: string,
  input: ImportReadingsInput,
): Promise<Reading[]> {
  const tank = await findTankFor(deps.db, actor, tankId, 'read');
  const sourceIssues: ErrorIssue[] = roleCan(actor.role, 'readings:record-visit')
    ? []
    : input.readings.flatMap((reading, index) =>
        reading.source === 'home-test'
          ? []
          : [{ path: `body.readings.${index}.source`, message: 'owners import home tests only' }],
      );
  return insertManual(deps, actor, tank, input.readings, sourceIssues);
}

export type ReadingRow = {
  id: number | string;
  parameter: ParameterKey;
  value: number;
  entered_value: number;
  entered_unit: string;
  measured_at_ms: number | string;
  source: ReadingSource;
  recorded_by: string | null;
  method: string | null;
  note: string | null;
  sample_temp_c: number | null;
  reference_temp_c: number | null;
};

/** Columns of a reading for raw SQL, with its time as epoch ms and who or what recorded it. */
export const readingColumns = (r: SQL) => sql`
  ${r}.id, ${r}.parameter, ${r}.value, ${r}.entered_value, ${r}.entered_unit,
  extract(epoch from ${r}.measured_at) * 1000 as measured_at_ms, ${r}.source,
  coalesce((select u.name from users u where u.id = ${r}.recorded_by),
           (select d.name from devices d where d.id = ${r}.device_id)) as recorded_by,
  ${r}.method, ${r}.note, ${r}.sample_temp_c, ${r}.reference_temp_c`;

export function readingFromRow(row: ReadingRow): Reading {
  return {
    id: Number(row.id),
    parameter: row.parameter,
    value: row.value,
    enteredValue: row.entered_value,
    enteredUnit: row.entered_unit,
    measuredAt: new Date(Math.round(Number(row.measured_at_ms))).toISOString(),
    source: row.source,
    recordedBy: row.recorded_by,
    method: row.method,
    note: row.note,
    sampleTempC: row.sample_temp_c,
    referenceTempC: row.reference_temp_c,
  };
}

export const cursorOf = (reading: Reading) => `${reading.measuredAt}_${reading.id}`;

/**
 * Newest first, by keyset. Each parameter is read down its own stretch of readings_history_idx
 * and the streams are merged, so a page costs the same on a year of device data as on a week.
 */
async function readingsPage(
  db: Db,
  tankId: string,
  filter: Omit<ReadingListQuery, 'limit'>,
  limit: number,
): Promise<Reading[]> {
  const parameters = filter.parameter ? [filter.parameter] : [...parameterKeys];
  const conditions: SQL[] = [sql`r.tank_id = ${tankId}`, sql`r.parameter = p.parameter`];
  if (filter.source) conditions.push(sql`r.source = ${filter.source}`);
  if (filter.from) conditions.push(sql`r.measured_at >= ${filter.from}::timestamptz`);
  if (filter.to) conditions.push(sql`r.measured_at <= ${filter.to}::timestamptz`);
  if (filter.before) {
    const split = filter.before.lastIndexOf('_');
    const at = filter.before.slice(0, split);
    const id = Number(filter.before.slice(split + 1));
    conditions.push(sql`(r.measured_at, r.id) < (${at}::timestamptz, ${id}::bigint)`);
  }
  const result = await db.execute<ReadingRow>(sql`
    select x.* from unnest(${sql.param(parameters)}::parameter_key[]) as p(parameter)
    cross join lateral (
      select ${readingColumns(sql`r`)}
      from readings r
      where ${sql.join(conditions, sql` and `)}
      order by r.measured_at desc, r.id desc
      limit ${limit}
    ) x
    order by x.measured_at_ms desc, x.id desc
    limit ${limit}`);
  return result.rows.map(readingFromRow);
}

export async function listReadings(
  db: Db,
  reads: ReadRouting,
  actor: Actor,
  tankId: string,
  query: ReadingListQuery,
): Promise<ReadingPage> {
  const tank = await findTankFor(db, actor, tankId, 'read');
  const rows = await reads.read(tank.id, (source) => readingsPage(source, tank.id, query, query.limit + 1));
  const page = rows.slice(0, query.limit);
  return { readings: page, next: rows.length > query.limit ? cursorOf(page.at(-1)!) : null };
}

export interface ReadingsCsv {
  fileName: string;
  /** The header line, then the readings oldest first by (measured at, id), a page at a time. */
  lines: AsyncIterable<string>;
}

/** The longest stretch one export covers: a year of 5-minute device data with room for a season. */
export const maxExportDays = 400;
const exportPageSize = 2000;

type ExportRow = ReadingRow & { at: string };

/**
 * One parameter's readings oldest first, by keyset on (measured_at, id) down readings_history_idx
 * (tank, parameter, measured_at), `exportPageSize` rows per query. Each query reads only the rows
 * it returns (a source filter aside, which the index does not hold), and no connection is held
 * between pages.
 */
async function* parameterPages(
  db: Db,
  tankId: string,
  parameter: ParameterKey,
  filter: { source?: ReadingSource; from: string; to?: string },
): AsyncGenerator<ExportRow[]> {
  let after: { at: string; id: number } | null = null;
  for (;;) {
    const conditions: SQL[] = [
      sql`r.tank_id = ${tankId}`,
      sql`r.parameter = ${parameter}`,
      sql`r.measured_at >= ${filter.from}::timestamptz`,
    ];
    if (filter.to) conditions.push(sql`r.measured_at <= ${filter.to}::timestamptz`);
    if (filter.source) conditions.push(sql`r.source = ${filter.source}`);
    if (after) {
      // The plain bound gives the index its range; the row comparison breaks ties by id.
      conditions.push(sql`r.measured_at >= ${after.at}::timestamptz`);
      conditions.push(sql`(r.measured_at, r.id) > (${after.at}::timestamptz, ${after.id}::bigint)`);
    }
    const { rows } = await db.execute<ExportRow>(sql`
      select ${readingColumns(sql`r`)}, r.measured_at::text as at
      from readings r
      where ${sql.join(conditions, sql` and `)}
      order by r.measured_at, r.id
      limit ${exportPageSize}`);
    if (rows.length > 0) yield rows;
    if (rows.length < exportPageSize) return;
    const last = rows.at(-1)!;
    after = { at: last.at, id: Number(last.id) };
  }
}

const before = (a: ExportRow, b: ExportRow) => {
  const byTime = Number(a.measured_at_ms) - Number(b.measured_at_ms);
  return byTime < 0 || (byTime === 0 && Number(a.id) < Number(b.id));
};

/**
 * The parameters' pages merged into one (measured_at, id) order. At most one page per parameter is
 * held at a time, so memory stays flat however long the range.
 */
async function* mergedReadings(streams: AsyncGenerator<ExportRow[]>[]): AsyncGenerator<ExportRow> {
  const heads: { stream: AsyncGenerator<ExportRow[]>; page: ExportRow[]; next: number }[] = [];
  for (const stream of streams) {
    const first = await stream.next();
    if (!first.done) heads.push({ stream, page: first.value, next: 0 });
  }
  while (heads.length > 0) {
    let pick = 0;
    for (let i = 1; i < heads.length; i += 1) {
      if (before(heads[i]!.page[heads[i]!.next]!, heads[pick]!.page[heads[pick]!.next]!)) pick = i;
    }
    const head = heads[pick]!;
    yield head.page[head.next]!;
    head.next += 1;
    if (head.next < head.page.length) continue;
    const more = await head.stream.next();
    if (more.done) heads.splice(pick, 1);
    else Object.assign(head, { page: more.value, next: 0 });
  }
}

/** The export's stretch: `from` defaults to `maxExportDays` before `to` (or now); longer is refused. */
function exportRange(query: ReadingExportQuery, now: Date): { from: string; to?: string } {
  const end = query.to ? new Date(query.to) : now;
  const from = query.from ?? new Date(end.getTime() - maxExportDays * dayMs).toISOString();
  const spanMs = end.getTime() - new Date(from).getTime();
  if (spanMs < 0) {
    throw badRequest('invalid_request', 'The export range ends before it starts.', [
      { path: 'query.to', message: 'must not be before from' },
    ]);
  }
  if (spanMs > maxExportDays * dayMs) {
    throw badRequest(
      'range_too_long',
      `An export covers at most ${maxExportDays} days; choose a shorter range or export it in parts.`,
      [{ path: 'query.from', message: `must be at most ${maxExportDays} days before the end of the range` }],
    );
  }
  return { from, ...(query.to ? { to: query.to } : {}) };
}

/**
 * The filtered readings as CSV, oldest first, read page by page while the caller writes them, so a
 * year of device data never sits in memory. Access and range are checked before anything is written.
 */
export async function exportReadingsCsv(
  db: Db,
  reads: ReadRouting,
  actor: Actor,
  tankId: string,
  query: ReadingExportQuery,
  now: Date,
): Promise<ReadingsCsv> {
  const tank = await findTankFor(db, actor, tankId, 'read');
  const range = exportRange(query, now);
  const day = now.toISOString().slice(0, 10);
  const slug =
    tank.name
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-|-$/g, '') || 'tank';
  const parameters = query.parameter ? [query.parameter] : [...parameterKeys];
  async function* lines() {
    yield csvHeaderLine();
    const source = reads.choose(tank.id);
    const streams = parameters.map((parameter) =>
      parameterPages(source, tank.id, parameter, { ...range, source: query.source }),
    );
    let chunk: string[] = [];
    for await (const row of mergedReadings(streams)) {
      chunk.push(readingCsvLine(readingFromRow(row)));
      if (chunk.length === exportPageSize) {
        yield chunk.join('');
        chunk = [];
      }
    }
    if (chunk.length > 0) yield chunk.join('');
  }
  return { fileName: `${slug}-readings-${query.parameter ?? 'all'}-${day}.csv`, lines: lines() };
}

export async function latestReadings(
  db: Db,
  actor: Actor,
  tankId: string,
  now: Date,
): Promise<TankHealthSummary> {
  const tank = await findTankFor(db, actor, tankId, 'read');
  const health = await healthForTanks(db, [tank.id], now);
  return (
    health.get(tank.id) ?? {
      status: 'no-data',
      statusReason: 'No readings yet',
      parameters: [],
      lastReadingAt: null,
    }
  );
}
