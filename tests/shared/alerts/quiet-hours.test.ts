import { describe, expect, it } from 'vitest';
import { inQuietHours } from '@shared/alerts/quiet-hours';

const overnight = { quietHours: { start: '22:00', end: '07:00' }, timeZone: 'Europe/London' };

describe('inQuietHours', () => {
  it('holds back messages late at night in the person’s own time zone', () => {
    // 23:30 UTC in December is 23:30 in London (GMT).
    expect(inQuietHours(overnight, new Date('2026-12-01T23:30:00Z'))).toBe(true);
    expect(inQuietHours(overnight, new Date('2026-12-02T06:59:00Z'))).toBe(true);
  });

  it('lets messages through in the day, and at the very end of the window', () => {
    expect(inQuietHours(overnight, new Date('2026-12-02T07:00:00Z'))).toBe(false);
    expect(inQuietHours(overnight, new Date('2026-12-02T12:00:00Z'))).toBe(false);
    expect(inQuietHours(overnight, new Date('2026-12-01T21:59:00Z'))).toBe(false);
  });

  it('follows summer time: 21:30 UTC in July is 22:30 in London', () => {
    expect(inQuietHours(overnight, new Date('2026-07-01T21:30:00Z'))).toBe(true);
  });

  it('reads the clock where the person is, not where the server is', () => {
    const sydney = { ...overnight, timeZone: 'Australia/Sydney' };
    // 12:00 UTC on 1 Dec is 23:00 in Sydney (AEDT, UTC+11).
    expect(inQuietHours(sydney, new Date('2026-12-01T12:00:00Z'))).toBe(true);
  });

  it('handles a window within one day, and no window at all', () => {
    const afternoon = { quietHours: { start: '13:00', end: '14:00' }, timeZone: 'UTC' };
    expect(inQuietHours(afternoon, new Date('2026-12-01T13:30:00Z'))).toBe(true);
    expect(inQuietHours(afternoon, new Date('2026-12-01T14:30:00Z'))).toBe(false);
    expect(inQuietHours({ quietHours: null, timeZone: 'UTC' }, new Date())).toBe(false);
  });
});
