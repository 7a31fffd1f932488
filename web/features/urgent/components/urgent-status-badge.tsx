import { urgentStatusNames, type UrgentStatus } from '@shared/urgent/lifecycle';
import { Badge } from '../../../components/badge';

/*
 * Each status has its own shape beside its word, so it never rests on colour alone: a bell for a
 * request nobody has picked up, an arrow while help is coming, a tick when resolved, a cross when
 * declined.
 */
const looks: Readonly<Record<UrgentStatus, { tone: string; mark: string }>> = {
  requested: { tone: 'border border-alert-700/40 bg-alert-100 text-alert-700', mark: '!' },
  acknowledged: { tone: 'border border-watch-700/30 bg-watch-100 text-watch-700', mark: '→' },
  assigned: { tone: 'border border-watch-700/30 bg-watch-100 text-watch-700', mark: '→' },
  'on-the-way': { tone: 'border border-brine-700/30 bg-brine-100 text-brine-700', mark: '→' },
  'on-site': { tone: 'border border-brine-700/30 bg-brine-100 text-brine-700', mark: '●' },
  resolved: { tone: 'border border-healthy-700/30 bg-healthy-100 text-healthy-700', mark: '✓' },
  declined: { tone: 'border border-nodata-700/30 bg-nodata-100 text-nodata-700', mark: '✕' },
};

export function UrgentStatusBadge({
  status,
  size = 'md',
}: {
  status: UrgentStatus;
  size?: 'sm' | 'md' | 'lg';
}) {
  const { tone, mark } = looks[status];
  return (
    <Badge tone={tone} size={size} mark={<span className="font-bold">{mark}</span>}>
      {urgentStatusNames[status]}
    </Badge>
  );
}
