import { describe, expect, it } from 'vitest';
import { formatHeader, formatTable } from './table';

describe('bench tables', () => {
  it('prints measure | ours | same-run baseline | ratio | budget | met, with notes', () => {
    const text = formatTable({
      title: 'owner-tanks',
      rows: [
        {
          measure: 'throughput',
          ours: '72 req/s',
          baseline: '141 req/s',
          ratio: 0.5106,
          budget: '≥ 0.8',
          met: false,
        },
        { measure: 'CPU | per request', ours: '5 ms' },
      ],
      notes: ['3 rounds of 10 s'],
    });
    expect(text).toBe(
      [
        '### owner-tanks',
        '',
        '| measure | ours | same-run baseline | ratio | budget | met |',
        '|---|---|---|---|---|---|',
        '| throughput | 72 req/s | 141 req/s | 0.51 | ≥ 0.8 | **no** |',
        '| CPU \\| per request | 5 ms | — | — | — | — |',
        '',
        '- 3 rounds of 10 s',
        '',
      ].join('\n'),
    );
  });

  it('names the machine, the commit and the durability settings in the header', () => {
    const text = formatHeader({
      date: '2026-12-02T08:00:00.000Z',
      commit: 'd94398d',
      cpu: 'AMD EPYC',
      cores: 2,
      loadBefore: '2.10 2.00 1.90',
      postgres: 'PostgreSQL 15.18',
      fsync: 'on',
      synchronousCommit: 'on',
      workMem: '4MB',
      seedScale: 1,
      runScale: 0.2,
    });
    expect(text).toContain('## Bench run 2026-12-02T08:00:00.000Z');
    expect(text).toContain('- commit d94398d; AMD EPYC × 2');
    expect(text).toContain('fsync=on, synchronous_commit=on, work_mem=4MB');
    expect(text).toContain('- seed scale 1; BENCH_SCALE 0.2 for sample counts');
  });
});
