import os from 'node:os';
import type { Bench } from '../support/bench';
import { cannon, interleave, loadSeconds, medianOf, rounds, type LoadResult } from '../support/load';
import { formatFigure, ratio } from '../support/stats';

const connections = 10;

/** Two API processes on one PostgreSQL, as behind a load balancer: the load split across both. */
export const twoInstances: Bench = {
  name: 'two-instances',
  summary: 'owner GET /api/tanks on 1 API process vs 2 on the same PostgreSQL, same total connections',
  async run({ stack }) {
    const owner = await stack.person('a', 'owner', 1);
    const browser = await stack.signIn(owner);
    const cookie = browser.cookieHeader(stack.api.origin);
    const headers = { cookie };
    const second = await stack.startApi();
    try {
      const one = `${stack.api.origin}/api/tanks`;
      const two = `${second.origin}/api/tanks`;
      const answer = await fetch(two, { headers });
      if (answer.status !== 200)
        throw new Error(`GET /api/tanks on the second process answered ${answer.status}`);
      await answer.arrayBuffer();
      await cannon({ url: one, headers, seconds: 2 });
      await cannon({ url: two, headers, seconds: 2 });

      const both = async (): Promise<LoadResult> => {
        const half = connections / 2;
        const [a, b] = await Promise.all([
          cannon({ url: one, headers, connections: half }),
          cannon({ url: two, headers, connections: half }),
        ]);
        return {
          requestsPerSecond: a.requestsPerSecond + b.requestsPerSecond,
          // Each half's p50/p99 as autocannon saw it; the table shows the worse of the two.
          p50Ms: Math.max(a.p50Ms, b.p50Ms),
          p99Ms: Math.max(a.p99Ms, b.p99Ms),
          bytesPerResponse: (a.bytesPerResponse + b.bytesPerResponse) / 2,
          requests: a.requests + b.requests,
          non2xx: a.non2xx + b.non2xx,
          errors: a.errors + b.errors,
          timeouts: a.timeouts + b.timeouts,
        };
      };
      const runs = await interleave(
        rounds,
        () => both(),
        () => cannon({ url: one, headers, connections }),
      );
      const ours = medianOf(runs.ours);
      const single = medianOf(runs.baseline);
      const failed = [...runs.ours, ...runs.baseline].reduce(
        (sum, run) => sum + run.non2xx + run.errors + run.timeouts,
        0,
      );
      return [
        {
          title: `two-instances: owner GET /api/tanks, ${connections} connections in all`,
          rows: [
            {
              measure: 'throughput (median of rounds)',
              ours: `2 processes (${connections / 2} connections each): ${formatFigure(ours.requestsPerSecond, 'req/s')}, p50 ${formatFigure(ours.p50Ms, 'ms')}, p99 ${formatFigure(ours.p99Ms, 'ms')}`,
              baseline: `1 process: ${formatFigure(single.requestsPerSecond, 'req/s')}, p50 ${formatFigure(single.p50Ms, 'ms')}, p99 ${formatFigure(single.p99Ms, 'ms')}`,
              ratio: ratio(ours.requestsPerSecond, single.requestsPerSecond),
              budget: 'none (reported for the README)',
            },
          ],
          notes: [
            `${rounds} rounds of ${loadSeconds} s, two processes and one in turns; both processes and PostgreSQL share this machine's ${os.cpus().length} cores with the load generator; non-2xx, errors or timeouts: ${failed}`,
            'the two processes are loaded at once by two autocannon runs in this process; their p50/p99 are the worse of the two halves',
          ],
        },
      ];
    } finally {
      await second.stop();
    }
  },
};
