/*
 * The one place that says how far back and ahead a date may lie. Every request schema that takes a
 * date or a moment builds on these, so a slip such as year 0001 or 9999 is refused against its field
 * instead of reaching the database or a chart. Rules that need the server's clock ("not in the
 * future") stay in the services, which hold the injected clock.
 */
import { z } from 'zod';

/** Nothing a client's tank history records predates this (common practice: older records are not kept). */
export const earliestDay = '1990-01-01';
const earliestMs = Date.parse(`${earliestDay}T00:00:00Z`);
const dayMs = 86_400_000;

/** How far ahead a planned date may be (a tank set up next spring, equipment ordered). */
export const aheadDays = 366;

const isoDay = (ms: number) => new Date(ms).toISOString().slice(0, 10);

/** A calendar date (YYYY-MM-DD) from 1990-01-01 to a year ahead. */
export const calendarDay = z.iso.date('use a date as YYYY-MM-DD').superRefine((day, ctx) => {
  // A malformed date is already reported by the format check; one issue per field is enough.
  if (!/^\d{4}-\d\d-\d\d$/.test(day)) return;
  const latest = isoDay(Date.now() + aheadDays * dayMs);
  if (day < earliestDay) ctx.addIssue({ code: 'custom', message: `use a date from ${earliestDay} on` });
  else if (day > latest) ctx.addIssue({ code: 'custom', message: `use a date no later than ${latest}` });
});

interface Window {
  /** Days before now the moment may lie; without it, back to 1990-01-01. */
  pastDays?: number;
  /** Days after now the moment may lie; without it, no bound here (a service judges it). */
  futureDays?: number;
}

/** An ISO 8601 moment with its offset, inside a window around now. */
export function instantWithin({ pastDays, futureDays }: Window) {
  return z.iso.datetime({ offset: true }).superRefine((value, ctx) => {
    const at = Date.parse(value);
    const now = Date.now();
    const earliest = pastDays === undefined ? earliestMs : now - pastDays * dayMs;
    const latest = futureDays === undefined ? Infinity : now + futureDays * dayMs;
    if (!Number.isFinite(at)) return; // reported by the format check
    if (at < earliest) {
      ctx.addIssue({ code: 'custom', message: `use a time from ${isoDay(earliest)} on` });
    } else if (at > latest) {
      ctx.addIssue({ code: 'custom', message: `use a time no later than ${isoDay(latest)}` });
    }
  });
}

/** One end of a window of history to read: from 1990 to a year ahead. */
export const instant = instantWithin({ futureDays: aheadDays });

/**
 * When something happened (a reading was taken, a status changed): from 1990 on. How far after now
 * it may lie is the service's rule, judged against the server's clock (readings: 5 minutes).
 */
export const pastInstant = instantWithin({});
