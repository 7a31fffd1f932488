import { describe, expect, it } from 'vitest';
import { occurrenceDays, routineRule, wallInstant, wallTimeOf, zonedWindow } from '@shared/visits/recurrence';

/*
 * Clock changes in 2026, from memory, with the rule each follows:
 * - Europe/London: EU summer time starts the last Sunday of March and ends the last Sunday of
 *   October, both at 01:00 UTC (Directive 2000/84/EC; the UK keeps the same dates under the Summer
 *   Time Order 2002): 29 March 2026 (01:00 GMT → 02:00 BST) and 25 October 2026 (02:00 BST → 01:00 GMT).
 * - America/New_York: daylight saving time starts the second Sunday of March and ends the first
 *   Sunday of November, at 02:00 local (Energy Policy Act of 2005, 15 U.S.C. §260a): 8 March 2026
 *   (02:00 EST → 03:00 EDT) and 1 November 2026 (02:00 EDT → 01:00 EST).
 * - Australia/Sydney: New South Wales daylight saving ends the first Sunday of April (03:00 AEDT →
 *   02:00 AEST) and starts the first Sunday of October (02:00 AEST → 03:00 AEDT) (Standard Time Act
 *   1987 (NSW)): 5 April 2026 and 4 October 2026.
 */

interface PlannedVisit {
  day: string;
  start: string;
  end: string;
}

/** The visits of a series, as its days and the UTC instants of their windows. */
function plan(
  rule: string,
  firstDay: string,
  range: [string, string],
  hours: [string, string],
  zone: string,
) {
  return occurrenceDays(rule, firstDay, ...range).map((day): PlannedVisit => {
    const { start, end } = zonedWindow(day, hours[0], hours[1], zone);
    return { day, start: start.toISOString(), end: end.toISOString() };
  });
}

const fortnightly = routineRule(14);

describe('routineRule', () => {
  it('writes a whole number of weeks as a weekly rule', () => {
    expect(fortnightly).toBe('FREQ=WEEKLY;INTERVAL=2');
    expect(routineRule(7)).toBe('FREQ=WEEKLY;INTERVAL=1');
    expect(routineRule(28)).toBe('FREQ=WEEKLY;INTERVAL=4');
  });

  it('writes any other interval in days', () => {
    expect(routineRule(1)).toBe('FREQ=DAILY;INTERVAL=1');
    expect(routineRule(10)).toBe('FREQ=DAILY;INTERVAL=10');
  });

  it('leaves DTSTART out: the series keeps its first day beside the rule', () => {
    expect(routineRule(21)).not.toMatch(/DTSTART|RRULE:/);
  });

  it('refuses an interval that is not a whole number of days from 1', () => {
    expect(() => routineRule(0)).toThrow(RangeError);
    expect(() => routineRule(-7)).toThrow(RangeError);
    expect(() => routineRule(1.5)).toThrow(RangeError);
    expect(() => routineRule(Number.NaN)).toThrow(RangeError);
  });
});

describe('a fortnightly 09:00 routine service across the clock changes', () => {
  it('stays at 09:00 in London when summer time starts: 09:00Z becomes 08:00Z', () => {
    const visits = plan(
      fortnightly,
      '2026-03-17',
      ['2026-03-01', '2026-04-20'],
      ['09:00', '10:00'],
      'Europe/London',
    );
    expect(visits).toEqual([
      { day: '2026-03-17', start: '2026-03-17T09:00:00.000Z', end: '2026-03-17T10:00:00.000Z' },
      { day: '2026-03-31', start: '2026-03-31T08:00:00.000Z', end: '2026-03-31T09:00:00.000Z' },
      { day: '2026-04-14', start: '2026-04-14T08:00:00.000Z', end: '2026-04-14T09:00:00.000Z' },
    ]);
  });

  it('stays at 09:00 in London when summer time ends: 08:00Z becomes 09:00Z', () => {
    const visits = plan(
      fortnightly,
      '2026-03-17',
      ['2026-10-01', '2026-11-15'],
      ['09:00', '10:00'],
      'Europe/London',
    );
    expect(visits.map((v) => v.start)).toEqual([
      '2026-10-13T08:00:00.000Z',
      '2026-10-27T09:00:00.000Z',
      '2026-11-10T09:00:00.000Z',
    ]);
    for (const visit of visits) {
      expect(wallTimeOf(new Date(visit.start), 'Europe/London')).toEqual({ day: visit.day, time: '09:00' });
    }
  });

  it('stays at 09:00 in New York: 14:00Z in winter, 13:00Z in summer', () => {
    const zone = 'America/New_York';
    const spring = plan(fortnightly, '2026-02-24', ['2026-02-20', '2026-03-15'], ['09:00', '10:30'], zone);
    expect(spring).toEqual([
      { day: '2026-02-24', start: '2026-02-24T14:00:00.000Z', end: '2026-02-24T15:30:00.000Z' },
      { day: '2026-03-10', start: '2026-03-10T13:00:00.000Z', end: '2026-03-10T14:30:00.000Z' },
    ]);
    const autumn = plan(fortnightly, '2026-02-24', ['2026-10-15', '2026-11-10'], ['09:00', '10:30'], zone);
    expect(autumn.map((v) => v.start)).toEqual(['2026-10-20T13:00:00.000Z', '2026-11-03T14:00:00.000Z']);
    for (const visit of [...spring, ...autumn]) {
      expect(wallTimeOf(new Date(visit.start), zone)).toEqual({ day: visit.day, time: '09:00' });
    }
  });

  it('stays at 09:00 in Sydney, where summer time ends in April and starts in October', () => {
    const zone = 'Australia/Sydney';
    // 09:00 in Sydney is the evening before in UTC: 22:00Z under AEDT (UTC+11), 23:00Z under AEST (UTC+10).
    const april = plan(fortnightly, '2026-03-24', ['2026-03-20', '2026-04-10'], ['09:00', '10:00'], zone);
    expect(april).toEqual([
      { day: '2026-03-24', start: '2026-03-23T22:00:00.000Z', end: '2026-03-23T23:00:00.000Z' },
      { day: '2026-04-07', start: '2026-04-06T23:00:00.000Z', end: '2026-04-07T00:00:00.000Z' },
    ]);
    const october = plan(fortnightly, '2026-03-24', ['2026-09-20', '2026-10-10'], ['09:00', '10:00'], zone);
    expect(october.map((v) => v.start)).toEqual(['2026-09-21T23:00:00.000Z', '2026-10-05T22:00:00.000Z']);
    // The days are Sydney's own: the UTC date of each start is a day earlier, and nothing moves.
    for (const visit of [...april, ...october]) {
      expect(wallTimeOf(new Date(visit.start), zone)).toEqual({ day: visit.day, time: '09:00' });
    }
  });
});

describe('zonedWindow on the day the clocks change', () => {
  it('moves a 02:30 visit in New York on the spring-forward day to 03:30 EDT, forward by the skipped hour', () => {
    const { start, end } = zonedWindow('2026-03-08', '02:30', '04:00', 'America/New_York');
    expect(start.toISOString()).toBe('2026-03-08T07:30:00.000Z');
    expect(end.toISOString()).toBe('2026-03-08T08:00:00.000Z');
    expect(wallTimeOf(start, 'America/New_York')).toEqual({ day: '2026-03-08', time: '03:30' });
  });

  it('moves a 02:30 visit in Sydney on the spring-forward day to 03:30 AEDT', () => {
    const { start } = zonedWindow('2026-10-04', '02:30', '04:00', 'Australia/Sydney');
    expect(start.toISOString()).toBe('2026-10-03T16:30:00.000Z');
    expect(wallTimeOf(start, 'Australia/Sydney')).toEqual({ day: '2026-10-04', time: '03:30' });
  });

  it('leaves 02:30 in London alone on its spring-forward day (the skipped hour there is 01:00–02:00)', () => {
    expect(zonedWindow('2026-03-29', '02:30', '03:30', 'Europe/London').start.toISOString()).toBe(
      '2026-03-29T01:30:00.000Z',
    );
    expect(zonedWindow('2026-03-29', '01:30', '03:30', 'Europe/London').start.toISOString()).toBe(
      '2026-03-29T01:30:00.000Z',
    );
  });

  it('keeps the planned length when the skipped hour would push the start past the end', () => {
    const { start, end } = zonedWindow('2026-03-08', '02:30', '03:15', 'America/New_York');
    expect(start.toISOString()).toBe('2026-03-08T07:30:00.000Z');
    expect(end.getTime() - start.getTime()).toBe(45 * 60_000);
  });

  it('takes the first of a wall time that happens twice when the clocks go back', () => {
    // 01:30 happens at 00:30Z (BST) and again at 01:30Z (GMT) in London on 25 October 2026.
    const { start, end } = zonedWindow('2026-10-25', '01:30', '02:30', 'Europe/London');
    expect(start.toISOString()).toBe('2026-10-25T00:30:00.000Z');
    expect(end.toISOString()).toBe('2026-10-25T02:30:00.000Z');
  });

  it('refuses what is not a day, a time or a zone, and a window that ends before it starts', () => {
    expect(() => zonedWindow('2026-02-30', '09:00', '10:00', 'Europe/London')).toThrow(RangeError);
    expect(() => zonedWindow('2026-03-01', '9:00', '10:00', 'Europe/London')).toThrow(RangeError);
    expect(() => zonedWindow('2026-03-01', '09:00', '24:00', 'Europe/London')).toThrow(RangeError);
    expect(() => zonedWindow('2026-03-01', '09:00', '10:00', 'Atlantis/Lost_City')).toThrow(RangeError);
    expect(() => zonedWindow('2026-03-01', '10:00', '09:00', 'Europe/London')).toThrow(RangeError);
  });
});

describe('occurrenceDays', () => {
  it('gives a daily rule every day across a clock change, none twice and none missing', () => {
    const visits = plan(
      routineRule(1),
      '2026-03-27',
      ['2026-03-27', '2026-03-31'],
      ['09:00', '10:00'],
      'Europe/London',
    );
    expect(visits.map((v) => [v.day, v.start])).toEqual([
      ['2026-03-27', '2026-03-27T09:00:00.000Z'],
      ['2026-03-28', '2026-03-28T09:00:00.000Z'],
      ['2026-03-29', '2026-03-29T08:00:00.000Z'],
      ['2026-03-30', '2026-03-30T08:00:00.000Z'],
      ['2026-03-31', '2026-03-31T08:00:00.000Z'],
    ]);
  });

  it('gives a daily rule 365 days in a year, whatever the zone', () => {
    const days = occurrenceDays(routineRule(1), '2026-01-01', '2026-01-01', '2026-12-31');
    expect(days).toHaveLength(365);
    expect(new Set(days).size).toBe(365);
    expect(days.at(-1)).toBe('2026-12-31');
    for (const day of days) {
      const { start } = zonedWindow(day, '09:00', '10:00', 'Australia/Sydney');
      expect(wallTimeOf(start, 'Australia/Sydney')).toEqual({ day, time: '09:00' });
    }
  });

  it('steps a rule in days of any length', () => {
    expect(occurrenceDays(routineRule(10), '2026-03-20', '2026-03-01', '2026-04-30')).toEqual([
      '2026-03-20',
      '2026-03-30',
      '2026-04-09',
      '2026-04-19',
      '2026-04-29',
    ]);
  });

  it('keeps a weekly rule on the weekday of its first day', () => {
    const days = occurrenceDays(routineRule(7), '2026-10-14', '2026-10-01', '2026-11-11');
    expect(days).toEqual(['2026-10-14', '2026-10-21', '2026-10-28', '2026-11-04', '2026-11-11']);
    // 14 October 2026 is a Wednesday.
    expect(new Set(days.map((day) => new Date(`${day}T00:00:00Z`).getUTCDay()))).toEqual(new Set([3]));
  });

  it('includes occurrences on `from` and on `to`', () => {
    expect(occurrenceDays(fortnightly, '2026-03-17', '2026-03-31', '2026-04-14')).toEqual([
      '2026-03-31',
      '2026-04-14',
    ]);
    expect(occurrenceDays(fortnightly, '2026-03-17', '2026-03-31', '2026-03-31')).toEqual(['2026-03-31']);
  });

  it('gives nothing between occurrences, before the first day, or for a range that ends before it starts', () => {
    expect(occurrenceDays(fortnightly, '2026-03-17', '2026-04-01', '2026-04-13')).toEqual([]);
    expect(occurrenceDays(fortnightly, '2026-03-17', '2026-01-01', '2026-03-16')).toEqual([]);
    expect(occurrenceDays(fortnightly, '2026-03-17', '2026-01-01', '2026-03-17')).toEqual(['2026-03-17']);
    expect(occurrenceDays(fortnightly, '2026-03-17', '2026-04-14', '2026-03-31')).toEqual([]);
  });

  it('reads a rule written with its RRULE: name, and honours COUNT', () => {
    expect(
      occurrenceDays('RRULE:FREQ=WEEKLY;INTERVAL=2;COUNT=2', '2026-03-17', '2026-01-01', '2026-12-31'),
    ).toEqual(['2026-03-17', '2026-03-31']);
  });

  it('refuses a rule without a frequency and a day that does not exist', () => {
    expect(() => occurrenceDays('INTERVAL=2', '2026-03-17', '2026-03-01', '2026-04-01')).toThrow(RangeError);
    expect(() => occurrenceDays(fortnightly, '2026-02-29', '2026-03-01', '2026-04-01')).toThrow(RangeError);
  });
});

describe('wallInstant', () => {
  it('is the instant a wall clock reads a time, and wallTimeOf reads it back', () => {
    const instant = wallInstant('2026-07-02', '09:30', 'Australia/Sydney');
    expect(instant.toISOString()).toBe('2026-07-01T23:30:00.000Z');
    expect(wallTimeOf(instant, 'Australia/Sydney')).toEqual({ day: '2026-07-02', time: '09:30' });
  });

  it('resolves the skipped and the repeated hour as zonedWindow does', () => {
    expect(wallInstant('2026-03-08', '02:30', 'America/New_York').toISOString()).toBe(
      '2026-03-08T07:30:00.000Z',
    );
    expect(wallInstant('2026-11-01', '01:30', 'America/New_York').toISOString()).toBe(
      '2026-11-01T05:30:00.000Z',
    );
  });

  it('refuses an unknown zone', () => {
    expect(() => wallInstant('2026-07-02', '09:30', 'Mars/Olympus_Mons')).toThrow(RangeError);
  });
});

describe('wallTimeOf', () => {
  it('reads the calendar and clock of the zone, not of the server', () => {
    const instant = new Date('2026-07-01T23:30:00Z');
    expect(wallTimeOf(instant, 'Europe/London')).toEqual({ day: '2026-07-02', time: '00:30' });
    expect(wallTimeOf(instant, 'America/New_York')).toEqual({ day: '2026-07-01', time: '19:30' });
    expect(wallTimeOf(instant, 'Australia/Sydney')).toEqual({ day: '2026-07-02', time: '09:30' });
    expect(wallTimeOf(instant, 'UTC')).toEqual({ day: '2026-07-01', time: '23:30' });
  });
});
