import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { benchDataDir } from './cluster';

const clockTicks = 100;

interface ProcStat {
  ppid: number;
  cpuMs: number;
  /** CPU of children that have exited and been waited for. */
  reapedMs: number;
}

function procStat(pid: number): ProcStat | null {
  try {
    // Fields after the command name: state is 0, ppid 1, utime 11, stime 12, cutime 13, cstime 14
    // (proc(5)).
    const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1]!.split(' ');
    const ms = (a: number, b: number) => ((Number(fields[a]) + Number(fields[b])) * 1000) / clockTicks;
    return { ppid: Number(fields[1]), cpuMs: ms(11, 12), reapedMs: ms(13, 14) };
  } catch {
    return null; // gone between the listing and the read
  }
}

/**
 * User + system CPU of a process and every descendant, in ms (Linux /proc): live ones from their
 * own counters, exited ones (a pool closing idle connections) from the root's reaped counters.
 */
export function treeCpuMs(rootPid: number): number {
  const stats = new Map<number, ProcStat>();
  for (const entry of readdirSync('/proc')) {
    if (!/^\d+$/.test(entry)) continue;
    const stat = procStat(Number(entry));
    if (stat) stats.set(Number(entry), stat);
  }
  const inTree = (pid: number): boolean => {
    for (let at = pid, hops = 0; at > 1 && hops < 64; hops++) {
      if (at === rootPid) return true;
      at = stats.get(at)?.ppid ?? 0;
    }
    return false;
  };
  let total = stats.get(rootPid)?.reapedMs ?? 0;
  for (const [pid, stat] of stats) if (inTree(pid)) total += stat.cpuMs;
  return total;
}

/** The bench cluster's postmaster, read from its pid file. */
export function postmasterPid(): number {
  return Number(readFileSync(path.join(benchDataDir, 'data', 'postmaster.pid'), 'utf8').split('\n')[0]);
}

export interface CpuSplit {
  apiMs: number;
  postgresMs: number;
  driverMs: number;
}

/** CPU spent by the API, PostgreSQL and this process while `work` runs. */
export async function measureCpu<T>(apiPid: number | null, work: () => Promise<T>): Promise<[T, CpuSplit]> {
  const pgPid = postmasterPid();
  const read = () => ({
    api: apiPid === null ? 0 : treeCpuMs(apiPid),
    postgres: treeCpuMs(pgPid),
    driver: (() => {
      const usage = process.cpuUsage();
      return (usage.user + usage.system) / 1000;
    })(),
  });
  const before = read();
  const result = await work();
  const after = read();
  return [
    result,
    {
      apiMs: after.api - before.api,
      postgresMs: after.postgres - before.postgres,
      driverMs: after.driver - before.driver,
    },
  ];
}
