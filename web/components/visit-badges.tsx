import { visitKindLabels, visitStatusLabels, type VisitKind, type VisitStatus } from '@shared/visits/kinds';
import { Badge } from './badge';

/*
 * A visit's status and kind, as the schedule and the tank's visits both show them. Each status has
 * its own shape beside its word, so it never rests on colour alone.
 */

const statusLooks: Readonly<Record<VisitStatus, { tone: string; mark: string }>> = {
  // An empty ring: planned, nothing written yet.
  scheduled: { tone: 'bg-ink-100 text-ink-900', mark: 'h-2.5 w-2.5 rounded-full border-2 border-current' },
  // A half-filled ring: a report is on its way.
  'in-progress': {
    tone: 'bg-watch-100 text-watch-700',
    mark: 'h-2.5 w-2.5 rounded-full border-2 border-current bg-[linear-gradient(90deg,currentColor_50%,transparent_50%)]',
  },
  // A filled dot: done and sent to the client.
  published: { tone: 'bg-healthy-100 text-healthy-700', mark: 'h-2.5 w-2.5 rounded-full bg-current' },
  // A bar: called off.
  cancelled: { tone: 'bg-nodata-100 text-nodata-700', mark: 'h-0.5 w-2.5 bg-current' },
};

export function VisitStatusBadge({ status, size = 'md' }: { status: VisitStatus; size?: 'sm' | 'md' }) {
  const { tone, mark } = statusLooks[status];
  return (
    <Badge tone={tone} size={size} mark={<span className={mark} />}>
      {visitStatusLabels[status]}
    </Badge>
  );
}

export function VisitKindBadge({ kind, size = 'md' }: { kind: VisitKind; size?: 'sm' | 'md' }) {
  // An urgent visit is the one kind that should stand out in a day's list.
  const tone =
    kind === 'urgent'
      ? 'border border-alert-700/40 bg-alert-100 text-alert-700'
      : 'border border-ink-300 bg-white text-ink-900';
  return (
    <Badge tone={tone} size={size}>
      {visitKindLabels[kind]}
    </Badge>
  );
}
