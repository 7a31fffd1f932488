import type { TimelineEntry } from '@shared/schemas/timeline';
import { dayIn } from '../../../lib/format';

export interface TimelineDay {
  /** The calendar day on the tank's clock, "2026-12-01". */
  day: string;
  entries: TimelineEntry[];
}

/** Entries already newest first, cut into the days they fall on at the tank's clock. */
export function groupByDay(entries: readonly TimelineEntry[]): TimelineDay[] {
  const days: TimelineDay[] = [];
  for (const entry of entries) {
    const day = dayIn(entry.at, entry.timeZone);
    const last = days.at(-1);
    if (last?.day === day) last.entries.push(entry);
    else days.push({ day, entries: [entry] });
  }
  return days;
}
