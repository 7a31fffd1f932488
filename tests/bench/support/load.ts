import autocannon from 'autocannon';
import { median } from './stats';

export interface LoadResult {
  requestsPerSecond: number;
  p50Ms: number;
  p99Ms: number;
  /** Body and headers per answer, as autocannon counts them. */
  bytesPerResponse: number;
  requests: number;
  non2xx: number;
  errors: number;
  timeouts: number;
}

export const loadSeconds = Number(process.env.BENCH_DURATION_S ?? 10);

/** HTTP load with autocannon, `connections` at once for `seconds`. */
export async function cannon(options: {
  url: string;
  connections?: number;
  seconds?: number;
  headers?: Record<string, string>;
  /** An answer slower than this counts as an error (autocannon's default is 10 s). */
  timeoutS?: number;
}): Promise<LoadResult> {
  const result = await autocannon({
    url: options.url,
    connections: options.connections ?? 10,
    duration: options.seconds ?? loadSeconds,
    headers: options.headers,
    timeout: options.timeoutS ?? 60,
  });
  return {
    requestsPerSecond: result.requests.average,
    p50Ms: result.latency.p50,
    p99Ms: result.latency.p99,
    bytesPerResponse: result.requests.total > 0 ? result.throughput.total / result.requests.total : 0,
    requests: result.requests.total,
    non2xx: result.non2xx,
    errors: result.errors,
    timeouts: result.timeouts,
  };
}

export interface Interleaved<T> {
  ours: T[];
  baseline: T[];
}

/**
 * Ours and the baseline in turns (A B A B A B), so both see the same machine: on a shared 2-core
 * box the load from others drifts within minutes, and a ratio of runs far apart would measure it.
 */
export async function interleave<T>(
  rounds: number,
  ours: (round: number) => Promise<T>,
  baseline: (round: number) => Promise<T>,
): Promise<Interleaved<T>> {
  const result: Interleaved<T> = { ours: [], baseline: [] };
  for (let round = 0; round < rounds; round++) {
    result.ours.push(await ours(round));
    result.baseline.push(await baseline(round));
  }
  return result;
}

/** The median of each field over rounds (each field on its own, as the table reports them). */
export function medianOf<T extends object>(runs: T[]): { [K in keyof T]: number } {
  const out = {} as Record<string, number>;
  for (const key of Object.keys(runs[0] ?? {})) {
    out[key] = median(runs.map((run) => Number((run as Record<string, unknown>)[key])));
  }
  return out as { [K in keyof T]: number };
}

export const rounds = Number(process.env.BENCH_ROUNDS ?? 3);
