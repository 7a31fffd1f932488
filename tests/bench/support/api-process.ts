import { spawn, type ChildProcess } from 'node:child_process';
import { openSync, readFileSync, writeFileSync } from 'node:fs';
import { setTimeout as sleep } from 'node:timers/promises';
import { buildServer, serverNodeFlags } from '../../../api/build';

/**
 * The API in a process of its own, as production runs it (`npm run build`, then
 * `node dist/api/server.mjs`), so its memory and CPU are its own and not the load generator's.
 */
export interface ApiProcess {
  origin: string;
  pid: number;
  /** Peak resident set (VmHWM) since start or since the last `resetPeak`, in bytes. */
  peakRss(): number;
  /** Current resident set (VmRSS), in bytes. */
  rss(): number;
  /** User + system CPU time so far, in ms. */
  cpuMs(): number;
  /** Starts a new VmHWM window (Linux: writing 5 to clear_refs). */
  resetPeak(): void;
  stop(): Promise<void>;
}

const clockTicks = 100;

/** Built once per bench run, from the sources as they are. */
let bundle: Promise<string> | undefined;

function statusField(pid: number, field: string): number {
  const match = new RegExp(`^${field}:\\s+(\\d+) kB`, 'm').exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
  if (!match) throw new Error(`/proc/${pid}/status has no ${field}`);
  return Number(match[1]) * 1024;
}

export async function startApiProcess(options: {
  env: Record<string, string>;
  port: number;
  logFile: string;
}): Promise<ApiProcess> {
  const log = openSync(options.logFile, 'a');
  bundle ??= buildServer();
  // BENCH_CPU_PROF=<folder>: a V8 CPU profile of the API, written there when it stops.
  const profile = process.env.BENCH_CPU_PROF
    ? ['--cpu-prof', `--cpu-prof-dir=${process.env.BENCH_CPU_PROF}`]
    : [];
  const child: ChildProcess = spawn(process.execPath, [...profile, ...serverNodeFlags, await bundle], {
    env: { ...process.env, ...options.env, PORT: String(options.port) },
    stdio: ['ignore', log, log],
  });
  const origin = `http://localhost:${options.port}`;
  let exited: string | null = null;
  child.once('exit', (code, signal) => (exited = `exited with ${code ?? signal}`));
  const started = Date.now();
  for (;;) {
    if (exited) throw new Error(`the API ${exited} before answering; see ${options.logFile}`);
    const ok = await fetch(`${origin}/api/health`).then(
      (response) => response.status < 500,
      () => false,
    );
    if (ok) break;
    if (Date.now() - started > 180_000)
      throw new Error(`the API did not answer within 180 s; see ${options.logFile}`);
    await sleep(250);
  }
  const pid = child.pid!;
  return {
    origin,
    pid,
    peakRss: () => statusField(pid, 'VmHWM'),
    rss: () => statusField(pid, 'VmRSS'),
    cpuMs() {
      const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1]!.split(' ');
      // Fields 14 and 15 of /proc/<pid>/stat (utime, stime) are 11 and 12 after the command name.
      return ((Number(fields[11]) + Number(fields[12])) * 1000) / clockTicks;
    },
    resetPeak: () => writeFileSync(`/proc/${pid}/clear_refs`, '5'),
    async stop() {
      if (exited) return;
      const gone = new Promise<void>((resolve) => child.once('exit', () => resolve()));
      child.kill('SIGTERM');
      const timer = setTimeout(() => child.kill('SIGKILL'), 15_000);
      await gone;
      clearTimeout(timer);
    },
  };
}
