import type { TankStatus } from '@shared/parameters/health';
import { StatusShape, toneClasses, type StatusTone } from './status-shapes';

const statuses: Record<TankStatus, { label: string; tone: StatusTone }> = {
  healthy: { label: 'Healthy', tone: 'good' },
  watch: { label: 'Watch', tone: 'watch' },
  alert: { label: 'Alert', tone: 'alert' },
  'no-data': { label: 'No recent data', tone: 'none' },
};

/** A tank's status at a glance: shape, word and colour together, never colour alone. */
export function TankStatusBadge({ status, size = 'md' }: { status: TankStatus; size?: 'md' | 'lg' }) {
  const { label, tone } = statuses[status];
  const large = size === 'lg';
  return (
    <span
      className={`inline-flex items-center gap-1.5 rounded-full border font-bold ${toneClasses[tone]} ${
        large ? 'px-3.5 py-1.5 text-base' : 'px-2.5 py-1 text-sm'
      }`}
      data-status={status}
    >
      <StatusShape tone={tone} className={large ? 'h-5 w-5' : 'h-4 w-4'} />
      {label}
    </span>
  );
}
