const minute = 60_000;
const hour = 60 * minute;
const day = 24 * hour;

/** "just now", "12 min ago", "3 h ago", "2 days ago". */
export function timeAgo(iso: string, now = Date.now()): string {
  const ms = now - Date.parse(iso);
  if (ms < minute) return 'just now';
  if (ms < hour) return `${Math.floor(ms / minute)} min ago`;
  if (ms < day) return `${Math.floor(ms / hour)} h ago`;
  const days = Math.floor(ms / day);
  return days === 1 ? '1 day ago' : `${days} days ago`;
}

const dateTime = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short' });
export const formatDateTime = (iso: string | number) => dateTime.format(new Date(iso));

/** The value a datetime-local input wants: local time, to the minute. */
export function localInputValue(date: Date): string {
  const local = new Date(date.getTime() - date.getTimezoneOffset() * minute);
  return local.toISOString().slice(0, 16);
}

/** A datetime-local value back to an instant with its offset, or null when it is not a time. */
export function instantFromLocalInput(value: string): string | null {
  if (!/^\d{4}-\d\d-\d\dT\d\d:\d\d/.test(value)) return null;
  const date = new Date(value);
  return Number.isNaN(date.getTime()) ? null : date.toISOString();
}
