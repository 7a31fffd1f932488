import { z } from 'zod';

/*
 * A person's own schedule as an iCalendar feed (RFC 5545), at an address holding a secret that only
 * they know; Brinewatch keeps its SHA-256. Issuing a new address retires the old one.
 */

/** Any text: a token that is not one of ours is answered like an unknown one (404), not a 400. */
export const calendarFeedParams = z.object({ token: z.string() });

export interface CalendarFeedStatus {
  active: boolean;
}

/** Shown once, when issued: the address cannot be read back later. */
export interface CalendarFeedAddress {
  url: string;
}
