import { TZDate, tzOffset } from '@date-fns/tz';
import * as rrulePackage from 'rrule';
import { isKnownTimeZone } from '@shared/time/time-zones';

/*
 * Repeating visits are planned on the wall calendar: a series is a rule over calendar days plus
 * wall times in the tank's zone, and each day becomes an instant only at the end (`zonedWindow`).
 * So "every other Tuesday at 09:00" stays on Tuesdays at 09:00 across clock changes, and the instant
 * moves by the hour instead.
 */

/**
 * rrule 2.8.1 gives Node its CommonJS build, whose names only `default` carries, and bundlers an ES
 * build without a default export: take the names from wherever this runtime put them. (A function,
 * so the bundler does not warn about the `default` the ES build lacks.)
 */
function namesOf<T extends object>(namespace: T): T {
  return (namespace as { default?: T }).default ?? namespace;
}
const { RRule } = namesOf(rrulePackage);

const dayPattern = /^(\d{4})-(\d{2})-(\d{2})$/;
const timePattern = /^([01]\d|2[0-3]):([0-5]\d)$/;
const minuteMs = 60_000;
const hourMs = 60 * minuteMs;

function partsOfDay(day: string): [number, number, number] {
  const match = dayPattern.exec(day);
  const parts = match ? ([Number(match[1]), Number(match[2]), Number(match[3])] as const) : null;
  // Date.UTC rolls 2026-02-30 over into March; a real day survives the round trip.
  if (!parts || new Date(Date.UTC(parts[0], parts[1] - 1, parts[2])).toISOString().slice(0, 10) !== day) {
    throw new RangeError(`"${day}" is not a calendar day (YYYY-MM-DD)`);
  }
  return [parts[0], parts[1], parts[2]];
}

function partsOfTime(time: string): [number, number] {
  const match = timePattern.exec(time);
  if (!match) throw new RangeError(`"${time}" is not a wall time (HH:MM, 24-hour)`);
  return [Number(match[1]), Number(match[2])];
}

function checkZone(timeZone: string) {
  if (!isKnownTimeZone(timeZone)) throw new RangeError(`"${timeZone}" is not a known IANA time zone`);
}

/** A calendar day as its UTC midnight: a floating date, which no zone's clock change can move. */
function floating(day: string): Date {
  const [year, month, date] = partsOfDay(day);
  return new Date(Date.UTC(year, month - 1, date));
}

/**
 * The recurrence rule for a routine service every `intervalDays` days, as an RFC 5545 RRULE value
 * without DTSTART (the series' first day is kept beside it). A whole number of weeks is written
 * weekly, which is how people say it and how calendar apps show it.
 */
export function routineRule(intervalDays: number): string {
  if (!Number.isInteger(intervalDays) || intervalDays < 1) {
    throw new RangeError(`a service interval is a whole number of days from 1, not ${intervalDays}`);
  }
  const weekly = intervalDays % 7 === 0;
  const rule = new RRule({
    freq: weekly ? RRule.WEEKLY : RRule.DAILY,
    interval: weekly ? intervalDays / 7 : intervalDays,
  });
  return rule.toString().replace(/^RRULE:/, '');
}

/**
 * The calendar days (YYYY-MM-DD) on which `rule`, starting on `firstDay`, falls between `from` and
 * `to`, both included. Computed on floating dates, so a clock change can neither add nor drop a day.
 * `rule` is an RRULE value, with or without its "RRULE:" name; a DTSTART in it is ignored.
 */
export function occurrenceDays(rule: string, firstDay: string, from: string, to: string): string[] {
  const options = RRule.parseString(rule.trim());
  if (options.freq === undefined) throw new RangeError(`"${rule}" has no FREQ`);
  const start = floating(firstDay);
  const [lower, upper] = [floating(from), floating(to)];
  if (upper < lower) return [];
  const recurrence = new RRule({ ...options, dtstart: start, tzid: null });
  return recurrence.between(lower, upper, true).map((day) => day.toISOString().slice(0, 10));
}

/**
 * The instant at which the wall clock in `timeZone` reads `time` on `day`.
 *
 * RFC 5545 §3.3.5 decides the two awkward cases, so our instants agree with what calendar apps read
 * from the feed's `DTSTART;TZID=…` lines: a wall time that does not exist (the hour skipped when
 * clocks go forward) is read with the offset in force before the gap, which moves it forward by the
 * gap (01:30 in London on the spring-forward day is 02:30 BST); a wall time that happens twice
 * (clocks going back) is the first of the two.
 */
export function wallInstant(day: string, time: string, timeZone: string): Date {
  checkZone(timeZone);
  const [year, month, date] = partsOfDay(day);
  const [hours, minutes] = partsOfTime(time);
  // TZDate already moves a skipped time forward by the gap; in a repeated hour it takes the second.
  const resolved = new TZDate(year, month - 1, date, hours, minutes, 0, timeZone).getTime();
  const asIfUtc = Date.UTC(year, month - 1, date, hours, minutes);
  const offsets = new Set(
    [resolved - 24 * hourMs, resolved - 3 * hourMs, resolved].map((at) => tzOffset(timeZone, new Date(at))),
  );
  const sameWallTime = [...offsets]
    .map((offset) => asIfUtc - offset * minuteMs)
    .filter((at) => {
      const wall = wallTimeOf(new Date(at), timeZone);
      return wall.day === day && wall.time === time;
    });
  return new Date(Math.min(resolved, ...sameWallTime));
}

/**
 * The instants of a visit planned on `day` from `startTime` to `endTime` ("HH:MM", 24-hour) on the
 * wall clock in `timeZone` (IANA), resolved as `wallInstant` explains. Should the start be moved
 * forward past the end by a skipped hour (02:30–03:15 in New York on the spring-forward day), the
 * window keeps its planned length rather than end before it starts.
 */
export function zonedWindow(
  day: string,
  startTime: string,
  endTime: string,
  timeZone: string,
): { start: Date; end: Date } {
  checkZone(timeZone);
  const [startHours, startMinutes] = partsOfTime(startTime);
  const [endHours, endMinutes] = partsOfTime(endTime);
  const plannedMinutes = endHours * 60 + endMinutes - (startHours * 60 + startMinutes);
  if (plannedMinutes <= 0) throw new RangeError(`a visit ends after it starts (${startTime}–${endTime})`);
  const start = wallInstant(day, startTime, timeZone);
  let end = wallInstant(day, endTime, timeZone);
  if (end <= start) end = new Date(start.getTime() + plannedMinutes * minuteMs);
  return { start, end };
}

const twoDigits = (n: number) => String(n).padStart(2, '0');

/** What the wall calendar and clock in `timeZone` read at `instant`: "YYYY-MM-DD" and "HH:MM". */
export function wallTimeOf(instant: Date, timeZone: string): { day: string; time: string } {
  checkZone(timeZone);
  if (Number.isNaN(instant.getTime())) throw new RangeError('not a valid instant');
  const wall = new TZDate(instant.getTime(), timeZone);
  return {
    day: `${String(wall.getFullYear()).padStart(4, '0')}-${twoDigits(wall.getMonth() + 1)}-${twoDigits(wall.getDate())}`,
    time: `${twoDigits(wall.getHours())}:${twoDigits(wall.getMinutes())}`,
  };
}
