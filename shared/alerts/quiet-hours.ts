import { z } from 'zod';

const clockTime = z.string().regex(/^([01]\d|2[0-3]):[0-5]\d$/, 'Use a 24-hour time such as 22:00.');

/** A daily window of local clock times in which only critical alerts reach a person. */
export const quietHours = z.object({ start: clockTime, end: clockTime });
export type QuietHours = z.infer<typeof quietHours>;

/** The local clock time (HH:MM, 24 h) at `at` in an IANA time zone. */
export function localClockTime(at: Date, timeZone: string): string {
  return new Intl.DateTimeFormat('en-GB', {
    hour: '2-digit',
    minute: '2-digit',
    hourCycle: 'h23',
    timeZone,
  }).format(at);
}

/**
 * Whether `at` falls in the person's quiet hours, in their own time zone. A window may run
 * past midnight (22:00–07:00); the start is inside it, the end is not.
 */
export function inQuietHours(
  preferences: { readonly quietHours: QuietHours | null; readonly timeZone: string },
  at: Date,
): boolean {
  if (!preferences.quietHours) return false;
  const local = localClockTime(at, preferences.timeZone);
  const { start, end } = preferences.quietHours;
  if (start === end) return false;
  return start < end ? local >= start && local < end : local >= start || local < end;
}
