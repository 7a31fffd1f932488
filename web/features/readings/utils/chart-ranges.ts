const hour = 3_600_000;
const day = 24 * hour;

export const chartRanges = {
  '24h': { label: '24 h', spoken: 'last 24 hours', ms: day },
  '7d': { label: '7 d', spoken: 'last 7 days', ms: 7 * day },
  '30d': { label: '30 d', spoken: 'last 30 days', ms: 30 * day },
  '90d': { label: '90 d', spoken: 'last 90 days', ms: 90 * day },
  '1y': { label: '1 year', spoken: 'last year', ms: 365 * day },
} as const;

export type ChartRange = keyof typeof chartRanges;
export const chartRangeKeys = Object.keys(chartRanges) as ChartRange[];
