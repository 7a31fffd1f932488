import { useId, useState } from 'react';
import { tankSummaryTipLimit } from '@shared/first-load/api-paths';
import type { TipFeedItem } from '@shared/schemas/care-tips';
import { Button } from '../../../components/button';
import { FieldError } from '../../../components/field-error';
import { Markdown } from '../../../components/markdown';
import { EmptyState, ErrorState, LoadingState } from '../../../components/states';
import { TipCategoryBadge } from '../../../components/tip-badges';
import { TipPhoto } from '../../../components/tip-photo';
import { can, useMe } from '../../../lib/auth';
import { problemMessage } from '../../../lib/problem-message';
import { formatDate, formatDateTime } from '../../../lib/format';
import { useMarkTipHelpful, useTipFeed } from '../api/tip-feed';

function HelpfulToggle({ item }: { item: TipFeedItem }) {
  const mark = useMarkTipHelpful();
  const failed = mark.isError && mark.variables?.tipId === item.tipId;
  return (
    <div className="mt-3 flex flex-wrap items-center gap-3">
      <button
        type="button"
        aria-pressed={item.helpful}
        onClick={() => mark.mutate({ tipId: item.tipId, helpful: !item.helpful })}
        className={`inline-flex min-h-11 items-center gap-2 rounded-lg border-2 px-4 font-bold transition-colors ${
          item.helpful
            ? 'border-brine-700 bg-brine-700 text-white hover:bg-brine-600'
            : 'border-ink-300 bg-white text-ink-900 hover:border-ink-700'
        }`}
      >
        <span aria-hidden="true">{item.helpful ? '✓' : '+'}</span>
        Helpful<span className="sr-only"> “{item.title}”</span>
      </button>
      {item.helpful && <span className="text-sm text-ink-700">Thanks, the company can see that.</span>}
      {failed && (
        <div role="alert" className="basis-full">
          <FieldError className="">{problemMessage(mark.error)}</FieldError>
        </div>
      )}
    </div>
  );
}

const listWords = (names: string[]) =>
  names.length < 2 ? (names[0] ?? '') : `${names.slice(0, -1).join(', ')} and ${names.at(-1)}`;

const hasCaution = (body: string) => /^:::\s*caution/im.test(body);

/**
 * One tip: what and when always; the text open for the newest, one tap away for the older ones, so
 * a few tips fit under the tank's summary. A folded tip says when it carries a safety caution.
 */
function TipCard({
  item,
  tankNames,
  canMark,
  startOpen,
}: {
  item: TipFeedItem;
  /** The tanks it came for, where the feed covers several. */
  tankNames: string[] | null;
  canMark: boolean;
  startOpen: boolean;
}) {
  const id = useId();
  const [open, setOpen] = useState(startOpen);
  return (
    <article
      aria-labelledby={`${id}-title`}
      className={`rounded-card border-l-8 bg-white p-4 shadow-card sm:p-5 ${
        item.category === 'safety' ? 'border-l-watch-700' : 'border-l-brine-300'
      }`}
    >
      <div className="flex flex-wrap items-center gap-x-3 gap-y-1 text-sm text-ink-700">
        <TipCategoryBadge category={item.category} />
        <time dateTime={item.deliveredAt} title={formatDateTime(item.deliveredAt)}>
          {formatDate(item.deliveredAt)}
        </time>
        {tankNames && <span>For {listWords(tankNames)}</span>}
      </div>
      <h3 id={`${id}-title`} className="mt-2 text-lg font-bold text-ink-900">
        {item.title}
      </h3>
      {!open && hasCaution(item.body) && (
        <p className="mt-1 flex items-center gap-2 text-sm font-bold text-watch-700">
          <span aria-hidden="true">▲</span> Includes a safety caution
        </p>
      )}
      <div id={`${id}-body`} hidden={!open}>
        {item.photoId && <TipPhoto photoId={item.photoId} title={item.title} className="mt-3" />}
        <Markdown source={item.body} className="mt-2" />
        {canMark && <HelpfulToggle item={item} />}
      </div>
      <button
        type="button"
        aria-expanded={open}
        aria-controls={`${id}-body`}
        onClick={() => setOpen((was) => !was)}
        className="mt-2 inline-flex min-h-11 items-center font-bold text-brine-700 underline-offset-2 hover:underline"
      >
        {open ? 'Show less' : 'Read the tip'}
        <span className="sr-only"> “{item.title}”</span>
      </button>
    </article>
  );
}

/** A tip sent to several of a person's tanks is one tip to read: shown once, naming them all. */
function oncePerTip(items: TipFeedItem[]): { item: TipFeedItem; tankNames: string[] }[] {
  const tips = new Map<string, { item: TipFeedItem; tankNames: string[] }>();
  for (const item of items) {
    const seen = tips.get(item.tipId);
    if (!seen) tips.set(item.tipId, { item, tankNames: [item.tankName] });
    else if (!seen.tankNames.includes(item.tankName)) seen.tankNames.push(item.tankName);
  }
  return [...tips.values()];
}

/** A person's care tips, newest first, a few at a time with older ones on request. */
function TipFeedList({
  tankId,
  limit,
  emptyText,
}: {
  tankId: string | null;
  limit: number;
  emptyText: string;
}) {
  const feed = useTipFeed(tankId, limit);
  const { data: me } = useMe();
  // Owners mark the tips they received; staff, who write them, see the count in the console.
  const canMark = me != null && !can(me, 'care-tips:write');
  if (feed.isPending) return <LoadingState label="Loading care tips…" />;
  if (feed.isError && !feed.data) {
    return <ErrorState error={feed.error} what="the care tips" onRetry={() => void feed.refetch()} />;
  }
  const tips = oncePerTip(feed.data.pages.flat());
  if (tips.length === 0) return <EmptyState title="No care tips yet">{emptyText}</EmptyState>;
  return (
    <div className="grid max-w-3xl gap-3">
      <ul className="grid gap-3">
        {tips.map(({ item, tankNames }, index) => (
          <li key={item.tipId}>
            <TipCard
              item={item}
              tankNames={tankId === null ? tankNames : null}
              canMark={canMark}
              startOpen={index === 0}
            />
          </li>
        ))}
      </ul>
      {feed.isFetchNextPageError && (
        <div role="alert">
          <FieldError>{problemMessage(feed.error)}</FieldError>
        </div>
      )}
      {feed.hasNextPage && (
        <Button
          tone="secondary"
          className="justify-self-start"
          disabled={feed.isFetchingNextPage}
          onClick={() => void feed.fetchNextPage()}
        >
          {feed.isFetchingNextPage ? 'Loading older tips…' : 'Show older tips'}
        </Button>
      )}
    </div>
  );
}

/** The care tips one tank received, for its page. */
export function TankTipsFeed({ tankId, companyName }: { tankId: string; companyName: string }) {
  return (
    <section aria-labelledby="tank-tips-title" className="grid gap-3">
      <h2 id="tank-tips-title" className="text-xl font-bold text-ink-900">
        Care tips
      </h2>
      <TipFeedList
        tankId={tankId}
        limit={tankSummaryTipLimit}
        emptyText={`Advice from ${companyName} about this tank will appear here.`}
      />
    </section>
  );
}

/** The newest care tips across a person's tanks, for the dashboard. */
export function DashboardTipsFeed({ companyName }: { companyName: string }) {
  return (
    <section aria-labelledby="dashboard-tips-title" className="grid gap-3">
      <h2 id="dashboard-tips-title" className="text-xl font-bold text-ink-900">
        Tips from {companyName}
      </h2>
      <TipFeedList
        tankId={null}
        limit={3}
        emptyText={`Advice from ${companyName} about your tanks will appear here.`}
      />
    </section>
  );
}
