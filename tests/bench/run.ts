import { spawnSync, execFileSync } from 'node:child_process';
import { appendFileSync, mkdirSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { alertLatency } from './benches/alert-latency';
import { history } from './benches/history';
import { ingest } from './benches/ingest';
import { overview } from './benches/overview';
import { ownerTanks } from './benches/owner-tanks';
import { rateSeries } from './benches/rate-series';
import { start } from './benches/start';
import { twoInstances } from './benches/two-instances';
import { benchScale } from './seed/plan';
import type { Bench } from './support/bench';
import { startBenchStack } from './support/bench-stack';
import { formatHeader, formatTable } from './support/table';

/*
 * `npm run bench [-- name…]`: the benches on the seeded cluster (`npm run bench:seed` first), each
 * printing a table with its same-run baseline, to stdout and tests/artifacts/bench-<date>.md (or the
 * file BENCH_ARTIFACT names).
 * The four older vitest benches run in vitest's bench mode, each on its own throwaway cluster.
 */
const stackBenches: Bench[] = [
  ownerTanks,
  overview,
  history,
  ingest,
  rateSeries,
  alertLatency,
  twoInstances,
  start,
];
const vitestBenches = ['demo-seed', 'live-messages', 'readings-export', 'readings-history'];

const wanted = process.argv.slice(2);
const known = [...stackBenches.map((bench) => bench.name), ...vitestBenches];
const unknown = wanted.filter((name) => !known.includes(name));
if (unknown.length > 0) {
  console.error(`unknown bench: ${unknown.join(', ')}; known: ${known.join(', ')}`);
  process.exit(2);
}
const chosen = (name: string) => wanted.length === 0 || wanted.includes(name);

const date = new Date().toISOString();
const artifact = process.env.BENCH_ARTIFACT ?? `tests/artifacts/bench-${date.slice(0, 10)}.md`;
mkdirSync(path.dirname(artifact), { recursive: true });
const emit = (text: string) => {
  console.log(text);
  appendFileSync(artifact, `${text}\n`);
};
const load = () =>
  os
    .loadavg()
    .map((n) => n.toFixed(2))
    .join(' ');

let failed = false;
const selected = stackBenches.filter((bench) => chosen(bench.name));
if (selected.length > 0) {
  const loadBefore = load();
  const stack = await startBenchStack();
  try {
    const { rows } = await stack.pool.query(
      `select version() as version, current_setting('fsync') as fsync,
         current_setting('synchronous_commit') as sync, current_setting('work_mem') as work_mem,
         (select scale from bench_seed limit 1) as seed_scale`,
    );
    const commit = (() => {
      try {
        const head = execFileSync('git', ['rev-parse', '--short', 'HEAD'], { encoding: 'utf8' }).trim();
        const dirty = execFileSync('git', ['status', '--porcelain', '--untracked-files=no'], {
          encoding: 'utf8',
        });
        return dirty.trim() === '' ? head : `${head} + uncommitted changes`;
      } catch {
        return 'unknown';
      }
    })();
    const header = {
      date,
      commit,
      cpu: os.cpus()[0]?.model ?? 'unknown CPU',
      cores: os.cpus().length,
      loadBefore,
      postgres: String(rows[0].version).split(' on ')[0]!,
      fsync: rows[0].fsync,
      synchronousCommit: rows[0].sync,
      workMem: rows[0].work_mem,
      seedScale: Number(rows[0].seed_scale),
      runScale: benchScale,
    };
    emit(formatHeader(header));
    for (const bench of selected) {
      console.log(`… ${bench.name}: ${bench.summary}`);
      try {
        for (const table of await bench.run({ stack })) emit(formatTable(table));
      } catch (error) {
        failed = true;
        emit(`### ${bench.name}\n\nfailed: ${(error as Error).stack ?? String(error)}\n`);
      }
    }
    emit(`load average after: ${load()}\n`);
  } finally {
    await stack.close();
  }
}

for (const name of vitestBenches.filter((bench) => wanted.includes(bench))) {
  // Only when named: they start clusters of their own and take minutes.
  const result = spawnSync(
    process.execPath,
    [
      'node_modules/vitest/vitest.mjs',
      'bench',
      '--run',
      '--project',
      'bench',
      `tests/bench/${name}.bench.ts`,
    ],
    { stdio: 'inherit' },
  );
  if (result.status !== 0) failed = true;
  emit(
    `### ${name}\n\nvitest bench tests/bench/${name}.bench.ts: ${result.status === 0 ? "ran (its table is vitest's, above)" : `failed (${result.status})`}\n`,
  );
}

console.log(`tables appended to ${artifact}`);
process.exit(failed ? 1 : 0);
