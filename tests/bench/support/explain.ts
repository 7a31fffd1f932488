import type pg from 'pg';

/** One node of `EXPLAIN (ANALYZE, BUFFERS, FORMAT JSON)`, as far as the summary reads it. */
export interface PlanNode {
  'Node Type': string;
  'Relation Name'?: string;
  'Index Name'?: string;
  'Plan Rows': number;
  'Actual Rows'?: number;
  'Actual Loops'?: number;
  'Actual Total Time'?: number;
  'Shared Hit Blocks'?: number;
  'Shared Read Blocks'?: number;
  'Temp Read Blocks'?: number;
  'Temp Written Blocks'?: number;
  'Sort Method'?: string;
  'Sort Space Type'?: string;
  Plans?: PlanNode[];
}

export interface ExplainOutput {
  Plan: PlanNode;
  'Planning Time'?: number;
  'Execution Time'?: number;
}

export interface PlanLine {
  depth: number;
  node: string;
  estimatedRows: number;
  /** Rows per loop × loops, so it compares with the estimate × loops. */
  actualRows: number | null;
  /** actual / estimated (both × loops), 1 when exact; null without ANALYZE. */
  misestimate: number | null;
  totalMs: number | null;
}

export interface PlanSummary {
  planningMs: number | null;
  executionMs: number | null;
  /** Counted at the top node, which includes its children's. */
  sharedHit: number;
  sharedRead: number;
  tempRead: number;
  tempWritten: number;
  sortsOnDisk: number;
  /** The node whose row estimate is furthest off, either way. */
  worstMisestimate: PlanLine | null;
  lines: PlanLine[];
}

function describe(node: PlanNode): string {
  const on = node['Index Name']
    ? ` using ${node['Index Name']}${node['Relation Name'] ? ` on ${node['Relation Name']}` : ''}`
    : node['Relation Name']
      ? ` on ${node['Relation Name']}`
      : '';
  const sort = node['Sort Method'] ? ` (${node['Sort Method']}, ${node['Sort Space Type'] ?? '?'})` : '';
  return `${node['Node Type']}${on}${sort}`;
}

export function summarisePlan(output: ExplainOutput | ExplainOutput[]): PlanSummary {
  const top = Array.isArray(output) ? output[0]! : output;
  const lines: PlanLine[] = [];
  let sortsOnDisk = 0;
  const walk = (node: PlanNode, depth: number) => {
    const loops = node['Actual Loops'] ?? 1;
    const actual = node['Actual Rows'] === undefined ? null : node['Actual Rows'] * loops;
    const estimated = node['Plan Rows'] * loops;
    lines.push({
      depth,
      node: describe(node),
      estimatedRows: estimated,
      actualRows: actual,
      misestimate: actual === null ? null : Math.max(actual, 1) / Math.max(estimated, 1),
      totalMs: node['Actual Total Time'] ?? null,
    });
    if (node['Sort Space Type'] === 'Disk') sortsOnDisk += 1;
    for (const child of node.Plans ?? []) walk(child, depth + 1);
  };
  walk(top.Plan, 0);
  const spread = (line: PlanLine) => (line.misestimate === null ? 0 : Math.abs(Math.log(line.misestimate)));
  const worst = lines.reduce<PlanLine | null>(
    (found, line) => (line.misestimate !== null && (!found || spread(line) > spread(found)) ? line : found),
    null,
  );
  return {
    planningMs: top['Planning Time'] ?? null,
    executionMs: top['Execution Time'] ?? null,
    sharedHit: top.Plan['Shared Hit Blocks'] ?? 0,
    sharedRead: top.Plan['Shared Read Blocks'] ?? 0,
    tempRead: top.Plan['Temp Read Blocks'] ?? 0,
    tempWritten: top.Plan['Temp Written Blocks'] ?? 0,
    sortsOnDisk,
    worstMisestimate: worst,
    lines,
  };
}

const ms = (value: number | null) => (value === null ? '?' : `${value.toFixed(1)} ms`);

/** A few lines for a bench's notes: the plan's shape, its buffers and its worst estimate. */
export function formatPlanSummary(summary: PlanSummary, maxLines = 8): string[] {
  const shape = summary.lines
    .slice(0, maxLines)
    .map(
      (line) =>
        `${'  '.repeat(line.depth)}${line.node}: est ${line.estimatedRows} rows, actual ${line.actualRows ?? '?'}` +
        (line.totalMs === null ? '' : `, ${ms(line.totalMs)}`),
    );
  const worst = summary.worstMisestimate;
  return [
    `execution ${ms(summary.executionMs)}, planning ${ms(summary.planningMs)}; buffers hit ${summary.sharedHit}, read ${summary.sharedRead}; temp read ${summary.tempRead}, written ${summary.tempWritten}; sorts on disk ${summary.sortsOnDisk}`,
    ...(worst && worst.misestimate !== null
      ? [`worst estimate: ${worst.node}, ${worst.estimatedRows} expected vs ${worst.actualRows} actual`]
      : []),
    ...shape.map((line) => `\`${line}\``),
    ...(summary.lines.length > maxLines ? [`(${summary.lines.length - maxLines} more nodes)`] : []),
  ];
}

/** Runs EXPLAIN (ANALYZE, BUFFERS, FORMAT JSON) on a statement and summarises it. */
export async function explainAnalyze(
  client: pg.Pool | pg.Client,
  text: string,
  values: unknown[] = [],
): Promise<PlanSummary> {
  const { rows } = await client.query<{ 'QUERY PLAN': ExplainOutput[] }>(
    `explain (analyze, buffers, format json) ${text}`,
    values,
  );
  return summarisePlan(rows[0]!['QUERY PLAN']);
}
