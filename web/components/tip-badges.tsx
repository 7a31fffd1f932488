import { tipCategoryLabels, type TipCategory, type TipStatus } from '@shared/schemas/care-tips';
import { Badge } from './badge';

/*
 * A care tip's category and where it stands, as the console's list, the owners' feed and the tip
 * suggestions show them. Each status has its own shape beside its word, never colour alone.
 */

export function TipCategoryBadge({ category, size = 'sm' }: { category: TipCategory; size?: 'sm' | 'md' }) {
  // Safety advice is the one category that should stand out in a feed.
  const tone =
    category === 'safety'
      ? 'border border-watch-700/40 bg-watch-100 text-watch-700'
      : 'border border-ink-300 bg-white text-ink-900';
  return (
    <Badge
      tone={tone}
      size={size}
      mark={category === 'safety' ? <span className="text-[0.8em] leading-none">▲</span> : undefined}
    >
      {tipCategoryLabels[category]}
    </Badge>
  );
}

const statusLooks: Readonly<Record<TipStatus, { tone: string; mark: string; label: string }>> = {
  // A dashed ring: written, not sent.
  draft: {
    tone: 'bg-ink-100 text-ink-900',
    mark: 'h-2.5 w-2.5 rounded-full border-2 border-dashed border-current',
    label: 'Draft',
  },
  // A ring: waiting for its time.
  scheduled: {
    tone: 'bg-brine-100 text-brine-700',
    mark: 'h-2.5 w-2.5 rounded-full border-2 border-current',
    label: 'Scheduled',
  },
  // A filled dot: with the owners.
  sent: {
    tone: 'bg-healthy-100 text-healthy-700',
    mark: 'h-2.5 w-2.5 rounded-full bg-current',
    label: 'Sent',
  },
  // A bar: taken back from the feeds.
  withdrawn: { tone: 'bg-nodata-100 text-nodata-700', mark: 'h-0.5 w-2.5 bg-current', label: 'Withdrawn' },
};

export function TipStatusBadge({ status, size = 'sm' }: { status: TipStatus; size?: 'sm' | 'md' }) {
  const { tone, mark, label } = statusLooks[status];
  return (
    <Badge tone={tone} size={size} mark={<span className={mark} />}>
      {label}
    </Badge>
  );
}
