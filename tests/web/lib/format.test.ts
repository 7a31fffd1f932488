import { describe, expect, it } from 'vitest';
import { relativeTime } from '../../../web/lib/format';

describe('relativeTime', () => {
  const now = Date.parse('2026-12-03T07:10:00Z');
  const ago = (ms: number) => now - ms;
  const hour = 3_600_000;

  it('says minutes and hours within the day', () => {
    expect(relativeTime(ago(30_000), now)).toBe('just now');
    expect(relativeTime(ago(5 * 60_000), now)).toBe('5 minutes ago');
    expect(relativeTime(ago(23 * hour), now)).toBe('23 hours ago');
  });

  it('calls a day and a half ago two days ago, not yesterday', () => {
    expect(relativeTime(ago(26 * hour), now)).toBe('yesterday');
    expect(relativeTime(ago(37.5 * hour), now)).toBe('2 days ago');
    expect(relativeTime(ago(72 * hour), now)).toBe('3 days ago');
  });
});
