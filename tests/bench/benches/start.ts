import { spawn } from 'node:child_process';
import { chmodSync, existsSync, mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { ensurePostgresBinaries, stopLeftoverServer } from '../../../api/dev/postgres';
import { demoEnv } from '../../helpers/demo-launcher';
import { copyProject, markClientBuilt } from '../../helpers/project-copy';
import type { Bench } from '../support/bench';
import { formatFigure, median } from '../support/stats';

const starts = 3;
const budgetMs = 5_000;

/** One `npm start` (the launcher as npm runs it) until /api/health answers 200; then stopped. */
async function timedStart(project: string, env: NodeJS.ProcessEnv, port: string): Promise<number> {
  const t0 = performance.now();
  const child = spawn(process.execPath, ['--import', 'tsx', 'api/dev/start.ts'], {
    cwd: project,
    env,
    stdio: ['ignore', 'ignore', 'pipe'],
  });
  let stderr = '';
  child.stderr?.on('data', (chunk: Buffer) => (stderr += chunk.toString()));
  const exited = new Promise<number | null>((resolve) => child.once('exit', (code) => resolve(code)));
  let ended = false;
  void exited.then(() => (ended = true));
  try {
    for (;;) {
      if (ended) throw new Error(`npm start stopped before it was healthy:\n${stderr.slice(-2000)}`);
      const ok = await fetch(`http://127.0.0.1:${port}/api/health`).then(
        (response) => response.status === 200,
        () => false,
      );
      if (ok) return performance.now() - t0;
      if (performance.now() - t0 > 300_000) throw new Error('npm start was not healthy within 300 s');
      await new Promise((resolve) => setTimeout(resolve, 50));
    }
  } finally {
    child.kill('SIGTERM');
    await exited;
  }
}

/** A second `npm start` on existing data, as tests/api/dev/second-start.test.ts runs it. */
export const start: Bench = {
  name: 'start',
  summary: `a second npm start on existing data until /api/health answers, median of ${starts}`,
  async run() {
    const workDir = mkdtempSync(path.join(os.tmpdir(), 'brinewatch-bench-start-'));
    // The server runs as the postgres user, which must be able to reach the data folder.
    chmodSync(workDir, 0o755);
    const project = path.join(workDir, 'project');
    const dataDir = path.join(workDir, 'data');
    try {
      await copyProject(project);
      // The client build is recorded as up to date: a second start skips it whatever it holds.
      await markClientBuilt(project);
      mkdirSync(dataDir, { mode: 0o755 });
      const env = await demoEnv(dataDir);
      const first = await timedStart(project, env, env.PORT);
      const again: number[] = [];
      for (let i = 0; i < starts; i++) again.push(await timedStart(project, env, env.PORT));
      const typical = median(again);
      return [
        {
          title: 'start: a second npm start on existing data',
          rows: [
            {
              measure: `ready (/api/health 200), median of ${starts}`,
              ours: `${formatFigure(typical, 'ms')} (${again.map((ms) => formatFigure(ms, 'ms')).join(', ')})`,
              budget: '≤ 5 s',
              met: typical <= budgetMs,
            },
            {
              measure: 'first start (migrations, demo scenario; client build skipped)',
              ours: formatFigure(first, 'ms'),
            },
          ],
          notes: [
            'the launcher in a copy of the project sharing node_modules, with its own data folder; time from spawn to the first 200 of /api/health, polled every 50 ms; the client build recorded as up to date beforehand, so no start builds it',
          ],
        },
      ];
    } finally {
      const pgData = path.join(dataDir, 'postgres', 'data');
      if (existsSync(pgData)) stopLeftoverServer(ensurePostgresBinaries(), pgData, () => {});
      rmSync(workDir, { recursive: true, force: true });
    }
  },
};
