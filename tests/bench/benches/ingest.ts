import type { Bench } from '../support/bench';
import { measureCpu, type CpuSplit } from '../support/cpu';
import { interleave, loadSeconds, rounds } from '../support/load';
import { formatFigure, median, percentile, ratio } from '../support/stats';

const senders = 10;
const batchSize = 100;
const perDevicePerMinute = 20;
const parameters = [
  { parameter: 'temperature', unit: '°C', value: () => 25.2 + Math.random() * 0.8 },
  { parameter: 'ph', unit: '', value: () => 8.1 + Math.random() * 0.1 },
  { parameter: 'salinity', unit: 'salinity', value: () => 34.8 + Math.random() * 0.4 },
] as const;

interface Device {
  id: string;
  tankId: string;
  companyId: string;
  token: string;
  /**
   * The last reading's time; the next ones go forward from here a second at a time, as a device
   * reports, so each batch is newer than the last and every rule judges it.
   */
  cursorMs: number;
}

interface Reading {
  parameter: string;
  value: number;
  unit: string;
  measuredAt: string;
}

function batchFor(device: Device): Reading[] {
  const readings: Reading[] = [];
  for (let i = 0; i < batchSize; i++) {
    const kind = parameters[i % parameters.length]!;
    if (i % parameters.length === 0) device.cursorMs += 1000;
    readings.push({
      parameter: kind.parameter,
      value: Math.round(kind.value() * 100) / 100,
      unit: kind.unit,
      measuredAt: new Date(device.cursorMs).toISOString(),
    });
  }
  return readings;
}

interface Run {
  readingsPerSecond: number;
  cpu?: CpuSplit;
  p99Ms: number;
  accepted: number;
  batches: number;
  elapsedS: number;
  refused: number;
}

/**
 * `senders` loops for `seconds`, each sending one batch at a time; every batch goes to the next
 * device of the pool, so no device passes the per-device limit within the minute.
 */
async function drive(
  seconds: number,
  devices: Device[],
  send: (device: Device, batch: Reading[]) => Promise<number>,
  /** The API's per-device limit applies; the bare INSERT has none. */
  limited: boolean,
  /** A fixed batch per device instead of new readings each time (the floor run). */
  batchOf: (device: Device) => Reading[] = batchFor,
) {
  const latencies: number[] = [];
  let accepted = 0;
  let refused = 0;
  let next = 0;
  const started = performance.now();
  const until = started + seconds * 1000;
  const uses = new Map<Device, number>();
  await Promise.all(
    Array.from({ length: senders }, async () => {
      while (performance.now() < until) {
        const device = devices[next++ % devices.length]!;
        const used = (uses.get(device) ?? 0) + 1;
        if (limited && used > perDevicePerMinute)
          throw new Error(`device pool too small: ${devices.length} devices`);
        uses.set(device, used);
        const batch = batchOf(device);
        const t0 = performance.now();
        const stored = await send(device, batch);
        latencies.push(performance.now() - t0);
        if (stored < 0) refused += 1;
        else accepted += stored;
      }
    }),
  );
  const elapsedS = (performance.now() - started) / 1000;
  return {
    readingsPerSecond: accepted / elapsedS,
    p99Ms: percentile(latencies, 0.99),
    accepted,
    batches: latencies.length,
    elapsedS,
    refused,
  } satisfies Run;
}

export const ingest: Bench = {
  name: 'ingest',
  summary: 'device ingest, 10 senders, batches of 100, vs a bare multi-row INSERT into readings_bare',
  async run({ stack }) {
    const { rows } = await stack.pool.query<{
      id: string;
      tank_id: string;
      company_id: string;
      token: string;
    }>(
      `select t.device_id as id, t.tank_id, k.company_id, t.device_token as token
       from bench_tanks t join bench_plan p using (company) join tanks k on k.id = t.tank_id
       where t.company = 'd' and t.n > p.alert_tanks order by t.n`,
    );
    // Far enough back that the most batches a device can send (the per-device limit in the warm-up
    // and each round) all stay in the past: ingest refuses readings from the future.
    const spanMs = perDevicePerMinute * (rounds + 1) * Math.ceil(batchSize / parameters.length) * 1000;
    const start = Date.now() - spanMs - 60_000;
    const devices: Device[] = rows.map((row) => ({
      id: row.id,
      tankId: row.tank_id,
      companyId: row.company_id,
      token: row.token,
      cursorMs: start,
    }));
    // The bare INSERT sends the same kind of batches from its own cursors: it runs several times
    // faster, and would otherwise push the API's devices into the future.
    const bareDevices = devices.map((device) => ({ ...device }));
    const deviceIds = devices.map((device) => device.id);
    // Each run starts clean: the previous run's readings and this minute's rate counters go.
    await stack.pool.query(`delete from readings where device_id = any($1::uuid[])`, [deviceIds]);
    await stack.pool.query(`drop table if exists readings_bare`);
    await stack.pool.query(`create table readings_bare (like readings including all)`);
    const counted = async () =>
      Number(
        (
          await stack.pool.query(`select count(*) as n from readings where device_id = any($1::uuid[])`, [
            deviceIds,
          ])
        ).rows[0].n,
      );
    const resetLimits = () => stack.pool.query(`delete from rate_limits where key like 'ingest:%'`);

    const url = `${stack.api.origin}/api/ingest/readings`;
    const viaApi = async (device: Device, batch: Reading[]) => {
      const response = await fetch(url, {
        method: 'POST',
        headers: { authorization: `Bearer ${device.token}`, 'content-type': 'application/json' },
        body: JSON.stringify({ readings: batch }),
      });
      const answer = (await response.json()) as { accepted?: number };
      if (response.status === 429) return -1;
      if (response.status !== 200 && response.status !== 201) {
        throw new Error(`ingest answered ${response.status}: ${JSON.stringify(answer)}`);
      }
      return answer.accepted ?? 0;
    };
    const columns = 9;
    const placeholders = Array.from(
      { length: batchSize },
      (_, row) =>
        `(${Array.from({ length: columns }, (_, col) => `$${row * columns + col + 1}`).join(', ')})`,
    ).join(', ');
    const bareInsert = `insert into readings_bare (company_id, tank_id, parameter, value, entered_value, entered_unit,
      measured_at, source, device_id) values ${placeholders}`;
    const bare = async (device: Device, batch: Reading[]) => {
      const values = batch.flatMap((r) => [
        device.companyId,
        device.tankId,
        r.parameter,
        r.value,
        r.value,
        r.unit,
        r.measuredAt,
        'device',
        device.id,
      ]);
      const result = await stack.pool.query(bareInsert, values);
      return result.rowCount ?? 0;
    };

    const before = await counted();
    await resetLimits();
    const warm = await drive(2, devices, viaApi, true);
    await drive(2, bareDevices, bare, false);
    const measured = async (apiPid: number | null, work: () => Promise<Run>) => {
      const [run, cpu] = await measureCpu(apiPid, work);
      return { ...run, cpu };
    };
    const runs = await interleave(
      rounds,
      async () => {
        await resetLimits();
        return measured(stack.api.pid, () => drive(loadSeconds, devices, viaApi, true));
      },
      async () => {
        await stack.pool.query('truncate readings_bare');
        return measured(null, () => drive(loadSeconds, bareDevices, bare, false));
      },
    );
    const cpuPerBatch = (list: Run[]) => {
      const batches = list.reduce((sum, run) => sum + run.batches, 0);
      const sum = (pick: (cpu: CpuSplit) => number) =>
        list.reduce((total, run) => total + (run.cpu ? pick(run.cpu) : 0), 0) / Math.max(1, batches);
      const api = sum((cpu) => cpu.apiMs);
      const postgres = sum((cpu) => cpu.postgresMs);
      const driver = sum((cpu) => cpu.driverMs);
      const parts = [
        ...(api > 0 ? [`API ${formatFigure(api, 'ms')}`] : []),
        `PostgreSQL ${formatFigure(postgres, 'ms')}`,
        `sender ${formatFigure(driver, 'ms')}`,
      ];
      return `${formatFigure(api + postgres + driver, 'ms')} (${parts.join(', ')})`;
    };
    const ours = median(runs.ours.map((run) => run.readingsPerSecond));
    const baseline = median(runs.baseline.map((run) => run.readingsPerSecond));
    const after = await counted();
    const stored = after - before;

    // The floor: each device sends one batch a day old, then the same batch again and again, so
    // every request does all its work (HTTP, token, limiter, checks, the INSERT's conflict probes)
    // except storing readings and judging them. No change inside storing or judging can beat it.
    const floorFrom = start - 86_400_000;
    const repeats = new Map(devices.map((device) => [device, batchFor({ ...device, cursorMs: floorFrom })]));
    await resetLimits();
    for (const device of devices) await viaApi(device, repeats.get(device)!);
    await resetLimits();
    const floor = await measured(stack.api.pid, () =>
      drive(Math.min(loadSeconds, 5), devices, viaApi, true, (device) => repeats.get(device)!),
    );
    await stack.pool.query(`delete from readings where device_id = any($1::uuid[]) and measured_at < $2`, [
      deviceIds,
      new Date(start).toISOString(),
    ]);
    const floorPerSecond = (floor.batches * batchSize) / floor.elapsedS;
    const floorRatio = ratio(floorPerSecond, baseline);
    const acceptedAll = warm.accepted + runs.ours.reduce((sum, run) => sum + run.accepted, 0);
    const r = ratio(ours, baseline);
    const refused = runs.ours.reduce((sum, run) => sum + run.refused, 0);
    return [
      {
        title: `ingest: POST /api/ingest/readings, ${senders} senders, batches of ${batchSize}`,
        rows: [
          {
            measure: 'readings stored per second (median of rounds)',
            ours: `${formatFigure(ours, 'readings/s')}, p99 ${formatFigure(median(runs.ours.map((run) => run.p99Ms)), 'ms')}`,
            baseline: `${formatFigure(baseline, 'readings/s')}, p99 ${formatFigure(median(runs.baseline.map((run) => run.p99Ms)), 'ms')}`,
            ratio: r,
            budget: '≥ 0.5',
            met: r >= 0.5,
          },
          {
            measure: 'CPU per batch of 100, all rounds',
            ours: cpuPerBatch(runs.ours),
            baseline: cpuPerBatch(runs.baseline),
          },
          {
            measure: 'floor: the same requests with every reading already stored',
            ours: `${formatFigure(floorPerSecond, 'readings/s')} handled; CPU per batch ${cpuPerBatch([floor])}`,
            ratio: floorRatio,
          },
          {
            measure: 'rows in the database = readings accepted',
            ours: `${stored} rows, ${acceptedAll} accepted (warm-up included); 429s: ${refused}`,
            met: stored === acceptedAll && refused === 0,
          },
        ],
        notes: [
          `${rounds} rounds of ${loadSeconds} s each, in turns; synchronous_commit on`,
          `baseline: the same batches as one multi-row INSERT … VALUES each (pg, pool of 12) into readings_bare (like readings including all: same indexes, no triggers or foreign keys)`,
          `${devices.length} devices (company D), each batch from the next one, so none sends more than ${perDevicePerMinute} a minute; the limiter's rows are cleared before each round`,
          "each device's readings go forward in time a second apart (3 parameters), so every batch is newer than the one before and every rule judges it",
          'warm-up 2 s each, not kept in the figures; the check compares the rows of these devices with the sum of `accepted`',
          `floor: ${Math.min(loadSeconds, 5)} s after the rounds, each device re-sending one batch it has already stored (all duplicates: no row written, no alert pass); its ratio is the most any change to storing or judging readings could reach`,
        ],
      },
    ];
  },
};
