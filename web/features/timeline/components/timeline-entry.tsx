import { useState } from 'react';
import { Link } from 'react-router';
import { timelineKindNames, type TimelineEntry } from '@shared/schemas/timeline';
import { Markdown } from '../../../components/markdown';
import { TipPhoto } from '../../../components/tip-photo';
import { formatDateTime, formatTime } from '../../../lib/format';
import { KindIcon, kindTones } from './kind-icon';

/** The DOM id of an entry, so a link to one tip can scroll to it. */
export const entryElementId = (entry: Pick<TimelineEntry, 'kind' | 'id'>) =>
  `timeline-${entry.kind}-${entry.id}`;

/**
 * One thing that happened to the tank: its mark on the line, its kind in words, the time on the
 * tank's clock, what it was and where to read more. A care tip can be read in full right here.
 */
export function TimelineEntryItem({ entry, highlighted }: { entry: TimelineEntry; highlighted: boolean }) {
  const titleId = `${entryElementId(entry)}-title`;
  // A tip opened from its link is shown in full; after that the reader's own toggle wins.
  const [toggled, setToggled] = useState<boolean | null>(null);
  const open = toggled ?? highlighted;
  return (
    <li className="relative pl-12">
      <span
        className={`absolute top-3 left-0 flex h-9 w-9 items-center justify-center rounded-full border-2 ${kindTones[entry.kind]}`}
      >
        <KindIcon kind={entry.kind} />
      </span>
      <article
        id={entryElementId(entry)}
        aria-labelledby={titleId}
        aria-current={highlighted ? 'true' : undefined}
        tabIndex={highlighted ? -1 : undefined}
        className={`scroll-mt-24 rounded-card bg-white p-4 shadow-card ${
          highlighted ? 'outline-4 outline-offset-2 outline-brine-500' : ''
        }`}
      >
        <p className="flex flex-wrap items-baseline gap-x-2 text-sm text-ink-700">
          <span className="font-bold text-ink-900">{timelineKindNames[entry.kind].one}</span>
          <time dateTime={entry.at} title={formatDateTime(entry.at, entry.timeZone)}>
            {formatTime(entry.at, entry.timeZone)}
          </time>
          {entry.editedAt && (
            <span>
              edited <time dateTime={entry.editedAt}>{formatDateTime(entry.editedAt, entry.timeZone)}</time>
            </span>
          )}
          {highlighted && <span className="font-bold text-brine-700">The tip you opened</span>}
        </p>
        <h4 id={titleId} className="mt-1 font-bold break-words text-ink-900">
          <Link
            to={entry.link}
            className="text-ink-900 underline decoration-ink-300 underline-offset-4 hover:decoration-ink-900"
          >
            {entry.title}
          </Link>
        </h4>
        {entry.summary && !(entry.body && open) && (
          <p className="mt-1 break-words text-ink-900">{entry.summary}</p>
        )}
        {entry.body && (
          <details open={open} onToggle={(event) => setToggled(event.currentTarget.open)} className="mt-2">
            <summary className="flex min-h-11 cursor-pointer items-center font-bold text-brine-700">
              Read the whole tip
            </summary>
            {entry.photoId && <TipPhoto photoId={entry.photoId} title={entry.title} className="mt-1" />}
            <Markdown source={entry.body} className="mt-1 text-ink-900" />
          </details>
        )}
      </article>
    </li>
  );
}
