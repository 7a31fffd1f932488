/*
 * How Brinewatch writes a moment, in the browser and in alerts and e-mails alike: "1 Dec 2026,
 * 18:27" on a 24-hour clock, whatever the reader's locale, so an owner and a technician reading
 * about the same reading see the same words.
 */

const locale = 'en-GB';
const dateOptions: Intl.DateTimeFormatOptions = { day: 'numeric', month: 'short', year: 'numeric' };
const dateTimeOptions: Intl.DateTimeFormatOptions = {
  ...dateOptions,
  hour: '2-digit',
  minute: '2-digit',
  hourCycle: 'h23',
};
// Shorter forms of the same words, for a chart's axis where the year is plain from the context.
const kinds = {
  date: dateOptions,
  'date-time': dateTimeOptions,
  'day-month': { day: 'numeric', month: 'short' },
  'day-month-time': { day: 'numeric', month: 'short', hour: '2-digit', minute: '2-digit', hourCycle: 'h23' },
  'month-year': { month: 'short', year: 'numeric' },
  // A visit's day and window: "Tue 8 Dec", "09:00".
  'weekday-day-month': { weekday: 'short', day: 'numeric', month: 'short' },
  'weekday-long': { weekday: 'long', day: 'numeric', month: 'long' },
  time: { hour: '2-digit', minute: '2-digit', hourCycle: 'h23' },
} satisfies Record<string, Intl.DateTimeFormatOptions>;
type FormatKind = keyof typeof kinds;
const formats = new Map<string, Intl.DateTimeFormat>();

function formatFor(kind: FormatKind, timeZone: string | undefined): Intl.DateTimeFormat {
  const key = `${kind}:${timeZone ?? ''}`;
  let format = formats.get(key);
  if (!format) {
    format = new Intl.DateTimeFormat(locale, {
      ...kinds[kind],
      ...(timeZone ? { timeZone } : {}),
    });
    formats.set(key, format);
  }
  return format;
}

/** "1 Dec 2026, 18:27" in `timeZone` (a tank's, a person's), or the runtime's own zone. */
export function formatDateTime(at: Date | string | number, timeZone?: string): string {
  return formatFor('date-time', timeZone).format(new Date(at));
}

/** "1 Dec 2026" in `timeZone`, or the runtime's own zone. */
export function formatDate(at: Date | string | number, timeZone?: string): string {
  return formatFor('date', timeZone).format(new Date(at));
}

/** "1 Dec, 18:00": a moment on a chart's axis. */
export function formatDayMonthTime(at: Date | string | number, timeZone?: string): string {
  return formatFor('day-month-time', timeZone).format(new Date(at));
}

/** "1 Dec": a day on a chart's axis. */
export function formatDayMonth(at: Date | string | number, timeZone?: string): string {
  return formatFor('day-month', timeZone).format(new Date(at));
}

/** "Dec 2026": a month on a chart's axis. */
export function formatMonthYear(at: Date | string | number, timeZone?: string): string {
  return formatFor('month-year', timeZone).format(new Date(at));
}

/** "Tue 8 Dec": the day of a visit, in `timeZone`. */
export function formatWeekday(at: Date | string | number, timeZone?: string): string {
  return formatFor('weekday-day-month', timeZone).format(new Date(at));
}

/** "Tuesday 8 December": a day's heading in a schedule, in `timeZone`. */
export function formatWeekdayLong(at: Date | string | number, timeZone?: string): string {
  return formatFor('weekday-long', timeZone).format(new Date(at));
}

/** "09:00" on a 24-hour clock, in `timeZone`. */
export function formatTime(at: Date | string | number, timeZone?: string): string {
  return formatFor('time', timeZone).format(new Date(at));
}
