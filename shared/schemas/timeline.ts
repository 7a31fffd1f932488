import { z } from 'zod';
import { cursorParam, encodeCursor } from '@shared/lists/cursor';
import { distinctList } from '@shared/lists/distinct';

/*
 * A tank's timeline: one feed, newest first, of what happened to the tank that its owners may read.
 * Each kind is one entry in `timelineKinds` (and, because the maps below are keyed by it, the
 * compiler then asks for its words here, its source in api/services/timeline.ts and its icon on
 * the screen).
 */

export const timelineKinds = ['visit', 'livestock', 'alert', 'tip', 'urgent'] as const;
export const timelineKind = z.enum(timelineKinds);
export type TimelineKind = z.infer<typeof timelineKind>;

/** The kind in words, for one entry and for a filter of many. */
export const timelineKindNames: Readonly<Record<TimelineKind, { one: string; many: string }>> = {
  visit: { one: 'Visit report', many: 'Visit reports' },
  livestock: { one: 'Livestock change', many: 'Livestock' },
  alert: { one: 'Alert', many: 'Alerts' },
  tip: { one: 'Care tip', many: 'Care tips' },
  urgent: { one: 'Urgent visit request', many: 'Urgent requests' },
};

export const maxTimelinePage = 100;

/**
 * Where a page ends: the last entry's (at, kind, id), the order the feed is sorted in. It travels
 * as an opaque token so clients pass it back rather than build one.
 */
export const timelinePosition = z.object({
  at: z.iso.datetime(),
  kind: timelineKind,
  id: z.uuid(),
});
export type TimelinePosition = z.infer<typeof timelinePosition>;

export function encodeTimelineCursor(position: TimelinePosition): string {
  return encodeCursor([position.at, position.kind, position.id]);
}

/** The `before` of a request, decoded; anything not made by `encodeTimelineCursor` is refused. */
export const timelineCursor = cursorParam(timelinePosition);

/** `kinds=visit,alert` or `kinds=visit&kinds=alert`; none (or empty) means every kind. */
const kindsParam = z
  .union([z.string().max(200), z.array(z.string().max(200)).max(20)])
  .transform((value) =>
    (Array.isArray(value) ? value : [value])
      .flatMap((part) => part.split(','))
      .map((part) => part.trim())
      .filter((part) => part !== ''),
  )
  .pipe(distinctList(timelineKind, 20));

export const timelineQuery = z.object({
  kinds: kindsParam.optional(),
  before: timelineCursor.optional(),
  limit: z.coerce.number().int().min(1).max(maxTimelinePage).default(30),
});
export type TimelineQuery = z.output<typeof timelineQuery>;

export const timelineEntry = z.object({
  kind: timelineKind,
  /** The visit, the livestock status event, the alert event, the tip or the urgent request's event. */
  id: z.uuid(),
  at: z.iso.datetime(),
  title: z.string(),
  /** One short line; empty when the title says it all. */
  summary: z.string(),
  /** Where to read more, inside the app. */
  link: z.string(),
  /** The tank's IANA zone: times are shown on the tank's clock. */
  timeZone: z.string(),
  /** When a visit report was changed after it was first published. */
  editedAt: z.iso.datetime().nullable(),
  /** Markdown to read in full in the feed itself (a care tip's text), or null. */
  body: z.string().nullable(),
  /** The photo shown with that text (a care tip's), or null. */
  photoId: z.uuid().nullable(),
});
export type TimelineEntry = z.infer<typeof timelineEntry>;

export interface TimelinePage {
  entries: TimelineEntry[];
  /** Pass as `before` for the next older page; null at the end. */
  next: string | null;
}
