import { describe, expect, it } from 'vitest';
import { visitOverdue } from '@shared/visits/overdue';
import { createTestClock, days, minutes } from '../../helpers/clock';

const joined = new Date('2026-11-02T10:00:00Z');

describe('visitOverdue', () => {
  it('is not overdue on the last day of a fortnightly interval after a visit', () => {
    const clock = createTestClock(new Date('2026-11-16T09:00:00Z'));
    const tank = { lastVisitAt: clock.now(), createdAt: joined, serviceIntervalDays: 14 };
    clock.advance(days(14));

    expect(visitOverdue(tank, clock.now())).toBe(false);
  });

  it('is overdue as soon as the interval since the last visit has passed', () => {
    const clock = createTestClock(new Date('2026-11-16T09:00:00Z'));
    const tank = { lastVisitAt: clock.now(), createdAt: joined, serviceIntervalDays: 14 };
    clock.advance(days(14) + minutes(1));

    expect(visitOverdue(tank, clock.now())).toBe(true);
  });

  it('counts a tank never visited from the day it joined, so a new client is not overdue at once', () => {
    const clock = createTestClock(joined);
    const tank = { lastVisitAt: null, createdAt: joined, serviceIntervalDays: 7 };

    expect(visitOverdue(tank, clock.now())).toBe(false);
    clock.advance(days(7));
    expect(visitOverdue(tank, clock.now())).toBe(false);
    clock.advance(minutes(1));
    expect(visitOverdue(tank, clock.now())).toBe(true);
  });

  it("follows the tank's own interval", () => {
    const clock = createTestClock(new Date('2026-11-16T09:00:00Z'));
    const visited = clock.now();
    clock.advance(days(20));

    expect(
      visitOverdue({ lastVisitAt: visited, createdAt: joined, serviceIntervalDays: 28 }, clock.now()),
    ).toBe(false);
    expect(
      visitOverdue({ lastVisitAt: visited, createdAt: joined, serviceIntervalDays: 14 }, clock.now()),
    ).toBe(true);
  });
});
