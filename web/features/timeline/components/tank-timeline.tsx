import { useEffect, useRef, useState } from 'react';
import { timelineKindNames, timelineKinds, type TimelineKind } from '@shared/schemas/timeline';
import { Button } from '../../../components/button';
import { RadioGroup } from '../../../components/radio-group';
import { EmptyState, ErrorState, LoadingState } from '../../../components/states';
import { formatDateTime, formatDayHeading, useNow } from '../../../lib/format';
import { useTimeline } from '../api/get-timeline';
import { groupByDay } from '../utils/group-by-day';
import { entryElementId, TimelineEntryItem } from './timeline-entry';

type Shown = 'all' | TimelineKind;

const choices = [
  { value: 'all' as const, label: 'Everything' },
  ...timelineKinds.map((kind) => ({ value: kind, label: timelineKindNames[kind].many })),
];

/** How many older pages a link to one tip may open by itself while looking for it. */
const maxPagesForLinkedTip = 10;

/**
 * A tank's story, newest first and grouped by day on the tank's clock, with a filter by kind. A
 * link with `tip` opens the pages down to that tip, then scrolls to it and marks it.
 */
export function TankTimeline({ tankId, tipId }: { tankId: string; tipId: string | null }) {
  const [shown, setShown] = useState<Shown>('all');
  const list = useTimeline(tankId, shown === 'all' ? [] : [shown]);
  const entries = list.data?.pages.flatMap((page) => page.entries) ?? [];
  const linkedTip = tipId ? entries.find((entry) => entry.kind === 'tip' && entry.id === tipId) : undefined;
  const tipWanted = tipId !== null && (shown === 'all' || shown === 'tip');
  const pageCount = list.data?.pages.length ?? 0;
  const { hasNextPage, isFetchingNextPage, fetchNextPage } = list;

  useEffect(() => {
    if (tipWanted && !linkedTip && hasNextPage && !isFetchingNextPage && pageCount < maxPagesForLinkedTip) {
      void fetchNextPage();
    }
  }, [tipWanted, linkedTip, hasNextPage, isFetchingNextPage, pageCount, fetchNextPage]);

  const scrolledTo = useRef<string | null>(null);
  useEffect(() => {
    if (!linkedTip || scrolledTo.current === linkedTip.id) return;
    scrolledTo.current = linkedTip.id;
    const element = document.getElementById(entryElementId(linkedTip));
    element?.scrollIntoView({ block: 'start' });
    element?.focus({ preventScroll: true });
  }, [linkedTip]);

  // Ticks, so "Today" turns into "Yesterday" on a screen left open overnight.
  const now = useNow(60_000);
  const zone = entries[0]?.timeZone;
  const otherClock = zone !== undefined && formatDateTime(now, zone) !== formatDateTime(now);
  const tipMissing =
    tipWanted && list.isSuccess && !linkedTip && (!hasNextPage || pageCount >= maxPagesForLinkedTip);

  return (
    // A reading width on a wide screen; the feed is text, not a table.
    <div className="grid max-w-3xl gap-4">
      <RadioGroup<Shown> legend="Show" look="compact" value={shown} onChange={setShown} options={choices} />
      {otherClock && (
        <p className="text-sm text-ink-700">Times are on the tank’s clock ({zone.replace(/_/g, ' ')}).</p>
      )}
      {tipMissing && (
        <p role="status" className="rounded-card bg-white p-4 text-ink-900 shadow-card">
          The care tip you opened is no longer on this tank’s timeline. The company may have withdrawn it.
        </p>
      )}
      {list.isPending ? (
        <LoadingState label="Loading the timeline…" />
      ) : list.isLoadingError ? (
        <ErrorState error={list.error} what="this tank’s timeline" onRetry={() => void list.refetch()} />
      ) : entries.length === 0 ? (
        <EmptyState
          title={
            shown === 'all'
              ? 'Nothing on this tank’s timeline yet'
              : `No ${timelineKindNames[shown].many.toLowerCase()} on this tank’s timeline yet`
          }
        >
          Visit reports, livestock changes, alerts and care tips will appear here as they happen.
        </EmptyState>
      ) : (
        <ol className="grid gap-6" aria-label="Timeline, newest first">
          {groupByDay(entries).map(({ day, entries: ofDay }) => (
            <li key={day}>
              <h3 className="mb-3 text-base font-bold text-ink-900">
                <time dateTime={day}>{formatDayHeading(ofDay[0]!.at, ofDay[0]!.timeZone, now)}</time>
              </h3>
              <ol className="relative grid gap-3 before:absolute before:top-0 before:bottom-0 before:left-[17px] before:w-0.5 before:bg-ink-100">
                {ofDay.map((entry) => (
                  <TimelineEntryItem
                    key={`${entry.kind}-${entry.id}`}
                    entry={entry}
                    highlighted={entry === linkedTip}
                  />
                ))}
              </ol>
            </li>
          ))}
        </ol>
      )}
      {list.hasNextPage && (
        <Button
          tone="secondary"
          className="justify-self-start"
          onClick={() => void list.fetchNextPage()}
          disabled={list.isFetchingNextPage}
        >
          {list.isFetchingNextPage ? 'Loading…' : 'Show older'}
        </Button>
      )}
      {list.isFetchNextPageError && (
        <ErrorState error={list.error} what="older entries" onRetry={() => void list.fetchNextPage()} />
      )}
    </div>
  );
}
