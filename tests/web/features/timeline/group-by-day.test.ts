import { describe, expect, it } from 'vitest';
import type { TimelineEntry } from '@shared/schemas/timeline';
import { formatDayHeading } from '../../../../web/lib/format';
import { groupByDay } from '../../../../web/features/timeline/utils/group-by-day';

const entry = (at: string, timeZone: string): TimelineEntry => ({
  kind: 'visit',
  id: crypto.randomUUID(),
  at,
  title: 'Visit report: routine service',
  summary: '',
  link: '/tanks/x',
  timeZone,
  editedAt: null,
  body: null,
  photoId: null,
});

describe('groupByDay', () => {
  it('cuts the feed at midnight on the tank’s clock, not at UTC midnight', () => {
    // 17:30 UTC on 1 December is 01:30 on 2 December in Perth (UTC+8).
    const entries = [
      entry('2026-12-01T17:30:00.000Z', 'Australia/Perth'),
      entry('2026-12-01T15:30:00.000Z', 'Australia/Perth'),
      entry('2026-12-01T10:00:00.000Z', 'Australia/Perth'),
    ];

    expect(groupByDay(entries).map((d) => [d.day, d.entries.length])).toEqual([
      ['2026-12-02', 1],
      ['2026-12-01', 2],
    ]);
  });
});

describe('formatDayHeading', () => {
  const now = Date.parse('2026-12-02T09:00:00Z');

  it('says today and yesterday on the tank’s clock', () => {
    expect(formatDayHeading('2026-12-02T01:00:00Z', 'Europe/London', now)).toBe('Today');
    expect(formatDayHeading('2026-12-01T23:30:00Z', 'Europe/London', now)).toBe('Yesterday');
    // Already 2 December in Perth at 23:30 UTC on the 1st.
    expect(formatDayHeading('2026-12-01T23:30:00Z', 'Australia/Perth', now)).toBe('Today');
  });

  it('names older days, with the year only when it is not this one', () => {
    expect(formatDayHeading('2026-11-24T12:00:00Z', 'Europe/London', now)).toBe('Tuesday 24 November');
    expect(formatDayHeading('2025-11-24T12:00:00Z', 'Europe/London', now)).toBe('Monday 24 November 2025');
  });
});
