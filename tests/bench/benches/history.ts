import type { Bench } from '../support/bench';
import { captureStatements } from '../support/capture';
import { explainAnalyze, formatPlanSummary } from '../support/explain';
import { formatFigure, median, percentile, ratio } from '../support/stats';
import { benchScale } from '../seed/plan';

const samples = Math.max(10, Math.round(60 * benchScale));

/** The bucket query history.ts ran before rollups: the same-run reference for the year chart. */
const rawBucketQuery = `
  select extract(epoch from date_bin($4::interval, r.measured_at, '2000-01-03T00:00:00Z'::timestamptz)) * 1000 as start_ms,
    min(r.value) as min, avg(r.value) as mean, max(r.value) as max, count(*)::int as count,
    (count(*) filter (where r.source = 'device'))::int as device,
    (count(*) filter (where r.source = 'home-test'))::int as home,
    (count(*) filter (where r.source = 'visit'))::int as visit
  from readings r
  where r.tank_id = $1 and r.parameter = 'temperature' and r.measured_at >= $2::timestamptz and r.measured_at <= $3::timestamptz
  group by 1 order by 1`;

async function timed(count: number, act: () => Promise<void>): Promise<number[]> {
  const times: number[] = [];
  for (let i = 0; i < count; i++) {
    const t0 = performance.now();
    await act();
    times.push(performance.now() - t0);
  }
  return times;
}

export const history: Bench = {
  name: 'history',
  summary: "a year of a device tank's temperature as 500 buckets, median and p95, with EXPLAIN",
  async run({ stack }) {
    const { rows } = await stack.pool.query(
      `select t.tank_id from bench_tanks t where t.company = 'a' and t.n = 1`,
    );
    const tankId = rows[0].tank_id as string;
    const owner = await stack.person('a', 'owner', 1);
    const browser = await stack.signIn(owner);
    const to = new Date();
    const from = new Date(to.getTime() - 365 * 86_400_000);
    const url = `${stack.api.origin}/api/tanks/${tankId}/readings?parameter=temperature&from=${from.toISOString()}&to=${to.toISOString()}&points=500`;
    const headers = { cookie: browser.cookieHeader(stack.api.origin) };
    let bucketMs = 0;
    const call = async () => {
      const response = await fetch(url, { headers });
      if (response.status !== 200)
        throw new Error(`history answered ${response.status}: ${await response.text()}`);
      const body = (await response.json()) as { bucketMs: number | null; buckets: unknown[] };
      bucketMs = body.bucketMs ?? 0;
    };
    await timed(3, call);
    const statements = await captureStatements(stack.pool, call);
    const raw = () =>
      stack.pool
        .query(rawBucketQuery, [tankId, from.toISOString(), to.toISOString(), `${bucketMs} milliseconds`])
        .then(() => undefined);
    await timed(2, raw);
    // In turns, like the load benches: one API call, one raw query.
    const ours: number[] = [];
    const baseline: number[] = [];
    for (let i = 0; i < samples; i++) {
      ours.push(...(await timed(1, call)));
      baseline.push(...(await timed(1, raw)));
    }
    const explained = [];
    for (const statement of statements.filter(
      (s) => /^\s*(select|with)\b/i.test(s.text) && /readings|rollup/i.test(s.text),
    )) {
      const summary = await explainAnalyze(stack.pool, statement.text, statement.values);
      explained.push({ statement, summary });
    }
    explained.sort((a, b) => (b.summary.executionMs ?? 0) - (a.summary.executionMs ?? 0));
    const rawPlan = await explainAnalyze(stack.pool, rawBucketQuery, [
      tankId,
      from.toISOString(),
      to.toISOString(),
      `${bucketMs} milliseconds`,
    ]);
    const oursMedian = median(ours);
    const r = ratio(oursMedian, median(baseline), true);
    return [
      {
        title: 'history: one year of temperature (5-minute device readings) as 500 points',
        rows: [
          {
            measure: 'GET …/readings?points=500, one at a time',
            ours: `median ${formatFigure(oursMedian, 'ms')}, p95 ${formatFigure(percentile(ours, 0.95), 'ms')}`,
            baseline: `raw bucket query via pg: median ${formatFigure(median(baseline), 'ms')}, p95 ${formatFigure(percentile(baseline, 0.95), 'ms')}`,
            ratio: r,
            budget: 'median ≤ 25 ms',
            met: oursMedian <= 25,
          },
        ],
        notes: [
          `${samples} samples each, API call and raw query in turns; bucket width ${bucketMs / 3_600_000} h; ratio is raw / ours (above 1: ours faster)`,
          `the API's ${statements.length} statements captured; the slowest reading one explained:`,
          ...(explained[0]
            ? [
                `\`${explained[0].statement.text.replace(/\s+/g, ' ').slice(0, 160)}…\``,
                ...formatPlanSummary(explained[0].summary),
              ]
            : ['(no statement on readings or rollups captured)']),
          'the raw bucket query (today before rollups):',
          ...formatPlanSummary(rawPlan),
        ],
      },
    ];
  },
};
