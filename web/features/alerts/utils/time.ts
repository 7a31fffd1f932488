const minute = 60_000;
const hour = 60 * minute;
const day = 24 * hour;

const relative = new Intl.RelativeTimeFormat(undefined, { numeric: 'auto' });
const dateTime = new Intl.DateTimeFormat(undefined, {
  dateStyle: 'medium',
  timeStyle: 'short',
  hourCycle: 'h23',
});

/** "just now", "5 minutes ago", "yesterday", "3 days ago": what a person says, not a timestamp. */
export function relativeTime(iso: string, now: number): string {
  const elapsed = now - Date.parse(iso);
  if (elapsed < minute) return 'just now';
  if (elapsed < hour) return relative.format(-Math.floor(elapsed / minute), 'minute');
  if (elapsed < day) return relative.format(-Math.floor(elapsed / hour), 'hour');
  return relative.format(-Math.floor(elapsed / day), 'day');
}

/** "12 Mar 2027, 14:05" in the reader's own locale and time zone, on a 24-hour clock. */
export const formatDateTime = (iso: string) => dateTime.format(new Date(iso));
