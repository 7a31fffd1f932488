import { formatFigure } from './stats';

export interface BenchRow {
  measure: string;
  /** Already formatted, e.g. "412 req/s, p99 38 ms". */
  ours: string;
  baseline?: string;
  ratio?: number;
  budget?: string;
  /** Undefined when the row has no budget. */
  met?: boolean;
}

export interface BenchTable {
  title: string;
  rows: BenchRow[];
  /** Lines printed under the table: what was measured and how. */
  notes?: string[];
}

const cell = (text: string) => text.replaceAll('|', '\\|').replaceAll('\n', ' ');

/** A Markdown table: measure | ours | same-run baseline | ratio | budget | met. */
export function formatTable(table: BenchTable): string {
  const lines = [
    `### ${table.title}`,
    '',
    '| measure | ours | same-run baseline | ratio | budget | met |',
    '|---|---|---|---|---|---|',
    ...table.rows.map((row) =>
      [
        '',
        cell(row.measure),
        cell(row.ours),
        cell(row.baseline ?? '—'),
        row.ratio === undefined ? '—' : formatFigure(row.ratio, ''),
        cell(row.budget ?? '—'),
        row.met === undefined ? '—' : row.met ? 'yes' : '**no**',
        '',
      ]
        .join(' | ')
        .trim(),
    ),
  ];
  if (table.notes && table.notes.length > 0) lines.push('', ...table.notes.map((note) => `- ${note}`));
  return `${lines.join('\n')}\n`;
}

export interface RunHeader {
  date: string;
  commit: string;
  cpu: string;
  cores: number;
  loadBefore: string;
  loadAfter?: string;
  postgres: string;
  fsync: string;
  synchronousCommit: string;
  workMem: string;
  /** The seeded data's scale (bench_seed). */
  seedScale: number;
  /** BENCH_SCALE of this run: it sets sample counts (history, alert crossings). */
  runScale: number;
}

export function formatHeader(header: RunHeader): string {
  return [
    `## Bench run ${header.date}`,
    '',
    `- commit ${header.commit}; ${header.cpu} × ${header.cores}`,
    `- load average before ${header.loadBefore}${header.loadAfter ? `, after ${header.loadAfter}` : ''}`,
    `- ${header.postgres}; fsync=${header.fsync}, synchronous_commit=${header.synchronousCommit}, work_mem=${header.workMem}`,
    `- seed scale ${header.seedScale}; BENCH_SCALE ${header.runScale} for sample counts`,
    '',
  ].join('\n');
}
