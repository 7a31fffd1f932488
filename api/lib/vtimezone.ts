import { tzOffset, tzScan } from '@date-fns/tz';

/*
 * RFC 5545 §3.6.5 wants a VTIMEZONE for every TZID a calendar uses (§3.2.19: "MUST be specified").
 * Rather than ship a zone database, each one is written from the runtime's own (Intl, through
 * @date-fns/tz) for the span the calendar covers: the offset in force at its start, then every
 * change up to its end, each as an observance without a repeat rule.
 */

const minuteMs = 60_000;
const hourMs = 60 * minuteMs;

const pad = (n: number) => String(n).padStart(2, '0');

/** "+0100", "-0330" (RFC 5545 §3.3.14). */
function utcOffset(minutes: number): string {
  const size = Math.abs(minutes);
  return `${minutes < 0 ? '-' : '+'}${pad(Math.floor(size / 60))}${pad(size % 60)}`;
}

/** The wall time at `instant` under `offsetMinutes`, as a floating DATE-TIME ("20260329T010000"). */
function wallStamp(instant: number, offsetMinutes: number): string {
  return new Date(instant + offsetMinutes * minuteMs).toISOString().replace(/[-:]/g, '').slice(0, 15);
}

/**
 * tzScan finds the first whole UTC hour after a change; zones such as Lord Howe change on the half
 * hour, so the minute is found by halving the hour before it.
 */
function changeInstant(timeZone: string, firstHourAfter: Date, offsetAfter: number): number {
  let before = firstHourAfter.getTime() - hourMs;
  let after = firstHourAfter.getTime();
  while (after - before > minuteMs) {
    const middle = before + Math.floor((after - before) / 2 / minuteMs) * minuteMs;
    if (tzOffset(timeZone, new Date(middle)) === offsetAfter) after = middle;
    else before = middle;
  }
  return after;
}

/** A VTIMEZONE for `timeZone` (IANA) that holds from `from` to `to`, lines joined with CRLF. */
export function vtimezone(timeZone: string, from: Date, to: Date): string {
  const start = Math.floor(from.getTime() / minuteMs) * minuteMs;
  const initial = tzOffset(timeZone, new Date(start));
  const changes = tzScan(timeZone, { start: new Date(start), end: to }).map((change) => ({
    at: changeInstant(timeZone, change.date, change.offset),
    offset: change.offset,
  }));
  // Summer time is any offset above the lowest one in the span; a zone without changes has only standard time.
  const standard = Math.min(initial, ...changes.map((change) => change.offset));
  const observance = (at: number, offsetFrom: number, offsetTo: number) => {
    const kind = offsetTo > standard ? 'DAYLIGHT' : 'STANDARD';
    return [
      `BEGIN:${kind}`,
      `DTSTART:${wallStamp(at, offsetFrom)}`,
      `TZOFFSETFROM:${utcOffset(offsetFrom)}`,
      `TZOFFSETTO:${utcOffset(offsetTo)}`,
      `END:${kind}`,
    ];
  };
  const lines = ['BEGIN:VTIMEZONE', `TZID:${timeZone}`, ...observance(start, initial, initial)];
  let previous = initial;
  for (const change of changes) {
    lines.push(...observance(change.at, previous, change.offset));
    previous = change.offset;
  }
  lines.push('END:VTIMEZONE');
  return lines.join('\r\n');
}
