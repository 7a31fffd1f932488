import type { ParameterKey } from '@shared/parameters/keys';
import { unitDecimals, unitSymbol } from '@shared/parameters/units';
import {
  minSwingDays,
  sampleOf,
  trendDirection,
  windowStats,
  type SeriesSample,
} from '@shared/readings/stats';
import type { ReadingHistory } from '@shared/schemas/readings';
import { displayValue, formatIn } from '../utils/display-units';
import { formatCount, formatDateTime } from '../../../lib/format';

/** The window's samples in the display unit: each bucket, or each reading. */
export function samplesOf(history: ReadingHistory, parameter: ParameterKey, unit: string): SeriesSample[] {
  const convert = (value: number) => displayValue(parameter, value, unit);
  if (history.mode === 'buckets') {
    const widthMs = history.bucketMs ?? undefined;
    return history.buckets.map((b) => ({
      at: Date.parse(b.start),
      min: convert(b.min),
      mean: convert(b.mean),
      max: convert(b.max),
      count: b.count,
      ...(widthMs === undefined ? {} : { widthMs }),
    }));
  }
  return history.readings.map((r) => sampleOf(Date.parse(r.measuredAt), convert(r.value)));
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
  // Readings less than a day apart: the change over the hours they span, not stretched to a day.
  const spanDays = stats.spanMs / 86_400_000;
  const withinDay = spanDays < 1;
  // The trend is written with one decimal more than the readings, as it is a change per day.
  const direction =
    trend === null
      ? null
      : trendDirection(
          withinDay ? trend * spanDays : trend,
          withinDay
            ? { perDayDecimals: decimals, valueDecimals: decimals, windowDays: 1 }
            : { perDayDecimals: decimals + 1, valueDecimals: decimals, windowDays },
        );
  const spanHours = Math.max(1, Math.round(stats.spanMs / 3_600_000));
  const rows: { term: string; value: string; hint?: string }[] = [
    {
      term: 'Latest',
      value: history.latest ? formatIn(parameter, history.latest.value, unit) : '—',
      hint: history.latest ? formatDateTime(history.latest.measuredAt) : undefined,
    },
    { term: 'Mean', value: number(stats.mean), hint: `${formatCount(stats.count)} readings` },
    { term: 'Lowest', value: number(stats.min) },
    { term: 'Highest', value: number(stats.max) },
    stats.averageDailySwing === null
      ? {
          term: 'Average daily swing',
          value: '—',
          hint: `needs two readings a day on at least ${minSwingDays} days`,
        }
      : {
          term: 'Average daily swing',
          value: number(stats.averageDailySwing),
          hint: `highest minus lowest, over ${formatCount(stats.swingDays)} days`,
        },
    trend === null || direction === null
      ? { term: 'Trend', value: '—', hint: 'needs readings at two times' }
      : direction === 'steady'
        ? { term: 'Trend', value: 'steady' }
        : withinDay
          ? {
              term: 'Trend',
              value: `${direction === 'rising' ? '+' : '−'}${number(Math.abs(trend * spanDays))} in ${spanHours} h`,
              hint: direction,
            }
          : {
              term: 'Trend',
              value: `${direction === 'rising' ? '+' : '−'}${number(Math.abs(trend), 1)} a day`,
              hint: direction,
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
