import type { Bench } from '../support/bench';
import { cannon, loadSeconds, rounds, type LoadResult } from '../support/load';
import { formatFigure, median } from '../support/stats';
import type { BenchCompany } from '../seed/plan';

/**
 * The staff overview. Today that is the unpaged GET /api/tanks; once the paged list exists this
 * one constant points at it. Before that route exists the path reaches GET /api/tanks/:tankId
 * and is refused as a bad id (400) or not found (404); then the old list is measured, so before
 * and after runs share the bench.
 */
export const overviewPath = '/api/tanks/overview';
const fallbackPath = '/api/tanks';

const mb = 1024 * 1024;
const rssBudget = 300 * mb;

export const overview: Bench = {
  name: 'overview',
  summary: 'staff tank overview at 50 / 500 / 2,000 tanks: p50, p99, bytes, API peak RSS',
  async run({ stack }) {
    const sizes: Array<{ company: BenchCompany; tanks: number; cookie: string }> = [];
    for (const company of ['c', 'b', 'a'] as const) {
      const admin = await stack.person(company, 'admin', 1);
      const browser = await stack.signIn(admin);
      const { rows } = await stack.pool.query(`select tanks from bench_plan where company = $1`, [company]);
      sizes.push({ company, tanks: rows[0].tanks, cookie: browser.cookieHeader(stack.api.origin) });
    }
    const probe = await fetch(`${stack.api.origin}${overviewPath}`, {
      headers: { cookie: sizes[0]!.cookie },
    });
    const path = probe.status === 404 || probe.status === 400 ? fallbackPath : overviewPath;
    await probe.arrayBuffer();

    const runs = new Map<BenchCompany, Array<LoadResult & { peakRss: number }>>();
    for (let round = 0; round < rounds; round++) {
      // Smallest to largest in each round, so every size sees the same drift of the machine.
      for (const size of sizes) {
        stack.api.resetPeak();
        const result = await cannon({ url: `${stack.api.origin}${path}`, headers: { cookie: size.cookie } });
        runs.set(size.company, [
          ...(runs.get(size.company) ?? []),
          { ...result, peakRss: stack.api.peakRss() },
        ]);
      }
    }
    const figure = (company: BenchCompany) => {
      const list = runs.get(company)!;
      return {
        p50: median(list.map((run) => run.p50Ms)),
        p99: median(list.map((run) => run.p99Ms)),
        bytes: median(list.map((run) => run.bytesPerResponse)),
        peakRss: Math.max(...list.map((run) => run.peakRss)),
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
        title: `overview: staff ${path}, 10 connections`,
        rows: [
          ...sizes.map((size) => {
            const f = figure(size.company);
            return {
              measure: `${size.tanks} tanks`,
              ours: `p50 ${formatFigure(f.p50, 'ms')}, p99 ${formatFigure(f.p99, 'ms')}, ${formatFigure(f.bytes / 1024, 'kB')}/answer, API peak RSS ${formatFigure(f.peakRss / mb, 'MiB')} (${f.requests} answers, ${f.failed} failed)`,
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
          `${rounds} rounds of ${loadSeconds} s per size, sizes in turns; medians over rounds; peak RSS is VmHWM of the API process, reset before each run (clear_refs); a reset starts from the current RSS, so a small size measured after a large one inherits heap not yet given back`,
          `each company's admin; ${path === fallbackPath ? `${overviewPath} answered ${probe.status}, so the unpaged ${fallbackPath} was measured` : 'first page of the paged overview'}`,
        ],
      },
    ];
  },
};
