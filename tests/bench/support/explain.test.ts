import { describe, expect, it } from 'vitest';
import { formatPlanSummary, summarisePlan, type ExplainOutput } from './explain';

/** The shape of the year-as-500-buckets query's plan before rollups (figures rounded). */
const plan: ExplainOutput[] = [
  {
    Plan: {
      'Node Type': 'Aggregate',
      'Plan Rows': 69076,
      'Actual Rows': 366,
      'Actual Loops': 1,
      'Actual Total Time': 404.2,
      'Shared Hit Blocks': 2650,
      'Shared Read Blocks': 12,
      'Temp Read Blocks': 488,
      'Temp Written Blocks': 490,
      Plans: [
        {
          'Node Type': 'Sort',
          'Plan Rows': 103396,
          'Actual Rows': 105108,
          'Actual Loops': 1,
          'Actual Total Time': 320.5,
          'Sort Method': 'external merge',
          'Sort Space Type': 'Disk',
          Plans: [
            {
              'Node Type': 'Index Scan',
              'Relation Name': 'readings',
              'Index Name': 'readings_history_idx',
              'Plan Rows': 103396,
              'Actual Rows': 105108,
              'Actual Loops': 1,
              'Actual Total Time': 80.1,
            },
          ],
        },
      ],
    },
    'Planning Time': 0.3,
    'Execution Time': 405.0,
  },
];

describe('EXPLAIN (ANALYZE, BUFFERS, FORMAT JSON) summary', () => {
  it('reads times, buffers, temp blocks and sorts on disk from the top of the plan', () => {
    const summary = summarisePlan(plan);
    expect(summary).toMatchObject({
      planningMs: 0.3,
      executionMs: 405,
      sharedHit: 2650,
      sharedRead: 12,
      tempRead: 488,
      tempWritten: 490,
      sortsOnDisk: 1,
    });
    expect(summary.lines.map((line) => [line.depth, line.node])).toEqual([
      [0, 'Aggregate'],
      [1, 'Sort (external merge, Disk)'],
      [2, 'Index Scan using readings_history_idx on readings'],
    ]);
  });

  it('finds the node whose row estimate is furthest off', () => {
    const worst = summarisePlan(plan).worstMisestimate;
    expect(worst?.node).toBe('Aggregate');
    expect(worst?.estimatedRows).toBe(69076);
    expect(worst?.actualRows).toBe(366);
  });

  it('multiplies rows by loops so an inner node compares with its estimate', () => {
    const summary = summarisePlan({
      Plan: { 'Node Type': 'Index Scan', 'Plan Rows': 1, 'Actual Rows': 11, 'Actual Loops': 13 },
    });
    expect(summary.lines[0]).toMatchObject({ estimatedRows: 13, actualRows: 143, misestimate: 11 });
  });

  it('writes a few lines for the notes', () => {
    const lines = formatPlanSummary(summarisePlan(plan));
    expect(lines[0]).toBe(
      'execution 405.0 ms, planning 0.3 ms; buffers hit 2650, read 12; temp read 488, written 490; sorts on disk 1',
    );
    expect(lines[1]).toBe('worst estimate: Aggregate, 69076 expected vs 366 actual');
    expect(lines).toContain('`  Sort (external merge, Disk): est 103396 rows, actual 105108, 320.5 ms`');
  });
});
