import type { ParameterKey } from '@shared/parameters/keys';
import { unitDecimals, unitSymbol } from '@shared/parameters/units';
import { sampleOf, windowStats, type SeriesSample } from '@shared/readings/stats';
import type { ReadingHistory } from '@shared/schemas/readings';
import { displayValue, formatIn } from '../utils/display-units';
import { formatCount, formatDateTime } from '../../../lib/format';

/** The window's samples in the display unit: each bucket, or each reading. */
export function samplesOf(history: ReadingHistory, parameter: ParameterKey, unit: string): SeriesSample[] {
  const convert = (value: number) => displayValue(parameter, value, unit);
  if (history.mode === 'buckets') {
    return history.buckets.map((b) => ({
      at: Date.parse(b.start),
      min: convert(b.min),
      mean: convert(b.mean),
      max: convert(b.max),
      count: b.count,
    }));
  }
  return history.readings.map((r) => sampleOf(Date.parse(r.measuredAt), convert(r.value)));
}

/** "+" or "−" for a value that still shows as non-zero at this precision, else nothing. */
function signOf(value: number, decimals: number): string {
  if (Number(Math.abs(value).toFixed(decimals)) === 0) return '';
  return value > 0 ? '+' : '−';
}

export function WindowStats({
  history,
  parameter,
  unit,
}: {
  history: ReadingHistory;
  parameter: ParameterKey;
  unit: string;
}) {
  const stats = windowStats(samplesOf(history, parameter, unit));
  const symbol = unitSymbol(parameter, unit);
  const decimals = unitDecimals(parameter, unit);
  const number = (value: number, extra = 0) => {
    const text = (Number(value.toFixed(decimals + extra)) || 0).toFixed(decimals + extra);
    return symbol ? `${text} ${symbol}` : text;
  };
  if (!stats) return null;
  const windowDays = (Date.parse(history.to) - Date.parse(history.from)) / 86_400_000;
  const trend = stats.trendPerDay;
  // Less change over the whole window than the unit is written to counts as steady.
  const steady = trend === null || Math.abs(trend * windowDays) < 10 ** -decimals;
  const trendWord = steady ? 'steady' : trend! > 0 ? 'rising' : 'falling';
  const rows: { term: string; value: string; hint?: string }[] = [
    {
      term: 'Latest',
      value: history.latest ? formatIn(parameter, history.latest.value, unit) : '—',
      hint: history.latest ? formatDateTime(history.latest.measuredAt) : undefined,
    },
    { term: 'Mean', value: number(stats.mean), hint: `${formatCount(stats.count)} readings` },
    { term: 'Lowest', value: number(stats.min) },
    { term: 'Highest', value: number(stats.max) },
    {
      term: 'Average daily swing',
      value: stats.averageDailySwing === null ? 'not enough readings' : number(stats.averageDailySwing),
      hint: 'highest minus lowest, per day',
    },
    {
      term: 'Trend',
      value:
        trend === null
          ? 'not enough readings'
          : `${signOf(trend, decimals + 1)}${number(Math.abs(trend), 1)} a day`,
      hint: trend === null ? undefined : trendWord,
    },
  ];
  return (
    <dl className="grid grid-cols-2 gap-x-4 gap-y-3 sm:grid-cols-3 lg:grid-cols-1">
      {rows.map((row) => (
        <div key={row.term} className="min-w-0">
          <dt className="text-xs font-bold uppercase tracking-wide text-ink-600">{row.term}</dt>
          <dd className="text-lg font-bold text-ink-950">{row.value}</dd>
          {row.hint && <dd className="text-xs text-ink-700">{row.hint}</dd>}
        </div>
      ))}
    </dl>
  );
}
