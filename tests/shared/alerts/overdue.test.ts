import { describe, expect, it } from 'vitest';
import { evaluateOverdue } from '@shared/alerts/overdue';
import { parameterCatalogue } from '@shared/parameters/catalogue';
import { createTestClock, days, hours } from '../../helpers/clock';
import { seriesStart } from './reading-series';

const alkalinityInterval = parameterCatalogue.alkalinity.homeTestIntervalMs!;

describe('evaluateOverdue', () => {
  it('is not overdue within the weekly alkalinity interval', () => {
    const clock = createTestClock(new Date(seriesStart));
    const tested = clock.now();
    clock.advance(days(7));

    expect(evaluateOverdue(tested, alkalinityInterval, clock.now())).toMatchObject({
      overdue: false,
      overdueByMs: 0,
    });
  });

  it('is overdue, with low urgency, once the interval has passed', () => {
    const clock = createTestClock(new Date(seriesStart));
    const tested = clock.now();
    clock.advance(days(7) + hours(2));

    expect(evaluateOverdue(tested, alkalinityInterval, clock.now())).toEqual({
      overdue: true,
      dueAt: new Date(tested.getTime() + days(7)),
      overdueByMs: hours(2),
      severity: 'notice',
    });
  });

  it('counts a parameter never tested as overdue', () => {
    expect(evaluateOverdue(null, alkalinityInterval, new Date(seriesStart))).toEqual({
      overdue: true,
      dueAt: null,
      overdueByMs: null,
      severity: 'notice',
    });
  });
});
