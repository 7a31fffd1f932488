import { useEffect, useState } from 'react';
import { volumeIn, volumeUnitLabels, type VolumeUnit } from '@shared/tanks/volume';
import {
  formatDate,
  formatDateTime,
  formatDayMonth,
  formatDayMonthTime,
  formatMonthYear,
  formatTime,
  formatWeekday,
  formatWeekdayLong,
} from '@shared/text/dates';

/*
 * The one place in the client that turns dates, times and numbers into text. Moments are written
 * by shared/text/dates.ts, the same words the alerts and e-mails use.
 */

const minute = 60_000;
const hour = 60 * minute;
const day = 24 * hour;

const locale = 'en-GB';
const relative = new Intl.RelativeTimeFormat(locale, { numeric: 'auto' });
const numberFormats = new Map<string, Intl.NumberFormat>();

/**
 * "just now", "5 minutes ago", "yesterday", "3 days ago": what a person says, not a timestamp.
 * Days are rounded, so 37 hours ago is "2 days ago", not "yesterday".
 */
export function relativeTime(iso: string | number, now = Date.now()): string {
  const elapsed = now - new Date(iso).getTime();
  if (elapsed < minute) return 'just now';
  if (elapsed < hour) return relative.format(-Math.floor(elapsed / minute), 'minute');
  if (elapsed < day) return relative.format(-Math.floor(elapsed / hour), 'hour');
  return relative.format(-Math.round(elapsed / day), 'day');
}

export {
  formatDate,
  formatDateTime,
  formatDayMonth,
  formatDayMonthTime,
  formatMonthYear,
  formatTime,
  formatWeekday,
  formatWeekdayLong,
};

/** "09:00–10:00": a visit's window on the wall clock of `timeZone` (the tank's). */
export function formatTimeWindow(start: string, end: string, timeZone: string): string {
  return `${formatTime(start, timeZone)}–${formatTime(end, timeZone)}`;
}

/** "Tue 8 Dec, 09:00–10:00": when a visit is planned, in the tank's zone. */
export function formatVisitWindow(start: string, end: string, timeZone: string): string {
  return `${formatWeekday(start, timeZone)}, ${formatTimeWindow(start, end, timeZone)}`;
}

/**
 * A day's heading in a feed, in `timeZone` (a tank's): "Today", "Yesterday", "Tuesday 8 December",
 * with the year only when it is not this one.
 */
export function formatDayHeading(at: string | number | Date, timeZone: string, now = Date.now()): string {
  const onDay = dayIn(at, timeZone);
  const today = dayIn(now, timeZone);
  const yesterday = new Date(Date.parse(`${today}T12:00:00Z`) - day).toISOString().slice(0, 10);
  if (onDay === today) return 'Today';
  if (onDay === yesterday) return 'Yesterday';
  const heading = formatWeekdayLong(at, timeZone);
  return onDay.slice(0, 4) === today.slice(0, 4) ? heading : `${heading} ${onDay.slice(0, 4)}`;
}

/** A calendar day ("2025-04-12") as people read it; no time zone can move a calendar day. */
export function formatDay(isoDay: string | null): string {
  if (!isoDay) return '—';
  return formatDate(`${isoDay}T00:00:00Z`, 'UTC');
}

/** Today's calendar day ("2026-12-01") in a time zone. */
export function todayIn(timeZone: string): string {
  return dayIn(new Date(), timeZone);
}

/** The calendar day ("2026-12-01") a moment falls on in a time zone; the runtime's own without one. */
export function dayIn(at: Date | string | number, timeZone?: string): string {
  return new Intl.DateTimeFormat('en-CA', {
    ...(timeZone ? { timeZone } : {}),
    year: 'numeric',
    month: '2-digit',
    day: '2-digit',
  }).format(new Date(at));
}

/** The value a datetime-local input wants: local time, to the minute. */
export function localInputValue(date: Date): string {
  const local = new Date(date.getTime() - date.getTimezoneOffset() * minute);
  return local.toISOString().slice(0, 16);
}

/** A datetime-local value back to an instant, or null when it is not a time. */
export function instantFromLocalInput(value: string): string | null {
  if (!/^\d{4}-\d\d-\d\dT\d\d:\d\d/.test(value)) return null;
  const date = new Date(value);
  return Number.isNaN(date.getTime()) ? null : date.toISOString();
}

/** The number formatter for `minimum`…`maximum` decimals, made once. */
function numberFormat(minimum: number, maximum: number): Intl.NumberFormat {
  const key = `${minimum}:${maximum}`;
  let format = numberFormats.get(key);
  if (!format) {
    format = new Intl.NumberFormat(locale, {
      minimumFractionDigits: minimum,
      maximumFractionDigits: maximum,
    });
    numberFormats.set(key, format);
  }
  return format;
}

// Rounding can leave "-0" or "-0.00"; nothing is shown without a sign.
const unsigned = (text: string) => (/^-[0.,]+$/.test(text) ? text.slice(1) : text);

/** A number with up to `digits` decimals, trailing zeros dropped: 7.5, 1,200. */
export function formatNumber(value: number, digits = 1): string {
  return unsigned(numberFormat(0, digits).format(value));
}

/** A number with exactly `decimals` decimals, as a result is read: 1.0260, 1,023.34. */
export function formatFixed(value: number, decimals: number): string {
  return unsigned(numberFormat(decimals, decimals).format(value));
}

/** How many of something, grouped by thousands: 12,480. */
export function formatCount(count: number): string {
  return formatNumber(count, 0);
}

/** "300 L (79.3 US gal)": litres first, the way the company stores it, with gallons alongside. */
export function formatVolume(litres: number, also: VolumeUnit = 'us-gallons'): string {
  const main = `${formatNumber(litres)} L`;
  if (litres === 0) return main;
  return `${main} (${formatNumber(volumeIn(litres, also))} ${volumeUnitLabels[also].short})`;
}

/** "the yellow tang" → "The yellow tang" for headings. */
export function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}

/** The current time, ticking every `everyMs`, so "5 minutes ago" stays true on a screen left open. */
export function useNow(everyMs = 30_000): number {
  const [now, setNow] = useState(() => Date.now());
  useEffect(() => {
    const timer = window.setInterval(() => setNow(Date.now()), everyMs);
    return () => window.clearInterval(timer);
  }, [everyMs]);
  return now;
}
