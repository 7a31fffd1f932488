import { request } from 'node:http';
import type { Bench } from '../support/bench';
import { captureStatements } from '../support/capture';
import { explainAnalyze, formatPlanSummary } from '../support/explain';
import { cannon, loadSeconds, rounds, type LoadResult } from '../support/load';
import { formatFigure, median } from '../support/stats';
import type { BenchCompany } from '../seed/plan';

/** The staff overview's first page (50 tanks), as the console asks for it. */
export const overviewPath = '/api/tanks/overview';

const mb = 1024 * 1024;
const rssBudget = 300 * mb;
const warmUpSeconds = 2;

/** Bytes of one answer as the server sends it to a browser that takes gzip and brotli. */
function bytesOnTheWire(url: string, cookie: string): Promise<{ bytes: number; encoding: string }> {
  return new Promise((resolve, reject) => {
    const sent = request(url, { headers: { cookie, 'accept-encoding': 'br, gzip' } }, (response) => {
      let bytes = 0;
      response.on('data', (chunk: Buffer) => (bytes += chunk.length));
      response.on('end', () => resolve({ bytes, encoding: response.headers['content-encoding'] ?? 'none' }));
      response.on('error', reject);
    });
    sent.on('error', reject);
    sent.end();
  });
}

export const overview: Bench = {
  name: 'overview',
  summary: 'staff tank overview at 50 / 500 / 2,000 tanks: p50, p99, bytes, API peak RSS',
  async run({ stack }) {
    const sizes: Array<{ company: BenchCompany; tanks: number; cookie: string; shown: number }> = [];
    for (const company of ['c', 'b', 'a'] as const) {
      const admin = await stack.person(company, 'admin', 1);
      const browser = await stack.signIn(admin);
      const { rows } = await stack.pool.query(`select tanks from bench_plan where company = $1`, [company]);
      const cookie = browser.cookieHeader(stack.api.origin);
      // The first answer judges every tank never judged (tank_status); that is a one-off, not the page.
      const probe = await fetch(`${stack.api.origin}${overviewPath}`, { headers: { cookie } });
      if (probe.status !== 200) {
        throw new Error(`${overviewPath} answered ${probe.status}: ${(await probe.text()).slice(0, 200)}`);
      }
      const page = (await probe.json()) as { tanks: unknown[] };
      sizes.push({ company, tanks: rows[0].tanks, cookie, shown: page.tanks.length });
    }
    const wire = new Map<BenchCompany, { bytes: number; encoding: string }>();
    for (const size of sizes) {
      wire.set(size.company, await bytesOnTheWire(`${stack.api.origin}${overviewPath}`, size.cookie));
    }

    const runs = new Map<BenchCompany, Array<LoadResult & { peakRss: number; idleRss: number }>>();
    for (let round = 0; round < rounds; round++) {
      // Smallest to largest in each round, so every size sees the same drift of the machine; each
      // size on an API process of its own, so no size inherits the heap another one grew.
      for (const size of sizes) {
        const api = await stack.startApi();
        const idleRss = api.rss();
        try {
          const url = `${api.origin}${overviewPath}`;
          await cannon({ url, headers: { cookie: size.cookie }, seconds: warmUpSeconds });
          api.resetPeak();
          const result = await cannon({ url, headers: { cookie: size.cookie } });
          runs.set(size.company, [
            ...(runs.get(size.company) ?? []),
            { ...result, peakRss: api.peakRss(), idleRss },
          ]);
        } finally {
          await api.stop();
        }
      }
    }
    // Where the time of one page goes at the largest size: its reading statements, explained.
    const largest = sizes[2]!;
    const statements = await captureStatements(stack.pool, async () => {
      const response = await fetch(`${stack.api.origin}${overviewPath}`, {
        headers: { cookie: largest.cookie },
      });
      await response.arrayBuffer();
    });
    const explained = [];
    for (const statement of statements.filter(
      (s) => /^\s*(select|with)\b/i.test(s.text) && !/\b(insert|update|delete)\b/i.test(s.text),
    )) {
      explained.push({
        statement,
        summary: await explainAnalyze(stack.pool, statement.text, statement.values),
      });
    }
    explained.sort((a, b) => (b.summary.executionMs ?? 0) - (a.summary.executionMs ?? 0));

    const figure = (company: BenchCompany) => {
      const list = runs.get(company)!;
      return {
        p50: median(list.map((run) => run.p50Ms)),
        p99: median(list.map((run) => run.p99Ms)),
        bytes: median(list.map((run) => run.bytesPerResponse)),
        peakRss: Math.max(...list.map((run) => run.peakRss)),
        idleRss: median(list.map((run) => run.idleRss)),
        requests: list.reduce((sum, run) => sum + run.requests, 0),
        failed: list.reduce((sum, run) => sum + run.non2xx + run.errors + run.timeouts, 0),
      };
    };
    const small = figure(sizes[0]!.company);
    const large = figure(sizes[2]!.company);
    const growth = large.p50 / small.p50;
    const allAnswered = sizes.every((size) => figure(size.company).failed === 0);
    return [
      {
        title: `overview: staff ${overviewPath} (first page), 10 connections`,
        rows: [
          ...sizes.map((size) => {
            const f = figure(size.company);
            return {
              measure: `${size.tanks} tanks`,
              ours: `p50 ${formatFigure(f.p50, 'ms')}, p99 ${formatFigure(f.p99, 'ms')}, ${size.shown} tanks shown, ${formatFigure(f.bytes / 1024, 'kB')}/answer (${formatFigure(wire.get(size.company)!.bytes / 1024, 'kB')} ${wire.get(size.company)!.encoding}), API peak RSS ${formatFigure(f.peakRss / mb, 'MiB')} (idle after start ${formatFigure(f.idleRss / mb, 'MiB')}) (${f.requests} answers, ${f.failed} failed)`,
            };
          }),
          {
            measure: `p50 at ${sizes[2]!.tanks} vs ${sizes[0]!.tanks} tanks`,
            ours: formatFigure(large.p50, 'ms'),
            baseline: formatFigure(small.p50, 'ms'),
            ratio: growth,
            budget: '≤ 1.5 (large / small)',
            met: allAnswered && growth <= 1.5,
          },
          {
            measure: `API peak RSS at ${sizes[2]!.tanks} tanks`,
            ours: formatFigure(large.peakRss / mb, 'MiB'),
            budget: '≤ 300 MB',
            met: allAnswered && large.peakRss <= rssBudget,
          },
        ],
        notes: [
          `${rounds} rounds of ${loadSeconds} s per size, sizes in turns; medians over rounds; each size on a fresh API process, warmed up for ${warmUpSeconds} s, then its peak RSS window reset (VmHWM, clear_refs) and measured`,
          "each company's admin, first page of the paged overview; bytes per answer as autocannon counts them (headers + body, no compression asked), in brackets one answer as sent to a browser that takes br/gzip",
          `one page at ${largest.tanks} tanks: ${statements.length} statements captured; the slowest reading ones explained (execution ms): ${explained
            .slice(0, 4)
            .map(
              (e) =>
                `${(e.summary.executionMs ?? 0).toFixed(1)} ms \`${e.statement.text.replace(/\s+/g, ' ').slice(0, 70)}…\``,
            )
            .join(' · ')}`,
          ...(explained[0] ? formatPlanSummary(explained[0].summary, 6) : []),
        ],
      },
    ];
  },
};
