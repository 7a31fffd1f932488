import type { BenchStack } from './bench-stack';
import type { BenchTable } from './table';

/** One bench the runner can pick by name. */
export interface Bench {
  name: string;
  summary: string;
  /** Stack benches share one seeded cluster and API process per run. */
  run(context: { stack: BenchStack }): Promise<BenchTable[]>;
}
