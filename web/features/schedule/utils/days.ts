/*
 * Calendar days ("2026-12-08") for moving through the schedule. They are floating dates, so the
 * arithmetic runs on UTC midnights, where no clock change can add or drop a day.
 */

const pattern = /^\d{4}-\d{2}-\d{2}$/;

const utc = (day: string) => new Date(`${day}T00:00:00Z`);
const dayOf = (date: Date) => date.toISOString().slice(0, 10);

/** A real calendar day in the form the API takes ("2026-02-30" is not one). */
export function isCalendarDay(value: string | null): value is string {
  return value !== null && pattern.test(value) && dayOf(utc(value)) === value;
}

export function addDays(day: string, days: number): string {
  const date = utc(day);
  date.setUTCDate(date.getUTCDate() + days);
  return dayOf(date);
}

/** The Monday-to-Sunday week a day falls in (ISO 8601 weeks start on Monday). */
export function weekOf(day: string): string[] {
  const sinceMonday = (utc(day).getUTCDay() + 6) % 7;
  const monday = addDays(day, -sinceMonday);
  return Array.from({ length: 7 }, (_, index) => addDays(monday, index));
}

/** A day as its UTC midnight, to be written with the formatters in the zone 'UTC'. */
export const floatingDay = (day: string) => `${day}T00:00:00Z`;
