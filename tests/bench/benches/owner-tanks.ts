import { spawn } from 'node:child_process';
import { writeFileSync } from 'node:fs';
import path from 'node:path';
import { freePort } from '../../helpers/free-port';
import type { Bench } from '../support/bench';
import { benchDataDir } from '../support/cluster';
import { captureStatements } from '../support/capture';
import { cannon, interleave, medianOf, rounds, loadSeconds } from '../support/load';
import { formatFigure, ratio } from '../support/stats';

/** The owner's tank list: the app against plain pg running the same statements. */
export const ownerTanks: Bench = {
  name: 'owner-tanks',
  summary: 'GET /api/tanks as an owner, 10 connections, vs bare node:http + pg with the same SQL',
  async run({ stack }) {
    const owner = await stack.person('a', 'owner', 1);
    const browser = await stack.signIn(owner);
    const url = `${stack.api.origin}/api/tanks`;
    const cookie = browser.cookieHeader(stack.api.origin);
    let body: unknown = null;
    const statements = await captureStatements(stack.pool, async () => {
      const response = await fetch(url, { headers: { cookie } });
      if (response.status !== 200) throw new Error(`GET /api/tanks answered ${response.status}`);
      body = await response.json();
    });
    if (statements.length === 0) throw new Error('no statements captured from GET /api/tanks');

    const planFile = path.join(benchDataDir, 'owner-tanks-plan.json');
    writeFileSync(planFile, JSON.stringify({ statements, body }));
    const port = await freePort();
    const bare = spawn(
      process.execPath,
      ['--import', 'tsx', 'tests/bench/support/bare-server.ts', planFile, String(port), stack.cluster.url],
      { stdio: ['ignore', 'pipe', 'inherit'] },
    );
    await new Promise<void>((resolve, reject) => {
      bare.stdout.once('data', () => resolve());
      bare.once('exit', (code) => reject(new Error(`bare server exited with ${code}`)));
    });
    try {
      const headers = { cookie };
      // Warm both (JIT, pg plans, buffers) before anything is kept.
      await cannon({ url, headers, seconds: 2 });
      await cannon({ url: `http://127.0.0.1:${port}/`, seconds: 2 });
      const cpuBefore = stack.api.cpuMs();
      const runs = await interleave(
        rounds,
        () => cannon({ url, headers }),
        () => cannon({ url: `http://127.0.0.1:${port}/` }),
      );
      const apiCpuMs = stack.api.cpuMs() - cpuBefore;
      const ours = medianOf(runs.ours);
      const baseline = medianOf(runs.baseline);
      const r = ratio(ours.requestsPerSecond, baseline.requestsPerSecond);
      const refused = runs.ours.reduce((sum, run) => sum + run.non2xx + run.errors, 0);
      const oursRequests = runs.ours.reduce((sum, run) => sum + run.requests, 0);
      return [
        {
          title: 'owner-tanks: GET /api/tanks as an owner (2 tanks), 10 connections',
          rows: [
            {
              measure: 'throughput (median of rounds)',
              ours: `${formatFigure(ours.requestsPerSecond, 'req/s')}, p99 ${formatFigure(ours.p99Ms, 'ms')}`,
              baseline: `${formatFigure(baseline.requestsPerSecond, 'req/s')}, p99 ${formatFigure(baseline.p99Ms, 'ms')}`,
              ratio: r,
              budget: '≥ 0.8',
              met: r >= 0.8,
            },
            {
              measure: 'API CPU per request',
              ours: formatFigure(apiCpuMs / Math.max(1, oursRequests), 'ms'),
            },
          ],
          notes: [
            `${rounds} rounds of ${loadSeconds} s each, app and baseline in turns; non-2xx or errors on the app: ${refused}`,
            `baseline: node:http + pg (pool of 10) replaying the ${statements.length} statements every one of 3 captured real requests sent (log_statement), one after another on one connection, then JSON.stringify of the same answer`,
            `statements: ${statements.map((s) => s.text.replace(/\s+/g, ' ').slice(0, 60)).join(' · ')}`,
          ],
        },
      ];
    } finally {
      bare.kill('SIGTERM');
    }
  },
};
