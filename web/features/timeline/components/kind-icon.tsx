import type { ReactNode } from 'react';
import type { TimelineKind } from '@shared/schemas/timeline';

/*
 * Brinewatch's own marks for the kinds of timeline entry, drawn here: a ticked clipboard for a visit
 * report, a fish for livestock, a warning triangle for an alert, a lamp for a care tip, a bolt in a
 * circle for an urgent visit request. Each entry
 * also names its kind in words, so neither the colour nor the shape has to carry it alone.
 */

const paths: Readonly<Record<TimelineKind, ReactNode>> = {
  visit: (
    <>
      <rect x="5" y="4" width="14" height="17" rx="2" />
      <path d="M9 2.5h6v3H9z" />
      <path d="m8.5 13.5 2.5 2.5 4.5-5" />
    </>
  ),
  livestock: (
    <>
      <path d="M2.5 12c3-4.5 8.5-6 12.5-3L21 5.5v13L15 15c-4 3-9.5 1.5-12.5-3z" />
      <circle cx="7.5" cy="11" r="0.9" fill="currentColor" />
    </>
  ),
  alert: (
    <>
      <path d="M12 3 22 20.5H2z" />
      <path d="M12 9.5v5" />
      <circle cx="12" cy="17.5" r="0.9" fill="currentColor" />
    </>
  ),
  tip: (
    <>
      <path d="M12 2.5a6.5 6.5 0 0 0-3.8 11.8c.8.6 1.3 1.4 1.3 2.4h5c0-1 .5-1.8 1.3-2.4A6.5 6.5 0 0 0 12 2.5z" />
      <path d="M9.5 19.5h5M10.5 22h3" />
    </>
  ),
  urgent: (
    <>
      <circle cx="12" cy="12" r="9.5" />
      <path d="M13 5.5 8 13h4l-1 5.5 5-7.5h-4z" />
    </>
  ),
};

/** The circle each entry hangs from on the timeline's line, in its kind's colours. */
export const kindTones: Readonly<Record<TimelineKind, string>> = {
  visit: 'border-brine-700 bg-brine-100 text-brine-700',
  livestock: 'border-healthy-700 bg-healthy-100 text-healthy-700',
  alert: 'border-alert-700 bg-alert-100 text-alert-700',
  tip: 'border-watch-700 bg-watch-100 text-watch-700',
  urgent: 'border-ink-700 bg-ink-100 text-ink-700',
};

export function KindIcon({ kind, className = 'h-5 w-5' }: { kind: TimelineKind; className?: string }) {
  return (
    <svg
      viewBox="0 0 24 24"
      className={className}
      fill="none"
      stroke="currentColor"
      strokeWidth="1.8"
      strokeLinecap="round"
      strokeLinejoin="round"
      aria-hidden="true"
      focusable="false"
    >
      {paths[kind]}
    </svg>
  );
}
