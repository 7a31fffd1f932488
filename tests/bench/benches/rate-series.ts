import { sql } from 'drizzle-orm';
import { connectDatabase } from '../../../api/db/client';
import { loadRateSeries, type NewReading, type SeriesPoint } from '../../../api/services/alert-engine';
import { evaluateRate } from '@shared/alerts/rate';
import { parameterCatalogue } from '@shared/parameters/catalogue';
import type { ParameterKey } from '@shared/parameters/keys';
import { companyPlans, deviceParameters } from '../seed/plan';
import type { Bench } from '../support/bench';
import { measureCpu, type CpuSplit } from '../support/cpu';
import { formatFigure, median, ratio } from '../support/stats';

const rounds = 5;

/**
 * What the rate rules read on every batch a device sends, on the tanks with a year of 5-minute
 * readings: the alert engine's query (the readings at the extreme changes only) against reading
 * the whole window, as the engine did before, each judged with evaluateRate. Both must give the
 * same verdict on every tank.
 */
export const rateSeries: Bench = {
  name: 'rate-series',
  summary: "the rate rules' read per device batch: extreme changes only vs the whole window",
  async run({ stack }) {
    // The API's own connection settings, as the alert pass runs them.
    const { db, pool } = connectDatabase(stack.cluster.url, { max: 2 });
    const latestOf = async (tankIds: string[]) => {
      const { rows } = await stack.pool.query<{
        tank_id: string;
        parameter: ParameterKey;
        value: number;
        measured_at: Date;
      }>(
        `select l.tank_id, l.parameter, l.value, l.measured_at from latest_readings l
         where l.tank_id = any($1::uuid[]) and l.parameter = any($2::parameter_key[])`,
        [tankIds, deviceParameters],
      );
      const tanks = new Map<string, Map<ParameterKey, NewReading>>();
      for (const row of rows) {
        if (!parameterCatalogue[row.parameter].rateOfChange) continue;
        const latest = tanks.get(row.tank_id) ?? new Map<ParameterKey, NewReading>();
        latest.set(row.parameter, {
          parameter: row.parameter,
          value: row.value,
          measuredAt: row.measured_at,
          source: 'device',
        });
        tanks.set(row.tank_id, latest);
      }
      return tanks;
    };
    const tankIdsOf = async (company: 'a' | 'd', from: number, count: number) =>
      (
        await stack.pool.query<{ tank_id: string }>(
          `select tank_id from bench_tanks where company = $1 and n > $2 order by n limit $3`,
          [company, from, count],
        )
      ).rows.map((row) => row.tank_id);

    /** The read before: every reading in each rule's window (twice its period up to the latest). */
    const wholeWindow = async (tankId: string, latest: Map<ParameterKey, NewReading>) => {
      const windows = [...latest.values()].map((reading) => ({
        reading,
        perMs: parameterCatalogue[reading.parameter].rateOfChange!.perMs,
      }));
      const result = await db.execute<{ parameter: ParameterKey; value: number; measured_at: string }>(sql`
        select w.parameter, r.value, r.measured_at
        from unnest(
          ${sql.param(windows.map((w) => w.reading.parameter))}::parameter_key[],
          ${sql.param(windows.map((w) => new Date(w.reading.measuredAt.getTime() - 2 * w.perMs).toISOString()))}::timestamptz[],
          ${sql.param(windows.map((w) => w.reading.measuredAt.toISOString()))}::timestamptz[]
        ) as w(parameter, from_at, to_at)
        join readings r on r.tank_id = ${tankId}::uuid and r.parameter = w.parameter
          and r.measured_at >= w.from_at and r.measured_at <= w.to_at
        order by w.parameter, r.measured_at`);
      const series = new Map<ParameterKey, SeriesPoint[]>(windows.map((w) => [w.reading.parameter, []]));
      for (const row of result.rows)
        series.get(row.parameter)!.push({ value: row.value, measuredAt: new Date(row.measured_at) });
      return series;
    };
    const ours = (tankId: string, latest: Map<ParameterKey, NewReading>) =>
      loadRateSeries(db, { id: tankId, rates: {} }, latest);

    const verdicts = (series: Map<ParameterKey, SeriesPoint[]>) =>
      [...series].map(([parameter, points]) => ({
        parameter,
        points: points.length,
        outcome: evaluateRate(points, parameterCatalogue[parameter].rateOfChange!),
      }));

    const measure = async (tanks: Map<string, Map<ParameterKey, NewReading>>) => {
      let differing = 0;
      const pass = async (read: typeof ours, times: number[], points: number[]) => {
        const judged = [];
        for (const [tankId, latest] of tanks) {
          const t0 = performance.now();
          const found = verdicts(await read(tankId, latest));
          times.push(performance.now() - t0);
          points.push(found.reduce((sum, v) => sum + v.points, 0));
          judged.push(found.map((v) => v.outcome));
        }
        return judged;
      };
      const runs = {
        ours: { times: [] as number[], points: [] as number[], cpu: [] as CpuSplit[] },
        baseline: { times: [] as number[], points: [] as number[], cpu: [] as CpuSplit[] },
      };
      await pass(ours, [], []);
      await pass(wholeWindow, [], []);
      for (let round = 0; round < rounds; round++) {
        const [mine, oursCpu] = await measureCpu(null, () => pass(ours, runs.ours.times, runs.ours.points));
        const [theirs, baseCpu] = await measureCpu(null, () =>
          pass(wholeWindow, runs.baseline.times, runs.baseline.points),
        );
        runs.ours.cpu.push(oursCpu);
        runs.baseline.cpu.push(baseCpu);
        mine.forEach((outcomes, i) => {
          if (JSON.stringify(outcomes) !== JSON.stringify(theirs[i])) differing += 1;
        });
      }
      const calls = rounds * tanks.size;
      const cpuPerCall = (list: CpuSplit[]) => {
        const postgres = list.reduce((sum, cpu) => sum + cpu.postgresMs, 0) / calls;
        const node = list.reduce((sum, cpu) => sum + cpu.driverMs, 0) / calls;
        return `${formatFigure(postgres + node, 'ms')} (PostgreSQL ${formatFigure(postgres, 'ms')}, Node ${formatFigure(node, 'ms')})`;
      };
      const oursMedian = median(runs.ours.times);
      const baselineMedian = median(runs.baseline.times);
      return {
        read: {
          ours: `median ${formatFigure(oursMedian, 'ms')}, ${formatFigure(median(runs.ours.points), 'points')} per call`,
          baseline: `median ${formatFigure(baselineMedian, 'ms')}, ${formatFigure(median(runs.baseline.points), 'points')} per call`,
          ratio: ratio(oursMedian, baselineMedian, true),
        },
        cpu: { ours: cpuPerCall(runs.ours.cpu), baseline: cpuPerCall(runs.baseline.cpu) },
        same: { ours: `${calls - differing} of ${calls}`, met: differing === 0 },
      };
    };

    const fiveMinute = await measure(
      await latestOf(
        await tankIdsOf('a', 0, companyPlans.find((plan) => plan.key === 'a')!.deviceHistoryTanks),
      ),
    );
    // Two days of 1-minute readings on 20 of the ingest company's devices, removed afterwards.
    const plan = companyPlans.find((p) => p.key === 'd')!;
    const denseIds = await tankIdsOf('d', plan.alertTanks, 20);
    const now = Date.now();
    const clear = () =>
      stack.pool.query(`delete from readings where tank_id = any($1::uuid[]) and source = 'device'`, [
        denseIds,
      ]);
    await clear();
    await stack.pool.query(
      `insert into readings (company_id, tank_id, device_id, source, parameter, value, entered_value, entered_unit, measured_at)
       select k.company_id, t.tank_id, t.device_id, 'device', p.parameter,
         p.base + sin(extract(epoch from m) / 5000) * p.swing + random() * p.swing / 10, 0, 'stored', m
       from bench_tanks t join tanks k on k.id = t.tank_id
       cross join (values ('temperature'::parameter_key, 25.5, 0.6), ('ph', 8.1, 0.15), ('salinity', 35.0, 0.3))
         as p(parameter, base, swing)
       cross join generate_series($2::timestamptz - interval '2 days', $2::timestamptz, interval '1 minute') as m
       where t.tank_id = any($1::uuid[])`,
      [denseIds, new Date(now - 60_000).toISOString()],
    );
    let oneMinute: Awaited<ReturnType<typeof measure>>;
    try {
      oneMinute = await measure(await latestOf(denseIds));
    } finally {
      await clear();
    }
    await pool.end();
    const rowsOf = (label: string, m: typeof fiveMinute) => [
      { measure: `${label}: read and judge, one tank at a time`, ...m.read },
      { measure: `${label}: CPU per call`, ...m.cpu },
      { measure: `${label}: same verdict (breach, settled, worst change) every time`, ...m.same },
    ];
    return [
      {
        title: 'rate-series: what the rate rules read per device batch',
        rows: [...rowsOf('5-minute readings', fiveMinute), ...rowsOf('1-minute readings', oneMinute)],
        notes: [
          `${rounds} rounds, ours and the whole-window read in turns; ratio is whole window / ours (above 1: ours faster)`,
          "baseline: the engine's read before this change, every reading in each rule's window sent to Node",
          "each tank judged as of its latest reading per parameter (latest_readings) with the catalogue's rules (temperature 1 °C an hour; pH and salinity per day)",
          `5-minute: company A's ${companyPlans.find((p) => p.key === 'a')!.deviceHistoryTanks} tanks with a year of device readings; 1-minute: 20 company D tanks given two days of readings for this bench, removed after`,
        ],
      },
    ];
  },
};
