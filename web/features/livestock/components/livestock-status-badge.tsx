import { livestockStatusLabels } from '@shared/schemas/livestock';
import { Badge } from '../../../components/badge';
import type { LivestockStatus } from '@shared/schemas/livestock-status';

const tones: Record<LivestockStatus, string> = {
  thriving: 'bg-healthy-100 text-healthy-700',
  stable: 'bg-ink-100 text-ink-800',
  watch: 'bg-watch-100 text-watch-700',
  sick: 'bg-alert-100 text-alert-700',
  removed: 'bg-nodata-100 text-nodata-700',
  died: 'bg-nodata-100 text-nodata-700',
};

/** Each status has its own shape as well as its word and colour, so colour is never the only cue. */
function Shape({ status }: { status: LivestockStatus }) {
  const common = {
    viewBox: '0 0 16 16',
    className: 'h-3.5 w-3.5 shrink-0',
    'aria-hidden': true,
    focusable: false,
  } as const;
  switch (status) {
    case 'thriving':
      return (
        <svg {...common}>
          <path d="M8 2 14 12H2z" fill="currentColor" />
        </svg>
      );
    case 'stable':
      return (
        <svg {...common}>
          <circle cx="8" cy="8" r="6" fill="currentColor" />
        </svg>
      );
    case 'watch':
      return (
        <svg {...common}>
          <path d="M8 1 15 8 8 15 1 8z" fill="currentColor" />
        </svg>
      );
    case 'sick':
      return (
        <svg {...common}>
          <path d="M6 1h4v5h5v4h-5v5H6v-5H1V6h5z" fill="currentColor" />
        </svg>
      );
    case 'removed':
      return (
        <svg {...common}>
          <path d="M2 8h9M8 4l4 4-4 4" stroke="currentColor" strokeWidth="2" fill="none" />
        </svg>
      );
    case 'died':
      return (
        <svg {...common}>
          <circle cx="8" cy="8" r="5.5" stroke="currentColor" strokeWidth="2" fill="none" />
        </svg>
      );
  }
}

export function LivestockStatusBadge({ status }: { status: LivestockStatus }) {
  return (
    <Badge tone={tones[status]} mark={<Shape status={status} />}>
      {livestockStatusLabels[status]}
    </Badge>
  );
}
