/*
 * The history chart: chart.js with its date adapter, loaded as its own chunk the first time a
 * chart is shown (see readings-chart-panel.tsx), so the tank page does not wait for it.
 */
import {
  Chart as ChartJS,
  Filler,
  Legend,
  LinearScale,
  LineController,
  LineElement,
  PointElement,
  ScatterController,
  TimeScale,
  Tooltip,
  type ChartDataset,
  type ChartOptions,
  type Plugin,
  type TooltipItem,
} from 'chart.js';
import 'chartjs-adapter-date-fns';
import { useMemo } from 'react';
import { Chart } from 'react-chartjs-2';
import { parameterCatalogue } from '@shared/parameters/catalogue';
import type { ParameterKey } from '@shared/parameters/keys';
import { unitDecimals, unitSymbol } from '@shared/parameters/units';
import type { ParameterLimits } from '@shared/parameters/limits';
import type { ReadingHistory } from '@shared/schemas/readings';
import type { Reading } from '@shared/readings/reading';
import { readingSourceLabels } from '@shared/readings/source-labels';
import { displayValue, formatIn, limitsIn } from '../utils/display-units';
import { formatDateTime } from '../../../lib/format';
import { axisEndPaddingMs, axisLabel, axisUnitFor } from '../utils/chart-ranges';

ChartJS.register(
  LineController,
  ScatterController,
  LineElement,
  PointElement,
  LinearScale,
  TimeScale,
  Tooltip,
  Legend,
  Filler,
);

const colours = {
  line: '#0f7f79',
  range: 'rgba(15, 127, 121, 0.18)',
  visit: '#0b3440',
  home: '#8a4b00',
  watchFill: 'rgba(251, 235, 208, 0.75)',
  watchLine: '#8a4b00',
  alertFill: 'rgba(251, 224, 220, 0.9)',
  alertLine: '#a3261b',
  grid: 'rgba(29, 90, 106, 0.12)',
  text: '#1d5a6a',
};

interface Point {
  x: number;
  y: number;
  /** What the tooltip says about where the point came from. */
  about: string;
  detail?: string;
}

interface Bands {
  /** In the chart's display unit. */
  limits: ParameterLimits | null;
  /** What every inhabitant tolerates, in the display unit; drawn as dotted lines. */
  tolerated: { min: number; max: number } | null;
  unitLabel: (value: number) => string;
}

/**
 * Draws the limit bands behind the data: the warning zone tinted, the critical zone tinted more
 * strongly, each bound a dashed line with its name and value written on it, so the bands read
 * without colour.
 */
const limitBands: Plugin<'line', Bands | undefined> = {
  id: 'limitBands',
  beforeDatasetsDraw(chart, _args, bands) {
    if (!bands) return;
    const { ctx, chartArea } = chart;
    const y = chart.scales.y;
    if (!y) return;
    const { warnLow, warnHigh, critLow, critHigh } = bands.limits ?? {
      warnLow: null,
      warnHigh: null,
      critLow: null,
      critHigh: null,
    };
    const px = (value: number) =>
      Math.min(chartArea.bottom, Math.max(chartArea.top, y.getPixelForValue(value)));
    const zone = (from: number, to: number, fill: string) => {
      const top = Math.min(from, to);
      const height = Math.abs(to - from);
      if (height <= 0) return;
      ctx.fillStyle = fill;
      ctx.fillRect(chartArea.left, top, chartArea.right - chartArea.left, height);
    };
    ctx.save();
    if (warnHigh !== null)
      zone(px(warnHigh), critHigh === null ? chartArea.top : px(critHigh), colours.watchFill);
    if (critHigh !== null) zone(px(critHigh), chartArea.top, colours.alertFill);
    if (warnLow !== null)
      zone(px(warnLow), critLow === null ? chartArea.bottom : px(critLow), colours.watchFill);
    if (critLow !== null) zone(px(critLow), chartArea.bottom, colours.alertFill);
    const line = (
      value: number | null,
      name: string,
      colour: string,
      below: boolean,
      look: { dash: number[]; side: 'left' | 'right' } = { dash: [6, 4], side: 'right' },
    ) => {
      if (value === null) return;
      const at = y.getPixelForValue(value);
      if (at < chartArea.top || at > chartArea.bottom) return;
      ctx.strokeStyle = colour;
      ctx.lineWidth = 1.5;
      ctx.setLineDash(look.dash);
      ctx.beginPath();
      ctx.moveTo(chartArea.left, at);
      ctx.lineTo(chartArea.right, at);
      ctx.stroke();
      ctx.setLineDash([]);
      ctx.fillStyle = colour;
      ctx.font = 'bold 11px "Merriweather Sans", sans-serif';
      ctx.textAlign = look.side;
      // A label never leaves the plot: at its top edge it goes under its line, at its bottom over it.
      if (!below && at - 14 < chartArea.top) below = true;
      else if (below && at + 14 > chartArea.bottom) below = false;
      ctx.textBaseline = below ? 'top' : 'bottom';
      const x = look.side === 'right' ? chartArea.right - 4 : chartArea.left + 4;
      const text = `${name} ${bands.unitLabel(value)}`;
      if (look.side === 'left') {
        // On the left the readings run under the label: a light backing keeps it legible.
        const width = ctx.measureText(text).width;
        ctx.fillStyle = 'rgba(255, 255, 255, 0.85)';
        ctx.fillRect(x - 2, below ? at + 2 : at - 16, width + 4, 14);
        ctx.fillStyle = colour;
      }
      ctx.fillText(text, x, at + (below ? 3 : -3));
    };
    // The livestock's range: dotted, labelled on the left, so it never hides a limit's label.
    if (bands.tolerated) {
      const livestock = { dash: [2, 3], side: 'left' as const };
      line(bands.tolerated.max, 'Livestock max', colours.visit, false, livestock);
      line(bands.tolerated.min, 'Livestock min', colours.visit, true, livestock);
    }
    line(critHigh, 'Critical', colours.alertLine, false);
    // A warning label goes under its line unless the critical line sits right above it.
    const roomAbove =
      warnHigh !== null &&
      critHigh !== null &&
      y.getPixelForValue(warnHigh) - y.getPixelForValue(critHigh) > 14;
    line(warnHigh, 'Warning', colours.watchLine, !roomAbove);
    line(warnLow, 'Warning', colours.watchLine, true);
    line(critLow, 'Critical', colours.alertLine, true);
    ctx.restore();
  },
};

interface ReadingsChartProps {
  parameter: ParameterKey;
  unit: string;
  history: ReadingHistory;
  /** What the tank's livestock tolerate together, in the stored unit; null when nothing is known. */
  tolerated?: { min: number; max: number } | null;
}

/** A symbol for the unit a reading was entered in, or the unit's own name if it is not one we know. */
function enteredSymbol(parameter: ParameterKey, unit: string): string {
  try {
    return unitSymbol(parameter, unit);
  } catch {
    return unit;
  }
}

function manualPoints(
  parameter: ParameterKey,
  unit: string,
  readings: Reading[],
  source: Reading['source'],
): Point[] {
  return readings
    .filter((r) => r.source === source)
    .map((r) => {
      const who = r.recordedBy ? ` by ${r.recordedBy}` : '';
      const entered =
        r.enteredUnit !== unit
          ? `entered as ${r.enteredValue} ${enteredSymbol(parameter, r.enteredUnit)}`.trim()
          : '';
      return {
        x: Date.parse(r.measuredAt),
        y: displayValue(parameter, r.value, unit),
        about: `${readingSourceLabels[r.source]}${who}`,
        detail: [entered, r.method, r.note].filter(Boolean).join(' · ') || undefined,
      };
    });
}

export function ReadingsChart({ parameter, unit, history, tolerated = null }: ReadingsChartProps) {
  const symbol = unitSymbol(parameter, unit);
  const label = parameterCatalogue[parameter].label;

  const { datasets, extent } = useMemo(() => {
    const convert = (value: number) => displayValue(parameter, value, unit);
    const sets: ChartDataset<'line' | 'scatter', Point[]>[] = [];
    const values: number[] = [];
    if (history.mode === 'buckets') {
      const width = history.bucketMs ?? 0;
      // A bucket is drawn at its middle, but never outside the window: the last bucket is usually
      // still filling, and its middle can lie after the window's end, where it would not be drawn.
      const from = Date.parse(history.from);
      const to = Date.parse(history.to);
      const mid = (start: string) => Math.min(to, Math.max(from, Date.parse(start) + width / 2));
      const counts = (b: ReadingHistory['buckets'][number]) =>
        [
          b.bySource.device && `${b.bySource.device} device`,
          b.bySource['home-test'] &&
            `${b.bySource['home-test']} home test${b.bySource['home-test'] > 1 ? 's' : ''}`,
          b.bySource.visit && `${b.bySource.visit} visit${b.bySource.visit > 1 ? 's' : ''}`,
        ]
          .filter(Boolean)
          .join(', ');
      const low = history.buckets.map((b) => ({ x: mid(b.start), y: convert(b.min), about: 'Lowest' }));
      const high = history.buckets.map((b) => ({ x: mid(b.start), y: convert(b.max), about: 'Highest' }));
      const mean = history.buckets.map((b) => ({
        x: mid(b.start),
        y: convert(b.mean),
        about: `Mean of ${b.count} reading${b.count > 1 ? 's' : ''} (${counts(b)})`,
        detail: `lowest ${formatIn(parameter, b.min, unit)}, highest ${formatIn(parameter, b.max, unit)}`,
      }));
      values.push(...low.map((p) => p.y), ...high.map((p) => p.y));
      sets.push(
        {
          type: 'line',
          label: 'Lowest',
          data: low,
          borderWidth: 0,
          pointRadius: 0,
          pointHitRadius: 0,
          fill: false,
        },
        {
          type: 'line',
          label: 'Range in each period',
          data: high,
          borderWidth: 0,
          pointRadius: 0,
          pointHitRadius: 0,
          backgroundColor: colours.range,
          fill: '-1',
        },
        {
          type: 'line',
          label: 'Mean',
          data: mean,
          borderColor: colours.line,
          backgroundColor: colours.line,
          borderWidth: 2,
          pointRadius: 0,
          pointHitRadius: 6,
          tension: 0.2,
        },
      );
    } else {
      const device = history.readings
        .filter((r) => r.source === 'device')
        .map((r) => ({
          x: Date.parse(r.measuredAt),
          y: convert(r.value),
          about: `Device${r.recordedBy ? ` (${r.recordedBy})` : ''}`,
        }));
      values.push(...device.map((p) => p.y));
      if (device.length > 0) {
        sets.push({
          type: 'line',
          label: 'Device readings',
          data: device,
          borderColor: colours.line,
          backgroundColor: colours.line,
          borderWidth: 2,
          pointRadius: device.length > 60 ? 0 : 2.5,
          pointHitRadius: 6,
          pointStyle: 'circle',
        });
      }
    }
    const home = manualPoints(parameter, unit, history.readings, 'home-test');
    const visits = manualPoints(parameter, unit, history.readings, 'visit');
    values.push(...home.map((p) => p.y), ...visits.map((p) => p.y));
    // A year of daily home tests is hundreds of markers on a phone's width: smaller ones, without
    // their white edge, so they read as a trail rather than a smear.
    const dense = home.length + visits.length;
    const radius = (full: number) => (dense > 150 ? full / 3 : dense > 50 ? full / 1.75 : full);
    const edge = dense > 150 ? 0 : 1;
    if (home.length > 0) {
      sets.push({
        type: 'scatter',
        label: 'Home tests',
        data: home,
        pointStyle: 'triangle',
        pointRadius: radius(6),
        pointHoverRadius: 8,
        backgroundColor: colours.home,
        borderColor: '#ffffff',
        borderWidth: edge,
      });
    }
    if (visits.length > 0) {
      sets.push({
        type: 'scatter',
        label: 'Visits',
        data: visits,
        pointStyle: 'rectRot',
        pointRadius: radius(6.5),
        pointHoverRadius: 8.5,
        backgroundColor: colours.visit,
        borderColor: '#ffffff',
        borderWidth: edge,
      });
    }
    return { datasets: sets, extent: values };
  }, [history, parameter, unit]);

  const limits = history.limits.limits;
  const options = useMemo((): ChartOptions<'line'> => {
    const convert = (value: number) => displayValue(parameter, value, unit);
    // The axis shows the data and the warning band; a critical bound only once the data nears it.
    const shown = [...extent];
    const toleratedShown = tolerated ? { min: convert(tolerated.min), max: convert(tolerated.max) } : null;
    if (toleratedShown) shown.push(toleratedShown.min, toleratedShown.max);
    if (limits?.warnLow != null) shown.push(convert(limits.warnLow));
    if (limits?.warnHigh != null) shown.push(convert(limits.warnHigh));
    const dataLow = Math.min(...extent);
    const dataHigh = Math.max(...extent);
    if (limits?.critLow != null && limits.warnLow != null && dataLow < convert(limits.warnLow))
      shown.push(convert(limits.critLow));
    if (limits?.critHigh != null && limits.warnHigh != null && dataHigh > convert(limits.warnHigh))
      shown.push(convert(limits.critHigh));
    const low = shown.length ? Math.min(...shown) : 0;
    const high = shown.length ? Math.max(...shown) : 1;
    const pad = (high - low || Math.abs(high) || 1) * 0.08;
    const from = Date.parse(history.from);
    const to = Date.parse(history.to);
    const axisUnit = axisUnitFor(to - from);
    return {
      responsive: true,
      maintainAspectRatio: false,
      animation: false,
      parsing: false,
      normalized: true,
      interaction: { mode: 'nearest', intersect: false },
      scales: {
        x: {
          type: 'time',
          min: from,
          max: to + axisEndPaddingMs(to - from),
          time: { unit: axisUnit },
          grid: { color: colours.grid },
          ticks: {
            color: colours.text,
            maxRotation: 0,
            autoSkipPadding: 16,
            callback: (value) => axisLabel(Number(value), axisUnit),
          },
        },
        y: {
          // Suggested, not fixed, so the axis rounds out to readable ticks.
          suggestedMin: low - pad,
          suggestedMax: high + pad,
          grid: { color: colours.grid },
          ticks: { color: colours.text },
          title: { display: true, text: symbol ? `${label} (${symbol})` : label, color: colours.text },
        },
      },
      plugins: {
        legend: {
          position: 'bottom',
          labels: {
            usePointStyle: true,
            color: colours.text,
            filter: (item) => item.text !== 'Lowest',
          },
        },
        tooltip: {
          callbacks: {
            title: (items) => {
              const first = items[0];
              return first ? formatDateTime((first.raw as Point).x) : '';
            },
            label: (item: TooltipItem<'line'>) => {
              const point = item.raw as Point;
              return `${point.about}: ${point.y.toFixed(unitDecimals(parameter, unit))}${symbol ? ` ${symbol}` : ''}`;
            },
            afterLabel: (item: TooltipItem<'line'>) => (item.raw as Point).detail ?? '',
          },
          filter: (item) => item.dataset.label !== 'Lowest' && item.dataset.label !== 'Range in each period',
        },
        limitBands: {
          limits: limits ? limitsIn(parameter, limits, unit) : null,
          tolerated: toleratedShown,
          unitLabel: (value: number) =>
            `${value.toFixed(unitDecimals(parameter, unit))}${symbol ? ` ${symbol}` : ''}`,
        },
      } as ChartOptions<'line'>['plugins'],
    };
  }, [extent, history.from, history.to, label, limits, parameter, symbol, tolerated, unit]);

  return (
    <Chart
      type="line"
      data={{ datasets: datasets as ChartDataset<'line', Point[]>[] }}
      options={options}
      plugins={[limitBands as Plugin<'line'>]}
      role="img"
      aria-label={`Chart of ${label.toLowerCase()} in ${symbol || 'pH'}; the same readings are listed in the table view.`}
    />
  );
}
